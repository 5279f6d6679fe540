import { listInvitations } from '../../services/accounts'

export default defineEventHandler(async (event) => {
  const owner = await requireMember(event, { roles: OWNERS })
  return listInvitations(owner.orgId)
})
