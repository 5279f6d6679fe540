import type { Knex } from 'knex'

// Rootstocks the nursery propagates that the catalogue lacked: Mark, a dwarfing stock, and G.890, a
// semi-dwarfing one of about half a seedling's size. Each is added only where no rootstock of that
// designation is there yet, so a catalogue an admin already gave one keeps its own entry, and a new
// database (whose seed then adds the other rootstocks, skipping designations already there) ends
// with the same rows as an old one. The figures and sources are the seed data file's
// (server/db/seeds/data/catalogue.ts), written out here so this migration stays as it ran;
// tests/unit/catalogueData.test.ts checks the two agree.

export const NURSERY_ROOTSTOCKS = [
  {
    designation: 'Mark',
    species: 'apple',
    vigour: 'dwarf',
    size_pct_of_seedling: 35,
    needs_support: true,
    in_row_m: 1.2,
    between_row_m: 4.3,
    years_to_first_crop: 2,
    years_to_first_crop_late: 3,
    years_to_full_bearing: 5,
    yield_per_tree_kg: 20,
    source: "Size 35-40 % of standard (35 % used, the low end), precocity 'very early', tree support needed, class: eXtension Apples (Cooperative Extension), apples.extension.org, 'Apple Rootstock Info: Mark' (an open-pollinated seedling of M.9, Michigan State University 1979; drought sensitive, irrigation recommended; root mass proliferation makes trees uneven) and its list of dwarfing rootstocks. NC State Extension, 'Apple Rootstocks and Tree Spacing', Table 1 (tree size as % of seedling, non-spur scion; fruit bearing age in years) lists Mark at 50 %, not used here. Spacing 14 ft x 4 ft: eXtension Apples (Cooperative Extension), apples.extension.org, 'Dwarfing Apple Rootstocks', as M.9. First crop 2-3 y, full bearing and yield: from memory (common practice, as M.9).",
  },
  {
    designation: 'G.890',
    species: 'apple',
    vigour: 'semi-dwarf',
    size_pct_of_seedling: 50,
    needs_support: false,
    in_row_m: 3.0,
    between_row_m: 4.6,
    years_to_first_crop: 2,
    years_to_first_crop_late: 3,
    years_to_full_bearing: 6,
    yield_per_tree_kg: 30,
    source: "Size 50 %: about half a seedling tree (common practice); the Treco rootstock description 'Geneva 890' gives 40-50 % of seedling where it is grown like Washington State and 60-65 % like New York, free standing, precocious and productive (yield efficiency similar to or better than M.9), resistant to fire blight, crown rot and woolly apple aphid, rooting well in layer beds. Class: eXtension Apples (Cooperative Extension), apples.extension.org lists G.890 with semi-dwarfing rootstocks. Spacing 10 ft x 15 ft (3.0 x 4.6 m): NMSU Guide H-307 'Rootstocks for Size Control in Apple Trees' (central leader systems 10-12 x 15-20 ft, lower figures used). First crop 2-3 y, full bearing and yield: from memory (common practice, as G.11 and M.26).",
  },
]

export async function up(knex: Knex): Promise<void> {
  for (const row of NURSERY_ROOTSTOCKS) {
    const there = await knex('rootstocks').where({ designation: row.designation }).first('id')
    if (!there) await knex('rootstocks').insert(row)
  }
}

// Going down leaves the rows: they are reference data that blocks, beds and contracts may name by
// now, and the schema is unchanged.
export async function down(): Promise<void> {}
