import { idParamSchema } from '#shared/schemas/fields'
import { blockPatchSchema, forecastQuerySchema } from '#shared/schemas/block'
import { getBlock, updateBlock } from '../../services/blocks'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeBlocks)
  const { id } = parseParams(event, idParamSchema)
  const patch = await parseBody(event, blockPatchSchema)
  await updateBlock(user.orgId, user.id, id, patch)
  return getBlock(user.orgId, id, forecastQuerySchema.parse({}))
})
