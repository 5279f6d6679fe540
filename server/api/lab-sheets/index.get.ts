import { labSheetListQuerySchema } from '#shared/schemas/labSheet'
import { listLabSheetsFor } from '../../services/labSheets'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readLabSheets)
  const page = parseQuery(event, labSheetListQuerySchema)
  return listLabSheetsFor(user, page)
})
