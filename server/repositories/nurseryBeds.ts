import type { Knex } from 'knex'
import type { BedCreateInput, BedKind, BedPatchInput, BedRecordCreateInput } from '#shared/schemas/nursery'
import type { BedRecord, NurseryBed } from '#shared/types/nursery'
import { useDb, type Db } from '../utils/db'

// Scoped queries for nursery beds and their yearly records: every one names the organisation, so
// another tenant's bed is simply not there. Transactions, checks and audit are the bed service's.

const BED_COLUMNS = [
  'b.id', 'b.name', 'b.kind', 'b.rootstockId', 'r.designation as rootstockDesignation', 'b.motherPlants',
  'b.yearEstablished', 'b.seedSource', 'b.notes', 'b.createdAt', 'b.updatedAt',
]

const RECORD_COLUMNS = ['id', 'bedId', 'kind', 'doneOn', 'count', 'grade', 'hormone', 'hormoneStrength', 'notes', 'byUserId', 'createdAt']

function bedsOf(db: Db, orgId: number) {
  return db('nurseryBeds as b').leftJoin('rootstocks as r', 'r.id', 'b.rootstockId').where('b.orgId', orgId)
}

/** The organisation's beds, by kind and name, with the count of all of them. */
export async function listBeds(orgId: number, page: { limit: number, offset: number }): Promise<{ items: NurseryBed[], total: number }> {
  const db = useDb()
  const rows = await bedsOf(db, orgId).select([...BED_COLUMNS, db.raw('COUNT(*) OVER () AS list_total')])
    .orderBy([{ column: 'b.kind' }, { column: 'b.name' }, { column: 'b.id' }]).limit(page.limit).offset(page.offset) as (NurseryBed & { listTotal: number })[]
  const total = rows[0]?.listTotal ?? (page.offset > 0 ? await countBeds(db, orgId) : 0)
  return { items: rows.map(({ listTotal: _t, ...bed }) => bed), total }
}

async function countBeds(db: Db, orgId: number): Promise<number> {
  const [row] = await db('nurseryBeds').where({ orgId }).count({ total: '*' }) as [{ total: number }]
  return Number(row.total)
}

export function findBed(db: Db, orgId: number, id: number): Promise<NurseryBed | undefined> {
  return bedsOf(db, orgId).andWhere('b.id', id).first(BED_COLUMNS)
}

/** The bed's own row, locked until the transaction ends, or undefined. */
export function lockBed(trx: Knex.Transaction, orgId: number, id: number): Promise<{ name: string, kind: BedKind, rootstockId: number | null, motherPlants: number | null, yearEstablished: number | null, seedSource: string | null } | undefined> {
  return trx('nurseryBeds').where({ id, orgId }).forUpdate().first('name', 'kind', 'rootstockId', 'motherPlants', 'yearEstablished', 'seedSource')
}

export async function insertBed(trx: Knex.Transaction, orgId: number, input: BedCreateInput): Promise<number> {
  const [id] = await trx('nurseryBeds').insert({ orgId, ...input })
  return id!
}

export async function updateBedRow(trx: Knex.Transaction, orgId: number, id: number, patch: BedPatchInput): Promise<void> {
  await trx('nurseryBeds').where({ id, orgId }).update({ ...patch, updatedAt: trx.fn.now(3) })
}

/** A bed's records, the latest work first. */
export async function listBedRecords(orgId: number, bedId: number, page: { limit: number, offset: number }): Promise<{ items: BedRecord[], total: number }> {
  const db = useDb()
  const rows = await db('nurseryBedRecords').where({ orgId, bedId }).select([...RECORD_COLUMNS, db.raw('COUNT(*) OVER () AS list_total')])
    .orderBy([{ column: 'doneOn', order: 'desc' }, { column: 'id', order: 'desc' }]).limit(page.limit).offset(page.offset) as (BedRecord & { listTotal: number })[]
  let total = rows[0]?.listTotal ?? 0
  if (!rows.length && page.offset > 0) {
    const [row] = await db('nurseryBedRecords').where({ orgId, bedId }).count({ total: '*' }) as [{ total: number }]
    total = Number(row.total)
  }
  return { items: rows.map(({ listTotal: _t, ...record }) => record), total }
}

export function findBedRecord(db: Db, orgId: number, id: number): Promise<BedRecord | undefined> {
  return db('nurseryBedRecords').where({ id, orgId }).first(RECORD_COLUMNS)
}

export async function insertBedRecord(trx: Knex.Transaction, orgId: number, bedId: number, byUserId: number, input: BedRecordCreateInput): Promise<number> {
  const [id] = await trx('nurseryBedRecords').insert({ orgId, bedId, byUserId, ...input })
  return id!
}
