import { profilePatchSchema } from '#shared/schemas/account'
import { findProfile, updateProfile } from '../repositories/users'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event, { roles: ['owner', 'member', 'viewer', 'admin'] })
  const patch = await parseBody(event, profilePatchSchema)
  return findProfile(await updateProfile(user.id, patch))
})
