import { createHash } from 'node:crypto'
import { LAB_SHEET_CONTENT_TYPES, LAB_SHEET_PREVIEW_ROWS, type LabSheetKind } from '#shared/schemas/labSheet'
import type { SessionUser } from '#shared/types/auth'
import type { LabSheetDetail, LabSheetList, LabSheetUploaded } from '#shared/types/labSheet'
import {
  contractedSheetLotIds, findLabSheet, insertLabSheet, keysInUse, listLabSheets, lotIdsOfSheet, sheetIdsBySha, type StoredSheet,
} from '../repositories/labSheets'
import { lotIdsVisibleTo } from '../repositories/lots'
import { recordAudit } from '../utils/audit'
import { isDbError, useDb, type Db } from '../utils/db'
import { deleteSheetObject, labSheetKey, presignSheetDownload, putSheetObject, sheetObjectBytes } from '../utils/labStorage'
import { judgeSheet } from '../utils/sheetKind'
import { readSheet, SheetUnreadable, type SheetTable } from '../utils/sheets'
import type { UploadPart } from '../utils/uploadParts'
import { fieldError, notFound } from '../utils/validation'

// Lab and juice sheets as files: uploaded by a grower, kept unchanged in the file store with a row
// here, and read back for a preview or a download. An upload of several files is all or nothing:
// every file is judged before any is stored, and a failure after some were stored removes them.
// The same bytes twice in one organisation are one sheet.

type Member = SessionUser & { orgId: number }

const ER_DUP_ENTRY = 1062

interface Judged { name: string, kind: LabSheetKind, bytes: Buffer, sha256: string, table?: SheetTable, problem?: string }

/** The name as the person knows it: no folder, no control characters, at most 255 characters. */
function fileName(sent: string): string {
  // eslint-disable-next-line no-control-regex
  const name = (sent.split(/[\\/]/).pop() ?? '').replace(/[\x00-\x1F\x7F]/g, '').trim()
  return (name || 'sheet').slice(0, 255)
}

async function tableOf(kind: LabSheetKind, bytes: Uint8Array): Promise<{ table?: SheetTable, problem?: string }> {
  if (kind === 'pdf') return {}
  try {
    return { table: await readSheet(kind, bytes) }
  }
  catch (error) {
    if (error instanceof SheetUnreadable) return { problem: error.message }
    throw error
  }
}

async function judgeAll(parts: UploadPart[]): Promise<Judged[]> {
  const files = parts.filter(p => p.field === 'file' && p.filename !== undefined)
  if (!files.length) throw fieldError([{ path: 'file', message: 'Choose at least one CSV, XLSX or PDF file' }])
  const judged: Judged[] = []
  for (const part of files) {
    const name = fileName(part.filename!)
    const verdict = await judgeSheet(name, part.data)
    if (!verdict.ok) {
      throw fieldError([{ path: 'file', message: verdict.message }], { statusCode: part.data.length ? 415 : 400, message: verdict.message })
    }
    const sha256 = createHash('sha256').update(part.data).digest('hex')
    judged.push({ name, kind: verdict.kind, bytes: part.data, sha256, ...await tableOf(verdict.kind, part.data) })
  }
  return judged
}

/** Removes objects this upload stored, unless a sheet row names them (the same file, uploaded at the same time by someone else). */
async function removeStored(keys: string[]): Promise<void> {
  if (!keys.length) return
  const inUse = await keysInUse(useDb(), keys).catch(() => new Set<string>())
  // Best effort: the error that caused the clean-up is the one the caller hears about.
  await Promise.allSettled(keys.filter(k => !inUse.has(k)).map(deleteSheetObject))
}

async function recordSheets(user: Member, files: Judged[]): Promise<Map<string, { id: number, duplicateOf?: number }>> {
  return useDb().transaction(async (trx) => {
    const earlier = await sheetIdsBySha(trx, user.orgId, files.map(f => f.sha256))
    const ids = new Map<string, { id: number, duplicateOf?: number }>()
    for (const file of files) {
      const known = ids.get(file.sha256)?.id ?? earlier.get(file.sha256)
      if (known !== undefined) {
        ids.set(file.sha256, { id: known, duplicateOf: known })
        continue
      }
      const id = await insertLabSheet(trx, {
        orgId: user.orgId, name: file.name, objectKey: labSheetKey(user.orgId, file.sha256), sha256: file.sha256, sizeBytes: file.bytes.length,
        contentType: LAB_SHEET_CONTENT_TYPES[file.kind], kind: file.kind, headers: file.table?.headers ?? null, uploadedByUserId: user.id, uploadedByName: user.name,
      })
      await recordAudit(trx, { orgId: user.orgId, actorUserId: user.id, action: 'lab_sheet.uploaded', objectType: 'lab_sheet', objectId: id, detail: { name: file.name, sha256: file.sha256, sizeBytes: file.bytes.length } })
      ids.set(file.sha256, { id })
    }
    return ids
  })
}

export async function uploadLabSheets(user: Member, parts: UploadPart[]): Promise<LabSheetUploaded[]> {
  const files = await judgeAll(parts)
  const earlier = await sheetIdsBySha(useDb(), user.orgId, files.map(f => f.sha256))
  const fresh = [...new Map(files.filter(f => !earlier.has(f.sha256)).map(f => [f.sha256, f])).values()]
  const stored: string[] = []
  try {
    for (const file of fresh) {
      const key = labSheetKey(user.orgId, file.sha256)
      await putSheetObject(key, file.bytes, LAB_SHEET_CONTENT_TYPES[file.kind], file.sha256)
      stored.push(key)
    }
  }
  catch (error) {
    await removeStored(stored)
    throw error
  }
  let ids: Map<string, { id: number, duplicateOf?: number }>
  try {
    // Twice at most: the same file uploaded at the same moment by another member makes the first try a duplicate.
    ids = await recordSheets(user, files).catch(error => (isDbError(error, ER_DUP_ENTRY) ? recordSheets(user, files) : Promise.reject(error)))
  }
  catch (error) {
    await removeStored(stored)
    throw error
  }
  return files.map(({ table, problem, ...file }) => {
    const { id, duplicateOf } = ids.get(file.sha256)!
    return {
      id, name: file.name, sha256: file.sha256, sizeBytes: file.bytes.length, contentType: LAB_SHEET_CONTENT_TYPES[file.kind], kind: file.kind,
      ...(duplicateOf === undefined ? {} : { duplicateOf }),
      ...(table ? { headers: table.headers, preview: table.rows.slice(0, LAB_SHEET_PREVIEW_ROWS) } : {}),
      ...(problem ? { problem } : {}),
    }
  })
}

/** The lots of other organisations' sheets this maker may see; none for a grower. */
async function visibleLotIds(db: Db, user: Member): Promise<number[]> {
  if (user.orgKind !== 'maker') return []
  const candidates = await contractedSheetLotIds(db, user.orgId)
  return candidates.length ? [...await lotIdsVisibleTo(db, user.orgId, candidates)] : []
}

export async function listLabSheetsFor(user: Member, page: { limit: number, offset: number }): Promise<LabSheetList> {
  const db = useDb()
  return listLabSheets(db, user.orgId, await visibleLotIds(db, user), page)
}

/** The sheet, and whether the caller may see all of it: its own, or (a maker) every lot on it one the maker may see. */
async function sheetFor(user: Member, id: number): Promise<{ stored: StoredSheet, whole: boolean }> {
  const db = useDb()
  const visible = await visibleLotIds(db, user)
  const stored = await findLabSheet(db, user.orgId, id, visible)
  if (!stored) notFound('That lab sheet')
  if (stored.orgId === user.orgId) return { stored, whole: true }
  const lots = await lotIdsOfSheet(db, id)
  const seen = new Set(visible)
  return { stored, whole: lots.every(lot => seen.has(lot)) }
}

export async function getLabSheet(user: Member, id: number): Promise<LabSheetDetail> {
  const { stored, whole } = await sheetFor(user, id)
  const { sheet } = stored
  if (!whole || sheet.kind === 'pdf') return { ...sheet, ...(whole ? {} : { headers: null }), preview: null, problem: null }
  const { table, problem } = await tableOf(sheet.kind, await sheetObjectBytes(stored.objectKey))
  return {
    ...sheet,
    preview: table ? { rows: table.rows.slice(0, LAB_SHEET_PREVIEW_ROWS), rowCount: table.rows.length } : null,
    problem: problem ?? null,
  }
}

/**
 * A PDF sheet's bytes, to show inside the page beside the form its readings are typed into (the
 * file store's own links are on another origin, which the page may not frame). Only PDFs: a CSV or
 * workbook is read into the preview instead.
 */
export async function labSheetPdf(user: Member, id: number): Promise<{ bytes: Uint8Array, name: string }> {
  const { stored, whole } = await sheetFor(user, id)
  if (!whole || stored.sheet.kind !== 'pdf') notFound('That PDF sheet')
  return { bytes: await sheetObjectBytes(stored.objectKey), name: stored.sheet.name }
}

/** A link to the file as uploaded, for the owner, and for a maker who may see every lot on it. */
export async function labSheetDownloadUrl(user: Member, id: number): Promise<string> {
  const { stored, whole } = await sheetFor(user, id)
  if (!whole) notFound('That lab sheet')
  return presignSheetDownload(stored.objectKey, stored.sheet.name, stored.sheet.contentType)
}
