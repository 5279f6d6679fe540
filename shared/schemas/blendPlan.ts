import { z } from 'zod'
import { BLEND_PLAN_STATES } from '../types/blendPlan'
import { blendSolveSchema } from './blend'
import { blankAsMissing, isoDate, optionalText, pageQuerySchema, requiredText, searchText, somethingToChange, writableObject } from './fields'

// Blend plans (`/api/blend-plans`): a draft saved from a solve's question, its changes while a draft,
// the list's filters, and the pressing recorded against a committed plan. Kilograms and litres in SI.

export const BLEND_PLAN_LIMITS = {
  nameLength: 120,
  notesLength: 2000,
  vesselLength: 80,
  /** Litres one pressing may record: far more than any press makes in a day. */
  litres: 10_000_000,
  kg: 10_000_000,
  lots: 200,
} as const

const PLAN_READ_ONLY = ['id', 'state', 'status', 'result', 'version', 'lots', 'pressing', 'moves', 'history', 'createdAt', 'updatedAt', 'committedAt', 'pressedAt']

/** `POST /api/blend-plans`: a name and the solve request; the server solves it and keeps the answer. */
export const blendPlanCreateSchema = writableObject({
  name: requiredText('a name for the plan', BLEND_PLAN_LIMITS.nameLength),
  request: blendSolveSchema,
  notes: optionalText('Enter the notes as text', BLEND_PLAN_LIMITS.notesLength).optional().transform(v => v ?? null),
}, PLAN_READ_ONLY)
export type BlendPlanCreateInput = z.output<typeof blendPlanCreateSchema>

/** `PATCH /api/blend-plans/{id}` while a draft: a new request is solved again. */
export const blendPlanPatchSchema = writableObject({
  name: requiredText('a name for the plan', BLEND_PLAN_LIMITS.nameLength).optional(),
  request: blendSolveSchema.optional(),
  notes: optionalText('Enter the notes as text', BLEND_PLAN_LIMITS.notesLength).optional(),
}, PLAN_READ_ONLY).refine(v => somethingToChange(v as Record<string, unknown>), { message: 'Nothing to change', path: ['name'] })
export type BlendPlanPatchInput = z.output<typeof blendPlanPatchSchema>

export const blendPlanListQuerySchema = pageQuerySchema.extend({
  state: z.preprocess(blankAsMissing, z.enum(BLEND_PLAN_STATES, { message: `Choose one of ${BLEND_PLAN_STATES.join(', ')}` }).optional()),
  lotId: z.preprocess(blankAsMissing, z.coerce.number({ message: 'Choose a lot' }).int({ message: 'Choose a lot' }).positive({ message: 'Choose a lot' }).optional()),
  q: searchText(80),
})
export type BlendPlanListQuery = z.output<typeof blendPlanListQuerySchema>

/** Bodies of the moves that carry nothing: commit and release. */
export const blendPlanMoveSchema = z.strictObject({}, { error: issue => (issue.code === 'unrecognized_keys' ? 'Unknown field' : 'Send a JSON object') })

const kgMessage = `Enter the kg taken, more than 0 and up to ${BLEND_PLAN_LIMITS.kg.toLocaleString('en-GB')}`
const litresMessage = `Enter the litres of juice pressed, more than 0 and up to ${BLEND_PLAN_LIMITS.litres.toLocaleString('en-GB')}`

const pressedLotSchema = z.strictObject({
  lotId: z.number({ message: 'Choose the lot' }).int({ message: 'Choose the lot' }).positive({ message: 'Choose the lot' }),
  kg: z.number({ message: kgMessage }).positive({ message: kgMessage }).max(BLEND_PLAN_LIMITS.kg, { message: kgMessage }),
}, { error: issue => (issue.code === 'unrecognized_keys' ? 'Unknown field' : 'Give each lot as { lotId, kg }') })

/** `POST /api/blend-plans/{id}/press`: what was actually pressed, lot by lot in the order pressed. */
export const pressingSchema = z.strictObject({
  pressedOn: isoDate('Enter the day it was pressed as YYYY-MM-DD'),
  litresPressed: z.number({ message: litresMessage }).positive({ message: litresMessage }).max(BLEND_PLAN_LIMITS.litres, { message: litresMessage }),
  vessel: requiredText('the vessel or tank the juice went into', BLEND_PLAN_LIMITS.vesselLength),
  notes: optionalText('Enter the notes as text', BLEND_PLAN_LIMITS.notesLength).optional().transform(v => v ?? null),
  lots: z.array(pressedLotSchema, { message: 'Give the kg taken from each lot' }).min(1, { message: 'Give the kg taken from at least one lot' })
    .max(BLEND_PLAN_LIMITS.lots, { message: `Give at most ${BLEND_PLAN_LIMITS.lots} lots` }),
}, { error: issue => (issue.code === 'unrecognized_keys' ? 'Unknown field' : 'Send the pressing as a JSON object') }).superRefine((body, ctx) => {
  const seen = new Set<number>()
  body.lots.forEach((lot, i) => {
    if (seen.has(lot.lotId)) ctx.addIssue({ code: 'custom', path: ['lots', i, 'lotId'], message: 'This lot is given twice' })
    seen.add(lot.lotId)
  })
})
export type PressingInput = z.output<typeof pressingSchema>
