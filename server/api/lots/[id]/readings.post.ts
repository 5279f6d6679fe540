import { idParamSchema } from '#shared/schemas/fields'
import { readingCreateSchema } from '#shared/schemas/lot'
import { addReading } from '../../../services/lots'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeLots)
  const { id } = parseParams(event, idParamSchema)
  const input = await parseBody(event, readingCreateSchema)
  const reading = await addReading(user.orgId, user.id, id, input)
  setResponseStatus(event, 201)
  return reading
})
