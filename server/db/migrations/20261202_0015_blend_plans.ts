import type { Knex } from 'knex'

// A maker's saved blend plans and what was pressed of them. A plan keeps the question it was solved
// from (the solve request) and its last answer; while it is committed, its kilograms of each lot are
// held in blend_plan_lots, so no other plan can count on them. A pressing records what was actually
// pressed (the day, the juice, the vessel) and pressing_lots the kilograms actually taken from each
// lot, which leave the lot. Every move of a plan is kept in blend_plan_events.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('blend_plans', (t) => {
    t.increments('id').primary()
    t.integer('org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.string('name', 120).notNullable()
    t.enu('state', ['draft', 'committed', 'pressed', 'released']).notNullable().defaultTo('draft')
    t.json('request').notNullable()
    t.json('result').notNullable()
    t.text('notes').nullable()
    t.integer('version').unsigned().notNullable().defaultTo(1)
    t.integer('created_by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.integer('updated_by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.timestamp('committed_at', { precision: 3 }).nullable()
    t.timestamp('released_at', { precision: 3 }).nullable()
    t.timestamp('pressed_at', { precision: 3 }).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['org_id', 'state'], 'blend_plans_org_state')
  })

  // The kilograms a plan takes of each lot, as its commit reserved them; they count against the lot
  // only while the plan is committed (a released or pressed plan keeps them as what was planned).
  await knex.schema.createTable('blend_plan_lots', (t) => {
    t.increments('id').primary()
    t.integer('plan_id').unsigned().notNullable().references('blend_plans.id').onDelete('CASCADE')
    // A lot goes only with its grower's organisation (the app never deletes a lot with readings).
    t.integer('lot_id').unsigned().notNullable().references('harvest_lots.id').onDelete('CASCADE')
    t.decimal('kg', 12, 1).notNullable()
    t.decimal('litres', 12, 1).notNullable()
    t.unique(['plan_id', 'lot_id'])
    t.index(['lot_id'], 'blend_plan_lots_lot')
  })

  await knex.schema.createTable('pressings', (t) => {
    t.increments('id').primary()
    t.integer('org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.integer('plan_id').unsigned().notNullable().unique().references('blend_plans.id').onDelete('CASCADE')
    t.date('pressed_on').notNullable()
    t.decimal('litres_pressed', 12, 1).notNullable()
    t.string('vessel', 80).notNullable()
    t.text('notes').nullable()
    t.integer('recorded_by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['org_id', 'pressed_on'], 'pressings_org_day')
  })

  await knex.schema.createTable('pressing_lots', (t) => {
    t.increments('id').primary()
    t.integer('pressing_id').unsigned().notNullable().references('pressings.id').onDelete('CASCADE')
    t.integer('lot_id').unsigned().notNullable().references('harvest_lots.id').onDelete('CASCADE')
    t.decimal('kg', 12, 1).notNullable()
    // The order the lots went into the press, 1 first.
    t.smallint('position').unsigned().notNullable()
    t.unique(['pressing_id', 'lot_id'])
    t.index(['lot_id'], 'pressing_lots_lot')
  })

  await knex.schema.createTable('blend_plan_events', (t) => {
    t.bigIncrements('id').primary()
    t.integer('plan_id').unsigned().notNullable().references('blend_plans.id').onDelete('CASCADE')
    // saved, edited, committed, released, pressed
    t.string('action', 30).notNullable()
    t.string('from_state', 20).nullable()
    t.string('to_state', 20).notNullable()
    t.integer('version').unsigned().notNullable()
    t.integer('by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.json('detail').nullable()
    t.timestamp('at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['plan_id', 'at'], 'blend_plan_events_plan')
  })
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['blend_plan_events', 'pressing_lots', 'pressings', 'blend_plan_lots', 'blend_plans']) await knex.schema.dropTableIfExists(table)
}
