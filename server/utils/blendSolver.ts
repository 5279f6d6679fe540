import loadHighs from 'highs'
import type { Highs, ModelData, SolveOutput } from 'highs'
import {
  BLEND_PROPERTIES,
  type BindingRange,
  type BlendLine,
  type BlendMiss,
  type BlendProperty,
  type ExcludedLot,
  type PredictedJuice,
  type SolverInput,
  type SolverLot,
  type SolverResult,
} from '#shared/types/blend'
import { blendMix, juiceKgPerLitre } from '#shared/utils/blendMix'
import { JUICE_CLASSES } from '#shared/utils/juiceClass'
import { BRIX_MAX, BRIX_MIN } from '#shared/utils/sugar'

// The blend planner's least-cost press blend, as a linear programme solved by HiGHS.
//
// Variables: the fraction of each lot's free fruit taken (kg = fraction × availableKg, so every
// column is 0–1 and the model stays well scaled whatever the tonnage). Litres from a lot are
// kg / 1000 × its juice yield. A range min ≤ average ≤ max is linear once multiplied out:
// Σ (p − min)·w·kg ≥ 0 and Σ (max − p)·w·kg ≥ 0, w being litres per kg of fruit for the per-litre
// figures (SG, TA, tannin) and kilograms of juice per kg of fruit for °Brix, which is a mass
// fraction (juice mass = litres × SG × 0.998203 kg/L, see blendMix.ts). Each row is divided by the
// blend's volume and the property's unit, so a row's value reads in units of the property.
//
// When no mix fits, the nearest one is found in three steps, each an LP on the same rows:
// 1. the most juice up to the volume that the free fruit and the share rules allow;
// 2. at that volume, the least total miss, each range's miss divided by its width, so that a
//    0.5 °Brix miss on a 2 °Brix range weighs the same as a 0.5 g/L miss on a 2 g/L one;
// 3. at that volume and total miss, the least cost.
// The volume goes first because a blend of nothing misses no range: weighed like a range, a
// shortfall would make the planner answer "press nothing" whenever a range is missed by more than
// its width. Taking the steps in turn keeps each objective well scaled, so the cost, which only
// breaks ties between equally near mixes, never trades against a miss.

/** Bad input: a RangeError whose message names the field, with its path for the API's issues. */
export class BlendInputError extends RangeError {
  readonly path: (string | number)[]
  constructor(path: (string | number)[], message: string) {
    super(`${formatPath(path)} ${message}`)
    this.name = 'BlendInputError'
    this.path = path
  }
}

/** HiGHS failed twice running, or answered with a status that means it could not solve. */
export class BlendSolverError extends Error {
  constructor(message: string, options?: { cause?: unknown }) {
    super(message, options)
    this.name = 'BlendSolverError'
  }
}

function formatPath(path: (string | number)[]): string {
  return path.map((part, i) => typeof part === 'number' ? `[${part}]` : i === 0 ? part : `.${part}`).join('')
}

interface PropertyRule {
  label: string
  /** °Brix mixes by juice mass, the rest by volume. */
  mixesBy: 'mass' | 'volume'
  /** The unit a binding range's saving is quoted per. */
  unit: number
  /**
   * A range set to one value is weighed, when missed, as if it were this wide: about the
   * resolution of the reading (a refractometer's 0.1 °Brix, half a hydrometer's gravity point,
   * a titration's 0.1 g/L).
   */
  narrowestWidth: number
  value: (lot: SolverLot) => number | null
}

const PROPERTIES: Record<BlendProperty, PropertyRule> = {
  brix: { label: '°Brix', mixesBy: 'mass', unit: 1, narrowestWidth: 0.1, value: lot => lot.brix },
  sg: { label: 'SG', mixesBy: 'volume', unit: 0.001, narrowestWidth: 0.0005, value: lot => lot.sg },
  taGPerL: { label: 'TA', mixesBy: 'volume', unit: 1, narrowestWidth: 0.1, value: lot => lot.taGPerL },
  tanninGPerL: { label: 'tannin', mixesBy: 'volume', unit: 1, narrowestWidth: 0.1, value: lot => lot.tanninGPerL },
}

// ---------------------------------------------------------------------------------------------
// Input

function requireNumber(path: (string | number)[], value: unknown, { min, above, max }: { min?: number, above?: number, max?: number }): void {
  const ok = typeof value === 'number' && Number.isFinite(value)
    && (min === undefined || value >= min) && (above === undefined || value > above) && (max === undefined || value <= max)
  if (ok) return
  const bounds = [min !== undefined ? `${min} or more` : '', above !== undefined ? `more than ${above}` : '', max !== undefined ? `at most ${max}` : '']
    .filter(Boolean).join(' and ')
  throw new BlendInputError(path, `must be a number${bounds ? ` of ${bounds}` : ''}; got ${String(value)}`)
}

function requireOptionalNumber(path: (string | number)[], value: unknown, bounds: { min?: number, above?: number, max?: number }): void {
  if (value !== null) requireNumber(path, value, bounds)
}

function checkLot(lot: SolverLot, i: number, keys: Set<string>): void {
  const at = (field: string) => ['lots', i, field]
  if (typeof lot.key !== 'string' || lot.key === '') throw new BlendInputError(at('key'), 'must be the lot\'s id or code')
  if (keys.has(lot.key)) throw new BlendInputError(at('key'), `${lot.key} is given twice`)
  keys.add(lot.key)
  requireNumber(at('availableKg'), lot.availableKg, { min: 0 })
  requireNumber(at('juiceYieldLPerTonne'), lot.juiceYieldLPerTonne, { min: 0 })
  requireNumber(at('brix'), lot.brix, { min: BRIX_MIN, max: BRIX_MAX })
  requireNumber(at('sg'), lot.sg, { above: 0 })
  requireOptionalNumber(at('taGPerL'), lot.taGPerL, { min: 0 })
  requireOptionalNumber(at('tanninGPerL'), lot.tanninGPerL, { min: 0 })
  requireOptionalNumber(at('ph'), lot.ph, { above: 0, max: 14 })
  requireNumber(at('costPerTonneMinor'), lot.costPerTonneMinor, { min: 0 })
  if (lot.varietyId !== null && !Number.isInteger(lot.varietyId)) throw new BlendInputError(at('varietyId'), `must be a variety's id or null; got ${String(lot.varietyId)}`)
  if (lot.juiceClass !== null && !JUICE_CLASSES.includes(lot.juiceClass)) throw new BlendInputError(at('juiceClass'), `must be one of ${JUICE_CLASSES.join(', ')} or null; got ${String(lot.juiceClass)}`)
}

/** Throws a BlendInputError naming the first bad field; the route answers it with 400. */
export function checkSolverInput(input: SolverInput): void {
  requireNumber(['volumeL'], input.volumeL, { above: 0 })
  if (!Array.isArray(input.lots) || input.lots.length === 0) throw new BlendInputError(['lots'], 'must hold at least one lot')
  const keys = new Set<string>()
  input.lots.forEach((lot, i) => checkLot(lot, i, keys))
  if (typeof input.target !== 'object' || input.target === null) throw new BlendInputError(['target'], 'must be an object of ranges')
  for (const [property, range] of Object.entries(input.target)) {
    if (!(BLEND_PROPERTIES as readonly string[]).includes(property)) throw new BlendInputError(['target', property], `is not a property a blend is planned on (${BLEND_PROPERTIES.join(', ')})`)
    if (range === undefined) continue
    if (typeof range !== 'object' || range === null) throw new BlendInputError(['target', property], 'must be a range { min, max }')
    requireNumber(['target', property, 'min'], range.min, { min: 0 })
    requireNumber(['target', property, 'max'], range.max, { min: 0 })
    if (range.min > range.max) throw new BlendInputError(['target', property], `min ${range.min} is above max ${range.max}`)
  }
  ;(input.shares ?? []).forEach((rule, i) => {
    if (rule.varietyId === undefined && rule.juiceClass === undefined) throw new BlendInputError(['shares', i], 'must name a varietyId or a juiceClass')
    if (rule.varietyId !== undefined && !Number.isInteger(rule.varietyId)) throw new BlendInputError(['shares', i, 'varietyId'], `must be a variety's id; got ${String(rule.varietyId)}`)
    if (rule.juiceClass !== undefined && !JUICE_CLASSES.includes(rule.juiceClass)) throw new BlendInputError(['shares', i, 'juiceClass'], `must be one of ${JUICE_CLASSES.join(', ')}; got ${String(rule.juiceClass)}`)
    if (rule.min === undefined && rule.max === undefined) throw new BlendInputError(['shares', i], 'must give a min or a max share')
    if (rule.min !== undefined) requireNumber(['shares', i, 'min'], rule.min, { min: 0, max: 1 })
    if (rule.max !== undefined) requireNumber(['shares', i, 'max'], rule.max, { min: 0, max: 1 })
    if (rule.min !== undefined && rule.max !== undefined && rule.min > rule.max) throw new BlendInputError(['shares', i], `min ${rule.min} is above max ${rule.max}`)
  })
}

// ---------------------------------------------------------------------------------------------
// The model

interface RangeRow { property: BlendProperty, bound: 'min' | 'max', value: number, width: number }
interface ShareRow { members: boolean[], bound: 'min' | 'max', value: number }

/** The lots a solve may use, with what each kilogram of their fruit gives, and its rows. */
interface Prepared {
  input: SolverInput
  /** Index into input.lots of each lot used. */
  used: number[]
  lots: SolverLot[]
  litresPerKg: number[]
  juiceKgPerKg: number[]
  ranges: RangeRow[]
  shares: ShareRow[]
  excluded: ExcludedLot[]
}

function prepare(input: SolverInput): Prepared {
  const constrained = BLEND_PROPERTIES.filter(p => input.target[p] !== undefined)
  const used: number[] = []
  const excluded: ExcludedLot[] = []
  input.lots.forEach((lot, i) => {
    const missing = constrained.filter(p => PROPERTIES[p].value(lot) === null).map(p => PROPERTIES[p].label)
    if (missing.length === 0) used.push(i)
    else excluded.push({ key: lot.key, reason: `no ${missing.join(' or ')} reading, and the target has a ${missing.join(' and a ')} range` })
  })
  const lots = used.map(i => input.lots[i]!)
  const ranges = constrained.flatMap((property): RangeRow[] => {
    const { min, max } = input.target[property]!
    const width = Math.max(max - min, PROPERTIES[property].narrowestWidth)
    return [{ property, bound: 'min', value: min, width }, { property, bound: 'max', value: max, width }]
  })
  const shares = (input.shares ?? []).flatMap((rule): ShareRow[] => {
    const members = lots.map(lot => (rule.varietyId === undefined || lot.varietyId === rule.varietyId)
      && (rule.juiceClass === undefined || lot.juiceClass === rule.juiceClass))
    const rows: ShareRow[] = []
    if (rule.min !== undefined) rows.push({ members, bound: 'min', value: rule.min })
    if (rule.max !== undefined) rows.push({ members, bound: 'max', value: rule.max })
    return rows
  })
  return {
    input,
    used,
    lots,
    litresPerKg: lots.map(lot => lot.juiceYieldLPerTonne / 1000),
    juiceKgPerKg: lots.map(lot => (lot.juiceYieldLPerTonne / 1000) * juiceKgPerLitre(lot.sg)),
    ranges,
    shares,
    excluded,
  }
}

/**
 * Which LP: the least-cost blend; the most juice (nearest, step 1); the least miss at a volume
 * (step 2); the least cost at a volume and miss (step 3).
 */
type Stage
  = | { kind: 'cost' }
    | { kind: 'volume' }
    | { kind: 'misses', volumeAtLeast: number }
    | { kind: 'cost-at-misses', volumeAtLeast: number, missAtMost: number }

/** A row: its entries by column and its bounds. */
interface Row { cols: number[], values: number[], lower: number, upper: number }

function rangeCoefficients(p: Prepared, row: RangeRow): number[] {
  const rule = PROPERTIES[row.property]
  const weights = rule.mixesBy === 'mass' ? p.juiceKgPerKg : p.litresPerKg
  const scale = p.input.volumeL * rule.unit
  return p.lots.map((lot, i) => {
    const excess = row.bound === 'min' ? rule.value(lot)! - row.value : row.value - rule.value(lot)!
    return (excess * weights[i]! * lot.availableKg) / scale
  })
}

function shareCoefficients(p: Prepared, row: ShareRow): number[] {
  return p.lots.map((lot, i) => {
    const member = row.members[i] ? 1 : 0
    const excess = row.bound === 'min' ? member - row.value : row.value - member
    return (excess * p.litresPerKg[i]! * lot.availableKg) / p.input.volumeL
  })
}

function sparseRow(dense: number[], lower: number, upper: number): Row {
  const cols: number[] = []
  const values: number[] = []
  dense.forEach((v, j) => {
    if (v !== 0) {
      cols.push(j)
      values.push(v)
    }
  })
  return { cols, values, lower, upper }
}

/** What a miss of one row unit costs in step 2: the property's unit over the range's width. */
function missWeight(row: RangeRow): number {
  return PROPERTIES[row.property].unit / row.width
}

/** The LP of one stage. Rows: the ranges first (in `ranges` order), then the shares, then the volume. */
function buildModel(p: Prepared, stage: Stage): ModelData {
  const n = p.lots.length
  const slack = stage.kind === 'misses' || stage.kind === 'cost-at-misses'
  const rows: Row[] = []
  if (stage.kind !== 'volume') {
    p.ranges.forEach((range, r) => {
      const row = sparseRow(rangeCoefficients(p, range), 0, Infinity)
      if (slack) {
        row.cols.push(n + r)
        row.values.push(1)
      }
      rows.push(row)
    })
  }
  for (const share of p.shares) rows.push(sparseRow(shareCoefficients(p, share), 0, Infinity))
  const volume = p.lots.map((lot, i) => (p.litresPerKg[i]! * lot.availableKg) / p.input.volumeL)
  const volumeLower = stage.kind === 'cost' ? 1 : stage.kind === 'volume' ? 0 : stage.volumeAtLeast
  rows.push(sparseRow(volume, volumeLower, 1))
  if (stage.kind === 'cost-at-misses') {
    rows.push({ cols: p.ranges.map((_, r) => n + r), values: p.ranges.map(missWeight), lower: 0, upper: stage.missAtMost })
  }

  const numCols = n + (slack ? p.ranges.length : 0)
  const cost = p.lots.map(lot => (lot.costPerTonneMinor / 1000) * lot.availableKg)
  let colCost: number[]
  if (stage.kind === 'volume') colCost = volume.map(v => -v)
  else if (stage.kind === 'misses') colCost = [...p.lots.map(() => 0), ...p.ranges.map(missWeight)]
  else colCost = [...cost, ...(slack ? p.ranges.map(() => 0) : [])]

  const starts = [0]
  const indices: number[] = []
  const values: number[] = []
  for (const row of rows) {
    indices.push(...row.cols)
    values.push(...row.values)
    starts.push(indices.length)
  }
  return {
    numCols,
    numRows: rows.length,
    colCost,
    colLower: new Array(numCols).fill(0),
    colUpper: [...p.lots.map(() => 1), ...(slack ? p.ranges.map(() => Infinity) : [])],
    rowLower: rows.map(row => row.lower),
    rowUpper: rows.map(row => row.upper),
    matrix: { format: 'csr', numRows: rows.length, numCols, starts, indices, values },
  }
}

/** The least-cost model of a solve as HiGHS takes it (for the bench, to time HiGHS alone). */
export function blendModel(input: SolverInput): ModelData {
  checkSolverInput(input)
  return buildModel(prepare(input), { kind: 'cost' })
}

// ---------------------------------------------------------------------------------------------
// Solving

/** A solve before rounding: kg per input lot (0 for lots not used), cost and savings unrounded. */
export interface BlendSolution {
  status: 'optimal' | 'nearest'
  kg: number[]
  litres: number
  costMinor: number
  predicted: PredictedJuice | null
  misses: BlendMiss[]
  binding: BindingRange[]
  excluded: ExcludedLot[]
}

export type HighsLoader = () => Promise<Highs>

export interface BlendSolver {
  /**
   * The blend as the API answers it: kg to 0.1 kg, litres to 0.1 L, shares to 4 places, the cost to a
   * whole minor unit, the cost per litre and each binding range's saving to a hundredth of one.
   */
  solve(input: SolverInput): Promise<SolverResult>
  /** The same solve unrounded. */
  solveExact(input: SolverInput): Promise<BlendSolution>
}

const MODEL_STATUS = { optimal: 7, infeasible: 8, unboundedOrInfeasible: 9 } as const

/** Runs one LP and reads its answer; `read` throws for a status that is no answer. */
type RunLp = <T>(model: ModelData, read: (out: SolveOutput) => T) => Promise<T>

/** The least-cost stage: an optimum, or no mix at all. */
function optimumOrNone(out: SolveOutput): SolveOutput | 'infeasible' {
  const status = out.modelStatus
  // Every column is bounded, so "infeasible or unbounded" can only mean infeasible.
  if (status === MODEL_STATUS.infeasible || status === MODEL_STATUS.unboundedOrInfeasible) return 'infeasible'
  return optimum(out)
}

/** The nearest-mix stages always have a solution (pressing nothing meets every row but the volume's). */
function optimum(out: SolveOutput): SolveOutput {
  if (out.modelStatus !== MODEL_STATUS.optimal) throw new BlendSolverError(`HiGHS ended the blend with model status ${out.modelStatus}`)
  return out
}

/**
 * A solver around one HiGHS runtime, loaded on the first solve and kept for the process. A solve
 * that throws inside HiGHS (a WebAssembly abort leaves the runtime unusable) drops the runtime and
 * is tried once more on a fresh one; a second failure throws.
 */
export function createBlendSolver(load: HighsLoader = () => loadHighs()): BlendSolver {
  let runtime: Promise<Highs> | undefined

  const run: RunLp = async (model, read) => {
    for (let attempt = 1; ; attempt++) {
      runtime ??= load()
      const current = runtime
      try {
        const out = (await current).raw.lpCall(model)
        if (out.status === -1) throw new BlendSolverError('HiGHS refused the blend model')
        return read(out.value)
      }
      catch (error) {
        if (runtime === current) runtime = undefined
        if (attempt >= 2) throw new BlendSolverError('The blend solver failed twice, the second time on a fresh HiGHS instance', { cause: error })
      }
    }
  }

  async function solveExact(input: SolverInput): Promise<BlendSolution> {
    checkSolverInput(input)
    const p = prepare(input)
    if (p.lots.length > 0) {
      const out = await run(buildModel(p, { kind: 'cost' }), optimumOrNone)
      if (out !== 'infeasible') return optimalSolution(p, out)
    }
    return nearestSolution(p, run)
  }

  return {
    solveExact,
    async solve(input) {
      return toResult(input, await solveExact(input))
    },
  }
}

/** kg per input lot from the fractions of the used lots, clamped to what is free. */
function kgOf(p: Prepared, fractions: Float64Array): number[] {
  const kg = p.input.lots.map(() => 0)
  p.used.forEach((lotIndex, j) => {
    const lot = p.lots[j]!
    kg[lotIndex] = Math.min(Math.max(fractions[j]!, 0), 1) * lot.availableKg
  })
  return kg
}

function totals(p: Prepared, kg: number[]) {
  let litres = 0
  let juiceKg = 0
  let cost = 0
  p.input.lots.forEach((lot, i) => {
    const l = (kg[i]! / 1000) * lot.juiceYieldLPerTonne
    litres += l
    juiceKg += l * juiceKgPerLitre(lot.sg)
    cost += (kg[i]! / 1000) * lot.costPerTonneMinor
  })
  return { litres, juiceKg, cost }
}

function predictedOf(input: SolverInput, kg: number[]): PredictedJuice | null {
  return blendMix(input.lots.map((lot, i) => ({ lot, kg: kg[i]! })))
}

/**
 * Moving a range's bound outward by δ adds δ × (the blend's litres, or kg of juice for °Brix) / (volume ×
 * unit) to its row, which is the row's lower bound moved down by as much. The row's dual value is
 * what a unit of that row bound costs, so a unit of the property saves dual × litres (or kg) / volume.
 */
function bindingOf(p: Prepared, out: SolveOutput, litres: number, juiceKg: number, cost: number): BindingRange[] {
  const binding: BindingRange[] = []
  p.ranges.forEach((range, r) => {
    const carried = PROPERTIES[range.property].mixesBy === 'mass' ? juiceKg : litres
    const costPerUnit = out.solution.rowDual[r]! * carried / p.input.volumeL
    if (costPerUnit > 1e-9 * Math.max(1, cost)) binding.push({ property: range.property, bound: range.bound, costPerUnit })
  })
  return binding
}

function optimalSolution(p: Prepared, out: SolveOutput): BlendSolution {
  const kg = kgOf(p, out.solution.colValue)
  const { litres, juiceKg, cost } = totals(p, kg)
  return {
    status: 'optimal',
    kg,
    litres,
    costMinor: cost,
    predicted: predictedOf(p.input, kg),
    misses: [],
    binding: bindingOf(p, out, litres, juiceKg, cost),
    excluded: p.excluded,
  }
}

/** A row bound fixed from an earlier step, loosened by the LP's own tolerance so the next step is feasible. */
const CARRY_OVER = 1e-9

async function nearestSolution(p: Prepared, run: RunLp): Promise<BlendSolution> {
  let kg = p.input.lots.map(() => 0)
  if (p.lots.length > 0) {
    const volumeModel = buildModel(p, { kind: 'volume' })
    const most = await run(volumeModel, optimum)
    const volume = Math.min(1, -objective(most, volumeModel))
    if (volume > CARRY_OVER) {
      const volumeAtLeast = Math.max(0, volume - CARRY_OVER)
      const missesModel = buildModel(p, { kind: 'misses', volumeAtLeast })
      const least = await run(missesModel, optimum)
      const missAtMost = objective(least, missesModel) * (1 + CARRY_OVER) + CARRY_OVER
      const cheapest = await run(buildModel(p, { kind: 'cost-at-misses', volumeAtLeast, missAtMost }), optimum)
      kg = kgOf(p, cheapest.solution.colValue)
    }
  }
  const { litres, cost } = totals(p, kg)
  const predicted = predictedOf(p.input, kg)
  return { status: 'nearest', kg, litres, costMinor: cost, predicted, misses: missesOf(p, predicted, litres), binding: [], excluded: p.excluded }
}

function objective(out: SolveOutput, model: ModelData): number {
  let sum = 0
  for (let j = 0; j < model.numCols; j++) sum += (model.colCost[j] as number) * out.solution.colValue[j]!
  return sum
}

/** Each range the blend misses by more than a millionth of its width, and the volume when short. */
function missesOf(p: Prepared, predicted: PredictedJuice | null, litres: number): BlendMiss[] {
  const misses: BlendMiss[] = []
  if (predicted) {
    for (const property of BLEND_PROPERTIES) {
      const range = p.input.target[property]
      const achieved = predicted[property]
      if (!range || achieved === null) continue
      const tolerance = 1e-6 * Math.max(range.max - range.min, PROPERTIES[property].narrowestWidth)
      if (achieved < range.min - tolerance || achieved > range.max + tolerance) misses.push({ property, min: range.min, max: range.max, achieved })
    }
  }
  const volumeL = p.input.volumeL
  if (litres < volumeL * (1 - 1e-6)) misses.push({ property: 'volumeL', min: volumeL, max: volumeL, achieved: round(litres, 1) })
  return misses
}

// ---------------------------------------------------------------------------------------------
// The answer

function round(value: number, places: number): number {
  const factor = 10 ** places
  return Math.round(value * factor) / factor
}

function toResult(input: SolverInput, s: BlendSolution): SolverResult {
  const lines: BlendLine[] = []
  input.lots.forEach((lot, i) => {
    const kg = round(s.kg[i]!, 1)
    if (kg <= 0) return
    const litres = (s.kg[i]! / 1000) * lot.juiceYieldLPerTonne
    lines.push({ key: lot.key, kg, litres: round(litres, 1), share: round(litres / s.litres, 4) })
  })
  const result: SolverResult = {
    status: s.status,
    lines,
    predicted: s.predicted,
    costMinor: Math.round(s.costMinor),
    costPerLitreMinor: s.litres > 0 ? round(s.costMinor / s.litres, 2) : 0,
    misses: s.misses,
    binding: s.binding.map(b => ({ ...b, costPerUnit: round(b.costPerUnit, 2) })),
  }
  if (s.excluded.length > 0) result.excluded = s.excluded
  return result
}

const shared = createBlendSolver()

/** The least-cost press blend for a target, or the nearest mix when none fits. Throws BlendInputError for bad input. */
export function solveBlend(input: SolverInput): Promise<SolverResult> {
  return shared.solve(input)
}

/** solveBlend before rounding, for cross-checks. */
export function solveBlendExact(input: SolverInput): Promise<BlendSolution> {
  return shared.solveExact(input)
}
