import knexFactory from 'knex'
import { knexConfig } from '../../server/db/config'

/** Brings the schema up to date; seeds the demo scenario into an empty database. */
export async function migrateAndSeed(databaseUrl: string): Promise<{ seeded: boolean }> {
  const knex = knexFactory(knexConfig(databaseUrl))
  try {
    await knex.migrate.latest()
    const [{ count }] = await knex('organisations').count({ count: '*' }) as [{ count: number }]
    if (Number(count) > 0) return { seeded: false }
    await knex.seed.run()
    return { seeded: true }
  }
  finally {
    await knex.destroy()
  }
}
