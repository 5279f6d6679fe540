import { idParamSchema, pageQuerySchema } from '#shared/schemas/fields'
import { listRunEvents } from '../../../../services/nurseryRuns'

// The run's events in date order (one day's in the order recorded): `{ items, total }`.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readNursery)
  const { id } = parseParams(event, idParamSchema)
  const page = parseQuery(event, pageQuerySchema)
  return listRunEvents(user.orgId, id, page)
})
