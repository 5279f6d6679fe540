import type { Knex } from 'knex'

// The e-mail outbox gains what a background sender needs (tries, the next try, a lease while one
// instance sends, the person and object a message is about), and in-app notices get their table.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('notifications', (t) => {
    t.integer('user_id').unsigned().nullable().references('users.id').onDelete('SET NULL').after('org_id')
    t.string('kind', 60).notNullable().defaultTo('account').after('user_id')
    t.string('link', 300).nullable().after('body')
    t.smallint('attempts').unsigned().notNullable().defaultTo(0).after('status')
    t.timestamp('next_attempt_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3)).after('attempts')
    // A sender holds a claimed row until its lease ends; a crash mid-send frees it for a retry then.
    t.timestamp('locked_until', { precision: 3 }).nullable().after('next_attempt_at')
    t.string('claimed_by', 80).nullable().after('locked_until')
    t.index(['status', 'next_attempt_at'], 'notifications_due')
    t.index(['org_id', 'created_at'], 'notifications_org_created')
  })
  // Rows written before the outbox had a sender were sent or failed at once; none waits.
  await knex('notifications').where({ status: 'failed' }).update({ attempts: 1 })
  await knex('notifications').where({ status: 'sent' }).update({ attempts: 1 })

  await knex.schema.createTable('notices', (t) => {
    t.bigIncrements('id').primary()
    t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE')
    t.integer('org_id').unsigned().nullable().references('organisations.id').onDelete('CASCADE')
    t.string('kind', 60).notNullable()
    t.string('subject', 200).notNullable()
    t.text('body').notNullable()
    t.string('link', 300).nullable()
    t.timestamp('read_at', { precision: 3 }).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['user_id', 'read_at'], 'notices_unread')
    t.index(['user_id', 'created_at'], 'notices_user_created')
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('notices')
  // The organisation's foreign key took over the new index in place of its own: give it one back first.
  await knex.schema.alterTable('notifications', (t) => {
    t.index(['org_id'], 'notifications_org_id_foreign')
  })
  await knex.schema.alterTable('notifications', (t) => {
    t.dropIndex(['org_id', 'created_at'], 'notifications_org_created')
    t.dropIndex(['status', 'next_attempt_at'], 'notifications_due')
    t.dropForeign(['user_id'])
    t.dropColumn('user_id')
    t.dropColumn('kind')
    t.dropColumn('link')
    t.dropColumn('attempts')
    t.dropColumn('next_attempt_at')
    t.dropColumn('locked_until')
    t.dropColumn('claimed_by')
  })
}
