import type { Knex } from 'knex'
import { ER_DUP_ENTRY, ER_ROW_IS_REFERENCED, isDbError } from './db'

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
      throw createError({ statusCode: 409, message: duplicate.message, data: { issues: [{ path: duplicate.field, message: duplicate.message }] } })
    }
    if (inUse && isDbError(e, ER_ROW_IS_REFERENCED)) throw createError({ statusCode: 409, message: inUse() })
    throw e
  }
}
