import type { Knex } from 'knex'
import type { BudwoodCreateInput } from '#shared/schemas/nursery'
import type { BudwoodLot } from '#shared/types/nursery'
import { useDb, type Db } from '../utils/db'

// Scoped queries for budwood lots: every one names the organisation, and the block a lot was cut
// from is joined only when it is the same organisation's.

const LOT_COLUMNS = [
  'w.id', 'w.label', 'w.varietyId', 'v.name as varietyName', 'w.cutOn', 'w.sourceKind', 'w.blockId', 'b.name as blockName',
  'w.sourceNote', 'w.supplier', 'w.certificate', 'w.sticks', 'w.notes',
]

function lotsOf(db: Db, orgId: number) {
  return db('budwoodLots as w')
    .join('varieties as v', 'v.id', 'w.varietyId')
    .leftJoin('orchardBlocks as b', q => q.on('b.id', 'w.blockId').andOn('b.orgId', 'w.orgId'))
    .where('w.orgId', orgId)
}

/** The organisation's budwood, the latest cut first, with the count of all of it. */
export async function listBudwood(orgId: number, page: { limit: number, offset: number }): Promise<{ items: BudwoodLot[], total: number }> {
  const db = useDb()
  const rows = await lotsOf(db, orgId).select([...LOT_COLUMNS, db.raw('COUNT(*) OVER () AS list_total')])
    .orderBy([{ column: 'w.cutOn', order: 'desc' }, { column: 'w.id', order: 'desc' }]).limit(page.limit).offset(page.offset) as (BudwoodLot & { listTotal: number })[]
  let total = rows[0]?.listTotal ?? 0
  if (!rows.length && page.offset > 0) {
    const [row] = await db('budwoodLots').where({ orgId }).count({ total: '*' }) as [{ total: number }]
    total = Number(row.total)
  }
  return { items: rows.map(({ listTotal: _t, ...lot }) => lot), total }
}

export function findBudwood(db: Db, orgId: number, id: number): Promise<BudwoodLot | undefined> {
  return lotsOf(db, orgId).andWhere('w.id', id).first(LOT_COLUMNS)
}

/** The organisation's own orchard block and the variety it grows, or undefined (another tenant's block too). */
export function findOwnBlock(trx: Knex.Transaction, orgId: number, blockId: number): Promise<{ name: string, varietyId: number, varietyName: string } | undefined> {
  return trx('orchardBlocks as b').join('varieties as v', 'v.id', 'b.varietyId')
    .where({ 'b.id': blockId, 'b.orgId': orgId }).first('b.name', 'b.varietyId', 'v.name as varietyName')
}

export async function insertBudwood(trx: Knex.Transaction, orgId: number, input: BudwoodCreateInput): Promise<number> {
  const [id] = await trx('budwoodLots').insert({ orgId, ...input })
  return id!
}
