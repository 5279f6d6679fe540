import type { FruitContractState } from '../utils/contractStatus'
import type { GrowerCoverageRow, MakerSupplyRow, OverCommitment } from '../utils/coverage'
import type { ForecastClass } from '../utils/forecast'
import type { BlockWithoutCurve } from './block'

/** A fruit contract counted in a grower's coverage (accepted, offered or countered). */
export interface CoverageContractSummary {
  id: number
  makerOrgName: string
  state: FruitContractState
  fruitClass: ForecastClass
}

/** `GET /api/coverage`: a grower's forecast per class and year against its fruit contracts. */
export interface GrowerCoverageReport {
  startYear: number
  /** The calendar years of the window, startYear first. */
  years: number[]
  /** One row per class and year with contracts in the window, in class order then year order. */
  rows: GrowerCoverageRow[]
  overCommitted: OverCommitment[]
  contracts: CoverageContractSummary[]
  /** Blocks counted as 0 kg because their rootstock lacks bearing figures. */
  blocksWithoutCurve: BlockWithoutCurve[]
}

/** One row of a maker's needs table. */
export interface NeedRow {
  juiceClass: ForecastClass
  year: number
  kg: number
}

/** `GET` and `PUT /api/needs`: the whole table, in class order then year order. */
export interface NeedsTable {
  items: NeedRow[]
  total: number
}

/** A tree contract whose trees are counted as 0 kg because the rootstock lacks bearing figures. */
export interface TreeContractWithoutCurve {
  id: number
  rootstockDesignation: string
  note: string
}

/** `GET /api/needs/supply`: a maker's need per class and year against its contracted supply. */
export interface MakerSupplyReport {
  startYear: number
  /** The calendar years of the window, startYear first. */
  years: number[]
  rows: MakerSupplyRow[]
  treeContractsWithoutCurve: TreeContractWithoutCurve[]
}
