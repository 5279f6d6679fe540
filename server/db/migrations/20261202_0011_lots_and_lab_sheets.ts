import type { Knex } from 'knex'

// Harvest lots, the lab and juice sheets uploaded for them (the file itself is kept in S3-compatible
// storage, its row here), the juice readings the sheets or a person's hand give, and the column
// mapping an organisation last used for a sheet of the same headers.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('harvest_lots', (t) => {
    t.increments('id').primary()
    t.integer('org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.string('code', 40).notNullable()
    t.integer('block_id').unsigned().nullable().references('orchard_blocks.id').onDelete('SET NULL')
    t.integer('variety_id').unsigned().notNullable().references('varieties.id')
    t.date('picked_on').notNullable()
    // The year of the harvest the lot belongs to (the year picked).
    t.smallint('harvest_year').unsigned().notNullable()
    t.decimal('net_kg', 12, 1).notNullable()
    t.integer('bins').unsigned().nullable()
    t.text('notes').nullable()
    t.enu('state', ['available', 'delivered', 'pressed']).notNullable().defaultTo('available')
    t.integer('created_by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.unique(['org_id', 'code'])
    t.index(['org_id', 'harvest_year'])
    t.index(['variety_id'])
  })

  await knex.schema.createTable('lab_sheets', (t) => {
    t.increments('id').primary()
    t.integer('org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    // The file's name as uploaded.
    t.string('name', 255).notNullable()
    t.string('object_key', 300).notNullable().unique()
    t.string('sha256', 64).notNullable()
    t.integer('size_bytes').unsigned().notNullable()
    // Judged from the bytes, not the name: text/csv, the XLSX type or application/pdf.
    t.string('content_type', 120).notNullable()
    t.enu('kind', ['csv', 'xlsx', 'pdf']).notNullable()
    // The header row of a CSV or XLSX sheet, as read.
    t.json('headers').nullable()
    t.integer('uploaded_by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.string('uploaded_by_name', 160).notNullable()
    t.timestamp('uploaded_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.timestamp('imported_at', { precision: 3 }).nullable()
    t.integer('imported_count').unsigned().nullable()
    t.integer('skipped_count').unsigned().nullable()
    // The same file twice in one organisation is one sheet.
    t.unique(['org_id', 'sha256'])
  })

  await knex.schema.createTable('juice_readings', (t) => {
    t.bigIncrements('id').primary()
    t.integer('org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    t.integer('lot_id').unsigned().notNullable().references('harvest_lots.id').onDelete('CASCADE')
    t.integer('lab_sheet_id').unsigned().nullable().references('lab_sheets.id').onDelete('SET NULL')
    // The sheet's row it came from (the header is row 1); null when typed by hand.
    t.integer('sheet_row').unsigned().nullable()
    t.date('sampled_on').notNullable()
    t.decimal('brix', 5, 2).nullable()
    // Specific gravity corrected to the organisation's hydrometer calibration temperature, and as read.
    t.decimal('sg', 6, 4).nullable()
    t.decimal('sg_as_read', 6, 4).nullable()
    t.decimal('temp_c', 4, 1).nullable()
    // Titratable acidity as malic acid in g/L, and as the lab reported it.
    t.decimal('ta_g_per_l', 6, 2).nullable()
    t.enu('ta_reported_as', ['malic', 'tartaric', 'sulfuric']).nullable()
    t.decimal('ta_reported_value', 8, 3).nullable()
    t.enu('ta_reported_unit', ['g/L', '% w/v']).nullable()
    t.decimal('ph', 4, 2).nullable()
    t.decimal('tannin_g_per_l', 6, 3).nullable()
    t.decimal('yan_mg_per_l', 7, 1).nullable()
    t.text('notes').nullable()
    t.integer('entered_by_user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.timestamp('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['lot_id', 'sampled_on'])
  })

  await knex.schema.createTable('sheet_mappings', (t) => {
    t.increments('id').primary()
    t.integer('org_id').unsigned().notNullable().references('organisations.id').onDelete('CASCADE')
    // sha-256 of the header row as normalised (trimmed, lower case, joined by tabs).
    t.string('headers_key', 64).notNullable()
    t.json('headers').notNullable()
    // { lotCode, sampledOn, brix, sg, … } → header, and the options (date format, decimal comma, acid, units).
    t.json('mapping').notNullable()
    t.json('options').notNullable()
    t.timestamp('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.unique(['org_id', 'headers_key'])
  })
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['sheet_mappings', 'juice_readings', 'lab_sheets', 'harvest_lots']) await knex.schema.dropTableIfExists(table)
}
