import type { Knex } from 'knex'
import { recordAudit } from './audit'
import { ER_DUP_ENTRY, ER_ROW_IS_REFERENCED, isDbError, useDb } from './db'
import { fieldError } from './validation'

/** A LIKE pattern that finds the text anywhere, with the text's own % and _ taken literally. */
function containsPattern(text: string): string {
  return `%${text.replace(/[\\%_]/g, c => `\\${c}`)}%`
}

// Left out when comparing names, so that "MM106" finds MM.106 and "Tremletts" finds Tremlett's.
const IGNORED_IN_NAMES = ['.', ' ', '-', "'", '’']

/** Narrows a query to rows whose name column contains the text, ignoring case and punctuation. */
export function whereNameContains(query: Knex.QueryBuilder, column: string, text: string): void {
  const compact = IGNORED_IN_NAMES.reduce((s, c) => s.split(c).join(''), text)
  const stripped = IGNORED_IN_NAMES.reduce(sql => `REPLACE(${sql}, ?, '')`, '??')
  query.where((q) => {
    q.where(column, 'like', containsPattern(text))
    if (compact) q.orWhereRaw(`${stripped} LIKE ?`, [column, ...IGNORED_IN_NAMES, containsPattern(compact)])
  })
}

/**
 * Runs a catalogue write and turns the database's refusals into answers the admin can act on:
 * a name already taken is a 409 on that field (the unique index ignores case), and a row still
 * named by blocks, nursery rows or contracts is a 409 saying why it stays.
 */
export async function guardCatalogueWrite<T>(
  refusals: { duplicate?: { field: string, message: string }, inUse?: () => string },
  write: () => Promise<T>,
): Promise<T> {
  try {
    return await write()
  }
  catch (e) {
    const { duplicate, inUse } = refusals
    if (duplicate && isDbError(e, ER_DUP_ENTRY)) {
      throw fieldError([{ path: duplicate.field, message: duplicate.message }], { statusCode: 409, message: duplicate.message })
    }
    if (inUse && isDbError(e, ER_ROW_IS_REFERENCED)) throw createError({ statusCode: 409, message: inUse() })
    throw e
  }
}

/** A nullable figure column as a number, or null. */
export const numberOrNull = (v: number | null) => (v === null ? null : Number(v))

/**
 * How one catalogue table is stored and answered. The repository keeps its own row type, column
 * mapping and wording; the list, get, create, update and delete below are the same for every table.
 */
export interface CatalogueTable<Row, Item> {
  table: string
  /** The audit object type and the word the answers use ("That variety was not found."). */
  noun: string
  /** The field that names an entry: the API field and the column have this same name. */
  nameField: keyof Row & string
  /** API field → column. */
  columns: Record<string, string>
  toItem: (row: Row) => Item
  /** The refusal when the name is already in the catalogue. */
  taken: (name: string | undefined) => string
}

type AnyTable = CatalogueTable<never, unknown>

function notFoundIn(t: AnyTable) {
  return createError({ statusCode: 404, message: `That ${t.noun} was not found.` })
}

function toColumns(t: AnyTable, input: Record<string, unknown>): Record<string, unknown> {
  return Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined).map(([k, v]) => [t.columns[k], v]))
}

function duplicateOf(t: AnyTable, input: Record<string, unknown>) {
  return { field: t.nameField, message: t.taken(input[t.nameField] as string | undefined) }
}

/** One entry as the API answers it, or a 404. */
export async function findCatalogueRow<Row, Item>(db: Knex | Knex.Transaction, t: CatalogueTable<Row, Item>, id: number): Promise<Item> {
  const row = await db(t.table).where({ id }).first() as Row | undefined
  if (!row) throw notFoundIn(t)
  return t.toItem(row)
}

/**
 * One page of the entries whose name contains the search text and whose columns equal the
 * given filters (a filter left out narrows nothing), in `order`, with the count of all that match.
 */
export async function listCatalogueRows<Row, Item>(
  t: CatalogueTable<Row, Item>,
  query: { limit: number, offset: number, q?: string },
  filters: Record<string, string | undefined>,
  order: { column: string }[],
): Promise<{ items: Item[], total: number }> {
  const base = useDb()(t.table).modify((q) => {
    if (query.q) whereNameContains(q, t.nameField, query.q)
    for (const [column, value] of Object.entries(filters)) if (value) q.where(column, value)
  })
  const [rows, [{ total }]] = await Promise.all([
    base.clone().select('*').orderBy(order).limit(query.limit).offset(query.offset) as Promise<Row[]>,
    base.clone().count({ total: '*' }) as unknown as Promise<[{ total: number }]>,
  ])
  return { items: rows.map(t.toItem), total: Number(total) }
}

/** Adds an entry and records who did; a name already taken is a 409. */
export function createCatalogueRow<Row, Item>(t: CatalogueTable<Row, Item>, actorId: number, input: Record<string, unknown>): Promise<Item> {
  return guardCatalogueWrite({ duplicate: duplicateOf(t, input) }, () => useDb().transaction(async (trx) => {
    const [id] = await trx(t.table).insert(toColumns(t, input))
    await recordAudit(trx, { orgId: null, actorUserId: actorId, action: `${t.noun}.created`, objectType: t.noun, objectId: id!, detail: { [t.nameField]: input[t.nameField] } })
    return findCatalogueRow(trx, t, id!)
  }))
}

/**
 * Saves the given fields of an entry and records which changed. `check` sees the stored row (locked
 * until the save commits) first and may refuse the patch by throwing.
 */
export function updateCatalogueRow<Row, Item>(
  t: CatalogueTable<Row, Item>, actorId: number, id: number, patch: Record<string, unknown>, check?: (current: Row) => void,
): Promise<Item> {
  return guardCatalogueWrite({ duplicate: duplicateOf(t, patch) }, () => useDb().transaction(async (trx) => {
    const current = await trx(t.table).where({ id }).forUpdate().first() as Row | undefined
    if (!current) throw notFoundIn(t)
    check?.(current)
    await trx(t.table).where({ id }).update({ ...toColumns(t, patch), updated_at: trx.fn.now(3) })
    const changed = Object.keys(patch).filter(k => patch[k] !== undefined)
    await recordAudit(trx, { orgId: null, actorUserId: actorId, action: `${t.noun}.updated`, objectType: t.noun, objectId: id, detail: { [t.nameField]: current[t.nameField], changed } })
    return findCatalogueRow(trx, t, id)
  }))
}

/** Deletes an entry and records who did; one still named by blocks or other records is a 409 saying so. */
export async function deleteCatalogueRow<Row, Item>(t: CatalogueTable<Row, Item>, actorId: number, id: number): Promise<void> {
  let name = `This ${t.noun}`
  const inUse = () => `${name} is named by orchard blocks or other records, so it cannot be deleted. Correct its details instead.`
  await guardCatalogueWrite({ inUse }, () => useDb().transaction(async (trx) => {
    const row = await trx(t.table).where({ id }).forUpdate().first(t.nameField) as Record<string, string> | undefined
    if (!row) throw notFoundIn(t)
    name = row[t.nameField]!
    await trx(t.table).where({ id }).delete()
    await recordAudit(trx, { orgId: null, actorUserId: actorId, action: `${t.noun}.deleted`, objectType: t.noun, objectId: id, detail: { [t.nameField]: row[t.nameField] } })
  }))
}
