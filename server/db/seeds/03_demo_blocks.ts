import type { Knex } from 'knex'

// Orchard blocks of the invented Estry valley growers. Hollowmere's is the mature 6 ha cider
// orchard (bittersweets and a sharp on semi-vigorous stocks); Tansy Row's are young bittersharp
// blocks on dwarfing stocks. Tree counts sit a little under what the spacing allows (gaps, headlands).
interface DemoBlock {
  org: string
  name: string
  variety: string
  rootstock: string
  treeCount: number
  yearPlanted: number
  areaHa: number
  inRowM: number
  betweenRowM: number
  organicStatus: 'conventional' | 'in_conversion' | 'organic'
  survivalRate: number
  notes: string | null
}

const HOLLOWMERE = 'Hollowmere Orchard & Nursery'
const TANSY_ROW = 'Tansy Row Fruit'

export const demoBlocks: DemoBlock[] = [
  { org: HOLLOWMERE, name: 'Long Ground', variety: 'Dabinett', rootstock: 'MM.106', treeCount: 830, yearPlanted: 2008, areaHa: 2.0, inRowM: 4.3, betweenRowM: 5.5, organicStatus: 'conventional', survivalRate: 0.96, notes: 'Bush trees, grassed alleys; shaken and picked up from the ground.' },
  { org: HOLLOWMERE, name: 'Chapel Piece', variety: 'Yarlington Mill', rootstock: 'MM.106', treeCount: 620, yearPlanted: 2010, areaHa: 1.5, inRowM: 4.3, betweenRowM: 5.5, organicStatus: 'conventional', survivalRate: 0.97, notes: null },
  { org: HOLLOWMERE, name: 'Well Field', variety: "Brown's Apple", rootstock: 'M.7', treeCount: 580, yearPlanted: 2012, areaHa: 1.2, inRowM: 3.7, betweenRowM: 5.5, organicStatus: 'organic', survivalRate: 0.98, notes: 'Sharp fruit for blending; organic since 2019.' },
  { org: HOLLOWMERE, name: 'Hedge Acre', variety: 'Harry Masters Jersey', rootstock: 'M.7', treeCount: 630, yearPlanted: 2014, areaHa: 1.3, inRowM: 3.7, betweenRowM: 5.5, organicStatus: 'conventional', survivalRate: 0.95, notes: null },
  { org: TANSY_ROW, name: 'River Strip', variety: 'Kingston Black', rootstock: 'M.26', treeCount: 1150, yearPlanted: 2018, areaHa: 1.2, inRowM: 2.4, betweenRowM: 4.3, organicStatus: 'conventional', survivalRate: 0.97, notes: 'Staked; wet corner at the river end.' },
  { org: TANSY_ROW, name: 'Osier Bed', variety: 'Foxwhelp', rootstock: 'M.26', treeCount: 760, yearPlanted: 2020, areaHa: 0.8, inRowM: 2.4, betweenRowM: 4.3, organicStatus: 'in_conversion', survivalRate: 0.98, notes: null },
  { org: TANSY_ROW, name: 'Top Flats', variety: 'Stoke Red', rootstock: 'G.41', treeCount: 2550, yearPlanted: 2022, areaHa: 1.0, inRowM: 1.1, betweenRowM: 3.5, organicStatus: 'conventional', survivalRate: 0.99, notes: 'Post-and-wire trellis.' },
]

async function idsByName(knex: Knex, table: string, column: string, names: string[]): Promise<Map<string, number>> {
  const rows = await knex(table).whereIn(column, [...new Set(names)]).select('id', column) as Record<string, string | number>[]
  return new Map(rows.map(r => [String(r[column]), Number(r.id)]))
}

export async function seed(knex: Knex): Promise<void> {
  const [{ count }] = await knex('orchard_blocks').count({ count: '*' }) as [{ count: number }]
  if (Number(count) > 0) return
  const [{ catalogue }] = await knex('varieties').count({ catalogue: '*' }) as [{ catalogue: number }]
  if (Number(catalogue) === 0) {
    console.warn('Demo orchard blocks skipped: the variety catalogue is empty (seed it first).')
    return
  }

  const orgs = await idsByName(knex, 'organisations', 'name', demoBlocks.map(b => b.org))
  const varieties = await idsByName(knex, 'varieties', 'name', demoBlocks.map(b => b.variety))
  const rootstocks = await idsByName(knex, 'rootstocks', 'designation', demoBlocks.map(b => b.rootstock))
  const lookup = (map: Map<string, number>, key: string, what: string): number => {
    const id = map.get(key)
    if (id === undefined) throw new Error(`Demo orchard blocks: no ${what} named "${key}"`)
    return id
  }

  await knex.transaction(async (trx) => {
    for (const b of demoBlocks) {
      await trx('orchard_blocks').insert({
        org_id: lookup(orgs, b.org, 'organisation'),
        name: b.name,
        variety_id: lookup(varieties, b.variety, 'variety'),
        rootstock_id: lookup(rootstocks, b.rootstock, 'rootstock'),
        tree_count: b.treeCount,
        year_planted: b.yearPlanted,
        area_ha: b.areaHa,
        in_row_m: b.inRowM,
        between_row_m: b.betweenRowM,
        organic_status: b.organicStatus,
        survival_rate: b.survivalRate,
        notes: b.notes,
      })
    }
  })
}
