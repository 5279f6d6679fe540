import type { Knex } from 'knex'

// Deliveries of fruit at the press under a fruit contract: the weigh ticket, the reading paid on,
// the settlement worked from the contract's terms (kept line by line as it was worked), the state
// and who disputed it, and the history of every move and correction.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('deliveries', (t) => {
    t.increments('id').primary()
    t.integer('fruit_contract_id').unsigned().notNullable().references('fruit_contracts.id').onDelete('CASCADE')
    t.integer('maker_org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.integer('grower_org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.integer('lot_id').unsigned().notNullable().references('harvest_lots.id')
    // The contract year the fruit counts against (the lot's harvest year).
    t.smallint('harvest_year').unsigned().notNullable()
    t.date('delivered_on').notNullable()
    // The weigh ticket: its number as printed, gross and tare when both were weighed, and net.
    t.string('ticket_no', 40).nullable()
    t.decimal('gross_kg', 12, 1).nullable()
    t.decimal('tare_kg', 12, 1).nullable()
    t.decimal('net_kg', 12, 1).notNullable()
    // The reading paid on (the lot's latest when none was chosen), and its °Brix as taken.
    t.bigInteger('reading_id').unsigned().nullable().references('juice_readings.id').onDelete('SET NULL')
    t.decimal('reading_brix', 5, 2).notNullable()
    t.date('reading_sampled_on').notNullable()
    t.decimal('rot_pct', 5, 2).nullable()
    t.decimal('damage_pct', 5, 2).nullable()
    // Set when the maker refuses the load for its quality, whatever the sugar.
    t.text('quality_reject_reason').nullable()
    t.enu('state', ['recorded', 'settled', 'paid', 'disputed']).notNullable().defaultTo('recorded')
    t.integer('version').unsigned().notNullable().defaultTo(1)
    t.enu('disputed_by', ['maker', 'grower']).nullable()
    t.text('dispute_reason').nullable()
    // Kilograms of this load past the contract year's tolerance, and what the maker did with them.
    t.decimal('excess_kg', 12, 1).notNullable().defaultTo(0)
    t.enu('excess_decision', ['accepted', 'refused']).nullable()
    // The settlement as worked (JSON of every line), its total, the seller's tax and the sum.
    t.string('currency', 3).notNullable()
    t.json('settlement').notNullable()
    t.bigInteger('amount_minor').notNullable()
    t.decimal('tax_rate_pct', 5, 2).nullable()
    t.bigInteger('tax_minor').notNullable().defaultTo(0)
    t.bigInteger('total_minor').notNullable()
    t.text('notes').nullable()
    t.integer('recorded_by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.timestamp('settled_at', { precision: 3 }).nullable()
    t.timestamp('paid_at', { precision: 3 }).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['maker_org_id', 'harvest_year'], 'deliveries_maker_year')
    t.index(['grower_org_id', 'harvest_year'], 'deliveries_grower_year')
    t.index(['fruit_contract_id', 'harvest_year'], 'deliveries_contract_year')
    t.index(['lot_id'], 'deliveries_lot')
  })

  await knex.schema.createTable('delivery_events', (t) => {
    t.bigIncrements('id').primary()
    t.integer('delivery_id').unsigned().notNullable().references('deliveries.id').onDelete('CASCADE')
    // recorded, corrected, disputed, dispute-withdrawn, settled, paid
    t.string('action', 30).notNullable()
    t.integer('version').unsigned().notNullable()
    t.integer('by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.integer('by_org_id').unsigned().nullable().references('organisations.id').onDelete('SET NULL')
    t.string('by_name', 160).notNullable()
    // [{ field, from, to }] for a correction; empty otherwise.
    t.json('changes').notNullable()
    t.text('reason').nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['delivery_id', 'id'], 'delivery_events_delivery')
  })
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['delivery_events', 'deliveries']) await knex.schema.dropTableIfExists(table)
}
