import { idParamSchema } from '#shared/schemas/fields'
import { lotPatchSchema } from '#shared/schemas/lot'
import { getLot, updateLot } from '../../services/lots'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeLots)
  const { id } = parseParams(event, idParamSchema)
  const patch = await parseBody(event, lotPatchSchema)
  await updateLot(user.orgId, user.id, id, patch)
  return getLot(user.orgId, id)
})
