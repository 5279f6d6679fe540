import { signUpSchema } from '#shared/schemas/account'
import { signUp } from '../../services/accounts'

export default defineEventHandler(async (event) => {
  const input = await parseBody(event, signUpSchema)
  await signUp(input)
  setResponseStatus(event, 201)
  return { ok: true, message: `We sent a confirmation link to ${input.email}.` }
})
