import { idParamSchema, pageQuerySchema } from '#shared/schemas/fields'
import { listReadings } from '../../../services/lots'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readLots)
  const { id } = parseParams(event, idParamSchema)
  const page = parseQuery(event, pageQuerySchema)
  return listReadings(user.orgId, id, page)
})
