import { forecastQuerySchema } from '#shared/schemas/block'
import { makerSupplyReport } from '../../services/needs'

// The maker's need per juice class and year against its accepted fruit contracts and the trees it has bought.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readNeeds)
  const span = parseQuery(event, forecastQuerySchema)
  return makerSupplyReport(user.orgId, span)
})
