import type { Knex } from 'knex'
import type { LabSheet } from '#shared/types/lot'
import type { Db } from '../utils/db'

// Scoped queries for lab sheets: an organisation's own, by id or sha-256, and the lots a sheet's
// readings are of (which decide what a maker may see).

const COLUMNS = [
  's.id', 's.name', 's.sha256', 's.sizeBytes', 's.contentType', 's.kind', 's.headers', 's.uploadedByName', 's.uploadedAt',
  's.importedAt', 's.importedCount', 's.skippedCount',
]

export interface LabSheetRow extends Omit<LabSheet, 'headers' | 'uploadedAt' | 'importedAt'> {
  headers: string | string[] | null
  uploadedAt: Date | string
  importedAt: Date | string | null
}

export interface StoredSheet { sheet: LabSheet, orgId: number, objectKey: string }

const iso = (d: Date | string | null) => (d === null ? null : new Date(d).toISOString())

export function toLabSheet(row: LabSheetRow): LabSheet {
  const headers = typeof row.headers === 'string' ? JSON.parse(row.headers) as string[] : row.headers
  return { ...row, headers, uploadedAt: iso(row.uploadedAt)!, importedAt: iso(row.importedAt) }
}

export interface NewLabSheet {
  orgId: number
  name: string
  objectKey: string
  sha256: string
  sizeBytes: number
  contentType: string
  kind: LabSheet['kind']
  headers: string[] | null
  uploadedByUserId: number
  uploadedByName: string
}

/** The organisation's sheets among these sha-256s, by sha-256: their ids. */
export async function sheetIdsBySha(db: Db, orgId: number, shas: string[]): Promise<Map<string, number>> {
  if (!shas.length) return new Map()
  const rows = await db('labSheets').where({ orgId }).whereIn('sha256', shas).select('id', 'sha256') as { id: number, sha256: string }[]
  return new Map(rows.map(r => [r.sha256, r.id]))
}

export async function insertLabSheet(trx: Knex.Transaction, sheet: NewLabSheet): Promise<number> {
  const [id] = await trx('labSheets').insert({ ...sheet, headers: sheet.headers && JSON.stringify(sheet.headers) })
  return id!
}

/** The object keys among these that a sheet row names (so a store clean-up leaves them be). */
export async function keysInUse(db: Db, keys: string[]): Promise<Set<string>> {
  if (!keys.length) return new Set()
  const rows = await db('labSheets').whereIn('objectKey', keys).select('objectKey') as { objectKey: string }[]
  return new Set(rows.map(r => r.objectKey))
}

/** Sheets of the organisation, or (for a maker) of others with readings of these lots. */
function sheetsSeenBy(db: Db, orgId: number, visibleLotIds: number[]) {
  return db('labSheets as s').where(q => q.where('s.orgId', orgId).orWhereExists(
    db('juiceReadings as r').whereRaw('r.lab_sheet_id = s.id').whereIn('r.lotId', visibleLotIds.length ? visibleLotIds : [0]),
  ))
}

/** Newest first, with the count of all. */
export async function listLabSheets(db: Db, orgId: number, visibleLotIds: number[], page: { limit: number, offset: number }): Promise<{ items: LabSheet[], total: number }> {
  const [rows, [count]] = await Promise.all([
    sheetsSeenBy(db, orgId, visibleLotIds).orderBy([{ column: 's.uploadedAt', order: 'desc' }, { column: 's.id', order: 'desc' }])
      .limit(page.limit).offset(page.offset).select(COLUMNS) as Promise<LabSheetRow[]>,
    sheetsSeenBy(db, orgId, visibleLotIds).count({ total: '*' }) as Promise<{ total: number }[]>,
  ])
  return { items: rows.map(toLabSheet), total: Number(count?.total ?? 0) }
}

/** One sheet the organisation owns, or one with readings of the lots given; undefined otherwise. */
export async function findLabSheet(db: Db, orgId: number, id: number, visibleLotIds: number[] = []): Promise<StoredSheet | undefined> {
  const row = await sheetsSeenBy(db, orgId, visibleLotIds).andWhere('s.id', id).first([...COLUMNS, 's.orgId', 's.objectKey']) as
    (LabSheetRow & { orgId: number, objectKey: string }) | undefined
  if (!row) return undefined
  const { orgId: owner, objectKey, ...sheet } = row
  return { sheet: toLabSheet(sheet), orgId: owner, objectKey }
}

/** The lots a sheet's readings are of. */
export async function lotIdsOfSheet(db: Db, sheetId: number): Promise<number[]> {
  const rows = await db('juiceReadings').where({ labSheetId: sheetId }).distinct('lotId') as { lotId: number }[]
  return rows.map(r => r.lotId)
}

/**
 * Lots with readings from sheets of organisations this one holds an accepted fruit contract with:
 * the only lots a maker could be shown, before the contract rules say which it may.
 */
export async function contractedSheetLotIds(db: Db, orgId: number): Promise<number[]> {
  const rows = await db('juiceReadings as r')
    .join('fruitContracts as c', 'c.growerOrgId', 'r.orgId')
    .whereNotNull('r.labSheetId').andWhere('c.makerOrgId', orgId).whereIn('c.state', ['accepted', 'fulfilled'])
    .distinct('r.lotId') as { lotId: number }[]
  return rows.map(r => r.lotId)
}
