import { listInvitations } from '../../services/accounts'

export default defineEventHandler(async (event) => {
  const owner = await requireMember(event, ACCESS_RULES.manageMembers)
  return listInvitations(owner.orgId)
})
