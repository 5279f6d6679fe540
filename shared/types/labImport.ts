import type { ColumnMapping, DateFormat, RowIssue } from '../utils/labImport'
import type { LabSheet } from './lot'

/** What the import page needs of a sheet: its headers, its first rows and the mapping to offer. */
export interface LabSheetMapping {
  sheet: LabSheet
  /** Empty for a PDF sheet, whose readings are typed by hand. */
  headers: string[]
  /** The first rows under the header, as read. */
  preview: string[][]
  rowCount: number
  /** The mapping last used for a sheet of these headers, else one suggested from the header names. */
  mapping: Partial<ColumnMapping>
  dateFormat: DateFormat
  decimalComma: boolean
  /** True when the mapping is one saved by the organisation for these headers. */
  saved: boolean
}

/** The rows kept, and the rows left out (with why) when bad rows were skipped. */
export interface LabImportResult { imported: number, skipped: number, errors: RowIssue[] }
