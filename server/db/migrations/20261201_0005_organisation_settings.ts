import type { Knex } from 'knex'

// Organisation settings: a public description and contact details for counterparties, the
// hemisphere it grows in, tax on sales, whether it is listed in the directory, and a nursery's
// plant-health registration number. Press types become one spelling each ("rack and cloth" was
// written before the list of press types existed).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('organisations', (t) => {
    t.string('description', 500).nullable().after('region')
    t.string('contact_name', 120).nullable().after('contact_email')
    t.string('contact_phone', 40).nullable().after('contact_name')
    t.string('public_email', 254).nullable().after('contact_phone')
    t.enu('hemisphere', ['north', 'south']).notNullable().defaultTo('north').after('public_email')
    t.decimal('tax_rate_pct', 5, 2).nullable().after('currency')
    t.boolean('listed').notNullable().defaultTo(false).after('tax_rate_pct')
    t.string('plant_health_reg_no', 40).nullable().after('hydrometer_calibration_c')
    t.index(['listed', 'status'])
  })
  await knex('organisations').where({ press_type: 'rack and cloth' }).update({ press_type: 'rack-and-cloth' })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('organisations', (t) => {
    t.dropIndex(['listed', 'status'])
    t.dropColumns('description', 'contact_name', 'contact_phone', 'public_email', 'hemisphere', 'tax_rate_pct', 'listed', 'plant_health_reg_no')
  })
}
