import type { Knex } from 'knex'

// The nursery's season, its buyers' view and its plant health: a budwood lot may be marked suspect
// (and cleared again), a tree contract remembers which milestones its buyer was told of so each is
// told once, and the lowest expected count the buyer was warned of; an organisation may name the
// country it grows in, for plant passports.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('budwood_lots', (t) => {
    // When a disease is suspected in the wood: the day it was found, why, and by whom.
    t.date('suspect_on').nullable().after('notes')
    t.string('suspect_reason', 500).nullable().after('suspect_on')
    t.integer('suspect_by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL').after('suspect_reason')
    t.timestamp('suspect_marked_at', { precision: 3 }).nullable().after('suspect_by_user_id')
    // Cleared when a test or inspection finds the wood clean; the suspicion stays on record.
    t.timestamp('suspect_cleared_at', { precision: 3 }).nullable().after('suspect_marked_at')
    t.string('suspect_cleared_reason', 500).nullable().after('suspect_cleared_at')
  })

  await knex.schema.createTable('tree_contract_milestones', (t) => {
    t.increments('id').primary()
    t.integer('tree_contract_id').unsigned().notNullable().references('tree_contracts.id').onDelete('CASCADE')
    // budded, take-counted, headed-back, dug, …
    t.string('milestone', 30).notNullable()
    // The run it was reached on.
    t.integer('run_id').unsigned().notNullable().references('nursery_runs.id').onDelete('CASCADE')
    t.date('reached_on').notNullable()
    t.timestamp('noticed_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.unique(['tree_contract_id', 'milestone', 'run_id'], { indexName: 'tree_contract_milestones_once' })
  })

  await knex.schema.alterTable('tree_contracts', (t) => {
    // The expected finished trees the buyer was last warned of, while below the contracted number.
    t.integer('shortfall_noticed_trees').unsigned().nullable()
  })

  await knex.schema.alterTable('organisations', (t) => {
    // ISO 3166-1 alpha-2, for plant passports; null when not given.
    t.string('country_code', 2).nullable().after('hemisphere')
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('organisations', t => t.dropColumn('country_code'))
  await knex.schema.alterTable('tree_contracts', t => t.dropColumn('shortfall_noticed_trees'))
  await knex.schema.dropTable('tree_contract_milestones')
  await knex.schema.alterTable('budwood_lots', (t) => {
    t.dropForeign(['suspect_by_user_id'])
    t.dropColumns('suspect_on', 'suspect_reason', 'suspect_by_user_id', 'suspect_marked_at', 'suspect_cleared_at', 'suspect_cleared_reason')
  })
}
