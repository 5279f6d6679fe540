import { rowListQuerySchema } from '#shared/schemas/nursery'
import { listRowsFor } from '../../../services/nurseryRuns'

// The rows of the nursery's fields, by field and row: `{ items, total }`.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readNursery)
  const query = parseQuery(event, rowListQuerySchema)
  return listRowsFor(user.orgId, query)
})
