import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { FORECAST_CLASSES } from '#shared/utils/forecast'
import { hashPassword } from '../../server/utils/passwords'
import { testDb, uniqueEmail } from '../support/db'
import { DEMO_PASSWORD } from '../support/env'
import { ApiClient } from '../support/http'

// A maker's needs table and its supply, on organisations of this file's own (removed afterwards
// with their people, needs and contracts), so the demo's figures neither move these nor are moved
// by them. Contract rows go straight into the tables, in the states each case needs.
const db = testDb()
const PREFIX = `Needs test ${Date.now().toString(36)}`

interface Person { client: ApiClient, email: string }
interface Org { id: number, people: Record<'owner' | 'member' | 'viewer', Person> }
const orgs: Org[] = []

async function person(orgId: number, role: 'owner' | 'member' | 'viewer'): Promise<Person> {
  const email = uniqueEmail(`needs-${role}`)
  await db('users').insert({ email, name: `Needs ${role}`, org_id: orgId, role, units: 'metric', password_hash: await hashPassword(DEMO_PASSWORD), email_verified_at: new Date() })
  const client = new ApiClient()
  await client.signIn(email, DEMO_PASSWORD)
  if (!client.hasSession()) throw new Error(`Sign-in failed for ${email}`)
  return { client, email }
}

async function scratchOrg(kind: 'grower' | 'maker', name: string): Promise<Org> {
  const [id] = await db('organisations').insert({ name: `${PREFIX} ${name}`, kind, status: 'active', is_nursery: kind === 'grower' })
  const org = { id: id!, people: { owner: await person(id!, 'owner'), member: await person(id!, 'member'), viewer: await person(id!, 'viewer') } }
  orgs.push(org)
  return org
}

let ids: { dabinett: number, m26: number, thorn: number, pyrodwarf: number }
let maker: Org
let otherMaker: Org
let nursery: Org

beforeAll(async () => {
  const idOf = async (table: string, column: string, value: string) => (await db(table).where(column, value).first('id')).id as number
  ids = {
    dabinett: await idOf('varieties', 'name', 'Dabinett'),
    m26: await idOf('rootstocks', 'designation', 'M.26'),
    thorn: await idOf('varieties', 'name', 'Thorn'),
    pyrodwarf: await idOf('rootstocks', 'designation', 'Pyrodwarf'),
  }
  maker = await scratchOrg('maker', 'Cidery')
  otherMaker = await scratchOrg('maker', 'Other cidery')
  nursery = await scratchOrg('grower', 'Nursery')
})

afterAll(async () => {
  const orgIds = orgs.map(o => o.id)
  await db('audit_events').whereIn('org_id', orgIds).delete()
  await db('sign_in_attempts').whereIn('email', orgs.flatMap(o => Object.values(o.people).map(p => p.email))).delete()
  // Needs, contracts and people go with their organisations (ON DELETE CASCADE).
  await db('organisations').whereIn('id', orgIds).delete()
})

const needsOf = async (orgId: number) => db('maker_needs').where({ org_id: orgId }).orderBy(['juice_class', 'harvest_year']).select('juice_class', 'harvest_year', 'kg')

describe('the needs table', () => {
  it('starts empty, and a save replaces the whole table, answered in class order then year order', async () => {
    const { owner, member } = maker.people
    expect((await owner.client.get('/api/needs')).body).toEqual({ items: [], total: 0 })

    const first = await owner.client.put('/api/needs', { items: [
      { juiceClass: 'bittersweet', year: 2031, kg: 10_000 },
      { juiceClass: 'sharp', year: 2031, kg: 500 },
      { juiceClass: 'bittersweet', year: 2030, kg: 10_000 },
      { juiceClass: 'perry sweet', year: 2030, kg: 1234.5 },
    ] })
    expect(first.status, JSON.stringify(first.body)).toBe(200)
    expect(first.body).toEqual({ total: 4, items: [
      { juiceClass: 'sharp', year: 2031, kg: 500 },
      { juiceClass: 'bittersweet', year: 2030, kg: 10_000 },
      { juiceClass: 'bittersweet', year: 2031, kg: 10_000 },
      { juiceClass: 'perry sweet', year: 2030, kg: 1234.5 },
    ] })
    expect((await owner.client.get('/api/needs')).body).toEqual(first.body)

    // A member saves too; rows left out are gone. The table read back may be sent back as it is.
    const second = await member.client.put('/api/needs', { ...first.body, items: first.body.items.slice(1, 3) })
    expect(second.status).toBe(200)
    expect(second.body.items).toEqual([{ juiceClass: 'bittersweet', year: 2030, kg: 10_000 }, { juiceClass: 'bittersweet', year: 2031, kg: 10_000 }])
    expect(await needsOf(maker.id)).toEqual([{ juice_class: 'bittersweet', harvest_year: 2030, kg: 10_000 }, { juice_class: 'bittersweet', harvest_year: 2031, kg: 10_000 }])

    // Each save is in the audit trail, by whom and what it did.
    const audit = await db('audit_events').where({ org_id: maker.id, action: 'needs.replaced' }).orderBy('id').select('actor_user_id', 'detail')
    expect(audit).toHaveLength(2)
    const detail = (row: { detail: unknown }) => (typeof row.detail === 'string' ? JSON.parse(row.detail) : row.detail)
    expect(detail(audit[0]!)).toEqual({ rowsBefore: 0, rows: 4, kgBefore: 0, kg: 21_734.5 })
    expect(detail(audit[1]!)).toEqual({ rowsBefore: 4, rows: 2, kgBefore: 21_734.5, kg: 20_000 })
    const memberId = (await db('users').where({ email: member.email }).first('id')).id
    expect(audit[1]!.actor_user_id).toBe(memberId)
  })

  it('lets a viewer read the table but not save it (403), and keeps each maker’s table its own', async () => {
    const before = await needsOf(maker.id)
    const { viewer } = maker.people
    expect((await viewer.client.get('/api/needs')).body.total).toBe(before.length)
    expect((await viewer.client.put('/api/needs', { items: [] })).status).toBe(403)
    expect(await needsOf(maker.id)).toEqual(before)

    const other = await otherMaker.people.owner.client.put('/api/needs', { items: [{ juiceClass: 'sweet', year: 2030, kg: 1 }] })
    expect(other.status).toBe(200)
    expect((await maker.people.owner.client.get('/api/needs')).body.items).toEqual(before.map(r => ({ juiceClass: r.juice_class, year: r.harvest_year, kg: r.kg })))
    expect(await needsOf(maker.id)).toEqual(before)
  })

  it('refuses a bad row with 400 naming its field, and saves none of the rows', async () => {
    const { owner } = maker.people
    const before = await needsOf(maker.id)
    const good = { juiceClass: 'sweet', year: 2030, kg: 100 }
    const cases: [unknown, string][] = [
      [{ items: [good, { ...good, year: 2031, kg: -1 }] }, 'items.1.kg'],
      [{ items: [{ ...good, kg: 100_000_001 }] }, 'items.0.kg'],
      [{ items: [{ ...good, kg: 10.25 }] }, 'items.0.kg'],
      [{ items: [{ ...good, kg: '100' }] }, 'items.0.kg'],
      [{ items: [{ ...good, juiceClass: 'medium sharp' }] }, 'items.0.juiceClass'],
      [{ items: [{ ...good, year: 1899 }] }, 'items.0.year'],
      [{ items: [{ ...good, year: 2030.5 }] }, 'items.0.year'],
      [{ items: [{ ...good, tonnes: 1 }] }, 'items.0.tonnes'],
      [{ items: [good], extra: 1 }, 'extra'],
      [{ items: 'all of it' }, 'items'],
      [{}, 'items'],
      // 601 different class-years (eight classes a year), one more than a table may hold.
      [{ items: Array.from({ length: 601 }, (_, i) => ({ juiceClass: FORECAST_CLASSES[i % 8], year: 1900 + Math.floor(i / 8), kg: 1 })) }, 'items'],
    ]
    for (const [body, field] of cases) {
      const res = await owner.client.put('/api/needs', body)
      expect(res.status, field).toBe(400)
      expect(res.body.data.issues.map((i: { path: string }) => i.path), field).toEqual([field])
    }
    expect(await needsOf(maker.id)).toEqual(before)
  })

  it('refuses the same class and year twice, naming the second', async () => {
    const { owner } = maker.people
    const before = await needsOf(maker.id)
    const res = await owner.client.put('/api/needs', { items: [
      { juiceClass: 'sharp', year: 2030, kg: 1 },
      { juiceClass: 'sharp', year: 2031, kg: 2 },
      { juiceClass: 'sharp', year: 2030, kg: 3 },
    ] })
    expect(res.status).toBe(400)
    expect(res.body.data.issues).toEqual([{ path: 'items.2.year', message: 'sharp 2030 is given twice' }])
    expect(await needsOf(maker.id)).toEqual(before)
  })

  it('ends two saves at once with one whole table or the other, never a mix', async () => {
    const { owner, member } = otherMaker.people
    const a = Array.from({ length: 40 }, (_, i) => ({ juiceClass: 'sweet', year: 2030 + i, kg: 1 }))
    const b = Array.from({ length: 40 }, (_, i) => ({ juiceClass: 'bittersharp', year: 2030 + i, kg: 2 }))
    for (let round = 0; round < 3; round++) {
      await owner.client.put('/api/needs', { items: [] })
      const answers = await Promise.all([owner.client.put('/api/needs', { items: a }), member.client.put('/api/needs', { items: b })])
      expect(answers.map(r => r.status)).toEqual([200, 200])
      const classes = new Set((await needsOf(otherMaker.id)).map(r => r.juice_class))
      expect(classes.size, `round ${round}`).toBe(1)
      expect((await needsOf(otherMaker.id)).length).toBe(40)
    }
  })
})

interface TreeRow { buyer: Org, state: string, variety: number, rootstock: number, trees: number, delivered?: number, year: number, season: 'autumn' | 'spring' }

async function treeContract(t: TreeRow): Promise<number> {
  const [id] = await db('tree_contracts').insert({
    buyer_org_id: t.buyer.id, nursery_org_id: nursery.id, drafted_by: 'buyer', last_offer_by: t.state === 'draft' ? null : 'buyer', state: t.state,
    version: t.state === 'draft' ? 0 : 1, variety_id: t.variety, rootstock_id: t.rootstock, tree_count: t.trees, tree_type: 'maiden',
    delivery_year: t.year, delivery_season: t.season, currency: 'GBP', unit_price_minor: 1200, deposit_if_buyer_cancels: 'kept',
    deposit_if_nursery_cancels: 'refunded', buyer_may_cancel_until: 'accepted', take_rate: 0.85, survival_rate: 0.5,
    delivered_count: t.delivered ?? null, delivered_on: t.delivered === undefined ? null : `${t.year}-11-15`,
  })
  return id!
}

async function fruitContract(makerOrg: Org, state: string, juiceClass: string, schedule: [number, number][]): Promise<number> {
  const [id] = await db('fruit_contracts').insert({
    maker_org_id: makerOrg.id, grower_org_id: nursery.id, drafted_by: 'maker', last_offer_by: state === 'draft' ? null : 'maker', state, version: state === 'draft' ? 0 : 1,
    species: 'apple', juice_class: juiceClass, tolerance_pct: 10, currency: 'GBP', base_price_per_tonne_minor: 25_000, baseline_brix: 12, reject_floor_brix: 9, crop_failure: 'forgiven',
  })
  await db('fruit_contract_years').insert(schedule.map(([year, tonnes]) => ({ contract_id: id, harvest_year: year, tonnes, window_from: `${year}-10-01`, window_to: `${year}-11-30` })))
  return id!
}

describe('GET /api/needs/supply', () => {
  let withoutCurve: number

  beforeAll(async () => {
    // Need: bittersweet 10 t (2030), 10 t (2031), 12 t (2032); sharp 0.5 t (2031).
    await maker.people.owner.client.put('/api/needs', { items: [
      { juiceClass: 'bittersweet', year: 2030, kg: 10_000 },
      { juiceClass: 'bittersweet', year: 2031, kg: 10_000 },
      { juiceClass: 'bittersweet', year: 2032, kg: 12_000 },
      { juiceClass: 'sharp', year: 2031, kg: 500 },
    ] })
    // Fruit: 4 t bittersweet accepted for 2030 and 2031 (a maker's supply counts the tonnes, not the
    // tolerance). Not counted: a draft, an open offer, another maker's accepted contract.
    await fruitContract(maker, 'accepted', 'bittersweet', [[2030, 4], [2031, 4]])
    await fruitContract(maker, 'draft', 'bittersweet', [[2032, 50]])
    await fruitContract(maker, 'offered', 'bittersweet', [[2031, 3]])
    await fruitContract(otherMaker, 'accepted', 'bittersweet', [[2030, 30]])
    // Trees: Dabinett on M.26 at the middle of its range (first crop at age 3, full bearing at 7,
    // 30 kg a tree; as a block is forecast). Fraction = (age − 3 + 1) / (7 − 3 + 1).
    //   100 trees accepted for spring 2027: planted 2027 (north), ages 3–6 in 2030–2033 → 1/5 … 4/5
    //     = 600, 1,200, 1,800, 2,400 kg
    //   500 ordered, 200 delivered in autumn 2026: first grow in 2027, the same ages, counted as 200 trees
    //     = 1,200, 2,400, 3,600, 4,800 kg
    // The contracts' survival rate (0.5 here) is the nursery's, inside the count ordered: not applied again.
    await treeContract({ buyer: maker, state: 'accepted', variety: ids.dabinett, rootstock: ids.m26, trees: 100, year: 2027, season: 'spring' })
    await treeContract({ buyer: maker, state: 'delivered', variety: ids.dabinett, rootstock: ids.m26, trees: 500, delivered: 200, year: 2026, season: 'autumn' })
    // Not counted: cancelled, draft, offered, another buyer's.
    await treeContract({ buyer: maker, state: 'cancelled', variety: ids.dabinett, rootstock: ids.m26, trees: 10_000, year: 2026, season: 'spring' })
    await treeContract({ buyer: maker, state: 'draft', variety: ids.dabinett, rootstock: ids.m26, trees: 10_000, year: 2026, season: 'spring' })
    await treeContract({ buyer: maker, state: 'offered', variety: ids.dabinett, rootstock: ids.m26, trees: 10_000, year: 2026, season: 'spring' })
    await treeContract({ buyer: otherMaker, state: 'accepted', variety: ids.dabinett, rootstock: ids.m26, trees: 10_000, year: 2026, season: 'spring' })
    // Thorn pears on Pyrodwarf: the catalogue has no yield per tree, so they are named and counted as 0 kg.
    withoutCurve = await treeContract({ buyer: maker, state: 'propagating', variety: ids.thorn, rootstock: ids.pyrodwarf, trees: 300, year: 2026, season: 'autumn' })
  })

  it('sets the need per class and year against accepted fruit and the trees to come, worked by hand', async () => {
    const res = await maker.people.viewer.client.get('/api/needs/supply?startYear=2030&years=4')
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.startYear).toBe(2030)
    expect(res.body.years).toEqual([2030, 2031, 2032, 2033])
    const row = (juiceClass: string, year: number, needKg: number, contractedKg: number, fromTreesKg: number, gapKg: number) => ({ juiceClass, year, needKg, contractedKg, fromTreesKg, gapKg })
    const expected = [
      // Sharp: a need only, 0.5 t in 2031, nothing to meet it.
      row('sharp', 2030, 0, 0, 0, 0),
      row('sharp', 2031, 500, 0, 0, 500),
      row('sharp', 2032, 0, 0, 0, 0),
      row('sharp', 2033, 0, 0, 0, 0),
      // Bittersweet: gap = need − fruit − trees, never below 0.
      row('bittersweet', 2030, 10_000, 4000, 600 + 1200, 10_000 - 4000 - 1800), // 4,200
      row('bittersweet', 2031, 10_000, 4000, 1200 + 2400, 10_000 - 4000 - 3600), // 2,400
      row('bittersweet', 2032, 12_000, 0, 1800 + 3600, 12_000 - 5400), // 6,600
      row('bittersweet', 2033, 0, 0, 2400 + 4800, 0),
    ]
    expect(res.body.rows).toHaveLength(expected.length)
    expected.forEach((want, i) => {
      const got = res.body.rows[i]
      expect({ juiceClass: got.juiceClass, year: got.year }).toEqual({ juiceClass: want.juiceClass, year: want.year })
      for (const key of ['needKg', 'contractedKg', 'fromTreesKg', 'gapKg'] as const) expect(got[key], `${want.juiceClass} ${want.year} ${key}`).toBeCloseTo(want[key], 3)
    })
    expect(res.body.treeContractsWithoutCurve).toEqual([{ id: withoutCurve, rootstockDesignation: 'Pyrodwarf', note: expect.stringMatching(/no yield per tree/) }])
  })

  it('moves the planting a season on in the southern hemisphere', async () => {
    await db('organisations').where({ id: maker.id }).update({ hemisphere: 'south' })
    try {
      const res = await maker.people.owner.client.get('/api/needs/supply?startYear=2030&years=2')
      // In the south both deliveries first grow into the next year's harvest: the spring 2027 trees
      // count as planted 2028 (ages 2, 3 → 0 and 1/5 × 3,000 = 600 kg); the autumn 2026 ones as 2027, as before.
      const bittersweet = res.body.rows.filter((r: { juiceClass: string }) => r.juiceClass === 'bittersweet')
      expect(bittersweet.map((r: { fromTreesKg: number }) => r.fromTreesKg)).toEqual([1200, 600 + 2400].map(kg => expect.closeTo(kg, 3)))
    }
    finally {
      await db('organisations').where({ id: maker.id }).update({ hemisphere: 'north' })
    }
  })

  it('leaves out needs and contract years outside the window asked for', async () => {
    const res = await maker.people.owner.client.get('/api/needs/supply?startYear=2032&years=1')
    expect(res.body.rows.map((r: { juiceClass: string, year: number, needKg: number, contractedKg: number }) => [r.juiceClass, r.year, r.needKg, r.contractedKg]))
      .toEqual([['bittersweet', 2032, 12_000, 0]])
  })

  it('answers an empty supply to a maker with no needs, contracts or trees', async () => {
    const [id] = await db('organisations').insert({ name: `${PREFIX} Empty cidery`, kind: 'maker', status: 'active' })
    const empty: Org = { id: id!, people: { owner: await person(id!, 'owner'), member: await person(id!, 'member'), viewer: await person(id!, 'viewer') } }
    orgs.push(empty)
    const res = await empty.people.owner.client.get('/api/needs/supply?startYear=2030&years=3')
    expect(res.body).toEqual({ startYear: 2030, years: [2030, 2031, 2032], rows: [], treeContractsWithoutCurve: [] })
  })

  it('answers 400 naming the parameter for a window it cannot forecast', async () => {
    const res = await maker.people.owner.client.get('/api/needs/supply?years=-3')
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0].path).toBe('years')
  })
})
