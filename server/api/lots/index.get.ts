import { lotListQuerySchema } from '#shared/schemas/lot'
import { listLots } from '../../services/lots'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readLots)
  const query = parseQuery(event, lotListQuerySchema)
  return listLots(user.orgId, query)
})
