import { deliveryDisputeSchema } from '#shared/schemas/delivery'
import { idParamSchema } from '#shared/schemas/fields'
import { disputeDelivery, getDelivery } from '../../../services/deliveries'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.disputeDeliveries)
  const { id } = parseParams(event, idParamSchema)
  const input = await parseBody(event, deliveryDisputeSchema)
  await disputeDelivery(user, id, input)
  return getDelivery(user, id)
})
