import { idParamSchema } from '#shared/schemas/fields'
import { deleteBlock } from '../../services/blocks'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeBlocks)
  const { id } = parseParams(event, idParamSchema)
  await deleteBlock(user.orgId, user.id, id)
  setResponseStatus(event, 204)
  return null
})
