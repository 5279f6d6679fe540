import { budwoodCreateSchema } from '#shared/schemas/nursery'
import { createBudwood } from '../../../services/budwood'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeNursery)
  const input = await parseBody(event, budwoodCreateSchema)
  const lot = await createBudwood(user.orgId, user.id, input)
  setResponseStatus(event, 201)
  return lot
})
