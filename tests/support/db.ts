import knexFactory, { type Knex } from 'knex'
import { afterAll } from 'vitest'
import { knexConfig } from '../../server/db/config'
import { testEnv } from './env'

let db: Knex | undefined

/**
 * Direct access to the test database, for arranging what a person cannot (time passing, expired
 * links). Rows come as the tables store them, snake_case, without the app's case conversion.
 */
export function testDb(): Knex {
  if (!db) {
    db = knexFactory(knexConfig(testEnv.databaseUrl, { caseConversion: false }))
    afterAll(async () => {
      await db?.destroy()
      db = undefined
    })
  }
  return db
}

export function uniqueEmail(prefix: string): string {
  return `${prefix}-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 7)}@example.test`
}
