import knexFactory, { type Knex } from 'knex'
import { afterAll, describe, expect, it } from 'vitest'
import { knexConfig } from '../../server/db/config'
import { testEnv } from '../support/env'

// The app's own configuration against the real server: camelCase in, camelCase out.
const db = knexFactory(knexConfig(testEnv.databaseUrl))
afterAll(() => db.destroy())

describe('case conversion at the database edge', () => {
  it('names columns in camelCase in selects, joins, where clauses and aliases', async () => {
    const row = await db('orchardBlocks as b').join('rootstocks as r', 'r.id', 'b.rootstockId')
      .where('b.name', 'Long Ground').first('b.treeCount', 'b.areaHa', 'r.yieldPerTreeKg', 'r.designation as rootstockDesignation')
    expect(row).toEqual({ treeCount: expect.any(Number), areaHa: expect.any(Number), yieldPerTreeKg: expect.any(Number), rootstockDesignation: expect.any(String) })
  })

  it('keeps raw SQL and ?? bindings working, and converts the rows they return', async () => {
    const [rows] = await db.raw('SELECT ?? AS designation, size_pct_of_seedling FROM ?? WHERE ?? = ?', ['designation', 'rootstocks', 'designation', 'MM.106'])
    expect(rows).toEqual([{ designation: 'MM.106', sizePctOfSeedling: expect.any(Number) }])
  })

  it('writes camelCase keys to snake_case columns and reads them back in one transaction', async () => {
    await db.transaction(async (trx) => {
      const [id] = await trx('auditEvents').insert({ orgId: null, actorUserId: null, action: 'test.case_conversion', objectType: 'test' })
      const stored = await trx('audit_events').where({ id }).first('object_type', 'actorUserId')
      expect(stored).toEqual({ objectType: 'test', actorUserId: null })
      await trx('auditEvents').where({ id }).delete()
    })
  })
})

describe('the connection pool when the database drops its connections', () => {
  it('hands out new connections instead of the dead ones, so the app needs no restart', async () => {
    const pool = knexFactory(knexConfig(testEnv.databaseUrl))
    const connectionId = async (q: Knex | Knex.Transaction) => ((await q.raw('SELECT CONNECTION_ID() AS id'))[0] as { id: number }[])[0]!.id
    try {
      // Three connections at once, then idle in the pool: what a restarted server leaves behind.
      const dead = await Promise.all([1, 2, 3].map(() => pool.transaction(trx => connectionId(trx))))
      expect(new Set(dead).size).toBe(3)
      for (const id of dead) await db.raw('KILL CONNECTION ?', [id])
      await new Promise(r => setTimeout(r, 200))
      for (let i = 0; i < 3; i++) expect(dead).not.toContain(await connectionId(pool))
    }
    finally {
      await pool.destroy()
    }
  })
})
