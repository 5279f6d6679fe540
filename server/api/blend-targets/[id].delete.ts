import { idParamSchema } from '#shared/schemas/fields'
import { deleteBlendTarget } from '../../services/blendTargets'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeBlends)
  const { id } = parseParams(event, idParamSchema)
  await deleteBlendTarget(user.orgId, user.id, id)
  setResponseStatus(event, 204)
  return null
})
