import { idParamSchema } from '#shared/schemas/fields'
import { deleteLot } from '../../services/lots'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeLots)
  const { id } = parseParams(event, idParamSchema)
  await deleteLot(user.orgId, user.id, id)
  setResponseStatus(event, 204)
  return null
})
