import type { Knex } from 'knex'

// The shared reference catalogue the platform admin curates: varieties and rootstocks.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('varieties', (t) => {
    t.increments('id').primary()
    t.string('name', 120).notNullable().unique()
    t.enu('species', ['apple', 'pear']).notNullable()
    t.enu('juice_class', ['sweet', 'sharp', 'bittersweet', 'bittersharp']).notNullable()
    t.decimal('typical_brix', 5, 2).nullable()
    t.decimal('typical_ta_g_per_l', 6, 2).nullable()
    t.decimal('typical_tannin_g_per_l', 6, 2).nullable()
    t.enu('harvest_season', ['early', 'mid', 'late']).nullable()
    t.string('source', 1000).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['species', 'juice_class'])
  })

  await knex.schema.createTable('rootstocks', (t) => {
    t.increments('id').primary()
    t.string('designation', 60).notNullable().unique()
    t.enu('species', ['apple', 'pear']).notNullable()
    t.enu('vigour', ['dwarf', 'semi-dwarf', 'semi-vigorous', 'vigorous']).notNullable()
    t.decimal('size_pct_of_seedling', 5, 1).nullable()
    t.boolean('needs_support').notNullable().defaultTo(false)
    t.decimal('in_row_m', 5, 2).nullable()
    t.decimal('between_row_m', 5, 2).nullable()
    t.decimal('years_to_first_crop', 4, 1).nullable()
    t.decimal('years_to_full_bearing', 4, 1).nullable()
    t.decimal('yield_per_tree_kg', 7, 1).nullable()
    t.string('source', 1000).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['species', 'vigour'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('rootstocks')
  await knex.schema.dropTableIfExists('varieties')
}
