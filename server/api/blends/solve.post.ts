import { blendSolveSchema } from '#shared/schemas/blend'
import { solveBlendFor } from '../../services/blends'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeBlends)
  const input = await parseBody(event, blendSolveSchema)
  return solveBlendFor(user.orgId, input)
})
