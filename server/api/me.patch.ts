import { profilePatchSchema } from '#shared/schemas/account'
import { findProfile, updateProfile } from '../repositories/users'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event, ACCESS_RULES.signedIn)
  const patch = await parseBody(event, profilePatchSchema)
  return findProfile(await updateProfile(user.id, patch))
})
