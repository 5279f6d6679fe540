import { idParamSchema } from '#shared/schemas/fields'
import { deletePlan } from '../../services/blendPlans'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeBlends)
  const { id } = parseParams(event, idParamSchema)
  await deletePlan(user, id)
  setResponseStatus(event, 204)
  return null
})
