import { idParamSchema } from '#shared/schemas/fields'
import { getBlendTarget } from '../../services/blendTargets'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readBlends)
  const { id } = parseParams(event, idParamSchema)
  return getBlendTarget(user.orgId, id)
})
