import { z } from 'zod'
import { PAYMENT_PURPOSES, PAYMENT_STATES } from '../types/payment'
import { blankAsMissing, optionalText, pageQuerySchema, positiveIdQuery } from './fields'

// Bodies and queries of the payments routes. The amount is never sent: the server works it out
// from the tree contract or the delivery.

const strict = <T extends z.ZodRawShape>(shape: T) => z.strictObject(shape, { error: issue => (issue.code === 'unrecognized_keys' ? 'Unknown field' : undefined) })
const objectId = (what: string) => z.number({ message: `Choose a ${what}` }).int({ message: `Choose a ${what}` }).positive({ message: `Choose a ${what}` }).optional()

/** `POST /api/payments`: a deposit or balance names its tree contract, a settlement its delivery. */
export const paymentCreateSchema = strict({
  purpose: z.enum(PAYMENT_PURPOSES, { message: `Choose one of ${PAYMENT_PURPOSES.join(', ')}` }),
  treeContractId: objectId('tree contract'),
  deliveryId: objectId('delivery'),
}).superRefine((v, ctx) => {
  if (v.purpose === 'settlement') {
    if (v.deliveryId === undefined) ctx.addIssue({ code: 'custom', path: ['deliveryId'], message: 'A settlement names the delivery it pays' })
    if (v.treeContractId !== undefined) ctx.addIssue({ code: 'custom', path: ['treeContractId'], message: 'A settlement pays a delivery, not a tree contract' })
  }
  else {
    if (v.treeContractId === undefined) ctx.addIssue({ code: 'custom', path: ['treeContractId'], message: `A ${v.purpose} names the tree contract it pays` })
    if (v.deliveryId !== undefined) ctx.addIssue({ code: 'custom', path: ['deliveryId'], message: `A ${v.purpose} pays a tree contract, not a delivery` })
  }
})
export type PaymentCreateInput = z.output<typeof paymentCreateSchema>

/** `POST /api/payments/{id}/refund`: an optional note for the other side. */
export const paymentRefundSchema = strict({
  reason: optionalText('Write the note as text', 500).optional(),
})
export type PaymentRefundInput = z.output<typeof paymentRefundSchema>

export const paymentListQuerySchema = pageQuerySchema.extend({
  purpose: z.preprocess(blankAsMissing, z.enum(PAYMENT_PURPOSES, { message: `Choose one of ${PAYMENT_PURPOSES.join(', ')}` }).optional()),
  state: z.preprocess(blankAsMissing, z.enum(PAYMENT_STATES, { message: `Choose one of ${PAYMENT_STATES.join(', ')}` }).optional()),
  side: z.preprocess(blankAsMissing, z.enum(['payer', 'payee'], { message: 'Choose payer or payee' }).optional()),
  treeContractId: positiveIdQuery('tree contract'),
  deliveryId: positiveIdQuery('delivery'),
})
export type PaymentListQuery = z.output<typeof paymentListQuerySchema>
