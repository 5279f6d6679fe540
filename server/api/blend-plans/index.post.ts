import { blendPlanCreateSchema } from '#shared/schemas/blendPlan'
import { createPlan, getPlan } from '../../services/blendPlans'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeBlends)
  const input = await parseBody(event, blendPlanCreateSchema)
  const id = await createPlan(user, input)
  setResponseStatus(event, 201)
  return getPlan(user, id)
})
