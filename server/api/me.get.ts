import { findProfile } from '../repositories/users'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event, ACCESS_RULES.signedIn)
  return findProfile(user)
})
