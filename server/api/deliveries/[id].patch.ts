import { deliveryPatchSchema } from '#shared/schemas/delivery'
import { idParamSchema } from '#shared/schemas/fields'
import { correctDelivery, getDelivery } from '../../services/deliveries'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.recordDeliveries)
  const { id } = parseParams(event, idParamSchema)
  const patch = await parseBody(event, deliveryPatchSchema)
  await correctDelivery(user, id, patch)
  return getDelivery(user, id)
})
