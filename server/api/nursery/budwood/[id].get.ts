import { idParamSchema } from '#shared/schemas/fields'
import { getBudwood } from '../../../services/budwood'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readNursery)
  const { id } = parseParams(event, idParamSchema)
  return getBudwood(user.orgId, id)
})
