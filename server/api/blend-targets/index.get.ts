import { blendTargetListQuerySchema } from '#shared/schemas/blend'
import { listBlendTargets } from '../../services/blendTargets'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readBlends)
  const query = parseQuery(event, blendTargetListQuerySchema)
  return listBlendTargets(user.orgId, query)
})
