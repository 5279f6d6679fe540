import { createHash } from 'node:crypto'
import { GetObjectCommand, NoSuchKey } from '@aws-sdk/client-s3'
import type { LabImportInput } from '#shared/schemas/labImport'
import type { LabImportResult, LabSheetMapping } from '#shared/types/labImport'
import type { LabSheet } from '#shared/types/lot'
import { normaliseReading, type NormalisedReading, type RawReading } from '#shared/utils/juiceReading'
import { checkRows, headersKeyText, lotsByCode, mappingHeaderIssues, suggestMapping, suggestUnits, type ColumnField, type ColumnMapping, type RowValues } from '#shared/utils/labImport'
import {
  findOrgSheet, findSavedMapping, insertReadings, markSheetImported, orgCalibrationC, orgLotsForImport, saveMapping, type ReadingInsert,
} from '../repositories/labImport'
import { recordAudit } from '../utils/audit'
import { useDb } from '../utils/db'
import { useS3 } from '../utils/s3'
import { readSheet, SheetUnreadable, type SheetTable } from '../utils/sheets'
import { conflict, fieldError, notFound } from '../utils/validation'

// Importing a lab sheet's readings: the file is read from the store, every row is checked against
// the organisation's lots and the trade's ranges, and then either all of it is kept or, when asked,
// the good rows are kept and the bad ones reported. The mapping used is saved for the next sheet
// with the same headers.

const PREVIEW_ROWS = 10
const PDF_MESSAGE = 'This sheet is a PDF: its readings cannot be read from the file, so type them in by hand on the lot.'

/** sha-256 of the header row as normalised, the key of the saved mappings. */
export function headersKey(headers: readonly string[]): string {
  return createHash('sha256').update(headersKeyText(headers)).digest('hex')
}

async function sheetOf(orgId: number, id: number): Promise<LabSheet & { objectKey: string }> {
  const sheet = await findOrgSheet(useDb(), orgId, id)
  if (!sheet) notFound('That lab sheet')
  return sheet
}

async function tableOf(sheet: LabSheet & { objectKey: string }): Promise<SheetTable> {
  const { client, bucket } = useS3()
  let bytes: Uint8Array
  try {
    const object = await client.send(new GetObjectCommand({ Bucket: bucket, Key: sheet.objectKey }))
    bytes = await object.Body!.transformToByteArray()
  }
  catch (error) {
    // The row is there but its file is not: nothing to read, and nothing a retry would change.
    if (error instanceof NoSuchKey) notFound('The file of that lab sheet')
    throw error
  }
  try {
    return await readSheet(sheet.kind as 'csv' | 'xlsx', bytes)
  }
  catch (error) {
    if (error instanceof SheetUnreadable) throw createError({ statusCode: 422, message: error.message })
    throw error
  }
}

export async function sheetMapping(orgId: number, id: number): Promise<LabSheetMapping> {
  const sheet = await sheetOf(orgId, id)
  const { objectKey: _key, ...shown } = sheet
  if (sheet.kind === 'pdf') {
    return { sheet: shown, headers: [], preview: [], rowCount: 0, mapping: {}, dateFormat: 'YYYY-MM-DD', decimalComma: false, saved: false }
  }
  const table = await tableOf(sheet)
  const saved = await findSavedMapping(useDb(), orgId, headersKey(table.headers))
  const base = { sheet: shown, headers: table.headers, preview: table.rows.slice(0, PREVIEW_ROWS), rowCount: table.rows.length }
  if (saved) return { ...base, mapping: saved.mapping, ...saved.options, saved: true }
  const suggested = suggestMapping(table.headers)
  return { ...base, mapping: { ...suggested, ...suggestUnits(table.headers, suggested) }, dateFormat: 'YYYY-MM-DD', decimalComma: false, saved: false }
}

/**
 * Each row's reading through the trade's ranges and corrections (shared/utils/juiceReading); its
 * issues are named by the mapped field, and the insert reuses the reading the check worked out.
 */
function readingsOfRows(mapping: ColumnMapping, calibrationC: number) {
  const done = new Map<number, NormalisedReading>()
  const units = { taAs: mapping.taAs, taUnit: mapping.taUnit, tanninUnit: mapping.tanninUnit }
  return {
    issues(row: RowValues): { field: ColumnField, message: string }[] {
      const result = normaliseReading({ ...row.values, ...units }, { calibrationC, species: row.lot.species })
      if (!result.ok) return result.issues.map(i => ({ field: ISSUE_FIELD[i.field] ?? 'brix', message: i.message }))
      done.set(row.row, result.reading)
      return []
    },
    insert(row: RowValues): Omit<ReadingInsert, 'orgId' | 'labSheetId' | 'enteredByUserId'> {
      return { lotId: row.lot.id, sheetRow: row.row, sampledOn: row.sampledOn, ...done.get(row.row)! }
    },
  }
}

/** The reading's fields by the sheet column they came from (the acid and units belong to their column). */
const ISSUE_FIELD: Partial<Record<keyof RawReading, ColumnField>> = {
  brix: 'brix', sg: 'sg', tempC: 'tempC', ta: 'ta', taAs: 'ta', taUnit: 'ta', ph: 'ph', tannin: 'tannin', tanninUnit: 'tannin', yan: 'yan',
}

const today = () => new Date().toISOString().slice(0, 10)

export async function importSheet(user: { id: number, orgId: number }, id: number, input: LabImportInput): Promise<LabImportResult> {
  const { orgId } = user
  const sheet = await sheetOf(orgId, id)
  if (sheet.kind === 'pdf') conflict(PDF_MESSAGE)
  if (sheet.importedAt) conflict(`This sheet was imported on ${sheet.importedAt.slice(0, 10)}; its readings are on the lots already.`)
  const table = await tableOf(sheet)
  const mapping: ColumnMapping = input.mapping
  const missing = mappingHeaderIssues(mapping, table.headers)
  if (missing.length) throw fieldError(missing)

  const db = useDb()
  const options = { dateFormat: input.dateFormat, decimalComma: input.decimalComma }
  const calibrationC = await orgCalibrationC(db, orgId)
  const lots = lotsByCode(await orgLotsForImport(db, orgId))
  const readings = readingsOfRows(mapping, calibrationC)
  const checked = checkRows(table, mapping, options, { lots, today: today() }, readings.issues)
  if (checked.issues.length && !input.skipBadRows) {
    const rows = checked.badRows.length
    throw createError({
      statusCode: 422,
      message: `${rows} row${rows === 1 ? '' : 's'} of the sheet cannot be imported, so nothing was: correct them, or skip the bad rows.`,
      data: { errors: checked.issues },
    })
  }

  const inserts: ReadingInsert[] = checked.good.map(row => ({ orgId, labSheetId: id, enteredByUserId: user.id, ...readings.insert(row) }))
  const counts = { imported: inserts.length, skipped: checked.badRows.length }
  await db.transaction(async (trx) => {
    // Locked and read again: two imports of one sheet at once keep one.
    const locked = await findOrgSheet(trx, orgId, id, true)
    if (!locked) notFound('That lab sheet')
    if (locked.importedAt) conflict('This sheet has just been imported by someone else; its readings are on the lots already.')
    await insertReadings(trx, inserts)
    await markSheetImported(trx, orgId, id, counts)
    await saveMapping(trx, orgId, headersKey(table.headers), table.headers, { mapping, options })
    await recordAudit(trx, { orgId, actorUserId: user.id, action: 'lab_sheet.imported', objectType: 'lab_sheet', objectId: id, detail: counts })
  })
  return { ...counts, errors: checked.issues }
}
