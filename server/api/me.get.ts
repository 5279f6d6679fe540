import { findProfile } from '../repositories/users'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event, { roles: ['owner', 'member', 'viewer', 'admin'] })
  return findProfile(user)
})
