import type { LabSheet } from './lot'

// The answers of the lab-sheet routes beyond the stored sheet itself (shared/types/lot.ts).

export interface LabSheetPreview {
  /** The first rows under the header, each cell as text. */
  rows: string[][]
  /** Rows under the header in the whole sheet. */
  rowCount: number
}

/** One file of an upload, as stored (or as found already stored). */
export interface LabSheetUploaded {
  id: number
  name: string
  sha256: string
  sizeBytes: number
  contentType: string
  kind: LabSheet['kind']
  /** The earlier sheet of the same bytes, when this file was one already uploaded. */
  duplicateOf?: number
  headers?: string[]
  preview?: string[][]
  /** Why a CSV or XLSX sheet's table could not be read (the file is stored all the same). */
  problem?: string
}

/** A sheet with who uploaded it, whether it is imported, and its first rows. */
export interface LabSheetDetail extends LabSheet {
  preview: LabSheetPreview | null
  problem: string | null
}

export interface LabSheetList {
  items: LabSheet[]
  total: number
}
