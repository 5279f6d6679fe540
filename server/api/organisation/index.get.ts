import { getSettings } from '../../services/organisations'

// The caller's own organisation's settings: its owners, members and viewers read them.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readSettings)
  return getSettings(user.orgId)
})
