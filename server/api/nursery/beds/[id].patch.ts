import { idParamSchema } from '#shared/schemas/fields'
import { bedPatchSchema } from '#shared/schemas/nursery'
import { getBed, updateBed } from '../../../services/nurseryBeds'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeNursery)
  const { id } = parseParams(event, idParamSchema)
  const patch = await parseBody(event, bedPatchSchema)
  await updateBed(user.orgId, user.id, id, patch)
  return getBed(user.orgId, id)
})
