import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { hashPassword } from '../../server/utils/passwords'
import { testDb, uniqueEmail } from '../support/db'
import { DEMO_PASSWORD, testEnv } from '../support/env'
import { ApiClient } from '../support/http'

// A grower's coverage, on organisations of this file's own (removed afterwards, with their blocks,
// contracts and people), so the demo's figures neither move these nor are moved by them.
// Contract rows go straight into the tables, in the states each case needs.
const db = testDb()
const PREFIX = `Coverage test ${Date.now().toString(36)}`

interface Org { id: number, client: ApiClient, email: string }
const orgs: Org[] = []

async function scratchOrg(kind: 'grower' | 'maker', name: string): Promise<Org> {
  const [id] = await db('organisations').insert({ name: `${PREFIX} ${name}`, kind, status: 'active' })
  const email = uniqueEmail(`coverage-${kind}`)
  await db('users').insert({ email, name: `${name} owner`, org_id: id, role: 'owner', units: 'metric', password_hash: await hashPassword(DEMO_PASSWORD), email_verified_at: new Date() })
  const client = new ApiClient()
  await client.signIn(email, DEMO_PASSWORD)
  if (!client.hasSession()) throw new Error(`Sign-in failed for ${email}`)
  const org = { id: id!, client, email }
  orgs.push(org)
  return org
}

interface FruitRow {
  maker: Org
  grower: Org
  state: string
  draftedBy?: 'maker' | 'grower'
  fruit: { variety_id: number } | { species: 'apple' | 'pear', juice_class: string }
  tolerancePct: number
  schedule: [year: number, tonnes: number][]
}

async function fruitContract(c: FruitRow): Promise<number> {
  const [id] = await db('fruit_contracts').insert({
    maker_org_id: c.maker.id, grower_org_id: c.grower.id, drafted_by: c.draftedBy ?? 'maker', last_offer_by: c.state === 'draft' ? null : 'maker',
    state: c.state, version: c.state === 'draft' ? 0 : 1, ...c.fruit, tolerance_pct: c.tolerancePct, currency: 'GBP',
    base_price_per_tonne_minor: 25_000, baseline_brix: 12, reject_floor_brix: 9, crop_failure: 'forgiven',
  })
  await db('fruit_contract_years').insert(c.schedule.map(([year, tonnes]) => ({
    contract_id: id, harvest_year: year, tonnes, window_from: `${year}-10-01`, window_to: `${year}-11-30`,
  })))
  return id!
}

let ids: { dabinett: number, m26: number }
let grower: Org
let otherGrower: Org
let maker: Org
const contract: Record<'accepted' | 'offered' | 'countered' | 'draft' | 'declined' | 'cancelled' | 'otherGrowers', number> = {} as never

beforeAll(async () => {
  ids = {
    dabinett: (await db('varieties').where({ name: 'Dabinett' }).first('id')).id,
    m26: (await db('rootstocks').where({ designation: 'M.26' }).first('id')).id,
  }
  grower = await scratchOrg('grower', 'Orchard')
  otherGrower = await scratchOrg('grower', 'Other orchard')
  maker = await scratchOrg('maker', 'Cidery')

  // The grower's forecast, bittersweet only (Dabinett), on M.26 at the early end of its range: first
  // crop at age 2, full bearing at age 6, 30 kg a tree (the seeded catalogue's figures, checked in
  // blocks.test.ts). Fraction of the full crop = (age − 2 + 1) / (6 − 2 + 1).
  //   Old block, 100 trees planted 2000, full bearing:          100 × 30 kg           = 3,000 kg a year
  //   Young block, 200 trees planted 2027, ages 3, 4, 5 in 2030–2032: 200 × 30 kg × 2/5, 3/5, 4/5
  //                                                             = 2,400, 3,600, 4,800 kg
  //   → bittersweet 5,400 kg (2030), 6,600 kg (2031), 7,800 kg (2032); no pears.
  const block = { org_id: grower.id, variety_id: ids.dabinett, rootstock_id: ids.m26, area_ha: 0.1, in_row_m: 2.4, between_row_m: 4.3, bearing_pace: 'early' }
  await db('orchard_blocks').insert([
    { ...block, name: `${PREFIX} old`, tree_count: 100, year_planted: 2000 },
    { ...block, name: `${PREFIX} young`, tree_count: 200, year_planted: 2027 },
  ])

  contract.accepted = await fruitContract({
    maker, grower, state: 'accepted', fruit: { species: 'apple', juice_class: 'bittersweet' }, tolerancePct: 10,
    // 2029 lies before the window asked for below, so it is left out (and does not fail the forecast).
    schedule: [[2029, 5], [2030, 7], [2031, 6], [2032, 6]],
  })
  contract.offered = await fruitContract({ maker, grower, state: 'offered', fruit: { variety_id: ids.dabinett }, tolerancePct: 0, schedule: [[2031, 1.5]] })
  contract.countered = await fruitContract({ maker, grower, state: 'countered', fruit: { species: 'pear', juice_class: 'sweet' }, tolerancePct: 5, schedule: [[2030, 2]] })
  // None of these count: the maker's draft the grower has not been shown, a declined and a cancelled
  // contract, and another grower's accepted contract with the same maker.
  contract.draft = await fruitContract({ maker, grower, state: 'draft', fruit: { species: 'apple', juice_class: 'bittersweet' }, tolerancePct: 0, schedule: [[2032, 100]] })
  contract.declined = await fruitContract({ maker, grower, state: 'declined', fruit: { species: 'apple', juice_class: 'bittersweet' }, tolerancePct: 0, schedule: [[2030, 50]] })
  contract.cancelled = await fruitContract({ maker, grower, state: 'cancelled', fruit: { species: 'apple', juice_class: 'sharp' }, tolerancePct: 0, schedule: [[2031, 9]] })
  contract.otherGrowers = await fruitContract({ maker, grower: otherGrower, state: 'accepted', fruit: { species: 'apple', juice_class: 'bittersweet' }, tolerancePct: 0, schedule: [[2030, 40]] })
})

afterAll(async () => {
  const orgIds = orgs.map(o => o.id)
  await db('audit_events').whereIn('org_id', orgIds).delete()
  await db('sign_in_attempts').whereIn('email', orgs.map(o => o.email)).delete()
  // Contracts, their years, blocks and people go with their organisations (ON DELETE CASCADE).
  await db('organisations').whereIn('id', orgIds).delete()
})

/** Each figure to within a gram: the forecast is a sum of products of decimals. */
function expectRows(actual: Record<string, unknown>[], expected: Record<string, unknown>[]) {
  expect(actual).toHaveLength(expected.length)
  expected.forEach((row, i) => {
    for (const [key, value] of Object.entries(row)) {
      if (typeof value === 'number') expect(actual[i]![key], `row ${i} ${key}`).toBeCloseTo(value, 3)
      else expect(actual[i]![key], `row ${i} ${key}`).toBe(value)
    }
  })
}

describe('GET /api/coverage', () => {
  it('sets the forecast per class and year against accepted and open contracts, worked by hand', async () => {
    const res = await grower.client.get('/api/coverage?startYear=2030&years=3')
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.startYear).toBe(2030)
    expect(res.body.years).toEqual([2030, 2031, 2032])
    expectRows(res.body.rows, [
      // 2030: 7 t accepted against 5,400 kg: 1,600 kg short; no offer that year.
      { juiceClass: 'bittersweet', year: 2030, forecastKg: 5400, contractedKg: 7000, offeredKg: 0, shortfallKg: 1600, shortfallIfAcceptedKg: 1600 },
      // 2031: 6 t accepted against 6,600 kg: covered; the 1.5 t Dabinett offer makes 7,500 kg: 900 kg short.
      { juiceClass: 'bittersweet', year: 2031, forecastKg: 6600, contractedKg: 6000, offeredKg: 1500, shortfallKg: 0, shortfallIfAcceptedKg: 900 },
      // 2032: 6 t against 7,800 kg. The maker's 100 t draft is not counted, or this would be short.
      { juiceClass: 'bittersweet', year: 2032, forecastKg: 7800, contractedKg: 6000, offeredKg: 0, shortfallKg: 0, shortfallIfAcceptedKg: 0 },
      // The countered pear contract sums under perry sweet, where the grower has no trees: 2 t open, 2,000 kg short if accepted.
      { juiceClass: 'perry sweet', year: 2030, forecastKg: 0, contractedKg: 0, offeredKg: 2000, shortfallKg: 0, shortfallIfAcceptedKg: 2000 },
    ])
    // No 2029 row (outside the window), no sharp row (the cancelled contract), no 40 t from another grower's contract.
    expect(res.body.rows.some((r: { year: number }) => r.year === 2029)).toBe(false)
  })

  it('warns where the contracts exceed the forecast by more than their tolerance', async () => {
    const res = await grower.client.get('/api/coverage?startYear=2030&years=3')
    expectRows(res.body.overCommitted, [
      // 2030: the least 7 t ± 10 % accepts is 6,300 kg, 900 kg above the 5,400 kg forecast: over-committed already.
      { juiceClass: 'bittersweet', year: 2030, forecastKg: 5400, contractedKg: 7000, leastKg: 6300, shortKg: 900, ifAccepted: false },
      // 2031: 6 t × 0.9 + 1.5 t × 1.0 = 5,400 + 1,500 = 6,900 kg, 300 kg above 6,600 kg: only if the offer is accepted.
      { juiceClass: 'bittersweet', year: 2031, forecastKg: 6600, contractedKg: 7500, leastKg: 6900, shortKg: 300, ifAccepted: true },
      // Perry sweet 2030: 2 t × 0.95 = 1,900 kg against nothing grown.
      { juiceClass: 'perry sweet', year: 2030, forecastKg: 0, contractedKg: 2000, leastKg: 1900, shortKg: 1900, ifAccepted: true },
    ])
  })

  it('lists the contracts it counted, with the maker and the class each is summed under', async () => {
    const res = await grower.client.get('/api/coverage?startYear=2030&years=3')
    expect(res.body.contracts).toEqual([
      { id: contract.accepted, makerOrgName: `${PREFIX} Cidery`, state: 'accepted', fruitClass: 'bittersweet' },
      { id: contract.offered, makerOrgName: `${PREFIX} Cidery`, state: 'offered', fruitClass: 'bittersweet' },
      { id: contract.countered, makerOrgName: `${PREFIX} Cidery`, state: 'countered', fruitClass: 'perry sweet' },
    ])
    expect(res.body.blocksWithoutCurve).toEqual([])
  })

  it('counts another grower’s own contracts only for that grower', async () => {
    const res = await otherGrower.client.get('/api/coverage?startYear=2030&years=1')
    expect(res.status).toBe(200)
    // 40 t accepted against no blocks at all.
    expectRows(res.body.rows, [{ juiceClass: 'bittersweet', year: 2030, forecastKg: 0, contractedKg: 40_000, offeredKg: 0, shortfallKg: 40_000, shortfallIfAcceptedKg: 40_000 }])
    expect(res.body.contracts.map((c: { id: number }) => c.id)).toEqual([contract.otherGrowers])
  })

  it('counts a contract once the maker offers it, not while it is the maker’s draft', async () => {
    await db('fruit_contracts').where({ id: contract.draft }).update({ state: 'offered', version: 1, last_offer_by: 'maker' })
    try {
      const res = await grower.client.get('/api/coverage?startYear=2032&years=1')
      // 2032: 6 t accepted, 100 t now offered against 7,800 kg: 106,000 − 7,800 = 98,200 kg short if accepted.
      expectRows(res.body.rows, [{ juiceClass: 'bittersweet', year: 2032, forecastKg: 7800, contractedKg: 6000, offeredKg: 100_000, shortfallKg: 0, shortfallIfAcceptedKg: 98_200 }])
    }
    finally {
      await db('fruit_contracts').where({ id: contract.draft }).update({ state: 'draft', version: 0, last_offer_by: null })
    }
  })

  it('answers an empty table for a window without contracts, and this year’s 15 years by default', async () => {
    const empty = await grower.client.get('/api/coverage?startYear=2040&years=2')
    expect(empty.status).toBe(200)
    expect(empty.body).toMatchObject({ startYear: 2040, years: [2040, 2041], rows: [], overCommitted: [] })
    const byDefault = await grower.client.get('/api/coverage')
    const thisYear = new Date().getUTCFullYear()
    expect(byDefault.body.startYear).toBe(thisYear)
    expect(byDefault.body.years).toHaveLength(15)
  })

  it('answers 400 naming the parameter for a window it cannot forecast', async () => {
    for (const [query, field] of [['startYear=abc', 'startYear'], ['startYear=1899', 'startYear'], ['years=0', 'years'], ['years=31', 'years'], ['years=2.5', 'years']]) {
      const res = await grower.client.get(`/api/coverage?${query}`)
      expect(res.status, query).toBe(400)
      expect(res.body.data.issues.map((i: { path: string }) => i.path), query).toEqual([field])
    }
  })
})

describe('the warning on an offer before the grower accepts it', () => {
  // The fruit-contract service calls this with the offer's terms; it reads the database the app does.
  let offerCoverageWarning: typeof import('../../server/services/coverage').offerCoverageWarning
  let closeDb: () => Promise<void>

  beforeAll(async () => {
    process.env.DATABASE_URL = testEnv.databaseUrl
    offerCoverageWarning = (await import('../../server/services/coverage')).offerCoverageWarning
    const { useDb } = await import('../../server/utils/db')
    closeDb = () => useDb().destroy()
  })
  afterAll(async () => {
    await closeDb()
  })

  it('names the years of the offer that its grower’s forecast would not cover, with the accepted contracts', async () => {
    // A new offer of 1 t bittersweet a year, ± 0 %, for 2030–2032, beside the accepted 7, 6, 6 t ± 10 %
    // (the open offers are not counted: only what is accepted, and this offer):
    //   2030: 6,300 kg least accepted is already above 5,400 kg: short 900 kg without the offer
    //   2031: 5,400 + 1,000 = 6,400 kg against 6,600 kg: covered
    //   2032: 5,400 + 1,000 = 6,400 kg against 7,800 kg: covered
    const warnings = await offerCoverageWarning(grower.id, { fruitClass: 'bittersweet', schedule: [{ year: 2030, tonnes: 1 }, { year: 2031, tonnes: 1 }, { year: 2032, tonnes: 1 }], tolerancePct: 0 })
    expectRows(warnings as never, [{ juiceClass: 'bittersweet', year: 2030, forecastKg: 5400, contractedKg: 7000, leastKg: 6300, shortKg: 900, ifAccepted: false }])

    // 2 t in 2031: 5,400 + 2,000 = 7,400 kg least, 800 kg above 6,600 kg, caused by accepting this offer.
    const big = await offerCoverageWarning(grower.id, { fruitClass: 'bittersweet', schedule: [{ year: 2031, tonnes: 2 }], tolerancePct: 0 })
    expectRows(big as never, [{ juiceClass: 'bittersweet', year: 2031, forecastKg: 6600, contractedKg: 8000, leastKg: 7400, shortKg: 800, ifAccepted: true }])

    // The same 2 t with 20 % tolerance: 5,400 + 1,600 = 7,000 kg, still 400 kg above.
    const tolerant = await offerCoverageWarning(grower.id, { fruitClass: 'bittersweet', schedule: [{ year: 2031, tonnes: 2 }], tolerancePct: 20 })
    expectRows(tolerant as never, [{ juiceClass: 'bittersweet', year: 2031, forecastKg: 6600, contractedKg: 8000, leastKg: 7000, shortKg: 400, ifAccepted: true }])
  })

  it('sets an offer against the years from its first to its last, in its own class only', async () => {
    // 2031–2032 span: 2030's over-commitment lies outside it; the perry offer does not count here.
    const none = await offerCoverageWarning(grower.id, { fruitClass: 'bittersweet', schedule: [{ year: 2031, tonnes: 1 }, { year: 2032, tonnes: 1 }], tolerancePct: 0 })
    expect(none).toEqual([])
    // A perry pear offer, where the grower has no pears: all of it is short, 3 t × 0.9 = 2,700 kg.
    const pears = await offerCoverageWarning(grower.id, { fruitClass: 'perry sweet', schedule: [{ year: 2031, tonnes: 3 }], tolerancePct: 10 })
    expectRows(pears as never, [{ juiceClass: 'perry sweet', year: 2031, forecastKg: 0, contractedKg: 3000, leastKg: 2700, shortKg: 2700, ifAccepted: true }])
  })

  it('leaves the offer’s own accepted version out when it names its id, so a revision is not counted twice', async () => {
    // The accepted contract revised to 6.5 t for 2030 (± 0 %): without its old 7 t, 6,500 kg against 5,400 kg.
    const revised = await offerCoverageWarning(grower.id, { id: contract.accepted, fruitClass: 'bittersweet', schedule: [{ year: 2030, tonnes: 6.5 }], tolerancePct: 0 })
    expectRows(revised as never, [{ juiceClass: 'bittersweet', year: 2030, forecastKg: 5400, contractedKg: 6500, leastKg: 6500, shortKg: 1100, ifAccepted: true }])
    // Another grower's id changes nothing here: it was never this grower's to count.
    const unrelated = await offerCoverageWarning(grower.id, { id: contract.otherGrowers, fruitClass: 'bittersweet', schedule: [{ year: 2030, tonnes: 6.5 }], tolerancePct: 0 })
    expectRows(unrelated as never, [{ juiceClass: 'bittersweet', year: 2030, forecastKg: 5400, contractedKg: 7000, leastKg: 6300, shortKg: 900, ifAccepted: false }])
  })
})
