import { runListQuerySchema } from '#shared/schemas/nursery'
import { listRuns } from '../../../services/nurseryRuns'

// The row map's runs with their counts and warnings, in map order: `{ items, total }`.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readNursery)
  const query = parseQuery(event, runListQuerySchema)
  return listRuns(user.orgId, query)
})
