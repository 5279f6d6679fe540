import { idParamSchema } from '#shared/schemas/fields'
import { getLot } from '../../services/lots'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readLots)
  const { id } = parseParams(event, idParamSchema)
  return getLot(user.orgId, id)
})
