import { blendPlanMoveSchema } from '#shared/schemas/blendPlan'
import { idParamSchema } from '#shared/schemas/fields'
import { releasePlan, getPlan } from '../../../services/blendPlans'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeBlends)
  const { id } = parseParams(event, idParamSchema)
  await parseBody(event, blendPlanMoveSchema)
  await releasePlan(user, id)
  return getPlan(user, id)
})
