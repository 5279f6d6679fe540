import { idParamSchema } from '#shared/schemas/fields'
import { eventCreateSchema } from '#shared/schemas/nursery'
import { recordEvent } from '../../../../services/nurseryRuns'

// Records one event: 201 with it; 200 with the earlier one when its entry key was recorded before.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeNursery)
  const { id } = parseParams(event, idParamSchema)
  const input = await parseBody(event, eventCreateSchema)
  const { event: recorded, replayed } = await recordEvent(user, id, input)
  setResponseStatus(event, replayed ? 200 : 201)
  return recorded
})
