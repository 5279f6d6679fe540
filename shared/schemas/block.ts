import { z } from 'zod'
import { pageQuerySchema, numberInRange, optionalText, requiredText, somethingToChange, TREE_SPACING_M } from './fields'

export const ORGANIC_STATUSES = ['conventional', 'in_conversion', 'organic'] as const
export type OrganicStatus = typeof ORGANIC_STATUSES[number]

/** Where in its rootstock's published range of bearing ages a block is forecast: the middle unless the grower knows better. */
export const BEARING_PACES = ['early', 'middle', 'late'] as const
export type BearingPace = typeof BEARING_PACES[number]

export const EARLIEST_YEAR_PLANTED = 1900
/** Next year: blocks may be recorded ahead of a winter planting. Read on each check, not at load. */
export function latestYearPlanted(now = new Date()): number {
  return now.getUTCFullYear() + 1
}

// Limits that catch typing slips (a count in the millions, spacing in cm) without ruling out any
// real planting: from 30 cm cordons to 15 m standard trees.
export const BLOCK_LIMITS = {
  trees: { min: 1, max: 100_000 },
  areaHa: { min: 0.01, max: 1000 },
  spacingM: TREE_SPACING_M,
  survival: { min: 0.01, max: 1 },
  nameLength: 120,
  notesLength: 2000,
} as const

function catalogueId(what: string) {
  return z.number({ message: `Choose a ${what}` }).int({ message: `Choose a ${what}` }).positive({ message: `Choose a ${what}` })
}

const yearPlanted = z.number({ message: 'Enter the year planted' }).int({ message: 'Enter a whole year' }).superRefine((year, ctx) => {
  const latest = latestYearPlanted()
  if (year < EARLIEST_YEAR_PLANTED || year > latest) {
    ctx.addIssue({ code: 'custom', message: `Enter a year from ${EARLIEST_YEAR_PLANTED} to ${latest}` })
  }
})

const blockFields = {
  name: requiredText('a name', BLOCK_LIMITS.nameLength),
  varietyId: catalogueId('variety'),
  rootstockId: catalogueId('rootstock'),
  treeCount: z.number({ message: 'Enter the number of trees' }).int({ message: 'Enter a whole number of trees' })
    .min(BLOCK_LIMITS.trees.min, { message: 'Enter from 1 to 100,000 trees' }).max(BLOCK_LIMITS.trees.max, { message: 'Enter from 1 to 100,000 trees' }),
  yearPlanted,
  areaHa: numberInRange(BLOCK_LIMITS.areaHa, 'Enter an area from 0.01 to 1000 ha'),
  inRowM: numberInRange(BLOCK_LIMITS.spacingM, 'Enter an in-row spacing from 0.3 to 15 m'),
  betweenRowM: numberInRange(BLOCK_LIMITS.spacingM, 'Enter a between-row spacing from 0.3 to 15 m'),
  organicStatus: z.enum(ORGANIC_STATUSES, { message: 'Choose conventional, in conversion or organic' }),
  survivalRate: numberInRange(BLOCK_LIMITS.survival, 'Enter a survival rate from 0.01 to 1 (1 = every tree standing)'),
  bearingPace: z.enum(BEARING_PACES, { message: 'Choose early, middle or late' }),
  notes: optionalText('Notes must be text', BLOCK_LIMITS.notesLength),
}

export const blockCreateSchema = z.object({
  ...blockFields,
  organicStatus: blockFields.organicStatus.default('conventional'),
  survivalRate: blockFields.survivalRate.default(1),
  bearingPace: blockFields.bearingPace.default('middle'),
  notes: blockFields.notes.optional().transform(v => v ?? null),
})
export type BlockCreateInput = z.infer<typeof blockCreateSchema>

export const blockPatchSchema = z.object(blockFields).partial()
  .refine(somethingToChange, { message: 'Nothing to change', path: ['name'] })
export type BlockPatchInput = z.infer<typeof blockPatchSchema>

export const blockListQuerySchema = pageQuerySchema

export const FORECAST_MAX_YEARS = 30

export const forecastQuerySchema = z.object({
  /** First calendar year of the forecast; this year when not given. */
  startYear: z.coerce.number().int().min(EARLIEST_YEAR_PLANTED, { message: 'Enter a year from 1900' }).max(2200, { message: 'Enter a year up to 2200' }).default(() => new Date().getUTCFullYear()),
  years: z.coerce.number().int().min(1, { message: 'Forecast at least 1 year' }).max(FORECAST_MAX_YEARS, { message: `Forecast at most ${FORECAST_MAX_YEARS} years` }).default(15),
})
export type ForecastQuery = z.infer<typeof forecastQuerySchema>
