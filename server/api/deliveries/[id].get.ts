import { idParamSchema } from '#shared/schemas/fields'
import { getDelivery } from '../../services/deliveries'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readDeliveries)
  const { id } = parseParams(event, idParamSchema)
  return getDelivery(user, id)
})
