import { blendPlanListQuerySchema } from '#shared/schemas/blendPlan'
import { listPlans } from '../../services/blendPlans'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readBlends)
  const query = parseQuery(event, blendPlanListQuerySchema)
  return listPlans(user, query)
})
