import type { Knex } from 'knex'

// A maker's named juice specs for the blend planner: the ranges a press blend is planned to (°Brix
// or SG, TA as malic in g/L, tannin in g/L), the volume it usually presses, and the pH it aims for
// as a note (pH does not mix linearly, so it is never planned on).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('blend_targets', (t) => {
    t.increments('id').primary()
    t.integer('org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.string('name', 120).notNullable()
    t.decimal('brix_min', 5, 2).nullable()
    t.decimal('brix_max', 5, 2).nullable()
    t.decimal('sg_min', 6, 4).nullable()
    t.decimal('sg_max', 6, 4).nullable()
    t.decimal('ta_min_g_per_l', 6, 2).nullable()
    t.decimal('ta_max_g_per_l', 6, 2).nullable()
    t.decimal('tannin_min_g_per_l', 6, 3).nullable()
    t.decimal('tannin_max_g_per_l', 6, 3).nullable()
    t.decimal('volume_l', 12, 1).nullable()
    t.string('ph_note', 120).nullable()
    t.text('notes').nullable()
    t.integer('created_by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.unique(['org_id', 'name'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('blend_targets')
}
