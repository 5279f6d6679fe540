import { pageQuerySchema } from './fields'

// Lab and juice sheets as uploaded: the limits the upload form, the server and the request-size
// limiter in nuxt.config.ts all read, and the list's query.

const MiB = 1024 * 1024

/** The largest file a sheet may be. */
export const LAB_SHEET_MAX_BYTES = 10 * MiB
/** The most files one upload may carry. */
export const LAB_SHEET_MAX_FILES = 5
/** Room for each part's boundary and headers (the file's name and type) around its bytes. */
export const LAB_SHEET_PART_FRAMING_BYTES = 16 * 1024
/** The largest upload request: every file at its largest, and its framing. */
export const LAB_SHEET_MAX_REQUEST_BYTES = LAB_SHEET_MAX_FILES * (LAB_SHEET_MAX_BYTES + LAB_SHEET_PART_FRAMING_BYTES)
/** The rows under the header shown before an import. */
export const LAB_SHEET_PREVIEW_ROWS = 10

/** A sheet's kind, judged from its bytes; the name's ending must agree. */
export const LAB_SHEET_KINDS = ['csv', 'xlsx', 'pdf'] as const
export type LabSheetKind = typeof LAB_SHEET_KINDS[number]

export const LAB_SHEET_CONTENT_TYPES: Record<LabSheetKind, string> = {
  csv: 'text/csv',
  xlsx: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
  pdf: 'application/pdf',
}

/** The endings a name of each kind may have. A lab's text export is often .txt or .tsv. */
export const LAB_SHEET_NAME_ENDINGS: Record<LabSheetKind, readonly string[]> = {
  csv: ['csv', 'tsv', 'txt'],
  xlsx: ['xlsx'],
  pdf: ['pdf'],
}

/** What the file picker offers. */
export const LAB_SHEET_ACCEPT = '.csv,.tsv,.txt,.xlsx,.pdf,text/csv,application/pdf,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet'

export const labSheetListQuerySchema = pageQuerySchema
