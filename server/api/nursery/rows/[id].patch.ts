import { idParamSchema } from '#shared/schemas/fields'
import { rowPatchSchema } from '#shared/schemas/nursery'
import { getRow, updateRowFor } from '../../../services/nurseryRuns'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeNursery)
  const { id } = parseParams(event, idParamSchema)
  const patch = await parseBody(event, rowPatchSchema)
  await updateRowFor(user, id, patch)
  return getRow(user.orgId, id)
})
