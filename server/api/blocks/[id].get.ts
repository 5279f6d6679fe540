import { idParamSchema } from '#shared/schemas/fields'
import { forecastQuerySchema } from '#shared/schemas/block'
import { getBlock } from '../../services/blocks'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readBlocks)
  const { id } = parseParams(event, idParamSchema)
  const span = parseQuery(event, forecastQuerySchema)
  return getBlock(user.orgId, id, span)
})
