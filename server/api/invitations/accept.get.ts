import { tokenSchema } from '#shared/schemas/account'
import { lookupInvitation } from '../../services/accounts'

// Public: the invited person is not signed in yet; the token is the credential.
export default defineEventHandler(async (event) => {
  const { token } = parseQuery(event, tokenSchema)
  return lookupInvitation(token)
})
