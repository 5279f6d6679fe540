import { deliveryCreateSchema } from '#shared/schemas/delivery'
import { getDelivery, recordDelivery } from '../../services/deliveries'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.recordDeliveries)
  const input = await parseBody(event, deliveryCreateSchema)
  const id = await recordDelivery(user, input)
  setResponseStatus(event, 201)
  return getDelivery(user, id)
})
