import { z } from 'zod'
import { isoDate, numberInRange, optionalText, pageQuerySchema, requiredText, somethingToChange, withDecimals, writableObject } from './fields'

// The nursery's bodies and queries: beds and their yearly records, liner stock, budwood lots, rows,
// runs and the events on a run. Keys a client reads back (ids, derived counts, warnings, tags) are
// dropped from a body; any other unknown key is refused by name.

export const BED_KINDS = ['stool', 'cutting', 'seedling', 'field'] as const
export type BedKind = typeof BED_KINDS[number]

/** Yearly records per bed kind. */
export const BED_RECORD_KINDS = ['cut-back', 'earthed-up', 'liners-lifted', 'cuttings-stuck', 'rooted', 'seedlings-raised'] as const
export type BedRecordKind = typeof BED_RECORD_KINDS[number]
export const BED_RECORDS_BY_KIND: Record<BedKind, readonly BedRecordKind[]> = {
  stool: ['cut-back', 'earthed-up', 'liners-lifted'],
  cutting: ['cuttings-stuck', 'rooted', 'liners-lifted'],
  seedling: ['seedlings-raised', 'liners-lifted'],
  field: [],
}

/** Liner grades by stem diameter (5–10 mm preferred; common practice). */
export const LINER_GRADES = ['3-5mm', '5-7mm', '7-10mm', '10-12mm', '12mm+'] as const
export type LinerGrade = typeof LINER_GRADES[number]

/**
 * What happens to a run. A double-worked tree has its interstem budded (and headed back) a season
 * before the variety; a knip tree's one-year tree is cut back in winter to grow a season more.
 */
export const EVENT_KINDS = ['lined-out', 'interstem-budded', 'budded', 'grafted', 'take-counted', 'headed-back', 'shoots-removed', 'staked', 'knip-cut-back', 'loss', 'dug'] as const
export type EventKind = typeof EVENT_KINDS[number]
/** Events a person records; `lined-out` is written when the run is made. */
export const RECORDED_EVENT_KINDS = EVENT_KINDS.filter(k => k !== 'lined-out') as Exclude<EventKind, 'lined-out'>[]

export const BUD_METHODS = ['chip-bud', 't-bud'] as const
export const GRAFT_METHODS = ['whip-and-tongue', 'cleft', 'bench', 'other-graft'] as const
export const LOSS_CAUSES = ['failed-take', 'winter-injury', 'rodents', 'fire-blight', 'other-disease', 'breakage', 'mislabel', 'other'] as const
export type LossCause = typeof LOSS_CAUSES[number]

export const BUDWOOD_SOURCES = ['own-block', 'own-tree', 'bought'] as const

export const NURSERY_LIMITS = {
  nameLength: 80,
  notesLength: 2000,
  count: { min: 1, max: 1_000_000 },
  positions: { min: 1, max: 100_000 },
  motherPlants: { min: 1, max: 1_000_000 },
  spacingCm: { min: 5, max: 500 },
  budHeightCm: { min: 0, max: 150 },
  caliperMm: { min: 1, max: 60 },
  heightCm: { min: 10, max: 400 },
} as const

const NURSERY_READ_ONLY = [
  'id', 'orgId', 'createdAt', 'updatedAt', 'tagCode', 'tagPrintedAt', 'identityChangedAt', 'counts', 'warnings', 'rowName', 'fieldName',
  'rootstockDesignation', 'varietyName', 'contract', 'byUserId', 'byName', 'blockName', 'stock', 'needsSupport', 'expected', 'rootstockNeedsSupport',
] as const

function count(what: string) {
  const message = `Enter ${what} as a whole number from 1 to 1,000,000`
  return z.number({ message }).int({ message }).min(NURSERY_LIMITS.count.min, { message }).max(NURSERY_LIMITS.count.max, { message })
}

function recordId(what: string) {
  return z.number({ message: `Choose ${what}` }).int({ message: `Choose ${what}` }).positive({ message: `Choose ${what}` })
}

const notes = optionalText('Notes must be text', NURSERY_LIMITS.notesLength)
const pastDate = (message: string) => isoDate(message)

// ----- Beds -----

export const bedFields = {
  name: requiredText('a name for the bed', NURSERY_LIMITS.nameLength),
  kind: z.enum(BED_KINDS, { message: 'Choose stool bed, cutting bed, seedling bed or nursery-row field' }),
  rootstockId: recordId('the rootstock').nullable(),
  motherPlants: z.number({ message: 'Enter the number of mother plants' }).int({ message: 'Enter a whole number of mother plants' })
    .min(1, { message: 'Enter at least 1 mother plant' }).max(NURSERY_LIMITS.motherPlants.max, { message: 'Enter at most 1,000,000 mother plants' }).nullable(),
  yearEstablished: z.number({ message: 'Enter the year established' }).int({ message: 'Enter a whole year' }).min(1900, { message: 'Enter a year from 1900' }).max(2200, { message: 'Enter a year up to 2200' }).nullable(),
  seedSource: optionalText('Enter the seed source as text', 200),
  notes,
}
export const bedCreateSchema = writableObject({
  ...bedFields,
  rootstockId: bedFields.rootstockId.optional().transform(v => v ?? null),
  motherPlants: bedFields.motherPlants.optional().transform(v => v ?? null),
  yearEstablished: bedFields.yearEstablished.optional().transform(v => v ?? null),
  seedSource: bedFields.seedSource.optional().transform(v => v ?? null),
  notes: notes.optional().transform(v => v ?? null),
}, NURSERY_READ_ONLY)
export type BedCreateInput = z.output<typeof bedCreateSchema>
export const bedPatchSchema = writableObject(
  Object.fromEntries(Object.entries(bedFields).filter(([k]) => k !== 'kind').map(([k, v]) => [k, v.optional()])) as { [K in Exclude<keyof typeof bedFields, 'kind'>]: z.ZodOptional<typeof bedFields[K]> },
  [...NURSERY_READ_ONLY, 'kind'],
).refine(v => somethingToChange(v as Record<string, unknown>), { message: 'Nothing to change', path: ['name'] })
export type BedPatchInput = z.output<typeof bedPatchSchema>

export const bedRecordCreateSchema = writableObject({
  kind: z.enum(BED_RECORD_KINDS, { message: `Choose one of ${BED_RECORD_KINDS.join(', ')}` }),
  doneOn: pastDate('Enter the date as YYYY-MM-DD'),
  count: count('the count').optional().transform(v => v ?? null),
  grade: z.enum(LINER_GRADES, { message: `Choose a stem diameter grade: ${LINER_GRADES.join(', ')}` }).optional().transform(v => v ?? null),
  hormone: optionalText('Enter the rooting hormone as text', 80).optional().transform(v => v ?? null),
  hormoneStrength: optionalText('Enter the strength as text (e.g. 0.3 % IBA)', 40).optional().transform(v => v ?? null),
  notes: notes.optional().transform(v => v ?? null),
}, NURSERY_READ_ONLY)
export type BedRecordCreateInput = z.output<typeof bedRecordCreateSchema>

// ----- Liners -----

export const linerLotCreateSchema = writableObject({
  rootstockId: recordId('the rootstock'),
  grade: z.enum(LINER_GRADES, { message: `Choose a stem diameter grade: ${LINER_GRADES.join(', ')}` }),
  count: count('the number of liners'),
  receivedOn: pastDate('Enter the day they came in as YYYY-MM-DD'),
  supplier: requiredText('the supplier', 160),
  certificate: optionalText('Enter the certificate as text', 120).optional().transform(v => v ?? null),
  notes: notes.optional().transform(v => v ?? null),
}, [...NURSERY_READ_ONLY, 'source'])
export type LinerLotCreateInput = z.output<typeof linerLotCreateSchema>

// ----- Budwood -----

export const budwoodCreateSchema = writableObject({
  label: requiredText('a label for the lot', 60),
  varietyId: recordId('the variety'),
  cutOn: pastDate('Enter the day it was cut as YYYY-MM-DD'),
  sourceKind: z.enum(BUDWOOD_SOURCES, { message: 'Choose own block, own tree or bought in' }),
  blockId: recordId('the block').nullable().optional().transform(v => v ?? null),
  sourceNote: optionalText('Enter the source as text', 200).optional().transform(v => v ?? null),
  supplier: optionalText('Enter the supplier as text', 160).optional().transform(v => v ?? null),
  certificate: optionalText('Enter the certificate as text', 120).optional().transform(v => v ?? null),
  sticks: count('the number of sticks'),
  notes: notes.optional().transform(v => v ?? null),
}, NURSERY_READ_ONLY)
export type BudwoodCreateInput = z.output<typeof budwoodCreateSchema>

/** The latest date it is anywhere now (UTC+14), as YYYY-MM-DD: a person's "today" is never later. */
const latestToday = () => new Date(Date.now() + 14 * 3_600_000).toISOString().slice(0, 10)

export const BUDWOOD_SUSPECT_REASON_MAX = 500

/** Marks a lot suspect: the day the disease was suspected (not in the future) and why. */
export const budwoodSuspectSchema = writableObject({
  suspectOn: isoDate('Enter the day it was suspected as YYYY-MM-DD').refine(v => v <= latestToday(), { message: 'The day it was suspected cannot be in the future' }),
  reason: requiredText('why the lot is suspect (what was seen, or who reported it)', BUDWOOD_SUSPECT_REASON_MAX),
}, [...NURSERY_READ_ONLY, 'suspect'])
export type BudwoodSuspectInput = z.output<typeof budwoodSuspectSchema>

/** Clears a suspect lot: why it is no longer thought infected (a test, an inspection). */
export const budwoodClearSchema = writableObject({
  reason: requiredText('why the lot is cleared (a test result or an inspection)', BUDWOOD_SUSPECT_REASON_MAX),
}, [...NURSERY_READ_ONLY, 'suspect'])
export type BudwoodClearInput = z.output<typeof budwoodClearSchema>

// ----- Rows and runs -----

export const rowCreateSchema = writableObject({
  fieldId: recordId('the field'),
  name: requiredText('the row name or number', 40),
  positions: z.number({ message: 'Enter the number of positions in the row' }).int({ message: 'Enter a whole number of positions' })
    .min(NURSERY_LIMITS.positions.min, { message: 'Enter from 1 to 100,000 positions' }).max(NURSERY_LIMITS.positions.max, { message: 'Enter from 1 to 100,000 positions' }),
  spacingCm: withDecimals(numberInRange(NURSERY_LIMITS.spacingCm, 'Enter a spacing from 5 to 500 cm, or leave it empty'), 1, 'Give the spacing to 0.1 cm').nullable().optional().transform(v => v ?? null),
  notes: notes.optional().transform(v => v ?? null),
}, NURSERY_READ_ONLY)
export type RowCreateInput = z.output<typeof rowCreateSchema>
/** A row stays in its field; its name, length, spacing and notes may be corrected. */
export const rowPatchSchema = writableObject({
  name: requiredText('the row name or number', 40).optional(),
  positions: z.number({ message: 'Enter the number of positions in the row' }).int({ message: 'Enter a whole number of positions' })
    .min(NURSERY_LIMITS.positions.min, { message: 'Enter from 1 to 100,000 positions' }).max(NURSERY_LIMITS.positions.max, { message: 'Enter from 1 to 100,000 positions' }).optional(),
  spacingCm: withDecimals(numberInRange(NURSERY_LIMITS.spacingCm, 'Enter a spacing from 5 to 500 cm, or leave it empty'), 1, 'Give the spacing to 0.1 cm').nullable().optional(),
  notes: notes.optional(),
}, [...NURSERY_READ_ONLY, 'fieldId'])
  .refine(v => somethingToChange(v as Record<string, unknown>), { message: 'Nothing to change', path: ['name'] })
export type RowPatchInput = z.output<typeof rowPatchSchema>
export const rowListQuerySchema = pageQuerySchema.extend({
  fieldId: z.coerce.number().int().positive({ message: 'Not a valid field id' }).optional(),
})
export type RowListQuery = z.output<typeof rowListQuerySchema>

const position = (what: string) => z.number({ message: `Enter the ${what} position` }).int({ message: `Enter a whole ${what} position` }).min(1, { message: `The ${what} position starts at 1` })

export const runFields = {
  rowId: recordId('the row'),
  fromPosition: position('first'),
  toPosition: position('last'),
  rootstockId: recordId('the rootstock'),
  interstem: optionalText('Enter the interstem as text', 80),
  linerGrade: z.enum(LINER_GRADES, { message: `Choose a stem diameter grade: ${LINER_GRADES.join(', ')}` }).nullable(),
  linedOutOn: pastDate('Enter the day lined out as YYYY-MM-DD'),
  linedOutCount: count('the number of liners lined out'),
  varietyId: recordId('the variety it is meant for'),
  treeContractId: recordId('the tree contract').nullable(),
  notes,
}
export const runCreateSchema = writableObject({
  ...runFields,
  interstem: runFields.interstem.optional().transform(v => v ?? null),
  linerGrade: runFields.linerGrade.optional().transform(v => v ?? null),
  treeContractId: runFields.treeContractId.optional().transform(v => v ?? null),
  notes: notes.optional().transform(v => v ?? null),
}, NURSERY_READ_ONLY).superRefine((v, ctx) => {
  if (v.toPosition < v.fromPosition) ctx.addIssue({ code: 'custom', path: ['toPosition'], message: 'The last position must be at or after the first' })
})
export type RunCreateInput = z.output<typeof runCreateSchema>
/** The map's facts of a run may be corrected; its count comes from its events. */
export const runPatchSchema = writableObject({
  fromPosition: runFields.fromPosition.optional(),
  toPosition: runFields.toPosition.optional(),
  rootstockId: runFields.rootstockId.optional(),
  interstem: runFields.interstem.optional(),
  varietyId: runFields.varietyId.optional(),
  treeContractId: runFields.treeContractId.optional(),
  notes: notes.optional(),
}, [...NURSERY_READ_ONLY, 'rowId', 'linedOutOn', 'linedOutCount', 'linerGrade'])
  .refine(v => somethingToChange(v as Record<string, unknown>), { message: 'Nothing to change', path: ['varietyId'] })
export type RunPatchInput = z.output<typeof runPatchSchema>

export const runListQuerySchema = pageQuerySchema.extend({
  varietyId: z.coerce.number().int().positive({ message: 'Not a valid variety id' }).optional(),
  rootstockId: z.coerce.number().int().positive({ message: 'Not a valid rootstock id' }).optional(),
  treeContractId: z.coerce.number().int().positive({ message: 'Not a valid contract id' }).optional(),
  rowId: z.coerce.number().int().positive({ message: 'Not a valid row id' }).optional(),
  hasWarnings: z.enum(['true', 'false'], { message: 'Say true or false' }).optional().transform(v => (v === undefined ? undefined : v === 'true')),
})
export type RunListQuery = z.output<typeof runListQuerySchema>

// ----- Events on a run -----

const dugGrade = z.strictObject({
  caliperMm: withDecimals(numberInRange(NURSERY_LIMITS.caliperMm, 'Enter the trunk caliper above the union, 1 to 60 mm'), 1, 'Give the caliper to 0.1 mm'),
  heightCm: z.number({ message: 'Enter the height in cm' }).int({ message: 'Enter a whole number of cm' }).min(NURSERY_LIMITS.heightCm.min, { message: 'Enter a height from 10 to 400 cm' }).max(NURSERY_LIMITS.heightCm.max, { message: 'Enter a height from 10 to 400 cm' }).nullable().optional().transform(v => v ?? null),
  feathered: z.boolean({ message: 'Say whether the trees are feathered' }).optional().transform(v => v ?? false),
  count: count('the trees of this grade'),
}, { error: issue => (issue.code === 'unrecognized_keys' ? 'Unknown field' : undefined) })
export type DugGrade = z.output<typeof dugGrade>

const eventCommon = {
  happenedOn: pastDate('Enter the day as YYYY-MM-DD'),
  notes: notes.optional().transform(v => v ?? null),
  /** Sent by a phone with an entry made offline: the same key twice records the entry once. */
  clientKey: z.string({ message: 'Send the entry key as text' }).regex(/^[A-Za-z0-9_-]{8,64}$/, { message: 'An entry key is 8 to 64 letters, digits, - or _' }).optional(),
}

/** The body of each kind of event a person records. */
export const EVENT_BODY_SCHEMAS = {
  'budded': writableObject({ kind: z.literal('budded'), ...eventCommon, method: z.enum(BUD_METHODS, { message: 'Choose chip bud or T-bud' }), varietyId: recordId('the variety budded'), budwoodLotId: recordId('the budwood lot').nullable().optional().transform(v => v ?? null), budHeightCm: withDecimals(numberInRange(NURSERY_LIMITS.budHeightCm, 'Enter a bud height from 0 to 150 cm'), 1, 'Give the height to 0.1 cm').nullable().optional().transform(v => v ?? null), count: count('the number budded'), dayOrder: z.number({ message: 'Enter the order budded that day' }).int().min(1, { message: 'The first run budded that day is 1' }).max(1000, { message: 'Enter at most 1000' }).nullable().optional().transform(v => v ?? null) }, NURSERY_READ_ONLY),
  'grafted': writableObject({ kind: z.literal('grafted'), ...eventCommon, method: z.enum(GRAFT_METHODS, { message: 'Choose whip-and-tongue, cleft, bench or another graft' }), varietyId: recordId('the variety grafted'), budwoodLotId: recordId('the budwood lot').nullable().optional().transform(v => v ?? null), count: count('the number grafted'), dayOrder: z.number().int().min(1).max(1000).nullable().optional().transform(v => v ?? null) }, NURSERY_READ_ONLY),
  'interstem-budded': writableObject({ kind: z.literal('interstem-budded'), ...eventCommon, method: z.enum(BUD_METHODS, { message: 'Choose chip bud or T-bud' }), budwoodLotId: recordId('the budwood lot').nullable().optional().transform(v => v ?? null), count: count('the number budded with the interstem'), dayOrder: z.number({ message: 'Enter the order budded that day' }).int().min(1, { message: 'The first run budded that day is 1' }).max(1000, { message: 'Enter at most 1000' }).nullable().optional().transform(v => v ?? null) }, NURSERY_READ_ONLY),
  'take-counted': writableObject({ kind: z.literal('take-counted'), ...eventCommon, count: z.number({ message: 'Enter the number of buds that took' }).int({ message: 'Enter a whole number' }).min(0, { message: 'Enter 0 or more' }).max(NURSERY_LIMITS.count.max, { message: 'Enter at most 1,000,000' }) }, NURSERY_READ_ONLY),
  'headed-back': writableObject({ kind: z.literal('headed-back'), ...eventCommon }, NURSERY_READ_ONLY),
  'shoots-removed': writableObject({ kind: z.literal('shoots-removed'), ...eventCommon, passNo: z.number({ message: 'Enter which pass this is' }).int({ message: 'Enter a whole number' }).min(1, { message: 'The first pass is 1' }).max(50, { message: 'Enter at most 50' }).optional() }, NURSERY_READ_ONLY),
  'staked': writableObject({ kind: z.literal('staked'), ...eventCommon }, NURSERY_READ_ONLY),
  'knip-cut-back': writableObject({ kind: z.literal('knip-cut-back'), ...eventCommon }, NURSERY_READ_ONLY),
  'loss': writableObject({ kind: z.literal('loss'), ...eventCommon, count: count('the number lost'), cause: z.enum(LOSS_CAUSES, { message: `Choose a cause: ${LOSS_CAUSES.join(', ')}` }) }, NURSERY_READ_ONLY),
  'dug': writableObject({ kind: z.literal('dug'), ...eventCommon, grades: z.array(dugGrade, { message: 'Give the dug trees by grade' }).min(1, { message: 'Give at least one grade' }).max(20, { message: 'Give at most 20 grades' }) }, NURSERY_READ_ONLY),
} as const

/** One event's body: its `kind` picks the schema, whose issues name the fields. */
export const eventCreateSchema = z.looseObject({
  kind: z.enum(RECORDED_EVENT_KINDS, { message: `Choose the kind of event: ${RECORDED_EVENT_KINDS.join(', ')}` }),
}).transform((value, ctx) => {
  const result = EVENT_BODY_SCHEMAS[value.kind].safeParse(value)
  if (result.success) return result.data as z.output<typeof EVENT_BODY_SCHEMAS[keyof typeof EVENT_BODY_SCHEMAS]>
  for (const issue of result.error.issues) ctx.addIssue(issue as Parameters<typeof ctx.addIssue>[0])
  return z.NEVER
})
export type EventCreateInput = z.output<typeof eventCreateSchema>

export const tagsPrintedSchema = writableObject({
  runIds: z.array(recordId('a run'), { message: 'Send the runs printed as a list of ids' }).min(1, { message: 'Send at least one run' }).max(500, { message: 'Send at most 500 runs' }),
}, [])
export type TagsPrintedInput = z.output<typeof tagsPrintedSchema>
