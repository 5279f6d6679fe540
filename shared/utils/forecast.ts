// Yield forecast: kg of fruit per calendar year from a grower's blocks, summed
// by juice class and set against the tonnes makers have contracted.
//
// Bearing curve (the shape is common practice; the rootstock's own figures come
// from extension tables such as NC State's "Apple Rootstocks and Tree Spacing"):
//   tree age = year − year planted (0 in the planting year);
//   age < first crop                → 0 kg;
//   first crop ≤ age < full bearing → a straight-line ramp,
//                                     fraction = (age − first + 1) / (full − first + 1),
//                                     so the first cropping year already bears something;
//   age ≥ full bearing              → the full yield per tree, flat thereafter.
// kg = trees × survival rate × yield per tree at full bearing × fraction.

import { APPLE_CLASSES, isClassOf, PEAR_CLASSES, type FruitSpecies, type JuiceClass } from './juiceClass'

// Apple and perry pear classes are kept apart wherever crops are added up by class: a perry pear's
// "sweet" is not an apple's (their thresholds differ), so pears sum under "perry …" keys.
export const FORECAST_CLASSES = [...APPLE_CLASSES, ...PEAR_CLASSES.map(c => `perry ${c}` as const)] as const
export type ForecastClass = (typeof FORECAST_CLASSES)[number]

/** The key a species' juice class is summed under. */
export function forecastClassOf(species: FruitSpecies, juiceClass: JuiceClass): ForecastClass {
  if (!isClassOf(species, juiceClass)) throw new RangeError(`A ${species} has no juice class "${juiceClass}"`)
  return (species === 'pear' ? `perry ${juiceClass}` : juiceClass) as ForecastClass
}

export interface BearingCurve {
  /** Tree age (years after planting) of the first crop. */
  yearsToFirstCrop: number
  /** Tree age at which the full crop is reached; not before the first crop. */
  yearsToFullBearing: number
  /** kg per tree at full bearing. */
  yieldPerTreeKgAtFull: number
}

export interface ForecastBlock {
  trees: number
  yearPlanted: number
  /** Share of the planted trees still standing, 0–1; 1 when not given. */
  survivalRate?: number
}

export interface ForecastOptions {
  startYear: number
  /** How many calendar years to forecast, from startYear; 15 when not given. */
  years?: number
}

export interface YearKg {
  year: number
  kg: number
}

export const DEFAULT_FORECAST_YEARS = 15

function requireWholeNumber(value: number, what: string, min: number): void {
  if (!Number.isInteger(value) || value < min) {
    throw new RangeError(`${what} must be a whole number of at least ${min}; got ${value}`)
  }
}

function requireCurve(curve: BearingCurve): void {
  requireWholeNumber(curve.yearsToFirstCrop, 'Years to first crop', 0)
  requireWholeNumber(curve.yearsToFullBearing, 'Years to full bearing', 0)
  if (curve.yearsToFullBearing < curve.yearsToFirstCrop) {
    throw new RangeError(
      `Years to full bearing (${curve.yearsToFullBearing}) cannot be fewer than years to first crop (${curve.yearsToFirstCrop})`,
    )
  }
  if (!Number.isFinite(curve.yieldPerTreeKgAtFull) || curve.yieldPerTreeKgAtFull < 0) {
    throw new RangeError(`Yield per tree at full bearing must be zero or more kg; got ${curve.yieldPerTreeKgAtFull}`)
  }
}

function requireBlock(block: ForecastBlock): void {
  requireWholeNumber(block.trees, 'Tree count', 0)
  requireWholeNumber(block.yearPlanted, 'Year planted', 1000)
  const survival = block.survivalRate ?? 1
  if (!Number.isFinite(survival) || survival < 0 || survival > 1) {
    throw new RangeError(`Survival rate must be from 0 to 1; got ${survival}`)
  }
}

function forecastYears(options: ForecastOptions): number[] {
  const count = options.years ?? DEFAULT_FORECAST_YEARS
  requireWholeNumber(options.startYear, 'Start year', 1000)
  requireWholeNumber(count, 'Number of years', 1)
  return Array.from({ length: count }, (_, i) => options.startYear + i)
}

/** Share of the full crop a tree of this age bears (0–1), per the curve above. */
export function bearingFraction(treeAge: number, curve: BearingCurve): number {
  requireCurve(curve)
  if (!Number.isInteger(treeAge)) throw new RangeError(`Tree age must be a whole number of years; got ${treeAge}`)
  const { yearsToFirstCrop: first, yearsToFullBearing: full } = curve
  if (treeAge < first) return 0
  if (treeAge >= full) return 1
  return (treeAge - first + 1) / (full - first + 1)
}

/** kg per calendar year for one block, from options.startYear for options.years years. */
export function forecastBlock(block: ForecastBlock, curve: BearingCurve, options: ForecastOptions): YearKg[] {
  requireBlock(block)
  requireCurve(curve)
  const survival = block.survivalRate ?? 1
  return forecastYears(options).map(year => ({
    year,
    kg: block.trees * survival * curve.yieldPerTreeKgAtFull * bearingFraction(year - block.yearPlanted, curve),
  }))
}

export interface ClassedBlock extends ForecastBlock {
  /** Apple when not given. */
  species?: FruitSpecies
  juiceClass: JuiceClass
  curve: BearingCurve
}

export type ForecastByClass = Record<ForecastClass, YearKg[]>

/** Forecast kg per class per year; every apple and perry class is present (zeros where no block). */
export function sumForecastByClass(blocks: readonly ClassedBlock[], options: ForecastOptions): ForecastByClass {
  const years = forecastYears(options)
  const totals = Object.fromEntries(FORECAST_CLASSES.map(c => [c, years.map(year => ({ year, kg: 0 }))])) as ForecastByClass
  for (const block of blocks) {
    const rows = totals[forecastClassOf(block.species ?? 'apple', block.juiceClass)]
    forecastBlock(block, block.curve, options).forEach((row, i) => {
      const total = rows[i]
      if (total) total.kg += row.kg
    })
  }
  return totals
}

export interface ContractedTonnes {
  juiceClass: ForecastClass
  year: number
  tonnes: number
}

export interface CoverageRow {
  juiceClass: ForecastClass
  year: number
  forecastKg: number
  contractedKg: number
  /** forecast ÷ contracted (1 = exactly covered); null when nothing is contracted. */
  coverage: number | null
  /** kg the forecast falls short of the contracts; 0 when covered. */
  shortfallKg: number
}

/**
 * Coverage of contracted tonnes by the forecast, one row per class and year
 * that has contracts (several contracts for the same class and year are added),
 * in class order then year order.
 */
export function forecastCoverage(forecast: ForecastByClass, contracts: readonly ContractedTonnes[]): CoverageRow[] {
  const contractedKg = new Map<string, number>()
  for (const c of contracts) {
    if (!FORECAST_CLASSES.includes(c.juiceClass)) {
      throw new RangeError(`Juice class must be one of ${FORECAST_CLASSES.join(', ')}; got ${String(c.juiceClass)}`)
    }
    requireWholeNumber(c.year, 'Contract year', 1000)
    if (!Number.isFinite(c.tonnes) || c.tonnes < 0) {
      throw new RangeError(`Contracted tonnes must be zero or more; got ${c.tonnes}`)
    }
    const key = `${c.juiceClass}:${c.year}`
    contractedKg.set(key, (contractedKg.get(key) ?? 0) + c.tonnes * 1000)
  }

  const rows: CoverageRow[] = []
  for (const juiceClass of FORECAST_CLASSES) {
    const years = [...contractedKg.keys()]
      .filter(key => key.startsWith(`${juiceClass}:`))
      .map(key => Number(key.slice(juiceClass.length + 1)))
      .sort((a, b) => a - b)
    for (const year of years) {
      const row = forecast[juiceClass].find(r => r.year === year)
      if (!row) throw new RangeError(`The forecast has no figure for ${year}; forecast more years to cover the contracts`)
      const contracted = contractedKg.get(`${juiceClass}:${year}`) ?? 0
      rows.push({
        juiceClass,
        year,
        forecastKg: row.kg,
        contractedKg: contracted,
        coverage: contracted > 0 ? row.kg / contracted : null,
        shortfallKg: Math.max(0, contracted - row.kg),
      })
    }
  }
  return rows
}
