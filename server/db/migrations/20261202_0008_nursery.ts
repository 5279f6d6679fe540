import type { Knex } from 'knex'

// The nursery: beds that make rootstock (stool, cutting and seedling beds) and the fields of nursery
// rows, each bed's yearly records; liner stock (lifted or bought in); budwood lots; the row map
// (rows with positions, runs: a stretch of one row with one rootstock, lined out on a date, meant
// for a variety and maybe a tree contract, with its tag); and the dated events on a run, from which
// its counts are derived.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('nursery_beds', (t) => {
    t.increments('id').primary()
    t.integer('org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.string('name', 80).notNullable()
    t.enu('kind', ['stool', 'cutting', 'seedling', 'field']).notNullable()
    t.integer('rootstock_id').unsigned().nullable().references('rootstocks.id')
    t.integer('mother_plants').unsigned().nullable()
    t.smallint('year_established').unsigned().nullable()
    t.string('seed_source', 200).nullable()
    t.text('notes').nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.unique(['org_id', 'name'])
  })

  await knex.schema.createTable('nursery_bed_records', (t) => {
    t.increments('id').primary()
    t.integer('org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.integer('bed_id').unsigned().notNullable().references('nursery_beds.id').onDelete('CASCADE')
    t.string('kind', 30).notNullable()
    t.date('done_on').notNullable()
    t.integer('count').unsigned().nullable()
    // Liners are graded by stem diameter (e.g. 5-7 mm).
    t.string('grade', 20).nullable()
    t.string('hormone', 80).nullable()
    t.string('hormone_strength', 40).nullable()
    t.text('notes').nullable()
    t.integer('by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['bed_id', 'done_on'])
  })

  await knex.schema.createTable('liner_lots', (t) => {
    t.increments('id').primary()
    t.integer('org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.integer('rootstock_id').unsigned().notNullable().references('rootstocks.id')
    t.string('grade', 20).notNullable()
    t.enu('source', ['lifted', 'bought']).notNullable()
    t.integer('bed_record_id').unsigned().nullable().references('nursery_bed_records.id').onDelete('CASCADE')
    t.string('supplier', 160).nullable()
    t.string('certificate', 120).nullable()
    t.integer('count').unsigned().notNullable()
    t.date('received_on').notNullable()
    t.text('notes').nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['org_id', 'rootstock_id', 'grade'])
  })

  await knex.schema.createTable('budwood_lots', (t) => {
    t.increments('id').primary()
    t.integer('org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.string('label', 60).notNullable()
    t.integer('variety_id').unsigned().notNullable().references('varieties.id')
    t.date('cut_on').notNullable()
    t.enu('source_kind', ['own-block', 'own-tree', 'bought']).notNullable()
    t.integer('block_id').unsigned().nullable().references('orchard_blocks.id').onDelete('SET NULL')
    // Which tree or row, as written; or the bought-in source's name.
    t.string('source_note', 200).nullable()
    t.string('supplier', 160).nullable()
    t.string('certificate', 120).nullable()
    t.integer('sticks').unsigned().notNullable()
    t.text('notes').nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.unique(['org_id', 'label'])
  })

  await knex.schema.createTable('nursery_rows', (t) => {
    t.increments('id').primary()
    t.integer('org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    // The nursery-row field the row lies in (a bed of kind `field`).
    t.integer('field_id').unsigned().notNullable().references('nursery_beds.id')
    t.string('name', 40).notNullable()
    t.integer('positions').unsigned().notNullable()
    t.decimal('spacing_cm', 5, 1).nullable()
    t.text('notes').nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.unique(['field_id', 'name'])
  })

  await knex.schema.createTable('nursery_runs', (t) => {
    t.increments('id').primary()
    t.integer('org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.integer('row_id').unsigned().notNullable().references('nursery_rows.id')
    t.integer('from_position').unsigned().notNullable()
    t.integer('to_position').unsigned().notNullable()
    t.integer('rootstock_id').unsigned().notNullable().references('rootstocks.id')
    t.string('interstem', 80).nullable()
    t.string('liner_grade', 20).nullable()
    t.date('lined_out_on').notNullable()
    t.integer('lined_out_count').unsigned().notNullable()
    t.integer('variety_id').unsigned().notNullable().references('varieties.id')
    t.integer('tree_contract_id').unsigned().nullable().references('tree_contracts.id').onDelete('SET NULL')
    t.string('tag_code', 16).notNullable().unique()
    t.timestamp('tag_printed_at', { precision: 3 }).nullable()
    // When the variety or rootstock last changed: a tag printed before it is stale.
    t.timestamp('identity_changed_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.text('notes').nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['org_id', 'row_id'])
    t.index(['tree_contract_id'])
  })

  await knex.schema.createTable('propagation_events', (t) => {
    t.bigIncrements('id').primary()
    t.integer('org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.integer('run_id').unsigned().notNullable().references('nursery_runs.id').onDelete('CASCADE')
    t.string('kind', 30).notNullable()
    t.date('happened_on').notNullable()
    t.integer('count').unsigned().nullable()
    t.string('cause', 30).nullable()
    t.string('method', 30).nullable()
    t.integer('variety_id').unsigned().nullable().references('varieties.id')
    t.integer('budwood_lot_id').unsigned().nullable().references('budwood_lots.id')
    t.decimal('bud_height_cm', 5, 1).nullable()
    t.smallint('day_order').unsigned().nullable()
    t.smallint('pass_no').unsigned().nullable()
    // Dug trees by grade: [{ caliperMm, heightCm, feathered, count }].
    t.json('grades').nullable()
    t.text('notes').nullable()
    t.integer('by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.string('by_name', 160).notNullable()
    // Sent with an entry made offline, so sending it twice records it once.
    t.string('client_key', 64).nullable()
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['run_id', 'happened_on'])
    t.unique(['org_id', 'client_key'])
  })
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['propagation_events', 'nursery_runs', 'nursery_rows', 'budwood_lots', 'liner_lots', 'nursery_bed_records', 'nursery_beds']) {
    await knex.schema.dropTableIfExists(table)
  }
}
