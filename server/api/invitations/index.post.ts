import { inviteSchema } from '#shared/schemas/account'
import { invite } from '../../services/accounts'

export default defineEventHandler(async (event) => {
  const owner = await requireMember(event, ACCESS_RULES.manageMembers)
  const input = await parseBody(event, inviteSchema)
  setResponseStatus(event, 201)
  return invite(owner, input)
})
