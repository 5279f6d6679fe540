import type { Knex } from 'knex'
import type { LinerGrade } from '#shared/schemas/nursery'
import type { LinerStockRow } from '#shared/types/nursery'
import type { Db } from '../utils/db'

// Liner stock, per rootstock and grade: the liners lifted from the nursery's own beds and bought
// in, less those lined out in runs (a run's liner grade says which stock it drew on; a run with no
// grade draws on no stock). One query answers the page and the check before a run is lined out.

export async function linerStock(db: Db, orgId: number, filter: { rootstockId?: number, grade?: LinerGrade } = {}): Promise<LinerStockRow[]> {
  const lots = db('linerLots as l').where('l.orgId', orgId)
    .select('l.rootstockId', 'l.grade', db.raw("SUM(CASE WHEN l.source = 'lifted' THEN l.count ELSE 0 END) AS lifted"), db.raw("SUM(CASE WHEN l.source = 'bought' THEN l.count ELSE 0 END) AS bought"))
    .groupBy('l.rootstockId', 'l.grade')
  const runs = db('nurseryRuns as n').where('n.orgId', orgId).whereNotNull('n.linerGrade')
    .select('n.rootstockId', 'n.linerGrade as grade', db.raw('SUM(n.lined_out_count) AS lined_out'))
    .groupBy('n.rootstockId', 'n.linerGrade')
  if (filter.rootstockId) {
    lots.andWhere('l.rootstockId', filter.rootstockId)
    runs.andWhere('n.rootstockId', filter.rootstockId)
  }
  if (filter.grade) {
    lots.andWhere('l.grade', filter.grade)
    runs.andWhere('n.linerGrade', filter.grade)
  }
  const [lotRows, runRows] = await Promise.all([lots, runs]) as [{ rootstockId: number, grade: LinerGrade, lifted: number, bought: number }[], { rootstockId: number, grade: LinerGrade, linedOut: number }[]]
  const key = (r: { rootstockId: number, grade: string }) => `${r.rootstockId}:${r.grade}`
  const rows = new Map<string, Omit<LinerStockRow, 'rootstockDesignation'>>()
  for (const r of lotRows) rows.set(key(r), { rootstockId: r.rootstockId, grade: r.grade, lifted: Number(r.lifted), bought: Number(r.bought), linedOut: 0, inStock: 0 })
  for (const r of runRows) {
    const row = rows.get(key(r)) ?? { rootstockId: r.rootstockId, grade: r.grade, lifted: 0, bought: 0, linedOut: 0, inStock: 0 }
    row.linedOut = Number(r.linedOut)
    rows.set(key(r), row)
  }
  const ids = [...new Set([...rows.values()].map(r => r.rootstockId))]
  const names = new Map((await db('rootstocks').whereIn('id', ids).select('id', 'designation') as { id: number, designation: string }[]).map(r => [r.id, r.designation]))
  return [...rows.values()]
    .map(r => ({ ...r, rootstockDesignation: names.get(r.rootstockId) ?? '', inStock: r.lifted + r.bought - r.linedOut }))
    .sort((a, b) => a.rootstockDesignation.localeCompare(b.rootstockDesignation) || a.grade.localeCompare(b.grade))
}

/**
 * Locks the organisation's liner stock for the rest of the transaction: every change to it (a lot
 * in, a run lined out) takes this lock first, so two at once cannot both spend the same liners.
 */
export async function lockLinerStock(trx: Knex.Transaction, orgId: number): Promise<void> {
  await trx('organisations').where({ id: orgId }).forUpdate().first('id')
}
