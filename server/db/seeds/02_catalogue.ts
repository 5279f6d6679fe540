import type { Knex } from 'knex'
import { rootstocks, varieties } from './data/catalogue'

// The shared reference catalogue (cider apple and perry pear varieties, apple and pear rootstocks),
// written once into an empty catalogue; the platform admin curates it from then on. The rows are
// in the API's shape; the database edge names the columns. Rootstocks a later migration added
// before the seed ran (20261202_0009_nursery_rootstocks) are already there and are skipped.
export async function seed(knex: Knex): Promise<void> {
  const [{ count }] = await knex('varieties').count({ count: '*' }) as [{ count: number }]
  if (Number(count) > 0) return

  await knex.transaction(async (trx) => {
    await trx('varieties').insert(varieties)
    const there = new Set((await trx('rootstocks').select('designation') as { designation: string }[]).map(r => r.designation.toLowerCase()))
    const missing = rootstocks.filter(r => !there.has(r.designation.toLowerCase()))
    if (missing.length) await trx('rootstocks').insert(missing)
  })
}
