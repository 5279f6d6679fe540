import { idParamSchema } from '#shared/schemas/fields'
import { getRow } from '../../../services/nurseryRuns'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readNursery)
  const { id } = parseParams(event, idParamSchema)
  return getRow(user.orgId, id)
})
