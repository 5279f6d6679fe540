import { idParamSchema } from '#shared/schemas/fields'
import { labImportSchema } from '#shared/schemas/labImport'
import { importSheet } from '../../../services/labImport'

// Imports a CSV or XLSX sheet's readings by the mapping: 200 { imported, skipped, errors }, or 422
// with every bad row in data.errors and nothing kept (unless skipBadRows).
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeLabSheets)
  const { id } = parseParams(event, idParamSchema)
  const input = await parseBody(event, labImportSchema)
  return importSheet(user, id, input)
})
