import type { DeliverySeason } from '#shared/utils/backplan'
import type { FruitContractState, TreeContractState } from '#shared/utils/contractStatus'
import type { Hemisphere } from '#shared/utils/hemisphere'
import type { FruitSpecies, JuiceClass } from '#shared/utils/juiceClass'
import type { RootstockBearing } from '../utils/bearingCurve'
import type { Db } from '../utils/db'

// Contract rows as coverage and supply read them: each query names the organisation and the side
// it is on, so another tenant's contract is simply not there. Reads only; the contract services
// own every write.

export type FruitSide = 'grower' | 'maker'

/** A fruit contract's fruit and tolerance, with the other party's name. */
export interface CoverageFruitContractRow {
  id: number
  state: FruitContractState
  counterpartyName: string
  /** The contract's own species and class; null when it is for one variety. */
  species: FruitSpecies | null
  juiceClass: JuiceClass | null
  /** The variety's, when the contract is for one. */
  varietySpecies: FruitSpecies | null
  varietyJuiceClass: JuiceClass | null
  tolerancePct: number
}

export interface CoverageScheduleRow { contractId: number, year: number, tonnes: number }

function fruitContractsOf(db: Db, side: FruitSide, orgId: number, states: readonly FruitContractState[], excludeId?: number) {
  const query = db('fruitContracts as fc').where(`fc.${side}OrgId`, orgId).whereIn('fc.state', states)
  return excludeId === undefined ? query : query.whereNot('fc.id', excludeId)
}

/**
 * The organisation's fruit contracts on `side` in `states` (less `excludeId`), by id, each with its
 * schedule of harvest years.
 */
export async function fruitContractsWithSchedule(
  db: Db,
  side: FruitSide,
  orgId: number,
  states: readonly FruitContractState[],
  excludeId?: number,
): Promise<{ contracts: CoverageFruitContractRow[], schedule: CoverageScheduleRow[] }> {
  const other = side === 'grower' ? 'maker' : 'grower'
  const [contracts, schedule] = await Promise.all([
    fruitContractsOf(db, side, orgId, states, excludeId)
      .join('organisations as o', 'o.id', `fc.${other}OrgId`)
      .leftJoin('varieties as v', 'v.id', 'fc.varietyId')
      .select('fc.id', 'fc.state', 'o.name as counterpartyName', 'fc.species', 'fc.juiceClass', 'v.species as varietySpecies', 'v.juiceClass as varietyJuiceClass', 'fc.tolerancePct')
      .orderBy('fc.id') as Promise<CoverageFruitContractRow[]>,
    fruitContractsOf(db, side, orgId, states, excludeId)
      .join('fruitContractYears as y', 'y.contractId', 'fc.id')
      .select('y.contractId', 'y.harvestYear as year', 'y.tonnes')
      .orderBy(['y.contractId', 'y.harvestYear']) as Promise<CoverageScheduleRow[]>,
  ])
  return { contracts, schedule }
}

/** A tree contract as supply reads it: the trees, where they go in, and the rootstock's bearing figures. */
export interface SupplyTreeContractRow extends Omit<RootstockBearing, 'designation'> {
  id: number
  state: TreeContractState
  treeCount: number
  deliveredCount: number | null
  deliveryYear: number
  deliverySeason: DeliverySeason
  species: FruitSpecies
  juiceClass: JuiceClass
  rootstockDesignation: string
}

// The tree contracts that bring fruit, as makerSupply counts them: agreed and not cancelled.
const BEARING_TREE_STATES: readonly TreeContractState[] = ['accepted', 'propagating', 'ready', 'delivered']

/** The tree contracts the organisation is the buyer of that will bring fruit, by id. */
export function buyerTreeContracts(db: Db, orgId: number): Promise<SupplyTreeContractRow[]> {
  return db('treeContracts as tc')
    .join('varieties as v', 'v.id', 'tc.varietyId')
    .join('rootstocks as r', 'r.id', 'tc.rootstockId')
    .where('tc.buyerOrgId', orgId)
    .whereIn('tc.state', BEARING_TREE_STATES)
    .select(
      'tc.id', 'tc.state', 'tc.treeCount', 'tc.deliveredCount', 'tc.deliveryYear', 'tc.deliverySeason', 'v.species', 'v.juiceClass',
      'r.designation as rootstockDesignation', 'r.yearsToFirstCrop', 'r.yearsToFirstCropLate', 'r.yearsToFullBearing', 'r.yieldPerTreeKg',
    )
    .orderBy('tc.id')
}

/** The hemisphere the organisation grows in (north when it is not there, which a signed-in member's is). */
export async function organisationHemisphere(db: Db, orgId: number): Promise<Hemisphere> {
  const row = await db('organisations').where({ id: orgId }).first('hemisphere') as { hemisphere: Hemisphere } | undefined
  return row?.hemisphere ?? 'north'
}
