import { z } from 'zod'
import { getRunByTag } from '../../../../services/nurseryRuns'

const codeParamSchema = z.object({ code: z.string({ message: 'Give the tag code' }).max(40, { message: 'A tag code is ten letters and digits' }) })

// The run a scanned or typed tag code names; another organisation's code is not found (404).
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readNursery)
  const { code } = parseParams(event, codeParamSchema)
  return getRunByTag(user.orgId, code)
})
