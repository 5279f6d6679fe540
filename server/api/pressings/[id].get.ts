import { idParamSchema } from '#shared/schemas/fields'
import { getPressing } from '../../services/blendPlans'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readBlends)
  const { id } = parseParams(event, idParamSchema)
  return getPressing(user, id)
})
