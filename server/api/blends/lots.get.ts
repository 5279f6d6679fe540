import { blendLotListQuerySchema } from '#shared/schemas/blend'
import { listBlendLots } from '../../services/blends'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readBlends)
  const query = parseQuery(event, blendLotListQuerySchema)
  return listBlendLots(user.orgId, query)
})
