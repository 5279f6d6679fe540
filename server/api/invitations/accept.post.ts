import { acceptInvitationSchema } from '#shared/schemas/account'
import { acceptInvitation } from '../../services/accounts'

export default defineEventHandler(async (event) => {
  const input = await parseBody(event, acceptInvitationSchema)
  setResponseStatus(event, 201)
  return acceptInvitation(input)
})
