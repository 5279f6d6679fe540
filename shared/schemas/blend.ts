import { z } from 'zod'
import { BLEND_PROPERTIES, type BlendLotInput, type BlendProperty } from '../types/blend'
import { LOT_STATES } from '../types/lot'
import { DEFAULT_ALCOHOL_METHOD } from '../utils/alcohol'
import { JUICE_CLASSES } from '../utils/juiceClass'
import { BRIX_MAX, BRIX_MIN, SG_MAX } from '../utils/sugar'
import { POTENTIAL_ALCOHOL_METHODS } from './calc'
import { SETTINGS_LIMITS } from './organisation'
import { blankAsMissing, optionalText, pageQuerySchema, positiveIdQuery, requiredText, searchText, somethingToChange, writableObject } from './fields'

// The blend planner's question (`POST /api/blends/solve`), its lot list's filters and the maker's
// saved targets. Quantities in SI (kg, L, g/L as malic), prices in integer minor units per tonne.

export const BLEND_LIMITS = {
  /** Lots in one solve: a season's lots with room to spare. */
  lots: 2000,
  shares: 50,
  volumeL: 10_000_000,
  availableKg: 10_000_000,
  pricePerTonne: 100_000_000,
  codeLength: 40,
  nameLength: 120,
  phNoteLength: 120,
  notesLength: 2000,
} as const

/** What a range of each property may span, and how it is named in a message. */
export const PROPERTY_LIMITS: Record<BlendProperty, { min: number, max: number, label: string }> = {
  brix: { min: BRIX_MIN, max: BRIX_MAX, label: '°Brix' },
  sg: { min: 1, max: SG_MAX, label: 'SG' },
  taGPerL: { min: 0, max: 30, label: 'TA (g/L as malic)' },
  tanninGPerL: { min: 0, max: 20, label: 'tannin (g/L)' },
}

function figure(what: string, range: { min: number, max: number }) {
  const message = `Enter ${what} from ${range.min} to ${range.max}`
  return z.number({ message }).min(range.min, { message }).max(range.max, { message })
}

function rangeOf(property: BlendProperty) {
  const limits = PROPERTY_LIMITS[property]
  return z.strictObject({
    min: figure(`the lowest ${limits.label}`, limits),
    max: figure(`the highest ${limits.label}`, limits),
  }, { error: issue => (issue.code === 'unrecognized_keys' ? 'Unknown field' : `Give the ${limits.label} range as { min, max }`) })
    .refine(r => r.min <= r.max, { message: `The lowest ${limits.label} is above the highest`, path: ['min'] })
}

/** Ranges of °Brix, SG, TA and tannin; each property may be left out. */
export const blendRangesSchema = z.strictObject(
  Object.fromEntries(BLEND_PROPERTIES.map(p => [p, rangeOf(p).optional()])) as { [P in BlendProperty]: z.ZodOptional<ReturnType<typeof rangeOf>> },
  { error: issue => (issue.code === 'unrecognized_keys' ? `Unknown field: ranges are ${BLEND_PROPERTIES.join(', ')}` : 'Give the ranges as an object') },
)

const positiveId = (what: string) => z.number({ message: `Give the ${what}'s id` }).int({ message: `Give the ${what}'s id` }).positive({ message: `Give the ${what}'s id` })
const volumeMessage = `Enter the volume in litres, more than 0 and up to ${BLEND_LIMITS.volumeL.toLocaleString('en-GB')}`
const volumeL = z.number({ message: volumeMessage }).positive({ message: volumeMessage }).max(BLEND_LIMITS.volumeL, { message: volumeMessage })
const price = (what: string) => {
  const message = `Enter ${what} as a whole number of minor units per tonne, from 0 to ${BLEND_LIMITS.pricePerTonne.toLocaleString('en-GB')}`
  return z.number({ message }).int({ message }).min(0, { message }).max(BLEND_LIMITS.pricePerTonne, { message })
}
const juiceYield = figure('the juice yield in L per tonne', SETTINGS_LIMITS.juiceYieldLPerT)
const availableKgMessage = `Enter the kg available, from 0 to ${BLEND_LIMITS.availableKg.toLocaleString('en-GB')}`

/** The fields a what-if lot must give, in the order their absence is named. */
const WHAT_IF_FIELDS = ['availableKg', 'brix', 'taGPerL', 'tanninGPerL', 'pricePerTonne', 'juiceYieldLPerTonne'] as const

// One shape for both kinds of lot, so a missing or stray field is named by its own path rather than
// by a union's "invalid input": a lot with a lotId is one the maker may see; one without is a what-if.
const lotSchema = z.strictObject({
  lotId: positiveId('lot').optional(),
  code: z.string({ message: 'Give the what-if lot a code' }).trim().min(1, { message: 'Give the what-if lot a code' })
    .max(BLEND_LIMITS.codeLength, { message: `Use at most ${BLEND_LIMITS.codeLength} characters` }).optional(),
  juiceYieldLPerTonne: juiceYield.optional(),
  haulagePerTonne: price('the haulage').optional(),
  pricePerTonne: price('the price').optional(),
  availableKg: z.number({ message: availableKgMessage }).min(0, { message: availableKgMessage }).max(BLEND_LIMITS.availableKg, { message: availableKgMessage }).optional(),
  brix: figure('°Brix', PROPERTY_LIMITS.brix).optional(),
  taGPerL: figure('the TA in g/L as malic', PROPERTY_LIMITS.taGPerL).optional(),
  tanninGPerL: figure('the tannin in g/L', PROPERTY_LIMITS.tanninGPerL).optional(),
}, { error: issue => (issue.code === 'unrecognized_keys' ? 'Unknown field' : 'Give each lot as { lotId } or a what-if lot') }).superRefine((lot, ctx) => {
  if (lot.lotId !== undefined) {
    for (const field of ['code', 'availableKg', 'brix', 'taGPerL', 'tanninGPerL'] as const) {
      if (lot[field] !== undefined) ctx.addIssue({ code: 'custom', path: [field], message: 'A lot of yours takes its figures from its reading; leave this out, or leave out lotId for a what-if lot' })
    }
    return
  }
  if (lot.code === undefined) ctx.addIssue({ code: 'custom', path: ['lotId'], message: 'Choose a lot, or give a what-if lot\'s code and figures' })
  if (lot.haulagePerTonne !== undefined) ctx.addIssue({ code: 'custom', path: ['haulagePerTonne'], message: 'Put a what-if lot\'s haulage in its price' })
  for (const field of WHAT_IF_FIELDS) {
    if (lot[field] === undefined) ctx.addIssue({ code: 'custom', path: [field], message: 'A what-if lot needs this figure' })
  }
}).transform((lot): BlendLotInput => (lot.lotId !== undefined
  ? { lotId: lot.lotId, juiceYieldLPerTonne: lot.juiceYieldLPerTonne, haulagePerTonne: lot.haulagePerTonne, pricePerTonne: lot.pricePerTonne }
  : { code: lot.code!, availableKg: lot.availableKg!, brix: lot.brix!, taGPerL: lot.taGPerL!, tanninGPerL: lot.tanninGPerL!, pricePerTonne: lot.pricePerTonne!, juiceYieldLPerTonne: lot.juiceYieldLPerTonne! }))

const shareMessage = 'Enter a share of the volume from 0 to 1'
const share = z.number({ message: shareMessage }).min(0, { message: shareMessage }).max(1, { message: shareMessage })

const shareSchema = z.strictObject({
  varietyId: positiveId('variety').optional(),
  juiceClass: z.enum(JUICE_CLASSES, { message: `Choose one of ${JUICE_CLASSES.join(', ')}` }).optional(),
  min: share.optional(),
  max: share.optional(),
}, { error: issue => (issue.code === 'unrecognized_keys' ? 'Unknown field' : 'Give each share as { varietyId or juiceClass, min, max }') }).superRefine((rule, ctx) => {
  if ((rule.varietyId === undefined) === (rule.juiceClass === undefined)) ctx.addIssue({ code: 'custom', path: ['varietyId'], message: 'Name either a variety or a juice class' })
  if (rule.min === undefined && rule.max === undefined) ctx.addIssue({ code: 'custom', path: ['min'], message: 'Give a lowest or a highest share' })
  if (rule.min !== undefined && rule.max !== undefined && rule.min > rule.max) ctx.addIssue({ code: 'custom', path: ['min'], message: 'The lowest share is above the highest' })
})

export const blendSolveSchema = z.strictObject({
  target: blendRangesSchema.default({}),
  volumeL,
  lots: z.array(lotSchema, { message: 'Choose the lots to blend' }).min(1, { message: 'Choose at least one lot' })
    .max(BLEND_LIMITS.lots, { message: `Choose at most ${BLEND_LIMITS.lots} lots` }),
  shares: z.array(shareSchema, { message: 'Give the shares as a list' }).max(BLEND_LIMITS.shares, { message: `Give at most ${BLEND_LIMITS.shares} share rules` }).optional(),
  alcoholMethod: z.enum(POTENTIAL_ALCOHOL_METHODS, { message: 'Choose gravity-drop, hall, balling or sugar' }).default(DEFAULT_ALCOHOL_METHOD),
}, { error: issue => (issue.code === 'unrecognized_keys' ? 'Unknown field' : 'Send the blend as a JSON object') }).superRefine((body, ctx) => {
  const seen = new Map<string, number>()
  body.lots.forEach((lot, i) => {
    const key = 'lotId' in lot ? `lot ${lot.lotId}` : `what-if ${lot.code}`
    if (seen.has(key)) ctx.addIssue({ code: 'custom', path: ['lots', i, 'lotId' in lot ? 'lotId' : 'code'], message: `Lot ${i + 1} is lot ${seen.get(key)! + 1} again` })
    else seen.set(key, i)
  })
})
export type BlendSolveInput = z.output<typeof blendSolveSchema>

export const blendLotListQuerySchema = pageQuerySchema.extend({
  juiceClass: z.preprocess(blankAsMissing, z.enum(JUICE_CLASSES, { message: `Choose one of ${JUICE_CLASSES.join(', ')}` }).optional()),
  varietyId: positiveIdQuery('variety'),
  growerId: positiveIdQuery('grower'),
  state: z.preprocess(blankAsMissing, z.enum(LOT_STATES.filter(s => s !== 'pressed') as ['available', 'delivered'], { message: 'Choose available or delivered' }).optional()),
  minFreeKg: z.preprocess(blankAsMissing, z.coerce.number({ message: 'Enter the kg as a number' }).min(0, { message: 'Enter 0 kg or more' }).max(BLEND_LIMITS.availableKg, { message: 'Enter at most 10,000,000 kg' }).optional()),
  q: searchText(80),
})
export type BlendLotListQuery = z.output<typeof blendLotListQuerySchema>

// ----- Saved targets -----

const targetFields = {
  name: requiredText('a name for the target', BLEND_LIMITS.nameLength),
  ranges: blendRangesSchema,
  volumeL: volumeL.nullable(),
  phNote: optionalText('Enter the pH note as text', BLEND_LIMITS.phNoteLength),
  notes: optionalText('Enter the notes as text', BLEND_LIMITS.notesLength),
}

const TARGET_READ_ONLY = ['id', 'createdAt', 'updatedAt']

export const blendTargetCreateSchema = writableObject({
  ...targetFields,
  ranges: targetFields.ranges.default({}),
  volumeL: targetFields.volumeL.optional().transform(v => v ?? null),
  phNote: targetFields.phNote.optional().transform(v => v ?? null),
  notes: targetFields.notes.optional().transform(v => v ?? null),
}, TARGET_READ_ONLY)
export type BlendTargetCreateInput = z.output<typeof blendTargetCreateSchema>

/** A change: any field; `ranges`, when given, replaces every range (a property left out has none). */
export const blendTargetPatchSchema = writableObject({
  name: targetFields.name.optional(),
  ranges: targetFields.ranges.optional(),
  volumeL: targetFields.volumeL.optional(),
  phNote: targetFields.phNote.optional(),
  notes: targetFields.notes.optional(),
}, TARGET_READ_ONLY).refine(v => somethingToChange(v as Record<string, unknown>), { message: 'Nothing to change', path: ['name'] })
export type BlendTargetPatchInput = z.output<typeof blendTargetPatchSchema>

export const blendTargetListQuerySchema = pageQuerySchema.extend({ q: searchText(80) })
export type BlendTargetListQuery = z.output<typeof blendTargetListQuerySchema>
