import { pageQuerySchema } from '#shared/schemas/fields'
import { listMembers } from '../../repositories/users'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event)
  const page = parseQuery(event, pageQuerySchema)
  return listMembers(user.orgId, page)
})
