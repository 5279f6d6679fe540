import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { demoBlocks } from '../../server/db/seeds/03_demo_blocks'
import { YOUNG_BLOCKS } from '../../server/db/seeds/data/demoContracts'
import { hashPassword } from '../../server/utils/passwords'
import { testDb, uniqueEmail } from '../support/db'
import { DEMO_PASSWORD } from '../support/env'
import { ApiClient, as } from '../support/http'

const db = testDb()
const TEST_PREFIX = 'Blocks test'
const thisYear = new Date().getUTCFullYear()

async function idOf(table: 'varieties' | 'rootstocks' | 'organisations', column: string, value: string): Promise<number> {
  const row = await db(table).where(column, value).first('id')
  if (!row) throw new Error(`No ${table} row with ${column} = ${value}`)
  return row.id
}

async function blockId(name: string): Promise<number> {
  return (await db('orchard_blocks').where({ name }).first('id')).id
}

let ids: Record<'kingstonBlack' | 'thorn' | 'dabinett' | 'm26' | 'pyrodwarf' | 'quinceA', number>

function newBlock(overrides: Record<string, unknown> = {}) {
  return {
    name: `${TEST_PREFIX} ${Math.random().toString(36).slice(2, 8)}`,
    varietyId: ids.kingstonBlack,
    rootstockId: ids.m26,
    treeCount: 100,
    yearPlanted: 2024,
    areaHa: 0.1,
    inRowM: 2.4,
    betweenRowM: 4.3,
    survivalRate: 0.9,
    organicStatus: 'conventional',
    ...overrides,
  }
}

beforeAll(async () => {
  ids = {
    kingstonBlack: await idOf('varieties', 'name', 'Kingston Black'),
    thorn: await idOf('varieties', 'name', 'Thorn'),
    dabinett: await idOf('varieties', 'name', 'Dabinett'),
    m26: await idOf('rootstocks', 'designation', 'M.26'),
    pyrodwarf: await idOf('rootstocks', 'designation', 'Pyrodwarf'),
    quinceA: await idOf('rootstocks', 'designation', 'Quince A'),
  }
})

afterAll(async () => {
  await db('orchard_blocks').where('name', 'like', `${TEST_PREFIX}%`).delete()
})

describe('listing blocks', () => {
  it('lists only the organisation’s own blocks, with catalogue names, class and density from the spacing', async () => {
    const res = await (await as('growerOwner')).get('/api/blocks')
    expect(res.status).toBe(200)
    const names = res.body.items.map((b: { name: string }) => b.name)
    expect(names).toEqual(expect.arrayContaining(['Long Ground', 'Chapel Piece', 'Well Field', 'Hedge Acre']))
    expect(names).not.toContain('River Strip')
    const longGround = res.body.items.find((b: { name: string }) => b.name === 'Long Ground')
    expect(longGround).toMatchObject({
      varietyName: 'Dabinett', species: 'apple', juiceClass: 'bittersweet', rootstockDesignation: 'MM.106',
      treeCount: 830, yearPlanted: 2008, areaHa: 2, inRowM: 4.3, betweenRowM: 5.5, organicStatus: 'conventional', survivalRate: 0.96,
    })
    // Trees per hectare = 10,000 m² / (4.3 m × 5.5 m) = 10,000 / 23.65 = 422.83 (the planting formula, worked by hand).
    expect(longGround.densityPerHa).toBeCloseTo(422.83, 2)
  })

  it('totals trees and area over all the organisation’s blocks, not only the page', async () => {
    // Tansy Row's blocks as seeded: 1150 + 760 + 2550 trees on 1.2 + 0.8 + 1.0 ha, and the young
    // Mill Leat and Ferry Piece, 1800 + 700 trees on 0.7 + 0.75 ha.
    const seeded = [...demoBlocks, ...YOUNG_BLOCKS].filter(b => b.org === 'Tansy Row Fruit')
    expect(seeded.reduce((sum, b) => sum + b.treeCount, 0)).toBe(6960)
    const res = await (await as('grower2Owner')).get('/api/blocks?limit=1')
    expect(res.status).toBe(200)
    expect(res.body.items).toHaveLength(1)
    expect(res.body.total).toBe(5)
    expect(res.body.totals.trees).toBe(6960)
    expect(res.body.totals.areaHa).toBeCloseTo(4.45, 6)
    // A page past the end has no blocks but still the count and totals of all of them.
    const past = await (await as('grower2Owner')).get('/api/blocks?limit=2&offset=10')
    expect(past.body).toMatchObject({ items: [], total: 5, totals: { trees: 6960 } })
    // Top Flats on G.41 at 1.1 m × 3.5 m: 10,000 / 3.85 = 2597.4 trees/ha (worked by hand).
    const all = await (await as('grower2Owner')).get('/api/blocks')
    expect(all.body.items.find((b: { name: string }) => b.name === 'Top Flats').densityPerHa).toBeCloseTo(2597.40, 2)
  })
})

describe('one block and its forecast', () => {
  it('forecasts 15 years on the rootstock’s bearing curve, matching a hand-worked example on M.26', async () => {
    // The seeded catalogue's M.26 curve (catalogue data: first crop at 2–4 years (NC State), full bearing at 6 from
    // the early end, 30 kg a tree). This block is forecast on the early end of the range.
    const m26 = await db('rootstocks').where({ id: ids.m26 }).first()
    expect([Number(m26.years_to_first_crop), Number(m26.years_to_first_crop_late), Number(m26.years_to_full_bearing), Number(m26.yield_per_tree_kg)]).toEqual([2, 4, 6, 30])

    const member = await as('growerMember')
    const created = await member.post('/api/blocks', newBlock({ treeCount: 100, yearPlanted: 2024, survivalRate: 0.9, bearingPace: 'early' }))
    expect(created.status).toBe(201)
    expect(created.body.forecast).toHaveLength(15)
    expect(created.body.forecast[0].year).toBe(thisYear)

    const res = await member.get(`/api/blocks/${created.body.id}?startYear=2024`)
    expect(res.status).toBe(200)
    expect(res.body.bearingCurve).toEqual({ yearsToFirstCrop: 2, yearsToFullBearing: 6, yieldPerTreeKgAtFull: 30 })
    expect(res.body.forecastNote).toBeNull()
    // 100 trees × 0.9 standing × 30 kg = 2700 kg at full bearing. Ages 0 and 1 bear nothing; from the first crop
    // (age 2) the share rises by fifths: (age − 2 + 1) / (6 − 2 + 1) → 540, 1080, 1620, 2160 kg; age 6 on, 2700 kg.
    const expected = [0, 0, 540, 1080, 1620, 2160, 2700, 2700, 2700, 2700, 2700, 2700, 2700, 2700, 2700]
    expect(res.body.forecast.map((r: { year: number }) => r.year)).toEqual(expected.map((_, i) => 2024 + i))
    res.body.forecast.forEach((r: { kg: number }, i: number) => expect(r.kg).toBeCloseTo(expected[i]!, 6))
  })

  it('forecasts on the middle of the rootstock’s range unless the grower picks an end, and moves the curve when changed', async () => {
    const member = await as('growerMember')
    const created = await member.post('/api/blocks', newBlock({ treeCount: 100, yearPlanted: 2024, survivalRate: 0.9 }))
    expect(created.body.bearingPace).toBe('middle')
    // M.26 at 2–4 years: the middle is 3, and full bearing moves with it, 6 → 7 (common practice).
    expect(created.body.bearingCurve).toEqual({ yearsToFirstCrop: 3, yearsToFullBearing: 7, yieldPerTreeKgAtFull: 30 })
    const late = await member.patch(`/api/blocks/${created.body.id}`, { bearingPace: 'late' })
    expect(late.status).toBe(200)
    expect(late.body.bearingCurve).toEqual({ yearsToFirstCrop: 4, yearsToFullBearing: 8, yieldPerTreeKgAtFull: 30 })
    const bad = await member.patch(`/api/blocks/${created.body.id}`, { bearingPace: 'soon' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues[0].path).toBe('bearingPace')
  })

  it('says so, and forecasts zero, when the rootstock lacks a bearing figure', async () => {
    // Pyrodwarf has no published yield per tree in the catalogue.
    const owner = await as('growerOwner')
    const created = await owner.post('/api/blocks', newBlock({ varietyId: ids.thorn, rootstockId: ids.pyrodwarf, inRowM: 2.7, betweenRowM: 3.6 }))
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ species: 'pear', varietyName: 'Thorn', rootstockDesignation: 'Pyrodwarf', bearingCurve: null })
    expect(created.body.forecastNote).toMatch(/no yield per tree at full bearing for rootstock Pyrodwarf/)
    expect(created.body.forecast).toHaveLength(15)
    expect(created.body.forecast.every((r: { kg: number }) => r.kg === 0)).toBe(true)

    const forecast = await owner.get('/api/blocks/forecast')
    expect(forecast.body.blocksWithoutCurve).toEqual(expect.arrayContaining([expect.objectContaining({ id: created.body.id, rootstockDesignation: 'Pyrodwarf' })]))
  })

  it('changes a block with PATCH and records who did it', async () => {
    const owner = await as('growerOwner')
    const created = await owner.post('/api/blocks', newBlock())
    const id = created.body.id
    const patched = await owner.patch(`/api/blocks/${id}`, { treeCount: 120, inRowM: 2, betweenRowM: 5, notes: 'Gapped up in spring' })
    expect(patched.status).toBe(200)
    // 10,000 / (2 × 5) = 1000 trees/ha.
    expect(patched.body).toMatchObject({ id, treeCount: 120, inRowM: 2, betweenRowM: 5, densityPerHa: 1000, notes: 'Gapped up in spring', varietyName: 'Kingston Black' })
    expect((await owner.get(`/api/blocks/${id}`)).body.treeCount).toBe(120)
    const audit = await db('audit_events').where({ object_type: 'orchard_block', object_id: id }).orderBy('id').select('action')
    expect(audit.map(a => a.action)).toEqual(['block.created', 'block.updated'])

    // A pear variety cannot stand on an apple rootstock.
    const mismatched = await owner.patch(`/api/blocks/${id}`, { varietyId: ids.thorn })
    expect(mismatched.status).toBe(400)
    expect(mismatched.body.data.issues[0].path).toBe('rootstockId')
    const moved = await owner.patch(`/api/blocks/${id}`, { varietyId: ids.thorn, rootstockId: ids.quinceA })
    expect(moved.status).toBe(200)
    expect(moved.body).toMatchObject({ varietyName: 'Thorn', rootstockDesignation: 'Quince A', species: 'pear' })

    expect((await owner.patch(`/api/blocks/${id}`, {})).status).toBe(400)
  })

  it('deletes a block: 204, then 404, with an audit entry', async () => {
    const member = await as('growerMember')
    const id = (await member.post('/api/blocks', newBlock())).body.id
    expect((await member.delete(`/api/blocks/${id}`)).status).toBe(204)
    expect((await member.get(`/api/blocks/${id}`)).status).toBe(404)
    expect((await member.delete(`/api/blocks/${id}`)).status).toBe(404)
    const audit = await db('audit_events').where({ object_type: 'orchard_block', object_id: id, action: 'block.deleted' }).first()
    expect(audit).toBeTruthy()
  })
})

describe('the organisation forecast by juice class', () => {
  it('adds every block’s forecast into its class, matching Tansy Row worked by hand', async () => {
    const owner = await as('grower2Owner')
    const res = await owner.get(`/api/blocks/forecast?startYear=2026`)
    expect(res.status).toBe(200)
    expect(res.body.years).toEqual(Array.from({ length: 15 }, (_, i) => 2026 + i))
    // Apple classes and perry pear classes (their own thresholds) are summed apart.
    expect(Object.keys(res.body.byClass).sort()).toEqual(['bittersharp', 'bittersweet', 'perry bittersharp', 'perry bittersweet', 'perry medium sharp', 'perry sweet', 'sharp', 'sweet'])
    // Tansy Row grows only bittersharp apples.
    for (const juiceClass of ['sweet', 'sharp', 'bittersweet', 'perry bittersharp']) expect(res.body.byClass[juiceClass].every((r: { kg: number }) => r.kg === 0)).toBe(true)
    // 2026 by hand, each block on the middle of its rootstock's range: M.26 2–4 y → first crop 3, full 6 + 1 = 7,
    // 30 kg; G.41 2–3 y → 2.5, counted from age 3, full 5.5 → 6, 20 kg:
    //   River Strip, 1150 trees × 0.97 × 30 kg, age 8 (full)        = 33,465 kg
    //   Osier Bed,    760 trees × 0.98 × 30 kg × 4/5 (age 6 of 3–7) = 17,875.2 kg
    //   Top Flats,   2550 trees × 0.99 × 20 kg × 2/4 (age 4 of 3–6) = 25,245 kg
    expect(res.body.byClass.bittersharp[0].kg).toBeCloseTo(76_585.2, 6)
    // 2027: Osier Bed reaches full bearing (22,344 kg), Top Flats 3/4 (37,867.5 kg).
    expect(res.body.byClass.bittersharp[1].kg).toBeCloseTo(93_676.5, 6)
    expect(res.body.totals[0]).toEqual({ year: 2026, kg: res.body.byClass.bittersharp[0].kg })

    // The same as adding each block's own forecast.
    const blocks = (await owner.get('/api/blocks')).body.items as { id: number }[]
    const perBlock = await Promise.all(blocks.map(async b => (await owner.get(`/api/blocks/${b.id}?startYear=2026`)).body.forecast as { kg: number }[]))
    res.body.byClass.bittersharp.forEach((r: { kg: number }, i: number) => {
      expect(r.kg).toBeCloseTo(perBlock.reduce((sum, f) => sum + f[i]!.kg, 0), 6)
    })
  })

  it('splits Hollowmere’s crop into bittersweet and sharp', async () => {
    const res = await (await as('growerOwner')).get('/api/blocks/forecast?startYear=2026&years=3')
    expect(res.body.years).toEqual([2026, 2027, 2028])
    // Long Ground, 830 Dabinett on MM.106 (70 kg at full bearing, age 18) alone gives 830 × 0.96 × 70 = 55,776 kg.
    expect(res.body.byClass.bittersweet[0].kg).toBeGreaterThanOrEqual(55_776)
    // Well Field: 580 Brown's Apple on M.7 (50 kg, full from age 7), planted 2012: 580 × 0.98 × 50 = 28,420 kg.
    expect(res.body.byClass.sharp[0].kg).toBeGreaterThanOrEqual(28_420)
  })
})

describe('refusals', () => {
  it('answers 400 naming the field for values outside the limits', async () => {
    const owner = await as('growerOwner')
    const cases: [Record<string, unknown>, string][] = [
      [{ name: '' }, 'name'],
      [{ name: 'x'.repeat(121) }, 'name'],
      [{ treeCount: 0 }, 'treeCount'],
      [{ treeCount: 100_001 }, 'treeCount'],
      [{ treeCount: 10.5 }, 'treeCount'],
      [{ yearPlanted: 1899 }, 'yearPlanted'],
      [{ yearPlanted: thisYear + 2 }, 'yearPlanted'],
      [{ areaHa: 0.001 }, 'areaHa'],
      [{ areaHa: 1001 }, 'areaHa'],
      [{ inRowM: 0.2 }, 'inRowM'],
      [{ betweenRowM: 16 }, 'betweenRowM'],
      [{ survivalRate: 0 }, 'survivalRate'],
      [{ survivalRate: 1.2 }, 'survivalRate'],
      [{ organicStatus: 'biodynamic' }, 'organicStatus'],
      [{ varietyId: 'Dabinett' }, 'varietyId'],
    ]
    for (const [change, field] of cases) {
      const res = await owner.post('/api/blocks', newBlock(change))
      expect(res.status, JSON.stringify(change)).toBe(400)
      expect(res.body.data.issues.map((i: { path: string }) => i.path), JSON.stringify(change)).toEqual([field])
    }
    // Next year is allowed: a block recorded ahead of a winter planting.
    const ahead = await owner.post('/api/blocks', newBlock({ yearPlanted: thisYear + 1 }))
    expect(ahead.status).toBe(201)
    expect(ahead.body.forecast[0].kg).toBe(0)
  })

  it('answers 400 naming the field for a variety or rootstock that is not in the catalogue', async () => {
    const owner = await as('growerOwner')
    const noVariety = await owner.post('/api/blocks', newBlock({ varietyId: 999_999 }))
    expect(noVariety.status).toBe(400)
    expect(noVariety.body.data.issues).toEqual([{ path: 'varietyId', message: expect.stringMatching(/not|no variety/i) }])
    const noRootstock = await owner.post('/api/blocks', newBlock({ rootstockId: 999_999 }))
    expect(noRootstock.status).toBe(400)
    expect(noRootstock.body.data.issues[0].path).toBe('rootstockId')
    const wrongSpecies = await owner.post('/api/blocks', newBlock({ varietyId: ids.thorn, rootstockId: ids.m26 }))
    expect(wrongSpecies.status).toBe(400)
    expect(wrongSpecies.body.data.issues[0].path).toBe('rootstockId')
  })

  it('answers 404 for another grower’s block and leaves it untouched', async () => {
    const longGround = await blockId('Long Ground')
    const other = await as('grower2Owner')
    expect((await other.get(`/api/blocks/${longGround}`)).status).toBe(404)
    expect((await other.patch(`/api/blocks/${longGround}`, { treeCount: 1 })).status).toBe(404)
    expect((await other.delete(`/api/blocks/${longGround}`)).status).toBe(404)
    expect((await db('orchard_blocks').where({ id: longGround }).first()).tree_count).toBe(830)
    expect((await (await as('growerOwner')).get('/api/blocks/999999')).status).toBe(404)
  })

  it('lets a viewer read the blocks but not change them (403)', async () => {
    const email = uniqueEmail('orchard-viewer')
    await db('users').insert({
      email, name: 'Orchard Viewer', org_id: await idOf('organisations', 'name', 'Hollowmere Orchard & Nursery'),
      role: 'viewer', units: 'metric', password_hash: await hashPassword(DEMO_PASSWORD), email_verified_at: new Date(),
    })
    const viewer = new ApiClient()
    await viewer.signIn(email, DEMO_PASSWORD)
    expect(viewer.hasSession()).toBe(true)
    const longGround = await blockId('Long Ground')
    expect((await viewer.get('/api/blocks')).status).toBe(200)
    expect((await viewer.get(`/api/blocks/${longGround}`)).status).toBe(200)
    expect((await viewer.get('/api/blocks/forecast')).status).toBe(200)
    expect((await viewer.post('/api/blocks', newBlock())).status).toBe(403)
    expect((await viewer.patch(`/api/blocks/${longGround}`, { treeCount: 1 })).status).toBe(403)
    expect((await viewer.delete(`/api/blocks/${longGround}`)).status).toBe(403)
    expect((await db('orchard_blocks').where({ id: longGround }).first()).tree_count).toBe(830)
  })
})
