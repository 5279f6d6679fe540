import { deliverySettleSchema } from '#shared/schemas/delivery'
import { idParamSchema } from '#shared/schemas/fields'
import { getDelivery, settleRecordedDelivery } from '../../../services/deliveries'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.recordDeliveries)
  const { id } = parseParams(event, idParamSchema)
  const input = await parseBody(event, deliverySettleSchema)
  await settleRecordedDelivery(user, id, input)
  return getDelivery(user, id)
})
