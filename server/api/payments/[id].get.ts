import { idParamSchema } from '#shared/schemas/fields'
import { getPayment } from '../../services/payments'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readPayments)
  const { id } = parseParams(event, idParamSchema)
  return getPayment(user, id)
})
