import { signUpSchema } from '#shared/schemas/account'
import { signUp } from '../../services/accounts'

export default defineEventHandler(async (event) => {
  const input = await parseBody(event, signUpSchema)
  await signUp(input)
  setResponseStatus(event, 201)
  return { ok: true, message: `A confirmation link is on its way to ${input.email}.` }
})
