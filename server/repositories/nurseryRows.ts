import type { Knex } from 'knex'
import type { RowCreateInput, RowListQuery, RowPatchInput } from '#shared/schemas/nursery'
import type { NurseryRow } from '#shared/types/nursery'
import type { Db } from '../utils/db'

// Scoped queries for the rows of the nursery's fields: every one names the organisation, so
// another tenant's row is simply not there. Checks, transactions and audit are the run service's.

const COLUMNS = ['r.id', 'r.fieldId', 'f.name as fieldName', 'r.name', 'r.positions', 'r.spacingCm', 'r.notes']

function rowsOf(db: Db, orgId: number) {
  return db('nurseryRows as r').join('nurseryBeds as f', 'f.id', 'r.fieldId').where('r.orgId', orgId)
}

export async function listRows(db: Db, orgId: number, query: RowListQuery): Promise<{ items: NurseryRow[], total: number }> {
  const filtered = () => rowsOf(db, orgId).modify((q) => {
    if (query.fieldId) q.andWhere('r.fieldId', query.fieldId)
  })
  // Rows are named by number more often than not: "Row 2" before "Row 10".
  const rows = await filtered().select([...COLUMNS, db.raw('COUNT(*) OVER () AS list_total')])
    .orderBy([{ column: 'f.name' }]).orderByRaw('natural_sort_key(r.name)').orderBy('r.id')
    .limit(query.limit).offset(query.offset) as (NurseryRow & { listTotal: number })[]
  if (!rows.length && query.offset > 0) {
    const [{ total }] = await filtered().count({ total: '*' }) as [{ total: number }]
    return { items: [], total: Number(total) }
  }
  return { items: rows.map(({ listTotal: _t, ...row }) => row), total: rows[0]?.listTotal ?? 0 }
}

export function findRow(db: Db, orgId: number, id: number): Promise<NurseryRow | undefined> {
  return rowsOf(db, orgId).andWhere('r.id', id).first(COLUMNS)
}

/** The row, locked until the transaction ends: runs are added to a row one at a time. */
export function lockRow(trx: Knex.Transaction, orgId: number, id: number): Promise<{ id: number, name: string, positions: number } | undefined> {
  return trx('nurseryRows').where({ id, orgId }).forUpdate().first('id', 'name', 'positions')
}

/** The organisation's own bed, if it is a nursery-row field. */
export function findField(trx: Knex.Transaction, orgId: number, id: number): Promise<{ id: number, name: string, kind: string } | undefined> {
  return trx('nurseryBeds').where({ id, orgId }).first('id', 'name', 'kind')
}

export async function insertRow(trx: Knex.Transaction, orgId: number, input: RowCreateInput): Promise<number> {
  const [id] = await trx('nurseryRows').insert({ orgId, ...input })
  return id!
}

export async function updateRow(trx: Knex.Transaction, orgId: number, id: number, patch: RowPatchInput): Promise<void> {
  await trx('nurseryRows').where({ id, orgId }).update(patch)
}
