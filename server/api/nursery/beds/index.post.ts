import { bedCreateSchema } from '#shared/schemas/nursery'
import { createBed, getBed } from '../../../services/nurseryBeds'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeNursery)
  const input = await parseBody(event, bedCreateSchema)
  const id = await createBed(user.orgId, user.id, input)
  setResponseStatus(event, 201)
  return getBed(user.orgId, id)
})
