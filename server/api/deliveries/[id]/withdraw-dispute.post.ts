import { deliveryWithdrawSchema } from '#shared/schemas/delivery'
import { idParamSchema } from '#shared/schemas/fields'
import { getDelivery, withdrawDispute } from '../../../services/deliveries'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.disputeDeliveries)
  const { id } = parseParams(event, idParamSchema)
  const input = await parseBody(event, deliveryWithdrawSchema)
  await withdrawDispute(user, id, input)
  return getDelivery(user, id)
})
