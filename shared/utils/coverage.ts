// Coverage: will the fruit promised under contracts grow?
//
// For a grower: its yield forecast per juice class and year against the tonnes of its fruit
// contracts. Accepted contracts are what it has promised; offered and countered ones are shown
// beside them, so the grower sees what accepting would do before it accepts. Other states (drafts,
// declined, cancelled, fulfilled) do not count.
//
// Tolerance: a contract for T tonnes ± t % is met by anything from T × (1 − t/100) upwards, so a
// forecast below T is short (shortfallKg says by how much) but not yet a broken promise. The
// over-commitment warning is raised only when the forecast falls below the least the contracts
// accept, Σ T × (1 − t/100): when contracts exceed the forecast by more than their tolerance.
//
// For a maker: its planned need per class and year against accepted fruit contracts and against
// the fruit still to come from trees it has under tree contracts.

import { forecastClassOf, forecastCoverage, sumForecastByClass, FORECAST_CLASSES, type BearingCurve, type ClassedBlock, type ContractedTonnes, type ForecastByClass, type ForecastClass, type ForecastOptions } from './forecast'
import type { DeliverySeason } from './backplan'
import type { FruitContractState, TreeContractState } from './contractStatus'
import type { Hemisphere } from './hemisphere'
import type { FruitSpecies, JuiceClass } from './juiceClass'

/** What a contract is for: a juice class of a species, or one variety (which has its class). */
export type ContractFruit
  = | { species?: FruitSpecies, juiceClass: JuiceClass }
    | { variety: { species: FruitSpecies, juiceClass: JuiceClass } }

export interface ScheduledTonnes {
  /** Harvest year. */
  year: number
  tonnes: number
}

export interface CoverageContract {
  state: FruitContractState
  fruit: ContractFruit
  schedule: readonly ScheduledTonnes[]
  /** ± % of each year's tonnes that still meets the contract, 0–100. */
  tolerancePct: number
}

/** The class a contract's fruit is summed under (perry pears under `perry …`). */
export function contractClassOf(fruit: ContractFruit): ForecastClass {
  const { species, juiceClass } = 'variety' in fruit ? fruit.variety : fruit
  return forecastClassOf(species ?? 'apple', juiceClass)
}

function requireTolerance(pct: number): void {
  if (!Number.isFinite(pct) || pct < 0 || pct > 100) throw new RangeError(`Tolerance must be from 0 to 100 %; got ${pct}`)
}

/** One line per contract year: its tonnes, and the least kg that meets it. */
function scheduleLines(contract: CoverageContract): (ContractedTonnes & { leastKg: number })[] {
  requireTolerance(contract.tolerancePct)
  const juiceClass = contractClassOf(contract.fruit)
  return contract.schedule.map(({ year, tonnes }) => ({
    juiceClass,
    year,
    tonnes,
    leastKg: tonnes * 1000 * (100 - contract.tolerancePct) / 100,
  }))
}

const keyOf = (juiceClass: ForecastClass, year: number) => `${juiceClass}:${year}`

function addTo(totals: Map<string, number>, key: string, kg: number): void {
  totals.set(key, (totals.get(key) ?? 0) + kg)
}

export interface GrowerCoverageRow {
  juiceClass: ForecastClass
  year: number
  forecastKg: number
  /** Under accepted contracts. */
  contractedKg: number
  /** Under contracts offered or countered and not yet answered. */
  offeredKg: number
  /** kg the forecast falls short of the accepted contracts; 0 when covered. */
  shortfallKg: number
  /** The same, were every open offer accepted. */
  shortfallIfAcceptedKg: number
}

export interface OverCommitment {
  juiceClass: ForecastClass
  year: number
  forecastKg: number
  /** kg the contracts call for: the accepted ones, and the open offers too when `ifAccepted`. */
  contractedKg: number
  /** The least those contracts accept, each less its tolerance. */
  leastKg: number
  /** leastKg − forecastKg. */
  shortKg: number
  /** True when the accepted contracts alone are covered and accepting the open offers would break that. */
  ifAccepted: boolean
}

export interface GrowerCoverage {
  /** One row per class and year with accepted or open contracts, in class order then year order. */
  rows: GrowerCoverageRow[]
  /** The warnings: class-years where the contracts exceed the forecast by more than their tolerance. */
  overCommitted: OverCommitment[]
}

const OPEN_STATES: readonly FruitContractState[] = ['offered', 'countered']

/**
 * A grower's coverage from its forecast (`sumForecastByClass`) and its fruit contracts. For the
 * warning on one offer, pass the accepted contracts and that offer alone.
 */
export function growerCoverage(forecast: ForecastByClass, contracts: readonly CoverageContract[]): GrowerCoverage {
  const accepted = contracts.filter(c => c.state === 'accepted').flatMap(scheduleLines)
  const open = contracts.filter(c => OPEN_STATES.includes(c.state)).flatMap(scheduleLines)

  // Both calls see the same class-years (open ones enter the first at 0 t), so their rows pair up.
  const acceptedRows = forecastCoverage(forecast, [...accepted, ...open.map(l => ({ ...l, tonnes: 0 }))])
  const allRows = forecastCoverage(forecast, [...accepted, ...open])

  const leastAccepted = new Map<string, number>()
  const leastAll = new Map<string, number>()
  for (const line of accepted) addTo(leastAccepted, keyOf(line.juiceClass, line.year), line.leastKg)
  for (const line of [...accepted, ...open]) addTo(leastAll, keyOf(line.juiceClass, line.year), line.leastKg)

  const rows: GrowerCoverageRow[] = []
  const overCommitted: OverCommitment[] = []
  acceptedRows.forEach((row, i) => {
    const all = allRows[i]!
    const { juiceClass, year, forecastKg } = row
    rows.push({
      juiceClass,
      year,
      forecastKg,
      contractedKg: row.contractedKg,
      offeredKg: all.contractedKg - row.contractedKg,
      shortfallKg: row.shortfallKg,
      shortfallIfAcceptedKg: all.shortfallKg,
    })
    const key = keyOf(juiceClass, year)
    const least = leastAccepted.get(key) ?? 0
    const leastIfAccepted = leastAll.get(key) ?? 0
    if (forecastKg < least) {
      overCommitted.push({ juiceClass, year, forecastKg, contractedKg: row.contractedKg, leastKg: least, shortKg: least - forecastKg, ifAccepted: false })
    }
    else if (forecastKg < leastIfAccepted) {
      overCommitted.push({ juiceClass, year, forecastKg, contractedKg: all.contractedKg, leastKg: leastIfAccepted, shortKg: leastIfAccepted - forecastKg, ifAccepted: true })
    }
  })
  return { rows, overCommitted }
}

// Tree contracts that bring fruit: agreed and not cancelled (delivered trees are in the ground).
const BEARING_TREE_STATES: readonly TreeContractState[] = ['accepted', 'propagating', 'ready', 'delivered']

/**
 * The year a delivered tree counts as planted (its age is 0 that year), in harvest years.
 * Common practice in the north, where a growing season falls inside one calendar year: a spring
 * delivery is planted that spring and grows that year; an autumn delivery is planted that autumn,
 * dormant, and its first growing season is the next year. In the south a growing season runs from
 * spring into the next calendar year, where its harvest falls, so both an autumn and a spring
 * delivery first grow into the next year's harvest (from memory).
 */
export function plantingYear(deliveryYear: number, season: DeliverySeason, hemisphere: Hemisphere = 'north'): number {
  if (!Number.isInteger(deliveryYear) || deliveryYear < 1000) throw new RangeError(`Delivery year must be a whole year; got ${deliveryYear}`)
  if (season !== 'spring' && season !== 'autumn') throw new RangeError(`Delivery season must be 'autumn' or 'spring'; got ${String(season)}`)
  if (hemisphere === 'south' || season === 'autumn') return deliveryYear + 1
  return deliveryYear
}

export interface SupplyTreeContract {
  state: TreeContractState
  /** Trees ordered, or delivered once the contract is delivered. */
  trees: number
  variety: { species: FruitSpecies, juiceClass: JuiceClass }
  /** The rootstock's bearing curve. */
  curve: BearingCurve
  deliveryYear: number
  deliverySeason: DeliverySeason
  /** Share of the trees expected to establish and stand, 0–1; 1 when not given. */
  survivalRate?: number
}

export interface PlannedNeed {
  juiceClass: ForecastClass
  year: number
  kg: number
}

export interface MakerSupplyRow {
  juiceClass: ForecastClass
  year: number
  needKg: number
  /** Under accepted fruit contracts. */
  contractedKg: number
  /** Still to come from trees under tree contracts. */
  fromTreesKg: number
  /** max(0, need − contracted − from trees). */
  gapKg: number
}

export interface MakerSupplyOptions extends ForecastOptions {
  hemisphere?: Hemisphere
}

/** The blocks a maker's tree contracts will become, for the forecast. */
export function treeContractBlocks(trees: readonly SupplyTreeContract[], hemisphere: Hemisphere = 'north'): ClassedBlock[] {
  return trees
    .filter(t => BEARING_TREE_STATES.includes(t.state))
    .map(t => ({
      species: t.variety.species,
      juiceClass: t.variety.juiceClass,
      trees: t.trees,
      yearPlanted: plantingYear(t.deliveryYear, t.deliverySeason, hemisphere),
      survivalRate: t.survivalRate,
      curve: t.curve,
    }))
}

/**
 * A maker's supply per class and year over the window in `options`: rows for every year of the
 * window for each class with a need, a contract or trees in it (class order, then year order).
 * Needs and contract years outside the window are left out.
 */
export function makerSupply(
  needs: readonly PlannedNeed[],
  contracts: readonly CoverageContract[],
  trees: readonly SupplyTreeContract[],
  options: MakerSupplyOptions,
): MakerSupplyRow[] {
  const fromTrees = sumForecastByClass(treeContractBlocks(trees, options.hemisphere), options)
  const years = fromTrees.sweet.map(r => r.year)

  const needKg = new Map<string, number>()
  for (const need of needs) {
    if (!FORECAST_CLASSES.includes(need.juiceClass)) throw new RangeError(`Juice class must be one of ${FORECAST_CLASSES.join(', ')}; got ${String(need.juiceClass)}`)
    if (!Number.isFinite(need.kg) || need.kg < 0) throw new RangeError(`A need must be zero or more kg; got ${need.kg}`)
    addTo(needKg, keyOf(need.juiceClass, need.year), need.kg)
  }
  const contractedKg = new Map<string, number>()
  for (const line of contracts.filter(c => c.state === 'accepted').flatMap(scheduleLines)) {
    if (!Number.isFinite(line.tonnes) || line.tonnes < 0) throw new RangeError(`Contracted tonnes must be zero or more; got ${line.tonnes}`)
    addTo(contractedKg, keyOf(line.juiceClass, line.year), line.tonnes * 1000)
  }

  const rows: MakerSupplyRow[] = []
  for (const juiceClass of FORECAST_CLASSES) {
    const classRows = years.map((year, i) => {
      const key = keyOf(juiceClass, year)
      const need = needKg.get(key) ?? 0
      const contracted = contractedKg.get(key) ?? 0
      const trees = fromTrees[juiceClass][i]!.kg
      return { juiceClass, year, needKg: need, contractedKg: contracted, fromTreesKg: trees, gapKg: Math.max(0, need - contracted - trees) }
    })
    if (classRows.some(r => r.needKg > 0 || r.contractedKg > 0 || r.fromTreesKg > 0)) rows.push(...classRows)
  }
  return rows
}
