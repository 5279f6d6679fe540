import { blendPlanPatchSchema } from '#shared/schemas/blendPlan'
import { idParamSchema } from '#shared/schemas/fields'
import { getPlan, updatePlan } from '../../services/blendPlans'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeBlends)
  const { id } = parseParams(event, idParamSchema)
  const input = await parseBody(event, blendPlanPatchSchema)
  await updatePlan(user, id, input)
  return getPlan(user, id)
})
