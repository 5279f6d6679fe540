import type { Knex } from 'knex'

// Organisations, their people, and what sign-in needs: invitations, one-time tokens,
// counted sign-in failures, the e-mail outbox and the audit trail.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('organisations', (t) => {
    t.increments('id').primary()
    t.string('name', 160).notNullable()
    t.enu('kind', ['grower', 'maker']).notNullable()
    t.boolean('is_nursery').notNullable().defaultTo(false)
    t.string('region', 120).nullable()
    t.string('contact_email', 254).nullable()
    t.string('currency', 3).notNullable().defaultTo('GBP')
    t.enu('status', ['pending', 'active', 'suspended']).notNullable().defaultTo('active')
    t.string('press_type', 40).nullable()
    t.decimal('default_juice_yield_l_per_t', 8, 2).nullable()
    t.decimal('hydrometer_calibration_c', 5, 2).notNullable().defaultTo(20)
    t.string('payment_account_id', 120).nullable()
    t.string('payment_customer_id', 120).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['kind', 'status'])
  })

  await knex.schema.createTable('users', (t) => {
    t.increments('id').primary()
    t.integer('org_id').unsigned().nullable().references('organisations.id').onDelete('CASCADE')
    t.string('email', 254).notNullable().unique()
    t.string('name', 160).notNullable()
    t.string('password_hash', 100).notNullable()
    t.enu('role', ['owner', 'member', 'viewer', 'admin']).notNullable()
    t.enu('units', ['metric', 'us']).notNullable().defaultTo('metric')
    t.timestamp('email_verified_at', { precision: 3 }).nullable()
    t.boolean('active').notNullable().defaultTo(true)
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['org_id', 'role'])
  })

  await knex.schema.createTable('invitations', (t) => {
    t.increments('id').primary()
    t.integer('org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.string('email', 254).notNullable()
    t.enu('role', ['owner', 'member', 'viewer']).notNullable()
    t.string('token_hash', 64).notNullable().unique()
    t.integer('invited_by').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.timestamp('expires_at', { precision: 3 }).notNullable()
    t.timestamp('accepted_at', { precision: 3 }).nullable()
    t.timestamp('revoked_at', { precision: 3 }).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['org_id', 'email'])
  })

  await knex.schema.createTable('user_tokens', (t) => {
    t.increments('id').primary()
    t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE')
    t.enu('purpose', ['verify_email', 'reset_password']).notNullable()
    t.string('token_hash', 64).notNullable().unique()
    t.timestamp('expires_at', { precision: 3 }).notNullable()
    t.timestamp('used_at', { precision: 3 }).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
  })

  await knex.schema.createTable('sign_in_attempts', (t) => {
    t.bigIncrements('id').primary()
    t.string('email', 254).notNullable()
    t.string('ip', 64).notNullable()
    t.boolean('succeeded').notNullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['email', 'created_at'])
    t.index(['ip', 'created_at'])
  })

  await knex.schema.createTable('notifications', (t) => {
    t.bigIncrements('id').primary()
    t.integer('org_id').unsigned().nullable().references('organisations.id').onDelete('SET NULL')
    t.string('recipient', 254).notNullable()
    t.string('subject', 200).notNullable()
    t.text('body').notNullable()
    t.enu('status', ['queued', 'sent', 'failed']).notNullable().defaultTo('queued')
    t.string('error', 500).nullable()
    t.timestamp('sent_at', { precision: 3 }).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
  })

  await knex.schema.createTable('audit_events', (t) => {
    t.bigIncrements('id').primary()
    t.integer('org_id').unsigned().nullable().references('organisations.id').onDelete('SET NULL')
    t.integer('actor_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.string('action', 80).notNullable()
    t.string('object_type', 60).notNullable()
    t.bigInteger('object_id').nullable()
    t.json('detail').nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['org_id', 'created_at'])
  })
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['audit_events', 'notifications', 'sign_in_attempts', 'user_tokens', 'invitations', 'users', 'organisations']) {
    await knex.schema.dropTableIfExists(table)
  }
}
