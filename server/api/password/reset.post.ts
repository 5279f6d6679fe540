import { resetPasswordSchema } from '#shared/schemas/account'
import { resetPassword } from '../../services/accounts'

export default defineEventHandler(async (event) => {
  const { token, password } = await parseBody(event, resetPasswordSchema)
  await resetPassword(token, password)
  return { ok: true }
})
