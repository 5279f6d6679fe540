import { tokenSchema } from '#shared/schemas/account'
import { verifyEmail } from '../../services/accounts'

export default defineEventHandler(async (event) => {
  const { token } = await parseBody(event, tokenSchema)
  await verifyEmail(token)
  return { ok: true }
})
