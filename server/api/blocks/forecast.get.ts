import { forecastQuerySchema } from '#shared/schemas/block'
import { organisationForecast } from '../../services/blocks'

// The organisation's yield forecast, kg per juice class and year, from every block's bearing curve.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readBlocks)
  const span = parseQuery(event, forecastQuerySchema)
  return organisationForecast(user.orgId, span)
})
