import { idParamSchema } from '#shared/schemas/fields'
import { getBed } from '../../../services/nurseryBeds'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readNursery)
  const { id } = parseParams(event, idParamSchema)
  return getBed(user.orgId, id)
})
