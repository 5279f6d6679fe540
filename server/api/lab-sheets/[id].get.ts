import { idParamSchema } from '#shared/schemas/fields'
import { getLabSheet } from '../../services/labSheets'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readLabSheets)
  const { id } = parseParams(event, idParamSchema)
  return getLabSheet(user, id)
})
