import knexFactory, { type Knex } from 'knex'
import { knexConfig } from '../db/config'

let instance: Knex | undefined

/** The app's connection pool (one per server process; the server keeps no other state). */
export function useDb(): Knex {
  instance ??= knexFactory(knexConfig())
  return instance
}

// MariaDB error numbers the app turns into answers a person can act on (match errno, not code).
export const ER_DUP_ENTRY = 1062
export const ER_NO_REFERENCED_ROW = 1452
export const ER_ROW_IS_REFERENCED = 1451

export function isDbError(error: unknown, errno: number): boolean {
  return typeof error === 'object' && error !== null && (error as { errno?: number }).errno === errno
}
