import { blendTargetPatchSchema } from '#shared/schemas/blend'
import { idParamSchema } from '#shared/schemas/fields'
import { getBlendTarget, updateBlendTarget } from '../../services/blendTargets'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeBlends)
  const { id } = parseParams(event, idParamSchema)
  const patch = await parseBody(event, blendTargetPatchSchema)
  await updateBlendTarget(user.orgId, user.id, id, patch)
  return getBlendTarget(user.orgId, id)
})
