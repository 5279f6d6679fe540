import { idParamSchema } from '#shared/schemas/fields'
import { paymentRefundSchema } from '#shared/schemas/payment'
import { refundPayment } from '../../../services/payments'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.refundPayments)
  const { id } = parseParams(event, idParamSchema)
  const input = await parseBody(event, paymentRefundSchema)
  return refundPayment(user, id, input)
})
