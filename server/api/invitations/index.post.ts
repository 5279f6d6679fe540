import { inviteSchema } from '#shared/schemas/account'
import { invite } from '../../services/accounts'

export default defineEventHandler(async (event) => {
  const owner = await requireMember(event, { roles: OWNERS })
  const input = await parseBody(event, inviteSchema)
  setResponseStatus(event, 201)
  return invite(owner, input)
})
