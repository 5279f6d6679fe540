import { readdirSync } from 'node:fs'
import { resolve } from 'node:path'
import knexFactory, { type Knex } from 'knex'
import { knexConfig } from '../../server/db/config'
import { seed as seedDemoAccounts } from '../../server/db/seeds/01_demo_accounts'
import { testEnv } from './env'

const migrationsDir = resolve(import.meta.dirname, '../../server/db/migrations')
// The same migration files, loaded through the test runner's TypeScript transform.
const migrationSource: Knex.MigrationSource<string> = {
  getMigrations: async () => readdirSync(migrationsDir).filter(f => f.endsWith('.ts')).sort(),
  getMigrationName: name => name,
  getMigration: name => import(/* @vite-ignore */ resolve(migrationsDir, name)),
}

export interface ScratchDb { url: string, db: Knex, drop: () => Promise<void> }

/**
 * A database of its own beside the test database, migrated and holding the demo sign-ins, for app
 * instances that must not share the test stack's (its own sender would take their work).
 * Rows come as the tables store them, snake_case.
 */
export async function scratchDatabase(name: string): Promise<ScratchDb> {
  const url = new URL(testEnv.databaseUrl)
  url.pathname = `/${name}`
  const admin = knexFactory(knexConfig(testEnv.databaseUrl))
  await admin.raw(`DROP DATABASE IF EXISTS \`${name}\``)
  await admin.raw(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`)
  const db = knexFactory(knexConfig(url.toString(), { caseConversion: false }))
  await db.migrate.latest({ migrationSource })
  await seedDemoAccounts(db)
  return {
    url: url.toString(),
    db,
    async drop() {
      await db.destroy()
      await admin.raw(`DROP DATABASE IF EXISTS \`${name}\``)
      await admin.destroy()
    },
  }
}

/** A port for a test's own app instance or service, clear of the test stack's own (its app port + offset). */
export function sidePort(offset: number): number {
  return Number(new URL(testEnv.appUrl).port) + offset
}
