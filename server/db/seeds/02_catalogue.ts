import type { Knex } from 'knex'
import { rootstocks, varieties } from './data/catalogue'

// The shared reference catalogue (cider apple and perry pear varieties, apple and pear rootstocks),
// written once into an empty catalogue; the platform admin curates it from then on.
export async function seed(knex: Knex): Promise<void> {
  const [{ count }] = await knex('varieties').count({ count: '*' }) as [{ count: number }]
  if (Number(count) > 0) return

  await knex.transaction(async (trx) => {
    await trx('varieties').insert(varieties.map(v => ({
      name: v.name,
      species: v.species,
      juice_class: v.juiceClass,
      typical_brix: v.typicalBrix,
      typical_ta_g_per_l: v.typicalTaGPerL,
      typical_tannin_g_per_l: v.typicalTanninGPerL,
      harvest_season: v.harvestSeason,
      source: v.source,
    })))
    await trx('rootstocks').insert(rootstocks.map(r => ({
      designation: r.designation,
      species: r.species,
      vigour: r.vigour,
      size_pct_of_seedling: r.sizePctOfSeedling,
      needs_support: r.needsSupport,
      in_row_m: r.inRowM,
      between_row_m: r.betweenRowM,
      years_to_first_crop: r.yearsToFirstCrop,
      years_to_full_bearing: r.yearsToFullBearing,
      yield_per_tree_kg: r.yieldPerTreeKg,
      source: r.source,
    })))
  })
}
