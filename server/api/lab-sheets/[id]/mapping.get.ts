import { idParamSchema } from '#shared/schemas/fields'
import { sheetMapping } from '../../../services/labImport'

// The sheet's headers, its first rows and the mapping to offer: the one saved for these headers, else a suggestion.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeLabSheets)
  const { id } = parseParams(event, idParamSchema)
  return sheetMapping(user.orgId, id)
})
