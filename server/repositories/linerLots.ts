import type { Knex } from 'knex'
import type { LinerGrade } from '#shared/schemas/nursery'
import type { LinerLot } from '#shared/types/nursery'
import { useDb, type Db } from '../utils/db'

// Scoped queries for liner lots: each lot lifted from the nursery's own beds or bought in. The
// stock they add up to is linerStock's; the lock every change takes first is lockLinerStock's.

const LOT_COLUMNS = [
  'l.id', 'l.rootstockId', 'r.designation as rootstockDesignation', 'l.grade', 'l.source', 'l.bedRecordId',
  'l.supplier', 'l.certificate', 'l.count', 'l.receivedOn', 'l.notes',
]

function lotsOf(db: Db, orgId: number) {
  return db('linerLots as l').join('rootstocks as r', 'r.id', 'l.rootstockId').where('l.orgId', orgId)
}

/** The organisation's lots, the latest in first, with the count of all of them. */
export async function listLinerLots(orgId: number, page: { limit: number, offset: number }): Promise<{ lots: LinerLot[], total: number }> {
  const db = useDb()
  const rows = await lotsOf(db, orgId).select([...LOT_COLUMNS, db.raw('COUNT(*) OVER () AS list_total')])
    .orderBy([{ column: 'l.receivedOn', order: 'desc' }, { column: 'l.id', order: 'desc' }]).limit(page.limit).offset(page.offset) as (LinerLot & { listTotal: number })[]
  let total = rows[0]?.listTotal ?? 0
  if (!rows.length && page.offset > 0) {
    const [row] = await db('linerLots').where({ orgId }).count({ total: '*' }) as [{ total: number }]
    total = Number(row.total)
  }
  return { lots: rows.map(({ listTotal: _t, ...lot }) => lot), total }
}

export function findLinerLot(db: Db, orgId: number, id: number): Promise<LinerLot | undefined> {
  return lotsOf(db, orgId).andWhere('l.id', id).first(LOT_COLUMNS)
}

export interface LinerLotValues {
  rootstockId: number
  grade: LinerGrade
  source: 'lifted' | 'bought'
  count: number
  receivedOn: string
  bedRecordId?: number | null
  supplier?: string | null
  certificate?: string | null
  notes?: string | null
}

/** Call under lockLinerStock, so the stock it adds to is not being spent at the same time. */
export async function insertLinerLot(trx: Knex.Transaction, orgId: number, values: LinerLotValues): Promise<number> {
  const [id] = await trx('linerLots').insert({ orgId, ...values })
  return id!
}
