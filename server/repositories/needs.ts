import type { Knex } from 'knex'
import type { NeedRow } from '#shared/types/coverage'
import type { Db } from '../utils/db'

// A maker's needs table: every query names the organisation. The needs service owns the
// transaction that replaces it.

const COLUMNS = ['juiceClass', 'harvestYear as year', 'kg']

/** The organisation's needs, unordered (the service puts them in class order). */
export function needRows(db: Db, orgId: number): Promise<NeedRow[]> {
  return db('makerNeeds').where({ orgId }).select(COLUMNS)
}

/**
 * Locks the organisation's needs until the transaction ends and answers them. The organisation's
 * own row is locked first: a locking read of an empty table takes only gap locks, which two
 * transactions may hold at once and then deadlock on their inserts.
 */
export async function lockNeeds(trx: Knex.Transaction, orgId: number): Promise<NeedRow[]> {
  await trx('organisations').where({ id: orgId }).forUpdate().first('id')
  return trx('makerNeeds').where({ orgId }).forUpdate().select(COLUMNS)
}

/** Replaces the organisation's whole table with `rows`. */
export async function replaceNeedRows(trx: Knex.Transaction, orgId: number, rows: readonly NeedRow[]): Promise<void> {
  await trx('makerNeeds').where({ orgId }).delete()
  if (rows.length) await trx('makerNeeds').insert(rows.map(r => ({ orgId, juiceClass: r.juiceClass, harvestYear: r.year, kg: r.kg })))
}
