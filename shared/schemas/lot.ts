import { z } from 'zod'
import { LOT_STATES, TA_ACIDS, TA_UNITS, TANNIN_UNITS } from '../types/lot'
import { JUICE_CLASSES } from '../utils/juiceClass'
import { blankAsMissing, isoDate, optionalText, pageQuerySchema, positiveIdQuery, searchText, somethingToChange, writableObject } from './fields'

// Harvest lots and the juice readings typed by hand. The impossible values of a juice are judged
// by shared/utils/juiceReading.ts (the same rules as a sheet's rows); these schemas take the shapes.

export const LOT_LIMITS = {
  codeLength: 40,
  netKg: { min: 0.1, max: 10_000_000 },
  bins: { max: 100_000 },
  notesLength: 2000,
} as const

/** Today as YYYY-MM-DD (UTC), read on each check. */
export function todayIso(now = new Date()): string {
  return now.toISOString().slice(0, 10)
}

const code = z.string({ message: 'Enter the lot\'s code' }).trim().min(1, { message: 'Enter the lot\'s code' })
  .max(LOT_LIMITS.codeLength, { message: `Use at most ${LOT_LIMITS.codeLength} characters` })
const id = (what: string) => z.number({ message: `Choose a ${what}` }).int({ message: `Choose a ${what}` }).positive({ message: `Choose a ${what}` })
const pickedOn = isoDate('Enter the day picked as YYYY-MM-DD').refine(v => v <= todayIso(), { message: 'The day picked cannot be in the future' })
const netKgMessage = 'Enter the net weight from 0.1 to 10,000,000 kg'
const netKg = z.number({ message: netKgMessage }).positive({ message: netKgMessage }).max(LOT_LIMITS.netKg.max, { message: netKgMessage })
const bins = z.number({ message: 'Enter a whole number of bins' }).int({ message: 'Enter a whole number of bins' })
  .min(0, { message: 'Enter a whole number of bins' }).max(LOT_LIMITS.bins.max, { message: 'Enter at most 100,000 bins' })
const notes = optionalText('Notes must be text', LOT_LIMITS.notesLength)

/** Fields the API answers that a client may send back; they are dropped, never written. */
const READ_ONLY = ['id', 'orgId', 'orgName', 'blockName', 'varietyName', 'species', 'varietyClass', 'harvestYear',
  'state', 'latestReading', 'juiceClass', 'createdAt', 'updatedAt']

export const lotCreateSchema = writableObject({
  code,
  blockId: id('block').nullable().optional().transform(v => v ?? null),
  /** Taken from the block when a block is given and no variety. */
  varietyId: id('variety').optional(),
  pickedOn,
  netKg,
  bins: bins.nullable().optional().transform(v => v ?? null),
  notes: notes.optional().transform(v => v ?? null),
}, READ_ONLY).superRefine((v, ctx) => {
  if (v.varietyId === undefined && v.blockId === null) ctx.addIssue({ code: 'custom', path: ['varietyId'], message: 'Choose a variety, or a block to take it from' })
})
export type LotCreateInput = z.infer<typeof lotCreateSchema>

export const lotPatchSchema = writableObject({
  code: code.optional(),
  blockId: id('block').nullable().optional(),
  varietyId: id('variety').optional(),
  pickedOn: pickedOn.optional(),
  netKg: netKg.optional(),
  bins: bins.nullable().optional(),
  notes: notes.optional(),
}, READ_ONLY).refine(somethingToChange, { message: 'Nothing to change', path: ['code'] })
export type LotPatchInput = z.infer<typeof lotPatchSchema>

export const lotListQuerySchema = pageQuerySchema.extend({
  varietyId: positiveIdQuery('variety'),
  blockId: positiveIdQuery('block'),
  juiceClass: z.preprocess(blankAsMissing, z.enum(JUICE_CLASSES, { message: `Choose one of ${JUICE_CLASSES.join(', ')}` }).optional()),
  state: z.preprocess(blankAsMissing, z.enum(LOT_STATES, { message: `Choose one of ${LOT_STATES.join(', ')}` }).optional()),
  harvestYear: z.preprocess(blankAsMissing, z.coerce.number({ message: 'Enter a year' }).int({ message: 'Enter a year' }).min(1900, { message: 'Enter a year from 1900' }).max(2200, { message: 'Enter a year up to 2200' }).optional()),
  q: searchText(80),
})
export type LotListQuery = z.infer<typeof lotListQuerySchema>

const measured = (what: string) => z.number({ message: `Enter ${what} as a number` }).nullable().optional()

export const readingCreateSchema = writableObject({
  sampledOn: isoDate('Enter the day sampled as YYYY-MM-DD').refine(v => v <= todayIso(), { message: 'The day sampled cannot be in the future' }),
  brix: measured('°Brix'),
  sg: measured('the specific gravity'),
  tempC: measured('the temperature'),
  ta: measured('the titratable acidity'),
  taAs: z.enum(TA_ACIDS, { message: 'Choose malic, tartaric or sulfuric' }).nullable().optional(),
  taUnit: z.enum(TA_UNITS, { message: 'Choose g/L or % w/v' }).nullable().optional(),
  ph: measured('the pH'),
  tannin: measured('the tannin'),
  tanninUnit: z.enum(TANNIN_UNITS, { message: 'Choose g/L, % or mg/L' }).nullable().optional(),
  yan: measured('the YAN'),
  notes: notes.optional().transform(v => v ?? null),
  /** The PDF sheet the reading was typed in from, when it was. */
  labSheetId: z.number({ message: 'Choose the sheet the reading was typed from' }).int({ message: 'Choose the sheet the reading was typed from' }).positive({ message: 'Choose the sheet the reading was typed from' }).nullable().optional(),
}, ['id', 'lotId', 'sheetRow', 'juiceClass', 'createdAt'])
export type ReadingCreateInput = z.infer<typeof readingCreateSchema>
