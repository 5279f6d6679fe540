import { pageQuerySchema } from '#shared/schemas/fields'
import { listBudwood } from '../../../repositories/budwood'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readNursery)
  const page = parseQuery(event, pageQuerySchema)
  return listBudwood(user.orgId, page)
})
