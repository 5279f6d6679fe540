import { rowCreateSchema } from '#shared/schemas/nursery'
import { createRow, getRow } from '../../../services/nurseryRuns'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeNursery)
  const input = await parseBody(event, rowCreateSchema)
  const id = await createRow(user, input)
  setResponseStatus(event, 201)
  return getRow(user.orgId, id)
})
