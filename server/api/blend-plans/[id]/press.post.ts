import { pressingSchema } from '#shared/schemas/blendPlan'
import { idParamSchema } from '#shared/schemas/fields'
import { getPlan, pressPlan } from '../../../services/blendPlans'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeBlends)
  const { id } = parseParams(event, idParamSchema)
  const input = await parseBody(event, pressingSchema)
  await pressPlan(user, id, input)
  setResponseStatus(event, 201)
  return getPlan(user, id)
})
