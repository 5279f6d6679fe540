import type { Knex } from 'knex'

// Perry pears get their own published classes (with "medium sharp"), rootstocks keep both ends of
// their published range of years to first crop, and a block says where in that range it is
// forecast. Reference rows shipped earlier with figures that disagree with their sources are
// corrected where they still hold the figure first shipped (an admin's own edit is left alone).

const OLD_CLASSES = ['sweet', 'sharp', 'bittersweet', 'bittersharp']
const NEW_CLASSES = ['sweet', 'sharp', 'medium sharp', 'bittersweet', 'bittersharp']

const PEAR_CLASSES: [name: string, shipped: string, published: string][] = [
  ['Blakeney Red', 'sweet', 'medium sharp'],
  ['Yellow Huffcap', 'sharp', 'medium sharp'],
  ['Brandy', 'sweet', 'medium sharp'],
  ['Gin', 'sweet', 'medium sharp'],
  ['Thorn', 'sharp', 'medium sharp'],
  ['Red Pear', 'sweet', 'medium sharp'],
]

const FIRST_CROP_LATE: [designation: string, late: number][] = [
  ['M.9', 3], ['G.41', 3], ['G.935', 3], ['G.11', 3], ['M.26', 4], ['M.7', 4], ['MM.106', 4], ['MM.111', 6],
  ['Seedling', 10], ['Quince C', 4], ['Quince A', 4], ['Pyrodwarf', 3], ['OHxF 333', 4], ['OHxF 87', 4], ['Pear seedling', 10],
]

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('varieties', (t) => {
    t.enu('juice_class', NEW_CLASSES).notNullable().alter()
  })
  await knex.schema.alterTable('rootstocks', (t) => {
    t.decimal('years_to_first_crop_late', 4, 1).nullable().after('years_to_first_crop')
  })
  await knex.schema.alterTable('orchard_blocks', (t) => {
    t.enu('bearing_pace', ['early', 'middle', 'late']).notNullable().defaultTo('middle').after('survival_rate')
  })

  for (const [name, shipped, published] of PEAR_CLASSES) {
    await knex('varieties').where({ name, species: 'pear', juice_class: shipped }).update({ juice_class: published })
  }
  // No perry pear is "sharp" in the published classes, and the forecast refuses one: an admin's own
  // "sharp" pear becomes medium sharp, the nearest pear class.
  await knex('varieties').where({ species: 'pear', juice_class: 'sharp' }).update({ juice_class: 'medium sharp' })
  await knex('varieties').where({ name: "Medaille d'Or", typical_tannin_g_per_l: 10.5 }).update({ typical_tannin_g_per_l: null })
  await knex('varieties').where({ name: 'Sweet Alford', typical_ta_g_per_l: 3.1 }).update({ typical_ta_g_per_l: null })
  await knex('rootstocks').where({ designation: 'OHxF 87', in_row_m: 1.5 })
    .update({ in_row_m: 5.5, between_row_m: 7.5, years_to_full_bearing: 8, yield_per_tree_kg: 100 })
  for (const [designation, late] of FIRST_CROP_LATE) {
    await knex('rootstocks').where({ designation }).whereNull('years_to_first_crop_late').where('years_to_first_crop', '<=', late)
      .update({ years_to_first_crop_late: late })
  }
}

// Going down takes the schema back; the corrected figures stay corrected (they are the sources'
// figures), and a medium sharp pear can only go back to the nearest old class, sharp.
export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('orchard_blocks', (t) => {
    t.dropColumn('bearing_pace')
  })
  await knex.schema.alterTable('rootstocks', (t) => {
    t.dropColumn('years_to_first_crop_late')
  })
  await knex('varieties').where({ juice_class: 'medium sharp' }).update({ juice_class: 'sharp' })
  await knex.schema.alterTable('varieties', (t) => {
    t.enu('juice_class', OLD_CLASSES).notNullable().alter()
  })
}
