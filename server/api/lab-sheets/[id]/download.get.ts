import { idParamSchema } from '#shared/schemas/fields'
import { labSheetDownloadUrl } from '../../../services/labSheets'

// A redirect to a link of the file store's, good for five minutes: the file never passes through the app.
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readLabSheets)
  const { id } = parseParams(event, idParamSchema)
  setResponseHeader(event, 'cache-control', 'no-store')
  return sendRedirect(event, await labSheetDownloadUrl(user, id), 302)
})
