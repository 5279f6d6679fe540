import knexFactory, { type Knex } from 'knex'
import { knexConfig } from '../db/config'
import { fieldError } from './validation'

let instance: Knex | undefined

/** The app's connection pool (one per server process; the server keeps no other state). */
export function useDb(): Knex {
  instance ??= knexFactory(knexConfig())
  return instance
}

export type Db = Knex | Knex.Transaction

/** A JSON column as the driver hands it back: a string to parse, or (through some paths) the value already. */
export const fromJson = <T>(value: string | T): T => (typeof value === 'string' ? JSON.parse(value) as T : value)

// MariaDB error numbers the app turns into answers a person can act on (match errno, not code).
const ER_DUP_ENTRY = 1062
const ER_ROW_IS_REFERENCED = 1451
const ER_NO_REFERENCED_ROW = 1452
const ER_LOCK_DEADLOCK = 1213

export function isDbError(error: unknown, errno: number): boolean {
  return typeof error === 'object' && error !== null && (error as { errno?: number }).errno === errno
}

/**
 * Runs a transaction, and runs it again (up to `tries` times in all) when the database chose it as
 * the victim of a deadlock (errno 1213): InnoDB rolls the victim back whole, so trying again is
 * safe, and it is what the server's own manual advises. Any other error is thrown at once.
 */
export async function transactionRetried<T>(work: (trx: Knex.Transaction) => Promise<T>, tries = 3, config?: Knex.TransactionConfig): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await useDb().transaction(work, config)
    }
    catch (error) {
      if (attempt >= tries || !isDbError(error, ER_LOCK_DEADLOCK)) throw error
      await new Promise(resolve => setTimeout(resolve, 10 * attempt + Math.floor(Math.random() * 20)))
    }
  }
}

/** How one kind of refusal by the database is answered. */
export interface DbRefusal {
  /** The field at fault, named in `data.issues`; left out for a refusal of the whole record. */
  field?: string
  /** What the person reads. A function, when the words depend on what the write found. */
  message: string | (() => string)
  /** The issue beside the field, when it should be shorter than the message. */
  issue?: string
  statusCode?: number
}

export interface DbRefusals {
  /** A unique key already taken (errno 1062): 409 by default. */
  duplicate?: DbRefusal
  /** A foreign key naming a row that is not there (errno 1452): 400 by default. */
  missingReference?: DbRefusal
  /** A row other rows still refer to (errno 1451): 409 by default. */
  inUse?: DbRefusal
}

const REFUSALS: { errno: number, kind: keyof DbRefusals, statusCode: number }[] = [
  { errno: ER_DUP_ENTRY, kind: 'duplicate', statusCode: 409 },
  { errno: ER_NO_REFERENCED_ROW, kind: 'missingReference', statusCode: 400 },
  { errno: ER_ROW_IS_REFERENCED, kind: 'inUse', statusCode: 409 },
]

/**
 * The one translator of database refusals: runs a write, and turns the errors listed in
 * `refusals` into 4xx answers that name the field (a race the service's own checks cannot close,
 * such as two people taking the same name at once). Anything else is thrown on unchanged.
 */
export async function withDbRefusals<T>(refusals: DbRefusals, write: () => Promise<T>): Promise<T> {
  try {
    return await write()
  }
  catch (error) {
    for (const { errno, kind, statusCode } of REFUSALS) {
      const refusal = refusals[kind]
      if (!refusal || !isDbError(error, errno)) continue
      const message = typeof refusal.message === 'function' ? refusal.message() : refusal.message
      const status = refusal.statusCode ?? statusCode
      if (!refusal.field) throw createError({ statusCode: status, message })
      throw fieldError([{ path: refusal.field, message: refusal.issue ?? message }], { statusCode: status, message })
    }
    throw error
  }
}

/**
 * One page of a list with the whole list's count, read in the same query (a window count). Only a
 * page past the end, which has no row to carry the count, asks for the count again on its own.
 */
export async function pageWithTotal<R>(
  db: Db,
  rows: Knex.QueryBuilder,
  count: () => Knex.QueryBuilder,
  page: { limit: number, offset: number },
): Promise<{ rows: R[], total: number }> {
  const found = await rows.select(db.raw('COUNT(*) OVER () AS list_total')).limit(page.limit).offset(page.offset) as (R & { listTotal: number })[]
  if (found[0]) return { rows: found.map(({ listTotal: _t, ...row }) => row as R), total: Number(found[0].listTotal) }
  const [{ total }] = await count().count({ total: '*' }) as [{ total: number }]
  return { rows: [], total: Number(total) }
}
