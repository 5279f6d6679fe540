import { runCreateSchema } from '#shared/schemas/nursery'
import { createRun, getRun } from '../../../services/nurseryRuns'

// Lines out a run: its positions, its liners from stock and its tag code, with the lined-out event.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeNursery)
  const input = await parseBody(event, runCreateSchema)
  const id = await createRun(user, input)
  setResponseStatus(event, 201)
  return getRun(user.orgId, id)
})
