import { noticeListQuerySchema } from '#shared/schemas/notice'
import { listNotices } from '../../repositories/notices'

// The signed-in person's own notices, newest first, with how many are unread.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.notices)
  const page = parseQuery(event, noticeListQuerySchema)
  return listNotices(user.id, page)
})
