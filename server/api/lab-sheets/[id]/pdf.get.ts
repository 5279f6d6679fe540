import { idParamSchema } from '#shared/schemas/fields'
import { labSheetPdf } from '../../../services/labSheets'

// A PDF sheet served from the app itself, to be shown in a frame of the sheet's page (see the
// route rule in nuxt.config.ts: this response alone may be framed, by our own pages only).
export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.readLabSheets)
  const { id } = parseParams(event, idParamSchema)
  const { bytes, name } = await labSheetPdf(user, id)
  const fileName = name.replace(/["\\\r\n]/g, '_')
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-length': bytes.length,
    'content-disposition': `inline; filename="${fileName.replace(/[^\x20-\x7E]/g, '_')}"; filename*=UTF-8''${encodeURIComponent(fileName)}`,
    'cache-control': 'private, no-store',
    // The page framing it is cross-origin isolated (COEP credentialless): a framed document must say
    // the same, or the browser blocks it; and it may be framed only by our own pages.
    'cross-origin-embedder-policy': 'credentialless',
    'cross-origin-resource-policy': 'same-origin',
    'content-security-policy': 'frame-ancestors \'self\'',
  })
  return Buffer.from(bytes)
})
