import type { LabSheet } from '#shared/types/lot'
import type { ColumnMapping, ImportLot, ImportOptions } from '#shared/utils/labImport'
import type { Db } from '../utils/db'

// Scoped queries for importing lab sheets: every one names the organisation.

const SHEET_COLUMNS = ['id', 'name', 'objectKey', 'sha256', 'sizeBytes', 'contentType', 'kind', 'headers', 'uploadedByName', 'uploadedAt', 'importedAt', 'importedCount', 'skippedCount']

type SheetRow = Omit<LabSheet, 'headers' | 'uploadedAt' | 'importedAt'> & { objectKey: string, headers: string | string[] | null, uploadedAt: Date, importedAt: Date | null }

const json = <T>(value: string | T | null): T | null => (typeof value === 'string' ? JSON.parse(value) as T : value)

function toSheet({ objectKey, headers, uploadedAt, importedAt, ...row }: SheetRow): LabSheet & { objectKey: string } {
  return {
    ...row, objectKey, headers: json<string[]>(headers),
    uploadedAt: new Date(uploadedAt).toISOString(), importedAt: importedAt === null ? null : new Date(importedAt).toISOString(),
  }
}

/** The organisation's sheet, locked for the import when `lock` is set; null when it has none of that id. */
export async function findOrgSheet(db: Db, orgId: number, id: number, lock = false): Promise<(LabSheet & { objectKey: string }) | null> {
  const query = db('labSheets').where({ id, orgId }).first(SHEET_COLUMNS)
  const row = await (lock ? query.forUpdate() : query) as SheetRow | undefined
  return row ? toSheet(row) : null
}

/** Every lot of the organisation with its code, picking day and species, for matching a sheet's rows. */
export async function orgLotsForImport(db: Db, orgId: number): Promise<(ImportLot & { code: string })[]> {
  return db('harvestLots as l').join('varieties as v', 'v.id', 'l.varietyId').where('l.orgId', orgId)
    .select('l.id', 'l.code', 'l.pickedOn', 'v.species')
}

export async function orgCalibrationC(db: Db, orgId: number): Promise<number> {
  const row = await db('organisations').where({ id: orgId }).first('hydrometerCalibrationC') as { hydrometerCalibrationC: string | number } | undefined
  return Number(row?.hydrometerCalibrationC ?? 20)
}

export interface SavedMapping { mapping: ColumnMapping, options: ImportOptions }

export async function findSavedMapping(db: Db, orgId: number, headersKey: string): Promise<SavedMapping | null> {
  const row = await db('sheetMappings').where({ orgId, headersKey }).first('mapping', 'options') as { mapping: string, options: string } | undefined
  return row ? { mapping: json<ColumnMapping>(row.mapping)!, options: json<ImportOptions>(row.options)! } : null
}

/** Keeps the mapping for the organisation's sheets of these headers, replacing the one before. */
export async function saveMapping(db: Db, orgId: number, headersKey: string, headers: readonly string[], saved: SavedMapping): Promise<void> {
  const values = { headers: JSON.stringify(headers), mapping: JSON.stringify(saved.mapping), options: JSON.stringify(saved.options) }
  await db('sheetMappings').insert({ orgId, headersKey, ...values }).onConflict(['orgId', 'headersKey']).merge({ ...values, updatedAt: db.fn.now(3) })
}

export interface ReadingInsert {
  orgId: number
  lotId: number
  labSheetId: number
  sheetRow: number
  sampledOn: string
  brix: number | null
  sg: number | null
  sgAsRead: number | null
  tempC: number | null
  taGPerL: number | null
  taReportedAs: string | null
  taReportedValue: number | null
  taReportedUnit: string | null
  ph: number | null
  tanninGPerL: number | null
  yanMgPerL: number | null
  enteredByUserId: number
}

/** Inserts the readings in batches, so a sheet of thousands of rows is a few statements. */
export async function insertReadings(db: Db, rows: readonly ReadingInsert[]): Promise<void> {
  for (let i = 0; i < rows.length; i += 1000) await db('juiceReadings').insert(rows.slice(i, i + 1000))
}

export async function markSheetImported(db: Db, orgId: number, id: number, counts: { imported: number, skipped: number }): Promise<void> {
  await db('labSheets').where({ id, orgId }).update({ importedAt: db.fn.now(3), importedCount: counts.imported, skippedCount: counts.skipped })
}
