import { forecastQuerySchema } from '#shared/schemas/block'
import { organisationForecast } from '../../services/blocks'

// The organisation's yield forecast, kg per juice class and year, from every block's bearing curve.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, { orgKind: 'grower', roles: READERS })
  const span = parseQuery(event, forecastQuerySchema)
  return organisationForecast(user.orgId, span)
})
