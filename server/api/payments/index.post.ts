import { paymentCreateSchema } from '#shared/schemas/payment'
import { requestPayment } from '../../services/payments'

// 201 with a new payment and its hosted page; 200 with the live one when it was asked for before.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.makePayments)
  const input = await parseBody(event, paymentCreateSchema)
  const { payment, created } = await requestPayment(user, input)
  setResponseStatus(event, created ? 201 : 200)
  return payment
})
