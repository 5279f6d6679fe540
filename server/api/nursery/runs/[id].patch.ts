import { idParamSchema } from '#shared/schemas/fields'
import { runPatchSchema } from '#shared/schemas/nursery'
import { getRun, updateRun } from '../../../services/nurseryRuns'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeNursery)
  const { id } = parseParams(event, idParamSchema)
  const patch = await parseBody(event, runPatchSchema)
  await updateRun(user, id, patch)
  return getRun(user.orgId, id)
})
