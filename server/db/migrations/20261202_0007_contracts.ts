import type { Knex } from 'knex'

// Tree contracts (buyer ↔ nursery) and fruit contracts (maker ↔ grower). Each row holds the terms
// as they stand (the current version); every offer and counter is also kept whole in the
// contract's history (`contract_events.terms`), so any version can be read back and compared.
// A maker's planned need of fruit per juice class and harvest year is its own small table.
const NEGOTIATION = ['draft', 'offered', 'countered', 'accepted', 'declined', 'cancelled']

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('tree_contracts', (t) => {
    t.increments('id').primary()
    t.integer('buyer_org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.integer('nursery_org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.enu('drafted_by', ['buyer', 'nursery']).notNullable()
    t.enu('last_offer_by', ['buyer', 'nursery']).nullable()
    t.enu('state', [...NEGOTIATION, 'propagating', 'ready', 'delivered']).notNullable().defaultTo('draft')
    t.integer('version').unsigned().notNullable().defaultTo(0)
    t.integer('accepted_version').unsigned().nullable()
    t.date('expires_on').nullable()
    t.integer('expiry_noticed_version').unsigned().nullable()
    t.integer('variety_id').unsigned().notNullable().references('varieties.id')
    t.integer('rootstock_id').unsigned().notNullable().references('rootstocks.id')
    // What is worked between rootstock and variety, as written (a pear variety over quince, M.9…).
    t.string('interstem', 80).nullable()
    t.integer('tree_count').unsigned().notNullable()
    t.string('tree_type', 20).notNullable()
    t.decimal('min_caliper_mm', 4, 1).nullable()
    t.smallint('delivery_year').unsigned().notNullable()
    t.enu('delivery_season', ['autumn', 'spring']).notNullable()
    t.string('currency', 3).notNullable()
    t.integer('unit_price_minor').unsigned().notNullable()
    t.integer('royalty_per_tree_minor').unsigned().notNullable().defaultTo(0)
    t.decimal('deposit_pct', 5, 2).notNullable().defaultTo(0)
    t.string('deposit_if_buyer_cancels', 20).notNullable()
    t.string('deposit_if_nursery_cancels', 20).notNullable()
    t.string('buyer_may_cancel_until', 20).notNullable()
    t.boolean('certificate_required').notNullable().defaultTo(false)
    t.decimal('take_rate', 4, 3).notNullable()
    t.decimal('survival_rate', 4, 3).notNullable()
    t.string('planting_site', 200).nullable()
    t.text('notes').nullable()
    t.enu('cancelled_by', ['buyer', 'nursery']).nullable()
    t.integer('delivered_count').unsigned().nullable()
    t.date('delivered_on').nullable()
    t.integer('created_by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['buyer_org_id', 'state'])
    t.index(['nursery_org_id', 'state'])
  })

  await knex.schema.createTable('fruit_contracts', (t) => {
    t.increments('id').primary()
    t.integer('maker_org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.integer('grower_org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.enu('drafted_by', ['maker', 'grower']).notNullable()
    t.enu('last_offer_by', ['maker', 'grower']).nullable()
    t.enu('state', [...NEGOTIATION, 'fulfilled']).notNullable().defaultTo('draft')
    t.integer('version').unsigned().notNullable().defaultTo(0)
    t.integer('accepted_version').unsigned().nullable()
    t.date('expires_on').nullable()
    t.integer('expiry_noticed_version').unsigned().nullable()
    // Either a juice class of a species, or one variety (which has its own class).
    t.enu('species', ['apple', 'pear']).nullable()
    t.string('juice_class', 20).nullable()
    t.integer('variety_id').unsigned().nullable().references('varieties.id')
    t.decimal('tolerance_pct', 5, 2).notNullable().defaultTo(0)
    t.string('currency', 3).notNullable()
    t.integer('base_price_per_tonne_minor').unsigned().notNullable()
    t.decimal('baseline_brix', 4, 1).notNullable()
    t.integer('bonus_per_brix_per_tonne_minor').unsigned().notNullable().defaultTo(0)
    t.integer('deduction_per_brix_per_tonne_minor').unsigned().notNullable().defaultTo(0)
    t.decimal('reject_floor_brix', 4, 1).notNullable()
    t.decimal('max_rot_pct', 5, 2).nullable()
    t.decimal('max_damage_pct', 5, 2).nullable()
    t.string('crop_failure', 20).notNullable()
    t.text('notes').nullable()
    t.enu('cancelled_by', ['maker', 'grower']).nullable()
    t.integer('created_by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['maker_org_id', 'state'])
    t.index(['grower_org_id', 'state'])
  })

  await knex.schema.createTable('fruit_contract_years', (t) => {
    t.increments('id').primary()
    t.integer('contract_id').unsigned().notNullable().references('fruit_contracts.id').onDelete('CASCADE')
    t.smallint('harvest_year').unsigned().notNullable()
    t.decimal('tonnes', 10, 3).notNullable()
    t.date('window_from').notNullable()
    t.date('window_to').notNullable()
    t.unique(['contract_id', 'harvest_year'])
  })

  await knex.schema.createTable('contract_events', (t) => {
    t.bigIncrements('id').primary()
    t.enu('contract_kind', ['tree', 'fruit']).notNullable()
    t.integer('contract_id').unsigned().notNullable()
    t.string('action', 30).notNullable()
    t.integer('version').unsigned().notNullable()
    t.integer('by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.integer('by_org_id').unsigned().nullable().references('organisations.id').onDelete('SET NULL')
    // Kept as written at the time, so the history still reads right after a person leaves.
    t.string('by_name', 160).notNullable()
    t.json('changes').notNullable()
    t.json('terms').nullable()
    // A note the person gave with the move (why they declined, say).
    t.string('reason', 500).nullable()
    t.timestamp('at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['contract_kind', 'contract_id', 'id'])
  })

  await knex.schema.createTable('maker_needs', (t) => {
    t.integer('org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.string('juice_class', 30).notNullable()
    t.smallint('harvest_year').unsigned().notNullable()
    t.decimal('kg', 12, 1).notNullable()
    t.primary(['org_id', 'juice_class', 'harvest_year'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('maker_needs')
  await knex.schema.dropTableIfExists('contract_events')
  await knex.schema.dropTableIfExists('fruit_contract_years')
  await knex.schema.dropTableIfExists('fruit_contracts')
  await knex.schema.dropTableIfExists('tree_contracts')
}
