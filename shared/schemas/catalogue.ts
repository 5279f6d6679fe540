import { z } from 'zod'
import { CLASSES_OF, isClassOf, JUICE_CLASSES, type JuiceClass } from '../utils/juiceClass'
import { blankAsMissing, pageQuerySchema, numberInRange, optionalText, requiredText, searchText, somethingToChange, TREE_SPACING_M } from './fields'

export const SPECIES = ['apple', 'pear'] as const
export type Species = typeof SPECIES[number]

export const HARVEST_SEASONS = ['early', 'mid', 'late'] as const
export type HarvestSeason = typeof HARVEST_SEASONS[number]

export const VIGOURS = ['dwarf', 'semi-dwarf', 'semi-vigorous', 'vigorous'] as const
export type Vigour = typeof VIGOURS[number]

// What a juice or a tree can physically have: the limits catch typing slips (a TA typed as
// 65 instead of 6.5, a spacing in feet typed into the metre box) without refusing any real figure.
// Long Ashton's cider apple data run 1.1–19.1 g/L acid and 0.9–6.0 g/L tannin (A. Lea, "Cider
// Apple Compositional Data"); the limits leave room above both.
export const CATALOGUE_LIMITS = {
  brix: { min: 0, max: 32 },
  taGPerL: { min: 0, max: 30 },
  tanninGPerL: { min: 0, max: 8 },
  sizePct: { min: 1, max: 150 },
  spacingM: TREE_SPACING_M,
  years: { min: 0, max: 20 },
  yieldPerTreeKg: { min: 0, max: 1000 },
  nameLength: 120,
  designationLength: 60,
  sourceLength: 1000,
  searchLength: 120,
} as const

/** A figure the catalogue may lack: a number inside its range, or null. */
function figure(what: string, range: { min: number, max: number }, unit: string) {
  return numberInRange(range, `Enter ${what} from ${range.min} to ${range.max} ${unit}, or leave it empty`).nullable()
}

const source = optionalText('The source must be text', CATALOGUE_LIMITS.sourceLength)

const species = z.enum(SPECIES, { message: 'Choose apple or pear' })

/**
 * A tree comes into full bearing no earlier than its first crop. Shared by the schemas and by
 * the repository, which checks a patch against the stored figures it leaves unchanged.
 */
export function bearingYearsIssue(firstCrop: number | null | undefined, fullBearing: number | null | undefined): string | null {
  if (typeof firstCrop !== 'number' || typeof fullBearing !== 'number' || fullBearing >= firstCrop) return null
  return `Years to full bearing (${fullBearing}) cannot be fewer than years to first crop (${firstCrop})`
}

/** The late end of a range of bearing ages is no earlier than its early end. */
export function bearingRangeIssue(firstCrop: number | null | undefined, firstCropLate: number | null | undefined): string | null {
  if (typeof firstCrop !== 'number' || typeof firstCropLate !== 'number' || firstCropLate >= firstCrop) return null
  return `The late end of the years to first crop (${firstCropLate}) cannot be before the early end (${firstCrop})`
}

function checkBearingYears(v: { yearsToFirstCrop?: number | null, yearsToFirstCropLate?: number | null, yearsToFullBearing?: number | null }, ctx: z.RefinementCtx) {
  const issue = bearingYearsIssue(v.yearsToFirstCrop, v.yearsToFullBearing)
  if (issue) ctx.addIssue({ code: 'custom', path: ['yearsToFullBearing'], message: issue })
  const range = bearingRangeIssue(v.yearsToFirstCrop, v.yearsToFirstCropLate)
  if (range) ctx.addIssue({ code: 'custom', path: ['yearsToFirstCropLate'], message: range })
}

/** Apples and perry pears have their own classes: a pear is never "sharp", an apple never "medium sharp". */
export function juiceClassIssue(species: Species | undefined, juiceClass: JuiceClass | undefined): string | null {
  if (!species || !juiceClass || isClassOf(species, juiceClass)) return null
  return `A ${species}'s class is ${CLASSES_OF[species].slice(0, -1).join(', ')} or ${CLASSES_OF[species].at(-1)}`
}

function checkJuiceClass(v: { species?: Species, juiceClass?: JuiceClass }, ctx: z.RefinementCtx) {
  const issue = juiceClassIssue(v.species, v.juiceClass)
  if (issue) ctx.addIssue({ code: 'custom', path: ['juiceClass'], message: issue })
}

const JUICE_CLASS_CHOICE = 'Choose sweet, sharp, bittersweet or bittersharp (perry pears: sweet, medium sharp, bittersweet or bittersharp)'

// ----- Varieties -----

const varietyFields = {
  name: requiredText('the variety name', CATALOGUE_LIMITS.nameLength),
  species,
  juiceClass: z.enum(JUICE_CLASSES, { message: JUICE_CLASS_CHOICE }),
  typicalBrix: figure('the typical sugar', CATALOGUE_LIMITS.brix, '°Brix'),
  typicalTaGPerL: figure('the typical acidity', CATALOGUE_LIMITS.taGPerL, 'g/L as malic'),
  typicalTanninGPerL: figure('the typical tannin', CATALOGUE_LIMITS.tanninGPerL, 'g/L'),
  harvestSeason: z.enum(HARVEST_SEASONS, { message: 'Choose early, mid or late' }).nullable(),
  source,
}

export const varietyCreateSchema = z.object({
  ...varietyFields,
  typicalBrix: varietyFields.typicalBrix.default(null),
  typicalTaGPerL: varietyFields.typicalTaGPerL.default(null),
  typicalTanninGPerL: varietyFields.typicalTanninGPerL.default(null),
  harvestSeason: varietyFields.harvestSeason.default(null),
  source: varietyFields.source.optional().transform(v => v ?? null),
}).superRefine(checkJuiceClass)
export type VarietyCreateInput = z.infer<typeof varietyCreateSchema>

export const varietyPatchSchema = z.object(varietyFields).partial()
  .superRefine(checkJuiceClass)
  .refine(somethingToChange, { message: 'Nothing to change', path: ['name'] })
export type VarietyPatchInput = z.infer<typeof varietyPatchSchema>

// ----- Rootstocks -----

const rootstockFields = {
  designation: requiredText('the rootstock designation', CATALOGUE_LIMITS.designationLength),
  species,
  vigour: z.enum(VIGOURS, { message: 'Choose dwarf, semi-dwarf, semi-vigorous or vigorous' }),
  sizePctOfSeedling: figure('the tree size', CATALOGUE_LIMITS.sizePct, '% of a seedling tree'),
  needsSupport: z.boolean({ message: 'Say whether the tree needs support' }),
  inRowM: figure('the in-row spacing', CATALOGUE_LIMITS.spacingM, 'm'),
  betweenRowM: figure('the between-row spacing', CATALOGUE_LIMITS.spacingM, 'm'),
  yearsToFirstCrop: figure('the years to first crop', CATALOGUE_LIMITS.years, 'years'),
  yearsToFirstCropLate: figure('the late end of the years to first crop', CATALOGUE_LIMITS.years, 'years'),
  yearsToFullBearing: figure('the years to full bearing', CATALOGUE_LIMITS.years, 'years'),
  yieldPerTreeKg: figure('the yield per tree', CATALOGUE_LIMITS.yieldPerTreeKg, 'kg'),
  source,
}

export const rootstockCreateSchema = z.object({
  ...rootstockFields,
  sizePctOfSeedling: rootstockFields.sizePctOfSeedling.default(null),
  needsSupport: rootstockFields.needsSupport.default(false),
  inRowM: rootstockFields.inRowM.default(null),
  betweenRowM: rootstockFields.betweenRowM.default(null),
  yearsToFirstCrop: rootstockFields.yearsToFirstCrop.default(null),
  yearsToFirstCropLate: rootstockFields.yearsToFirstCropLate.default(null),
  yearsToFullBearing: rootstockFields.yearsToFullBearing.default(null),
  yieldPerTreeKg: rootstockFields.yieldPerTreeKg.default(null),
  source: rootstockFields.source.optional().transform(v => v ?? null),
}).superRefine(checkBearingYears)
export type RootstockCreateInput = z.infer<typeof rootstockCreateSchema>

export const rootstockPatchSchema = z.object(rootstockFields).partial()
  .superRefine(checkBearingYears)
  .refine(somethingToChange, { message: 'Nothing to change', path: ['designation'] })
export type RootstockPatchInput = z.infer<typeof rootstockPatchSchema>

// ----- Lists -----

const search = searchText(CATALOGUE_LIMITS.searchLength)

function filter<T extends readonly [string, ...string[]]>(values: T, message: string) {
  return z.preprocess(blankAsMissing, z.enum(values, { message }).optional())
}

export const varietyListQuerySchema = pageQuerySchema.extend({
  q: search,
  species: filter(SPECIES, 'Choose apple or pear'),
  juiceClass: filter(JUICE_CLASSES, JUICE_CLASS_CHOICE),
})
export type VarietyListQuery = z.infer<typeof varietyListQuerySchema>

export const rootstockListQuerySchema = pageQuerySchema.extend({
  q: search,
  species: filter(SPECIES, 'Choose apple or pear'),
  vigour: filter(VIGOURS, 'Choose dwarf, semi-dwarf, semi-vigorous or vigorous'),
})
export type RootstockListQuery = z.infer<typeof rootstockListQuerySchema>
