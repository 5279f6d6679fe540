import { pageQuerySchema } from '#shared/schemas/fields'
import { listBeds } from '../../../repositories/nurseryBeds'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readNursery)
  const page = parseQuery(event, pageQuerySchema)
  return listBeds(user.orgId, page)
})
