import type { Knex } from 'knex'

// A grower's planted blocks: one variety on one rootstock, with the tree count and spacing
// the yield forecast and the planting density are worked from.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('orchard_blocks', (t) => {
    t.increments('id').primary()
    t.integer('org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.string('name', 120).notNullable()
    // A catalogue entry in use by a block cannot be deleted out from under it.
    t.integer('variety_id').unsigned().notNullable().references('varieties.id').onDelete('RESTRICT')
    t.integer('rootstock_id').unsigned().notNullable().references('rootstocks.id').onDelete('RESTRICT')
    t.integer('tree_count').unsigned().notNullable()
    t.smallint('year_planted').unsigned().notNullable()
    t.decimal('area_ha', 9, 3).notNullable()
    t.decimal('in_row_m', 5, 2).notNullable()
    t.decimal('between_row_m', 5, 2).notNullable()
    t.enu('organic_status', ['conventional', 'in_conversion', 'organic']).notNullable().defaultTo('conventional')
    // Share of the planted trees still standing; scales the forecast.
    t.decimal('survival_rate', 4, 3).notNullable().defaultTo(1)
    t.string('notes', 2000).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['org_id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('orchard_blocks')
}
