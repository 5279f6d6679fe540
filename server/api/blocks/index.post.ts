import { blockCreateSchema, forecastQuerySchema } from '#shared/schemas/block'
import { createBlock, getBlock } from '../../services/blocks'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeBlocks)
  const input = await parseBody(event, blockCreateSchema)
  const id = await createBlock(user.orgId, user.id, input)
  setResponseStatus(event, 201)
  return getBlock(user.orgId, id, forecastQuerySchema.parse({}))
})
