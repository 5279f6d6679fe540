import { lotCreateSchema } from '#shared/schemas/lot'
import { createLot, getLot } from '../../services/lots'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeLots)
  const input = await parseBody(event, lotCreateSchema)
  const id = await createLot(user.orgId, user.id, input)
  setResponseStatus(event, 201)
  return getLot(user.orgId, id)
})
