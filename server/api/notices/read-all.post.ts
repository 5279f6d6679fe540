import { markAllNoticesRead } from '../../repositories/notices'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.notices)
  return { marked: await markAllNoticesRead(user.id), unread: 0 }
})
