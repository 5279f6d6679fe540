import { pageQuerySchema } from '#shared/schemas/fields'
import { linerStockOf } from '../../../services/liners'

// Stock per rootstock and grade (lifted + bought − lined out), and a page of the lots behind it.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readNursery)
  const page = parseQuery(event, pageQuerySchema)
  return linerStockOf(user.orgId, page)
})
