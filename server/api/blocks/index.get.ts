import { blockListQuerySchema } from '#shared/schemas/block'
import { listBlocks } from '../../repositories/blocks'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, { orgKind: 'grower', roles: READERS })
  const page = parseQuery(event, blockListQuerySchema)
  return listBlocks(user.orgId, page)
})
