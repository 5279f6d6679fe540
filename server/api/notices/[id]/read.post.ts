import { idParamSchema } from '#shared/schemas/fields'
import { readNotice } from '../../../services/notices'

// Another person's notice is not found (404), like an unknown id.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.notices)
  const { id } = parseParams(event, idParamSchema)
  return readNotice(user.id, id)
})
