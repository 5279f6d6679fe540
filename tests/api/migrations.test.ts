import { readdirSync } from 'node:fs'
import { resolve } from 'node:path'
import knexFactory, { type Knex } from 'knex'
import { afterAll, describe, expect, it } from 'vitest'
import { knexConfig } from '../../server/db/config'
import { testEnv } from '../support/env'

// A scratch database beside the test database, so going down does not disturb the other tests.
const scratchUrl = (() => {
  const url = new URL(testEnv.databaseUrl)
  url.pathname = '/pomewright_migrations_check'
  return url.toString()
})()
const admin = knexFactory(knexConfig(testEnv.databaseUrl))
const scratch = knexFactory(knexConfig(scratchUrl))

// The same migration files, loaded through the test runner's TypeScript transform.
const dir = resolve(import.meta.dirname, '../../server/db/migrations')
const source: Knex.MigrationSource<string> = {
  getMigrations: async () => readdirSync(dir).filter(f => f.endsWith('.ts')).sort(),
  getMigrationName: name => name,
  getMigration: name => import(/* @vite-ignore */ resolve(dir, name)),
}
const config = { migrationSource: source }

afterAll(async () => {
  await scratch.destroy()
  await admin.raw('DROP DATABASE IF EXISTS `pomewright_migrations_check`')
  await admin.destroy()
})

describe('migrations', () => {
  it('go all the way up, all the way down, and up again', async () => {
    await admin.raw('DROP DATABASE IF EXISTS `pomewright_migrations_check`')
    await admin.raw('CREATE DATABASE `pomewright_migrations_check` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci')

    const [, applied] = await scratch.migrate.latest(config) as [number, string[]]
    expect(applied.length).toBeGreaterThan(0)
    for (const table of ['organisations', 'users', 'invitations', 'user_tokens', 'sign_in_attempts', 'audit_events', 'notifications']) {
      expect(await scratch.schema.hasTable(table), table).toBe(true)
    }

    while ((await scratch.migrate.currentVersion(config)) !== 'none') await scratch.migrate.down(config)
    const left = await scratch.raw("SELECT table_name AS name FROM information_schema.tables WHERE table_schema = 'pomewright_migrations_check' AND table_name NOT LIKE 'knex_migrations%'")
    expect(left[0]).toEqual([])

    const [, again] = await scratch.migrate.latest(config) as [number, string[]]
    expect(again).toEqual(applied)
  })
})
