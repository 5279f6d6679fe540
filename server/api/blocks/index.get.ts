import { blockListQuerySchema } from '#shared/schemas/block'
import { listBlocks } from '../../repositories/blocks'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readBlocks)
  const page = parseQuery(event, blockListQuerySchema)
  return listBlocks(user.orgId, page)
})
