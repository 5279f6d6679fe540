import type { Knex } from 'knex'
import { useDb, type Db } from '../utils/db'

/** One table of the shared catalogue (varieties, rootstocks): rows are the API's shape already. */
export interface CatalogueTable {
  table: 'varieties' | 'rootstocks'
  /** The audit object type and the word the answers use ("That variety was not found."). */
  noun: string
  /** The field that names an entry. */
  nameField: 'name' | 'designation'
}

/** A LIKE pattern that finds the text anywhere, with the text's own % and _ taken literally. */
export function containsPattern(text: string): string {
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
 * One page of the entries whose name contains the search text and whose columns equal the
 * given filters (a filter left out narrows nothing), in `order`, with the count of all that match.
 */
export async function listCatalogueRows<Item>(
  t: CatalogueTable,
  query: { limit: number, offset: number, q?: string },
  filters: Record<string, string | undefined>,
  order: { column: string }[],
): Promise<{ items: Item[], total: number }> {
  const db = useDb()
  const base = db(t.table).modify((q) => {
    if (query.q) whereNameContains(q, t.nameField, query.q)
    for (const [column, value] of Object.entries(filters)) if (value) q.where(column, value)
  })
  // The count of every match rides on each row of the page (a window count, taken before LIMIT), so a
  // list costs one query; only a page past the end, with no row to carry it, counts apart.
  const rows = await base.clone().select(`${t.table}.*`, db.raw('COUNT(*) OVER () AS list_total'))
    .orderBy(order).limit(query.limit).offset(query.offset) as (Item & { listTotal: number })[]
  if (rows.length === 0) {
    const [{ total }] = query.offset > 0 ? await base.clone().count({ total: '*' }) as unknown as [{ total: number }] : [{ total: 0 }]
    return { items: [], total }
  }
  return { items: rows.map(({ listTotal: _total, ...item }) => item as Item), total: rows[0]!.listTotal }
}

/** One entry, or undefined; `lock` holds it until the transaction ends. */
export function findCatalogueRow<Item>(db: Db, t: CatalogueTable, id: number, options: { lock?: boolean } = {}): Promise<Item | undefined> {
  const query = db(t.table).where({ id })
  return (options.lock ? query.forUpdate() : query).first() as Promise<Item | undefined>
}

export async function insertCatalogueRow(trx: Knex.Transaction, t: CatalogueTable, values: object): Promise<number> {
  const [id] = await trx(t.table).insert(values)
  return id!
}

export async function updateCatalogueRow(trx: Knex.Transaction, t: CatalogueTable, id: number, values: object): Promise<void> {
  await trx(t.table).where({ id }).update({ ...values, updatedAt: trx.fn.now(3) })
}

export async function deleteCatalogueRow(trx: Knex.Transaction, t: CatalogueTable, id: number): Promise<void> {
  await trx(t.table).where({ id }).delete()
}

/** The species of a catalogue variety and rootstock, for checking that they go together. */
export function catalogueSpecies(trx: Knex.Transaction, varietyId: number, rootstockId: number) {
  return Promise.all([
    trx('varieties').where({ id: varietyId }).first('name', 'species') as Promise<{ name: string, species: 'apple' | 'pear' } | undefined>,
    trx('rootstocks').where({ id: rootstockId }).first('designation', 'species') as Promise<{ designation: string, species: 'apple' | 'pear' } | undefined>,
  ])
}
