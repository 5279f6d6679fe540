import { z } from 'zod'
import { ACIDS } from '../utils/acid'
import { ALCOHOL_METHODS, DEFAULT_ALCOHOL_METHOD } from '../utils/alcohol'
import { DELIVERY_SEASONS, TREE_TYPES, interstemProblem } from '../utils/backplan'
import { HEMISPHERES } from '../utils/hemisphere'

// Query schemas of the public calculators. Each number comes in as query text and is coerced;
// its one message says what to enter, whether the value is missing, not a number or out of range.
// The ranges are what a juice, a cider or an orchard can physically have; the pure modules in
// shared/utils check their own wider limits again.

/** An empty box means "not given", not 0 (Number('') is 0). */
function blankAsMissing(value: unknown): unknown {
  return typeof value === 'string' && value.trim() === '' ? undefined : value
}

interface Range { min: number, max: number, unit?: string, digits?: number, above?: boolean }

function measure(what: string, { min, max, unit, digits, above = false }: Range) {
  const show = (n: number) => (digits === undefined ? String(n) : n.toFixed(digits))
  const span = above ? `above ${show(min)} and up to ${show(max)}` : `from ${show(min)} to ${show(max)}`
  const message = `Enter ${what} as a number ${span}${unit ? ` ${unit}` : ''}`
  const number = z.coerce.number({ message })
  return (above ? number.gt(min, { message }) : number.min(min, { message })).max(max, { message })
}

/** A number that must be given. */
function required(what: string, range: Range) {
  return z.preprocess(blankAsMissing, measure(what, range))
}

/** A number that one form of the query gives and the other leaves out. */
function optional(what: string, range: Range) {
  return z.preprocess(blankAsMissing, measure(what, range).optional())
}

function choice<T extends readonly [string, ...string[]]>(values: T, message: string) {
  return z.preprocess(blankAsMissing, z.enum(values, { message }))
}

/** Issues on each named field, for rules that span fields (exactly one of two, a complete pair). */
function flag(ctx: z.RefinementCtx, paths: string[], message: string) {
  for (const path of paths) ctx.addIssue({ code: 'custom', path: [path], message })
}

const gravityRange = (min: number): Range => ({ min, max: 1.14, digits: 3 })

// Sugar: °Brix or apparent SG 20/20 °C (what a hydrometer reads). 32 °Bx ≈ SG 1.140 is far past any
// fruit juice; below SG 1.000 a juice holds no sugar the NBS tables can read.
export const BRIX_RANGE: Range = { min: 0, max: 32 }
export const JUICE_SG_RANGE: Range = gravityRange(1)

/** How potential alcohol is estimated from a juice: a gravity method with FG 1.000, or its sugar ÷ 16.83 g/L. */
export const POTENTIAL_ALCOHOL_METHODS = [...ALCOHOL_METHODS, 'sugar'] as const
export type PotentialAlcoholMethod = (typeof POTENTIAL_ALCOHOL_METHODS)[number]

export const sugarQuerySchema = z.object({
  brix: optional('°Brix', BRIX_RANGE),
  sg: optional('the apparent specific gravity (20/20 °C)', JUICE_SG_RANGE),
  method: choice(POTENTIAL_ALCOHOL_METHODS, 'Choose gravity-drop, hall, balling or sugar').default(DEFAULT_ALCOHOL_METHOD),
}).superRefine((query, ctx) => {
  const given = Number(query.brix !== undefined) + Number(query.sg !== undefined)
  if (given === 0) flag(ctx, ['brix', 'sg'], 'Enter either °Brix or the specific gravity')
  if (given === 2) flag(ctx, ['brix', 'sg'], 'Enter °Brix or the specific gravity, not both')
})
export type SugarQuery = z.output<typeof sugarQuerySchema>

// Alcohol from original and final gravity. A dry cider can finish below 1.000 (alcohol is lighter
// than water); 0.980 is already drier than any cider or wine.
export const alcoholQuerySchema = z.object({
  og: required('the original gravity', gravityRange(1)),
  fg: required('the final gravity', gravityRange(0.98)),
  method: choice(ALCOHOL_METHODS, 'Choose gravity-drop, hall or balling').default(DEFAULT_ALCOHOL_METHOD),
}).refine(query => query.fg <= query.og, {
  path: ['fg'],
  message: 'The final gravity cannot be above the original gravity: fermentation does not add sugar',
})
export type AlcoholQuery = z.output<typeof alcoholQuerySchema>

// Titratable acidity: a figure in g/L as one acid, or a titration with NaOH. `as` names the acid
// the figure, or the titration's result, is expressed as.
const TITRATION_FIELDS = ['naohMl', 'normality', 'sampleMl'] as const
export const acidQuerySchema = z.object({
  value: optional('the titratable acidity', { min: 0, max: 100, unit: 'g/L' }),
  naohMl: optional('the NaOH volume', { min: 0, max: 250, unit: 'mL' }),
  normality: optional('the NaOH normality', { min: 0, max: 2, unit: 'N', above: true }),
  sampleMl: optional('the sample volume', { min: 0, max: 500, unit: 'mL', above: true }),
  as: choice(ACIDS, 'Choose the acid: malic, tartaric or sulfuric'),
}).superRefine((query, ctx) => {
  const titration = TITRATION_FIELDS.filter(field => query[field] !== undefined)
  if (query.value !== undefined && titration.length > 0) {
    flag(ctx, ['value', ...titration], 'Enter a titratable acidity or a titration, not both')
  }
  else if (query.value === undefined && titration.length < TITRATION_FIELDS.length) {
    const missing = TITRATION_FIELDS.filter(field => query[field] === undefined)
    flag(ctx, titration.length === 0 ? ['value', ...missing] : missing, 'Enter a titratable acidity, or the NaOH volume, its normality and the sample volume')
  }
})
export type AcidQuery = z.output<typeof acidQuerySchema>

// Juice class from one reading, by the apple thresholds unless the juice is pear. Apple juices run
// about 1–20 g/L TA and up to about 6 g/L tannin; the limits only catch typing slips.
export const classQuerySchema = z.object({
  taGPerL: required('the titratable acidity as malic', { min: 0, max: 50, unit: 'g/L' }),
  tanninGPerL: required('the tannin', { min: 0, max: 20, unit: 'g/L' }),
  species: choice(['apple', 'pear'] as const, 'Choose apple or pear').default('apple'),
})
export type ClassQuery = z.output<typeof classQuerySchema>

// Planting density from spacing in metres or in feet: 0.1 m (a stool bed) to 30 m (a vigorous
// standard tree with room to spare), and about the same span in feet.
export const SPACING_RANGE = {
  m: { min: 0.1, max: 30, unit: 'm' },
  ft: { min: 0.3, max: 100, unit: 'ft' },
} satisfies Record<string, Range>
const METRE_FIELDS = ['inRowM', 'betweenRowM'] as const
const FOOT_FIELDS = ['inRowFt', 'betweenRowFt'] as const

export const plantingQuerySchema = z.object({
  inRowM: optional('the in-row spacing', SPACING_RANGE.m),
  betweenRowM: optional('the between-row spacing', SPACING_RANGE.m),
  inRowFt: optional('the in-row spacing', SPACING_RANGE.ft),
  betweenRowFt: optional('the between-row spacing', SPACING_RANGE.ft),
}).superRefine((query, ctx) => {
  const metres = METRE_FIELDS.filter(field => query[field] !== undefined)
  const feet = FOOT_FIELDS.filter(field => query[field] !== undefined)
  if (metres.length > 0 && feet.length > 0) {
    flag(ctx, [...metres, ...feet], 'Enter the spacing in metres or in feet, not both')
  }
  else if (metres.length + feet.length === 0) {
    flag(ctx, [...METRE_FIELDS, ...FOOT_FIELDS], 'Enter the in-row and between-row spacing, in metres or in feet')
  }
  else {
    const pair = metres.length > 0 ? METRE_FIELDS : FOOT_FIELDS
    flag(ctx, pair.filter(field => query[field] === undefined), 'Enter both the in-row and the between-row spacing')
  }
})
export type PlantingQuery = z.output<typeof plantingQuerySchema>

// Nursery back-plan: the season a buyer wants finished trees, how many, and the nursery's own rates
// as percentages (share of buds that take; share of taken trees that reach sale). The tree type and
// an interstem change how many seasons propagation takes; left out, the tree is a maiden on its
// rootstock alone.
export const backPlanQuerySchema = z.object({
  deliveryYear: z.preprocess(blankAsMissing, z.coerce.number({ message: 'Enter the delivery year, e.g. 2028' }).int({ message: 'Enter the delivery year as a whole year' }).min(2000, { message: 'Enter a delivery year from 2000 to 2100' }).max(2100, { message: 'Enter a delivery year from 2000 to 2100' })),
  season: choice(DELIVERY_SEASONS, 'Choose autumn or spring delivery'),
  trees: z.preprocess(blankAsMissing, z.coerce.number({ message: 'Enter the number of trees wanted' }).int({ message: 'Enter a whole number of trees' }).min(1, { message: 'Enter from 1 to 1,000,000 trees' }).max(1_000_000, { message: 'Enter from 1 to 1,000,000 trees' })),
  takePct: required('the bud take', { min: 0, max: 100, unit: '%', above: true }),
  survivalPct: required('the survival to sale', { min: 0, max: 100, unit: '%', above: true }),
  // Left out or blank: a maiden, and no interstem.
  treeType: z.preprocess(blankAsMissing, z.enum(TREE_TYPES, { message: `Choose a tree type: ${TREE_TYPES.join(', ')}` }).default('maiden')),
  interstem: z.preprocess(blankAsMissing, z.enum(['true', 'false'], { message: 'Say true or false for an interstem' }).default('false').transform(v => v === 'true')),
  // Left out or blank: the northern hemisphere's season.
  hemisphere: z.preprocess(blankAsMissing, z.enum(HEMISPHERES, { message: 'Choose north or south' }).default('north')),
}).superRefine((query, ctx) => {
  const problem = interstemProblem(query.treeType, query.interstem)
  if (problem) flag(ctx, ['interstem'], problem)
})
export type BackPlanQuery = z.output<typeof backPlanQuerySchema>
