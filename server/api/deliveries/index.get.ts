import { deliveryListQuerySchema } from '#shared/schemas/delivery'
import { listDeliveries } from '../../services/deliveries'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readDeliveries)
  const query = parseQuery(event, deliveryListQuerySchema)
  return listDeliveries(user, query)
})
