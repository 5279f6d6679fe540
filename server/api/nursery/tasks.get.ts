import { taskListQuerySchema } from '#shared/schemas/nurseryTasks'
import { listNurseryTasks } from '../../services/nurseryTasks'

// The nursery's season calendar: what must be done by when, sorted by due date, `{ items, total }`.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readNursery)
  const query = parseQuery(event, taskListQuerySchema)
  return listNurseryTasks(user.orgId, query)
})
