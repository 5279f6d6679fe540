import knexFactory from 'knex'
import { knexConfig } from '../../server/db/config'

const REFERENCE_SEED = '02_catalogue.ts'

/** Brings the schema up to date; seeds the demo scenario into an empty database. */
export async function migrateAndSeed(databaseUrl: string): Promise<{ seeded: boolean }> {
  const knex = knexFactory(knexConfig(databaseUrl))
  try {
    await knex.migrate.latest()
    const [{ count }] = await knex('organisations').count({ count: '*' }) as [{ count: number }]
    if (Number(count) === 0) {
      await knex.seed.run()
      return { seeded: true }
    }
    // The reference catalogue is not demo data: fill it in on a database that predates it (the seed
    // leaves a catalogue that has rows alone).
    await knex.seed.run({ specific: REFERENCE_SEED })
    return { seeded: false }
  }
  finally {
    await knex.destroy()
  }
}
