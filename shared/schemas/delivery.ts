import { z } from 'zod'
import { DELIVERY_STATES } from '../types/delivery'
import { blankAsMissing, isoDate, optionalText, pageQuerySchema, positiveIdQuery, somethingToChange, withDecimals, writableObject } from './fields'
import { todayIso } from './lot'

// The bodies of deliveries at the press: the weigh ticket, the reading paid on and the quality
// seen at the press. Read-only keys a client sends back from what it read are dropped; any other
// unknown key is refused by name.

export const DELIVERY_LIMITS = {
  kg: { max: 10_000_000 },
  ticketLength: 40,
  notesLength: 2000,
  reasonLength: 500,
} as const

/** Keys the API answers that a client may send back; they are dropped, never written. */
export const DELIVERY_READ_ONLY_KEYS = [
  'id', 'makerOrgId', 'makerOrgName', 'growerOrgId', 'growerOrgName', 'lotCode', 'varietyName', 'harvestYear', 'readingBrix',
  'readingSampledOn', 'state', 'version', 'disputedBy', 'disputeReason', 'excessKg', 'excessDecision', 'currency', 'settlement',
  'amountMinor', 'taxRatePct', 'taxMinor', 'totalMinor', 'side', 'moves', 'settledAt', 'paidAt', 'createdAt', 'updatedAt',
  'history', 'year',
] as const

const id = (what: string) => z.number({ message: `Choose a ${what}` }).int({ message: `Choose a ${what}` }).positive({ message: `Choose a ${what}` })
const weight = (what: string, min: 'zero' | 'positive') => {
  const message = `Enter the ${what} from ${min === 'zero' ? 0 : 0.1} to 10,000,000 kg`
  const base = z.number({ message }).max(DELIVERY_LIMITS.kg.max, { message })
  return withDecimals(min === 'zero' ? base.min(0, { message }) : base.positive({ message }), 1, 'Give kg to 0.1')
}
const pct = (what: string) => {
  const message = `Enter the ${what} from 0 to 100 %, or leave it empty`
  return withDecimals(z.number({ message }).min(0, { message }).max(100, { message }), 2, 'Use at most 2 decimals')
}

const deliveryFields = {
  deliveredOn: isoDate('Enter the day delivered as YYYY-MM-DD').refine(v => v <= todayIso(), { message: 'The day delivered cannot be in the future' }),
  ticketNo: optionalText('Enter the weigh ticket number as text', DELIVERY_LIMITS.ticketLength),
  grossKg: weight('gross weight', 'positive').nullable(),
  tareKg: weight('tare', 'zero').nullable(),
  netKg: weight('net weight', 'positive'),
  /** The reading paid on; the lot's latest with a °Brix or SG when none is given. */
  readingId: id('reading of the lot').nullable(),
  rotPct: pct('share of rotten fruit').nullable(),
  damagePct: pct('share of damaged fruit').nullable(),
  /** Set when the maker refuses the load for its quality, whatever the sugar. */
  qualityRejectReason: optionalText('Enter the reason the load is refused as text', DELIVERY_LIMITS.reasonLength),
  notes: optionalText('Notes must be text', DELIVERY_LIMITS.notesLength),
}

export interface WeighTicket { grossKg: number | null, tareKg: number | null, netKg: number }

/**
 * The weigh ticket's own arithmetic: a tare needs the gross it came off and is less than it, and
 * when both were weighed the net is gross − tare (to 0.1 kg, the ticket's precision).
 */
export function weighTicketIssues(t: WeighTicket): { path: string, message: string }[] {
  if (t.tareKg === null) return []
  if (t.grossKg === null) return [{ path: 'grossKg', message: 'Enter the gross weight the tare was taken from, or leave the tare out' }]
  if (t.tareKg >= t.grossKg) return [{ path: 'tareKg', message: `The tare must be less than the gross weight (${t.grossKg} kg)` }]
  const expected = Math.round((t.grossKg - t.tareKg) * 10) / 10
  if (Math.round(t.netKg * 10) !== Math.round(expected * 10)) return [{ path: 'netKg', message: `Gross ${t.grossKg} kg less tare ${t.tareKg} kg is ${expected} kg net, not ${t.netKg} kg` }]
  return []
}

export const deliveryCreateSchema = writableObject({
  fruitContractId: id('fruit contract'),
  lotId: id('lot'),
  ...deliveryFields,
  ticketNo: deliveryFields.ticketNo.optional().transform(v => v ?? null),
  grossKg: deliveryFields.grossKg.optional().transform(v => v ?? null),
  tareKg: deliveryFields.tareKg.optional().transform(v => v ?? null),
  readingId: deliveryFields.readingId.optional().transform(v => v ?? null),
  rotPct: deliveryFields.rotPct.optional().transform(v => v ?? null),
  damagePct: deliveryFields.damagePct.optional().transform(v => v ?? null),
  qualityRejectReason: deliveryFields.qualityRejectReason.optional().transform(v => v ?? null),
  notes: deliveryFields.notes.optional().transform(v => v ?? null),
}, DELIVERY_READ_ONLY_KEYS).superRefine((v, ctx) => {
  for (const issue of weighTicketIssues(v)) ctx.addIssue({ code: 'custom', path: [issue.path], message: issue.message })
})
export type DeliveryCreateInput = z.output<typeof deliveryCreateSchema>

/**
 * A correction: any of the recorded figures, never the contract or the lot. The weigh ticket is
 * checked on the figures as they will stand, by the service.
 */
export const deliveryPatchSchema = writableObject(
  Object.fromEntries(Object.entries(deliveryFields).map(([k, v]) => [k, v.optional()])) as { [K in keyof typeof deliveryFields]: z.ZodOptional<typeof deliveryFields[K]> },
  [...DELIVERY_READ_ONLY_KEYS, 'fruitContractId', 'lotId'],
).refine(v => somethingToChange(v as Record<string, unknown>), { message: 'Nothing to change', path: ['netKg'] })
export type DeliveryPatchInput = z.output<typeof deliveryPatchSchema>
export type DeliveryField = keyof typeof deliveryFields
export const DELIVERY_FIELDS = Object.keys(deliveryFields) as DeliveryField[]

export const deliveryDisputeSchema = writableObject({
  reason: z.string({ message: 'Say what is wrong with the delivery' }).trim().min(1, { message: 'Say what is wrong with the delivery' })
    .max(DELIVERY_LIMITS.reasonLength, { message: `Use at most ${DELIVERY_LIMITS.reasonLength} characters` }),
}, DELIVERY_READ_ONLY_KEYS)
export type DeliveryDisputeInput = z.output<typeof deliveryDisputeSchema>

export const deliveryWithdrawSchema = writableObject({
  reason: optionalText('Enter the note as text', DELIVERY_LIMITS.reasonLength).optional().transform(v => v ?? null),
}, DELIVERY_READ_ONLY_KEYS)
export type DeliveryWithdrawInput = z.output<typeof deliveryWithdrawSchema>

/** What the maker does with the kilograms past the contract year's tolerance. */
export const EXCESS_CHOICES = ['accept', 'refuse'] as const
export type ExcessChoice = typeof EXCESS_CHOICES[number]

export const deliverySettleSchema = writableObject({
  excess: z.enum(EXCESS_CHOICES, { message: 'Say whether the kilograms past the tolerance are accepted (accept) or refused (refuse)' }).optional(),
}, DELIVERY_READ_ONLY_KEYS)
export type DeliverySettleInput = z.output<typeof deliverySettleSchema>

export const deliveryListQuerySchema = pageQuerySchema.extend({
  fruitContractId: positiveIdQuery('fruit contract'),
  growerOrgId: positiveIdQuery('grower'),
  makerOrgId: positiveIdQuery('maker'),
  lotId: positiveIdQuery('lot'),
  harvestYear: z.preprocess(blankAsMissing, z.coerce.number({ message: 'Enter a year' }).int({ message: 'Enter a year' }).min(1900, { message: 'Enter a year from 1900' }).max(2200, { message: 'Enter a year up to 2200' }).optional()),
  state: z.preprocess(blankAsMissing, z.enum(DELIVERY_STATES, { message: `Choose one of ${DELIVERY_STATES.join(', ')}` }).optional()),
})
export type DeliveryListQuery = z.output<typeof deliveryListQuerySchema>
