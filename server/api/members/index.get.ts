import { pageQuerySchema } from '../../../shared/schemas/account'
import { listMembers } from '../../repositories/members'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event)
  const page = parseQuery(event, pageQuerySchema)
  return listMembers(user.orgId, page)
})
