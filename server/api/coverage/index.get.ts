import { forecastQuerySchema } from '#shared/schemas/block'
import { growerCoverageReport } from '../../services/coverage'

// The grower's forecast per juice class and year against its accepted and open fruit contracts.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.coverage)
  const span = parseQuery(event, forecastQuerySchema)
  return growerCoverageReport(user.orgId, span)
})
