import knexFactory from 'knex'
import { snakeCase } from 'scule'
import { beforeAll, describe, expect, it } from 'vitest'
import { fruitTermsFields, treeTermsFields } from '#shared/schemas/contract'
import type { BearingPace } from '#shared/schemas/block'
import { growerCoverage, makerSupply, type CoverageContract, type SupplyTreeContract } from '#shared/utils/coverage'
import { sumForecastByClass, type BearingCurve, type ClassedBlock, type ForecastClass } from '#shared/utils/forecast'
import type { FruitSpecies, JuiceClass } from '#shared/utils/juiceClass'
import { knexConfig } from '../../server/db/config'
import { demoBlocks } from '../../server/db/seeds/03_demo_blocks'
import { seed } from '../../server/db/seeds/05_demo_contracts'
import { YOUNG_BLOCKS } from '../../server/db/seeds/data/demoContracts'
import { bearingCurveOf } from '../../server/utils/bearingCurve'
import { testDb } from '../support/db'
import { testEnv } from '../support/env'
import { as } from '../support/http'

// The demo world's contracts as the seed leaves them on a fresh database: what a person signing in
// as Quillhurst, Hollowmere or Tansy Row finds, and a history that agrees with each contract.
const db = testDb()

type Row = Record<string, unknown>
type Org = 'quillhurst' | 'hollowmere' | 'tansy' | 'marrowby'
const ORG_NAMES: Record<Org, string> = {
  quillhurst: 'Quillhurst Cider Works', hollowmere: 'Hollowmere Orchard & Nursery', tansy: 'Tansy Row Fruit', marrowby: 'Marrowby Perry House',
}
const org = {} as Record<Org, number>

interface Event { id: number, action: string, version: number, by_user_id: number, by_org_id: number, by_name: string, changes: { field: string, from: unknown, to: unknown }[], terms: Row | null, reason: string | null, at: Date }

const json = (value: unknown) => (typeof value === 'string' ? JSON.parse(value) : value)

async function history(kind: 'tree' | 'fruit', id: number): Promise<Event[]> {
  const rows = await db('contract_events').where({ contract_kind: kind, contract_id: id }).orderBy('id')
  return rows.map(r => ({ ...r, changes: json(r.changes), terms: json(r.terms) }))
}

/** The demo's own contract of this kind between the two: the first made (tests may add others). */
async function treeContract(variety: string): Promise<Row> {
  const row = await db('tree_contracts as c').join('varieties as v', 'v.id', 'c.variety_id').join('rootstocks as r', 'r.id', 'c.rootstock_id')
    .where({ 'c.buyer_org_id': org.quillhurst, 'c.nursery_org_id': org.hollowmere, 'v.name': variety })
    .orderBy('c.id').first('c.*', 'v.name as variety_name', 'r.designation')
  if (!row) throw new Error(`No demo tree contract for ${variety}`)
  return row
}

async function fruitContract(): Promise<{ row: Row, years: Row[] }> {
  const row = await db('fruit_contracts').where({ maker_org_id: org.quillhurst, grower_org_id: org.tansy }).orderBy('id').first()
  if (!row) throw new Error('No demo fruit contract between Quillhurst and Tansy Row')
  const years = await db('fruit_contract_years').where({ contract_id: row.id }).orderBy('harvest_year')
  return { row, years }
}

/** The terms as the contract row holds them, in the API's keys (the schedule from its own table). */
function rowTerms(fields: object, row: Row, years?: Row[]): Row {
  return Object.fromEntries(Object.keys(fields).map(key => [key, key === 'schedule'
    ? years!.map(y => ({ year: y.harvest_year, tonnes: y.tonnes, windowFrom: y.window_from, windowTo: y.window_to }))
    : row[snakeCase(key)]]))
}

/**
 * The history agrees with the contract and with the move rules: created by the drafter as version
 * 0, offered by the drafter as version 1, each counter by the side that did not make the last offer
 * and one version up with its changes listed, an acceptance by that side naming the version it
 * accepts, then only the nursery's work; each entry by that organisation's owner, in time order;
 * the last offer's terms are the row's.
 */
async function expectConsistentHistory(kind: 'tree' | 'fruit', row: Row, sides: Record<string, number>, years?: Row[]) {
  const fields = kind === 'tree' ? treeTermsFields : fruitTermsFields
  const events = await history(kind, row.id as number)
  const other = (orgId: number) => Object.values(sides).find(id => id !== orgId)
  const drafter = sides[row.drafted_by as string]

  expect(events[0]).toMatchObject({ action: 'created', version: 0, by_org_id: drafter, changes: [], terms: null })
  expect(row.created_by_user_id).toBe(events[0]!.by_user_id)
  let lastOffer: Event | null = null
  for (const [i, event] of events.entries()) {
    const person = await db('users').where({ id: event.by_user_id }).first('name', 'org_id', 'role')
    expect(person, `${event.action} by ${event.by_name}`).toMatchObject({ name: event.by_name, org_id: event.by_org_id, role: 'owner' })
    if (i === 0) continue
    const before = events[i - 1]!
    expect(event.at.getTime()).toBeGreaterThan(before.at.getTime())
    if (event.action === 'offered') {
      expect(lastOffer).toBeNull()
      expect(event).toMatchObject({ version: 1, by_org_id: drafter, changes: [] })
    }
    else if (event.action === 'countered') {
      expect(lastOffer).not.toBeNull()
      expect(event.version).toBe(lastOffer!.version + 1)
      expect(event.by_org_id).toBe(other(lastOffer!.by_org_id))
      const changed = Object.keys(fields).filter(k => JSON.stringify(event.terms![k]) !== JSON.stringify(lastOffer!.terms![k]))
      expect(event.changes.map(c => c.field).sort()).toEqual(changed.sort())
      for (const c of event.changes) expect([c.from, c.to]).toEqual([lastOffer!.terms![c.field], event.terms![c.field]])
    }
    else if (event.action === 'accepted') {
      expect(events.slice(i + 1).map(e => e.action).every(a => a === 'propagation-started')).toBe(true)
      expect(event).toMatchObject({ version: lastOffer!.version, by_org_id: other(lastOffer!.by_org_id), terms: null })
    }
    else if (event.action === 'propagation-started') {
      expect(before.action).toBe('accepted')
      expect(event).toMatchObject({ version: lastOffer!.version, by_org_id: sides.nursery, changes: [], terms: null })
    }
    else throw new Error(`Unexpected action ${event.action} in the demo history`)
    if (event.action === 'offered' || event.action === 'countered') {
      expect(Object.keys(event.terms!)).toEqual(Object.keys(fields))
      lastOffer = event
    }
  }
  expect(lastOffer).not.toBeNull()
  expect(row.version).toBe(lastOffer!.version)
  expect(sides[row.last_offer_by as string]).toBe(lastOffer!.by_org_id)
  expect(rowTerms(fields, row, years)).toEqual(lastOffer!.terms)
  const accepted = events.find(e => e.action === 'accepted')
  if (row.state === 'accepted' || row.state === 'propagating') expect([row.accepted_version, accepted?.version]).toEqual([row.version, row.version])
  else expect([row.accepted_version, accepted]).toEqual([null, undefined])
  return events
}

interface CatalogueBlock { tree_count: number, year_planted: number, survival_rate: number, bearing_pace: BearingPace, species: FruitSpecies, juice_class: JuiceClass, designation: string, years_to_first_crop: number | null, years_to_first_crop_late: number | null, years_to_full_bearing: number | null, yield_per_tree_kg: number | null }

function curveOf(r: CatalogueBlock, pace: BearingPace = 'middle'): BearingCurve {
  const { curve, note } = bearingCurveOf({ designation: r.designation, yearsToFirstCrop: r.years_to_first_crop, yearsToFirstCropLate: r.years_to_first_crop_late, yearsToFullBearing: r.years_to_full_bearing, yieldPerTreeKg: r.yield_per_tree_kg }, pace)
  if (!curve) throw new Error(note)
  return curve
}

/** Tansy Row's forecast by class, as the blocks page works it, over the demo's own blocks. */
async function tansyForecast() {
  const names = [...demoBlocks, ...YOUNG_BLOCKS].filter(b => b.org === ORG_NAMES.tansy).map(b => b.name)
  const rows = await db('orchard_blocks as b').join('varieties as v', 'v.id', 'b.variety_id').join('rootstocks as r', 'r.id', 'b.rootstock_id')
    .where('b.org_id', org.tansy).whereIn('b.name', names)
    .select('b.tree_count', 'b.year_planted', 'b.survival_rate', 'b.bearing_pace', 'v.species', 'v.juice_class', 'r.designation', 'r.years_to_first_crop', 'r.years_to_first_crop_late', 'r.years_to_full_bearing', 'r.yield_per_tree_kg') as CatalogueBlock[]
  expect(rows).toHaveLength(names.length)
  const blocks: ClassedBlock[] = rows.map(r => ({ trees: r.tree_count, yearPlanted: r.year_planted, survivalRate: r.survival_rate, species: r.species, juiceClass: r.juice_class, curve: curveOf(r, r.bearing_pace) }))
  return sumForecastByClass(blocks, { startYear: 2026, years: 5 })
}

function coverageContract(row: Row, years: Row[]): CoverageContract {
  return {
    state: row.state as CoverageContract['state'],
    fruit: { species: row.species as FruitSpecies, juiceClass: row.juice_class as JuiceClass },
    schedule: years.map(y => ({ year: y.harvest_year as number, tonnes: y.tonnes as number })),
    tolerancePct: row.tolerance_pct as number,
  }
}

beforeAll(async () => {
  for (const [key, name] of Object.entries(ORG_NAMES)) {
    const row = await db('organisations').where({ name }).first('id')
    if (!row) throw new Error(`No demo organisation ${name}`)
    org[key as Org] = row.id
  }
})

describe('the demo tree contracts, Quillhurst ↔ Hollowmere', () => {
  const sides = () => ({ buyer: org.quillhurst, nursery: org.hollowmere })

  it('has 1,200 Dabinett on MM.106 for spring delivery two years out, accepted after Hollowmere countered on price, and in propagation', async () => {
    const row = await treeContract('Dabinett')
    expect(row).toMatchObject({
      designation: 'MM.106', tree_count: 1200, tree_type: 'maiden', delivery_year: 2028, delivery_season: 'spring', currency: 'GBP',
      unit_price_minor: 1450, deposit_pct: 20, take_rate: 0.85, survival_rate: 0.9, certificate_required: true,
      state: 'propagating', version: 2, accepted_version: 2, drafted_by: 'buyer', last_offer_by: 'nursery',
    })
    expect(row.planting_site).toMatch(/Quillhurst/)
    const events = await expectConsistentHistory('tree', row, sides())
    expect(events.map(e => [e.action, e.version])).toEqual([['created', 0], ['offered', 1], ['countered', 2], ['accepted', 2], ['propagation-started', 2]])
    expect(events[2]!.changes).toEqual([{ field: 'unitPriceMinor', from: 1350, to: 1450 }])
  })

  it('has 600 Kingston Black on MM.106 three years out, offered once and accepted', async () => {
    const row = await treeContract('Kingston Black')
    expect(row).toMatchObject({ designation: 'MM.106', tree_count: 600, delivery_year: 2029, state: 'accepted', version: 1, accepted_version: 1, last_offer_by: 'buyer' })
    const events = await expectConsistentHistory('tree', row, sides())
    expect(events.map(e => [e.action, e.version, e.by_org_id])).toEqual([['created', 0, org.quillhurst], ['offered', 1, org.quillhurst], ['accepted', 1, org.hollowmere]])
  })

  it('has Yarlington Mill offered by Quillhurst and countered by Hollowmere on price, open for some weeks', async () => {
    const row = await treeContract('Yarlington Mill')
    expect(row).toMatchObject({ designation: 'MM.106', state: 'countered', version: 2, accepted_version: null, drafted_by: 'buyer', last_offer_by: 'nursery', unit_price_minor: 1600 })
    const events = await expectConsistentHistory('tree', row, sides())
    expect(events.map(e => [e.action, e.version, e.by_org_id])).toEqual([['created', 0, org.quillhurst], ['offered', 1, org.quillhurst], ['countered', 2, org.hollowmere]])
    const counter = events[2]!
    expect(counter.changes).toContainEqual({ field: 'unitPriceMinor', from: 1450, to: 1600 })
    expect(counter.reason).toBeTruthy()
    // Open until a day some weeks after the counter.
    const daysOpen = (Date.parse(row.expires_on as string) - counter.at.getTime()) / 86_400_000
    expect(daysOpen).toBeGreaterThan(14)
    expect(daysOpen).toBeLessThan(90)
    // Each side's owners and members heard of the other's move, with a link to the contract (whether
    // it is still unread is left to the notices tests, which mark notices read). Quillhurst's viewer
    // is told nothing.
    const told = async (email: string) => db('notices as n').join('users as u', 'u.id', 'n.user_id')
      .where({ 'u.email': email, 'n.link': `/contracts/tree/${row.id}` }).orderBy('n.id').select('n.kind', 'n.subject', 'n.body')
    const toOlu = await told('maker@demo.test')
    expect(toOlu).toEqual([expect.objectContaining({ kind: 'tree_contract.countered', subject: 'Hollowmere Orchard & Nursery made a counter-offer for 900 Yarlington Mill on MM.106' })])
    expect(toOlu[0].body).toContain(counter.reason)
    for (const email of ['grower@demo.test', 'grower-member@demo.test']) {
      expect((await told(email)).map(n => n.kind), email).toEqual(['tree_contract.offered'])
    }
    expect(await told('viewer@demo.test')).toEqual([])
  })
})

describe('the demo fruit contract, Tansy Row → Quillhurst', () => {
  it('sells bittersharp apples for the 2026–2030 harvests, each year with its tonnes and window, accepted', async () => {
    const { row, years } = await fruitContract()
    expect(row).toMatchObject({
      species: 'apple', juice_class: 'bittersharp', variety_id: null, state: 'accepted', currency: 'GBP', tolerance_pct: 10,
      base_price_per_tonne_minor: 21000, baseline_brix: 12, reject_floor_brix: 9.5, max_rot_pct: 5, crop_failure: 'carried',
    })
    expect(row.reject_floor_brix as number).toBeLessThan(row.baseline_brix as number)
    expect(years.map(y => y.harvest_year)).toEqual([2026, 2027, 2028, 2029, 2030])
    for (const y of years) {
      expect(y.tonnes as number).toBeGreaterThan(0)
      expect(String(y.window_from).slice(0, 4)).toBe(String(y.harvest_year))
      expect(String(y.window_to) >= String(y.window_from)).toBe(true)
    }
    await expectConsistentHistory('fruit', row, { maker: org.quillhurst, grower: org.tansy }, years)
  })

  it('asks more than Tansy Row’s bittersharp forecast, beyond the tolerance, in exactly one year', async () => {
    const { row, years } = await fruitContract()
    const forecast = await tansyForecast()
    // By hand (see the seed's data): 2027 is 93,676.5 kg, before the young blocks bear; 2030 is
    // 141,075 kg with Mill Leat at 3/4 and Ferry Piece at 2/5 of their full crops.
    expect(forecast.bittersharp[1]!.kg).toBeCloseTo(93_676.5, 6)
    expect(forecast.bittersharp[4]!.kg).toBeCloseTo(141_075, 6)
    const { overCommitted } = growerCoverage(forecast, [coverageContract(row, years)])
    expect(overCommitted.map(o => [o.juiceClass, o.year, o.ifAccepted])).toEqual([['bittersharp', 2027, false]])
    // The other four years are comfortably covered: at most 80 % of the forecast.
    for (const y of years.filter(y => y.harvest_year !== 2027)) {
      const kg = forecast.bittersharp.find(f => f.year === y.harvest_year)!.kg
      expect((y.tonnes as number) * 1000, String(y.harvest_year)).toBeLessThanOrEqual(0.8 * kg)
    }
  })

  it('has young blocks at Tansy Row and Hollowmere, so the forecasts rise year on year', async () => {
    const young = await db('orchard_blocks as b').join('varieties as v', 'v.id', 'b.variety_id').where('b.year_planted', '>=', 2023).select('b.org_id', 'v.juice_class')
    expect(young.some(b => b.org_id === org.tansy && b.juice_class === 'bittersharp')).toBe(true)
    expect(young.some(b => b.org_id === org.hollowmere)).toBe(true)
    const kg = (await tansyForecast()).bittersharp.map(f => f.kg)
    kg.slice(1).forEach((k, i) => expect(k).toBeGreaterThan(kg[i]!))
  })
})

describe('the over-commitment warning, as the demo people see it', () => {
  it('shows Tansy Row bittersharp 2027 on its coverage page and nothing else', async () => {
    const coverage = await (await as('grower2Owner')).get('/api/coverage')
    expect(coverage.status).toBe(200)
    expect(coverage.body.overCommitted.map((o: { juiceClass: string, year: number }) => `${o.juiceClass} ${o.year}`)).toEqual(['bittersharp 2027'])
    // Both sides read the accepted contract; the maker sees the warning on no accepted contract.
    const list = await (await as('makerOwner')).get('/api/fruit-contracts?state=accepted')
    expect(list.body.items.some((c: { growerOrgName: string }) => c.growerOrgName === 'Tansy Row Fruit')).toBe(true)
  })
})

describe('who has no contract', () => {
  it('Marrowby has none with Tansy Row, either way', async () => {
    const pairs = [[org.marrowby, org.tansy], [org.tansy, org.marrowby]]
    for (const [a, b] of pairs) {
      expect(await db('fruit_contracts').where({ maker_org_id: a, grower_org_id: b }).first('id')).toBeUndefined()
      expect(await db('tree_contracts').where({ buyer_org_id: a, nursery_org_id: b }).first('id')).toBeUndefined()
    }
  })
})

describe('Quillhurst’s fruit needs', () => {
  it('plans bittersweet, bittersharp and sharp for 2027–2036, about 120 t a season and rising', async () => {
    const needs = await db('maker_needs').where({ org_id: org.quillhurst }).orderBy(['juice_class', 'harvest_year'])
    const classes = [...new Set(needs.map(n => n.juice_class))].sort()
    expect(classes).toEqual(['bittersharp', 'bittersweet', 'sharp'])
    for (const juiceClass of classes) {
      const rows = needs.filter(n => n.juice_class === juiceClass)
      expect(rows.map(n => n.harvest_year)).toEqual(Array.from({ length: 10 }, (_, i) => 2027 + i))
      rows.slice(1).forEach((n, i) => expect(n.kg).toBeGreaterThanOrEqual(rows[i]!.kg))
    }
    const season = (year: number) => needs.filter(n => n.harvest_year === year).reduce((sum, n) => sum + n.kg, 0)
    // Quillhurst presses about 120 t a season (the demo scenario).
    expect(season(2027)).toBeGreaterThanOrEqual(110_000)
    expect(season(2027)).toBeLessThanOrEqual(130_000)
    expect(season(2036)).toBeGreaterThan(season(2027))
  })

  it('shows a gap in some classes and years once the contracts and the trees are counted', async () => {
    const needs = (await db('maker_needs').where({ org_id: org.quillhurst })).map(n => ({ juiceClass: n.juice_class as ForecastClass, year: n.harvest_year, kg: n.kg }))
    const { row, years } = await fruitContract()
    const trees: SupplyTreeContract[] = []
    for (const variety of ['Dabinett', 'Kingston Black', 'Yarlington Mill']) {
      const c = await treeContract(variety)
      const v = await db('varieties').where({ id: c.variety_id }).first('species', 'juice_class')
      const r = await db('rootstocks').where({ id: c.rootstock_id }).first()
      trees.push({ state: c.state as SupplyTreeContract['state'], trees: c.tree_count as number, variety: { species: v.species, juiceClass: v.juice_class }, curve: curveOf(r), deliveryYear: c.delivery_year as number, deliverySeason: c.delivery_season as SupplyTreeContract['deliverySeason'], survivalRate: c.survival_rate as number })
    }
    const rows = makerSupply(needs, [coverageContract(row, years)], trees, { startYear: 2027, years: 10 })
    const gaps = rows.filter(r => r.gapKg > 0)
    expect(gaps.length).toBeGreaterThan(0)
    expect(new Set(gaps.map(g => g.juiceClass)).size).toBeGreaterThan(1)
    // Tansy Row's bittersharp covers the need while the contract runs.
    expect(rows.filter(r => r.juiceClass === 'bittersharp' && r.year <= 2030).every(r => r.gapKg === 0)).toBe(true)
    expect(rows.some(r => r.gapKg === 0)).toBe(true)
  })
})

describe('seeding again', () => {
  it('adds nothing to a database that has the demo contracts already', async () => {
    const tables = ['tree_contracts', 'fruit_contracts', 'fruit_contract_years', 'contract_events', 'maker_needs', 'orchard_blocks', 'notices', 'notifications']
    const counts = () => Promise.all(tables.map(async t => Number((await db(t).count({ n: '*' }).first())!.n)))
    const before = await counts()
    // The way npm start seeds: through the database edge, with its case conversion.
    const knex = knexFactory(knexConfig(testEnv.databaseUrl))
    try {
      await seed(knex)
    }
    finally {
      await knex.destroy()
    }
    expect(await counts()).toEqual(before)
  })
})
