import { blendTargetCreateSchema } from '#shared/schemas/blend'
import { createBlendTarget, getBlendTarget } from '../../services/blendTargets'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeBlends)
  const input = await parseBody(event, blendTargetCreateSchema)
  const id = await createBlendTarget(user.orgId, user.id, input)
  setResponseStatus(event, 201)
  return getBlendTarget(user.orgId, id)
})
