import { LAB_SHEET_MAX_BYTES, LAB_SHEET_MAX_FILES, LAB_SHEET_MAX_REQUEST_BYTES } from '#shared/schemas/labSheet'
import { uploadLabSheets } from '../../services/labSheets'
import { readUploadParts } from '../../utils/uploadParts'

export default defineEventHandler(async (event) => {
  const user = await requireMember(event, ACCESS_RULES.writeLabSheets)
  const parts = await readUploadParts(event, {
    requestBytes: LAB_SHEET_MAX_REQUEST_BYTES,
    partBytes: LAB_SHEET_MAX_BYTES,
    parts: LAB_SHEET_MAX_FILES,
    tooBig: name => `${name} is larger than ${LAB_SHEET_MAX_BYTES / 1024 / 1024} MiB, the most a lab sheet may be.`,
  })
  const sheets = await uploadLabSheets(user, parts)
  setResponseStatus(event, 201)
  return sheets
})
