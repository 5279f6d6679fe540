import type { Knex } from 'knex'

// Payments through the processor: a tree contract's deposit or balance, or a settled delivery's
// settlement, from the party that owes it to the party that is owed (whose connected account the
// processor pays). The amount is integer minor units in the currency it was asked in. At most one
// live payment (pending or succeeded) per purpose and object: `live_key` is filled only while a
// payment is live, and its unique index refuses a second; the service also locks the object row
// and checks first. Every change of state is kept in `payment_events`, each processor event once
// (its id is unique), so a replayed webhook changes nothing twice.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('payments', (t) => {
    t.increments('id').primary()
    t.enu('purpose', ['deposit', 'balance', 'settlement']).notNullable()
    t.integer('tree_contract_id').unsigned().nullable().references('tree_contracts.id').onDelete('CASCADE')
    t.integer('delivery_id').unsigned().nullable().references('deliveries.id').onDelete('CASCADE')
    t.integer('payer_org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.integer('payee_org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.bigInteger('amount_minor').notNullable()
    t.string('currency', 3).notNullable()
    t.enu('state', ['pending', 'succeeded', 'failed', 'refunded']).notNullable().defaultTo('pending')
    // The seller's connected account the payment names, as it was when the payment was made.
    t.string('payment_account_id', 120).notNullable()
    t.string('checkout_session_id', 255).nullable().unique()
    t.text('checkout_url').nullable()
    t.string('payment_intent_id', 255).nullable().unique()
    t.string('refund_id', 255).nullable()
    t.bigInteger('refunded_minor').nullable()
    // Every request to the processor about this payment carries this key and a suffix for the call.
    t.string('idempotency_key', 80).notNullable().unique()
    t.text('failure_reason').nullable()
    t.integer('created_by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.timestamp('succeeded_at', { precision: 3 }).nullable()
    t.timestamp('failed_at', { precision: 3 }).nullable()
    t.timestamp('refunded_at', { precision: 3 }).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['payer_org_id', 'created_at'], 'payments_payer')
    t.index(['payee_org_id', 'created_at'], 'payments_payee')
    t.index(['tree_contract_id', 'purpose'], 'payments_tree_contract')
    t.index(['delivery_id', 'purpose'], 'payments_delivery')
  })
  // Exactly one object: a tree contract for a deposit or balance, a delivery for a settlement.
  await knex.raw(`ALTER TABLE payments ADD CONSTRAINT payments_one_object CHECK (
    (purpose IN ('deposit', 'balance') AND tree_contract_id IS NOT NULL AND delivery_id IS NULL)
    OR (purpose = 'settlement' AND delivery_id IS NOT NULL AND tree_contract_id IS NULL))`)
  await knex.raw(`ALTER TABLE payments ADD COLUMN live_key VARCHAR(40) AS (CASE WHEN state IN ('pending', 'succeeded')
    THEN CONCAT(purpose, ':', COALESCE(tree_contract_id, delivery_id)) END) PERSISTENT`)
  await knex.raw('CREATE UNIQUE INDEX payments_one_live ON payments (live_key)')

  await knex.schema.createTable('payment_events', (t) => {
    t.bigIncrements('id').primary()
    t.integer('payment_id').unsigned().notNullable().references('payments.id').onDelete('CASCADE')
    // created, succeeded, failed, refund-requested, refunded; `applied` false for an event that came
    // too late to change anything (a failure after the payment succeeded).
    t.string('action', 30).notNullable()
    t.string('from_state', 20).nullable()
    t.string('to_state', 20).notNullable()
    t.boolean('applied').notNullable().defaultTo(true)
    t.string('processor_event_id', 255).nullable().unique()
    t.string('processor_event_type', 80).nullable()
    t.integer('by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.string('by_name', 160).notNullable()
    t.text('note').nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['payment_id', 'id'], 'payment_events_payment')
  })
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['payment_events', 'payments']) await knex.schema.dropTableIfExists(table)
}
