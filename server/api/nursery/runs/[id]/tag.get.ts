import { idParamSchema } from '#shared/schemas/fields'
import { runTag } from '../../../../services/nurseryRuns'

// The run's tag: `{ code, url, qrSvg }`. Reading it records no printing (POST /api/nursery/tags/printed does).
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readNursery)
  const { id } = parseParams(event, idParamSchema)
  return runTag(user.orgId, id)
})
