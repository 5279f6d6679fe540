import { paymentListQuerySchema } from '#shared/schemas/payment'
import { listPayments } from '../../services/payments'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readPayments)
  const query = parseQuery(event, paymentListQuerySchema)
  return listPayments(user, query)
})
