import { forgotPasswordSchema } from '#shared/schemas/account'
import { requestPasswordReset } from '../../services/accounts'

export default defineEventHandler(async (event) => {
  const { email } = await parseBody(event, forgotPasswordSchema)
  await requestPasswordReset(email)
  return { ok: true, message: 'If that address has an account, a reset link is on its way.' }
})
