import type { Knex } from 'knex'
import { rootstocks, varieties } from './data/catalogue'

// The shared reference catalogue (cider apple and perry pear varieties, apple and pear rootstocks),
// written once into an empty catalogue; the platform admin curates it from then on. The rows are
// in the API's shape; the database edge names the columns.
export async function seed(knex: Knex): Promise<void> {
  const [{ count }] = await knex('varieties').count({ count: '*' }) as [{ count: number }]
  if (Number(count) > 0) return

  await knex.transaction(async (trx) => {
    await trx('varieties').insert(varieties)
    await trx('rootstocks').insert(rootstocks)
  })
}
