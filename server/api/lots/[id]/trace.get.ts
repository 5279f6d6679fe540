import { idParamSchema } from '#shared/schemas/fields'
import { traceLot } from '../../../services/blendPlans'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readLots)
  const { id } = parseParams(event, idParamSchema)
  return traceLot(user, id)
})
