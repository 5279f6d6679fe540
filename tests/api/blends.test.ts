import { beforeAll, describe, expect, it } from 'vitest'
import { potentialAbvFromBrix } from '../../shared/utils/alcohol'
import { brixToSg } from '../../shared/utils/sugar'
import { orgId } from '../support/contracts'
import { testDb } from '../support/db'
import { deliveryFixtures } from '../support/deliveries'
import { as } from '../support/http'

// The blend planner through the API, on lots of this file's own: Tansy Row's Kingston Black of the
// 2017 harvest, bought by Quillhurst under a contract of this file's that only covers 2017, so no
// other file's lots or contracts touch them. The contract is the fixtures' default: £210.00 a
// tonne at a 12.0 °Brix baseline, +£8.00 a tonne per °Brix above and −£12.00 below, rejected under
// 9.5 °Brix. Every lot is given a yield of 750 L a tonne in the request, so the maker's own setting
// (which another file may change) does not move the sums. Each sum is worked by hand beside it.
const db = testDb()
const MARK = 'T-BLS-'
const { contract, lot, reading } = deliveryFixtures(MARK)
const YIELD = 750

const issuePaths = (body: { data?: { issues?: { path: string }[] } }) => (body.data?.issues ?? []).map(i => i.path)

let sharp: number
let mild: number
let low: number
let unread: number
let noTannin: number
let hollowmere: number

async function tested(grower: 'tansyRow' | 'hollowmere', netKg: number, juice: Record<string, number>): Promise<number> {
  const id = await lot(grower, 'Kingston Black', netKg, '2017-10-01')
  await reading(id, { sampled_on: '2017-10-03', ...juice })
  return id
}

beforeAll(async () => {
  await contract({ years: { 2017: 500 } })
  // 12.0 °Bx is the baseline: £210.00 a tonne. 13.0 °Bx is 1.0 above: £210.00 + £8.00 = £218.00.
  sharp = await tested('tansyRow', 10_000, { brix: 12.0, ta_g_per_l: 8.0, tannin_g_per_l: 2.0, ph: 3.3 })
  mild = await tested('tansyRow', 10_000, { brix: 13.0, ta_g_per_l: 4.0, tannin_g_per_l: 2.0, ph: 3.7 })
  // 9.0 °Bx, under the 9.5 floor: it would earn £210.00 − 3.0 × £12.00 = £174.00, but is rejected.
  low = await tested('tansyRow', 5_000, { brix: 9.0, ta_g_per_l: 6.0, tannin_g_per_l: 2.0 })
  noTannin = await tested('tansyRow', 4_000, { brix: 12.5, ta_g_per_l: 6.0 })
  unread = await lot('tansyRow', 'Kingston Black', 3_000, '2017-10-01')
  // Quillhurst buys nothing of Hollowmere's 2017 harvest: not its to see.
  hollowmere = await tested('hollowmere', 10_000, { brix: 12.0, ta_g_per_l: 8.0, tannin_g_per_l: 2.0 })
})

const solve = async (body: unknown, caller: Parameters<typeof as>[0] = 'makerOwner') => (await as(caller)).post('/api/blends/solve', body)
const real = (lotId: number, extra: Record<string, unknown> = {}) => ({ lotId, juiceYieldLPerTonne: YIELD, ...extra })
const taRange = (min: number, max: number) => ({ taGPerL: { min, max } })
const lineOf = (body: { lines: { lotId?: number, code: string }[] }, key: number | string) => body.lines.find(l => (typeof key === 'number' ? l.lotId === key : l.code === key))

describe('the lots a maker may blend', () => {
  it('lists its covered lots with free kg, the latest reading and the contract\'s price for it', async () => {
    const res = await (await as('makerOwner')).get(`/api/blends/lots?q=${MARK}&limit=200`)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    const ids = res.body.items.map((l: { lotId: number }) => l.lotId)
    expect(ids).toEqual(expect.arrayContaining([sharp, mild, low, noTannin, unread]))
    expect(ids).not.toContain(hollowmere)
    expect(res.body.total).toBe(res.body.items.length)
    const settings = await db('organisations').where({ id: await orgId('quillhurst') }).first('default_juice_yield_l_per_t', 'currency')
    const byId = new Map(res.body.items.map((l: { lotId: number }) => [l.lotId, l]))
    expect(byId.get(sharp)).toMatchObject({
      code: expect.stringMatching(/^T-BLS-/), growerId: await orgId('tansyRow'), growerName: 'Tansy Row Fruit', varietyName: 'Kingston Black',
      species: 'apple', juiceClass: 'bittersharp', state: 'available', harvestYear: 2017, freeKg: 10_000,
      reading: { brix: 12, sg: null, taGPerL: 8, tanninGPerL: 2, ph: 3.3, testedOn: '2017-10-03' },
      pricePerTonne: 21_000, currency: 'GBP', rejected: false, rejectReason: null,
      juiceYieldLPerTonne: settings.default_juice_yield_l_per_t === null ? null : Number(settings.default_juice_yield_l_per_t),
    })
    expect(byId.get(mild)).toMatchObject({ pricePerTonne: 21_800, rejected: false })
    expect(byId.get(low)).toMatchObject({ pricePerTonne: 17_400, rejected: true, rejectReason: '9.0 °Brix is under the contract\'s reject floor of 9.5 °Brix' })
    expect(byId.get(unread)).toMatchObject({ reading: null, pricePerTonne: null, rejected: false })
    expect(typeof (byId.get(sharp) as { contractId: number }).contractId).toBe('number')
  })

  it('filters by free kg, state, grower, variety and class', async () => {
    const maker = await as('makerOwner')
    const ids = async (query: string) => {
      const res = await maker.get(`/api/blends/lots?q=${MARK}&limit=200&${query}`)
      expect(res.status, JSON.stringify(res.body)).toBe(200)
      return res.body.items.map((l: { lotId: number }) => l.lotId) as number[]
    }
    const atLeast = await ids('minFreeKg=6000')
    expect(atLeast).toEqual(expect.arrayContaining([sharp, mild]))
    expect(atLeast).not.toContain(low)
    expect(await ids('state=delivered')).toEqual([])
    expect(await ids(`growerId=${await orgId('hollowmere')}`)).toEqual([])
    expect(await ids('juiceClass=bittersweet')).toEqual([])
    expect((await ids('juiceClass=bittersharp')).length).toBe(5)
    const bad = await maker.get('/api/blends/lots?minFreeKg=-5&state=pressed')
    expect(bad.status).toBe(400)
    expect(issuePaths(bad.body)).toEqual(expect.arrayContaining(['minFreeKg', 'state']))
  })

  it('shows another maker none of them', async () => {
    const res = await (await as('maker2Owner')).get(`/api/blends/lots?q=${MARK}`)
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ items: [], total: 0 })
  })
})

describe('solving a blend', () => {
  // TA by volume: 8.0 a + 4.0 (1 − a) ≤ 6.5 g/L gives at most a = 0.625 of the litres from the
  // sharp lot, the cheaper one (£210.00 against £218.00 a tonne at the same yield). Of 4,000 L:
  // 2,500 L sharp = 3,333.3 kg, 1,500 L mild = 2,000 kg. Cost 3.3333 t × 21,000 + 2 t × 21,800
  // = 70,000 + 43,600 = 113,600 p, 28.40 p a litre.
  const known = { target: taRange(5, 6.5), volumeL: 4000 }

  it('finds the least-cost blend, checked by hand', async () => {
    const res = await solve({ ...known, lots: [real(sharp), real(mild)] })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body).toMatchObject({ status: 'optimal', cost: 113_600, costPerLitre: 28.4, currency: 'GBP', misses: [], rejected: [] })
    expect(lineOf(res.body, sharp)).toMatchObject({ lotId: sharp, kg: 3333.3, litres: 2500, share: 0.625, freeKg: 10_000, pricePerTonne: 21_000 })
    expect(lineOf(res.body, mild)).toMatchObject({ lotId: mild, kg: 2000, litres: 1500, share: 0.375, freeKg: 10_000, pricePerTonne: 21_800 })
    expect(res.body.predicted.taGPerL).toBeCloseTo(6.5, 6)
    expect(res.body.predicted.tanninGPerL).toBeCloseTo(2.0, 6)
    // SG mixes by volume: 0.625 × SG(12.0 °Bx) + 0.375 × SG(13.0 °Bx); potential alcohol by gravity
    // drop to 1.000 is (OG − 1.000) × 131.25 (homebrewing texts after Papazian).
    const sg = 0.625 * brixToSg(12) + 0.375 * brixToSg(13)
    expect(res.body.predicted.sg).toBeCloseTo(sg, 6)
    expect(res.body.predicted.potentialAbv).toBeCloseTo((sg - 1) * 131.25, 6)
    // Loosening the TA maximum by 1 g/L moves 0.25 of the litres (1 ÷ (8.0 − 4.0)) from mild to
    // sharp: 0.25 × 4,000 L × (21,800 − 21,000) / 750 p a litre = 1,066.67 p per g/L.
    expect(res.body.binding).toEqual([{ property: 'taGPerL', bound: 'max', costPerUnit: expect.closeTo(1066.67, 1) }])
  })

  it('works the potential alcohol by the method asked', async () => {
    const res = await solve({ ...known, lots: [real(sharp), real(mild)], alcoholMethod: 'sugar' })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    // Sugar (OIV refractometry table) ÷ 16.83 g/L per % vol (OIV).
    expect(res.body.predicted.potentialAbv).toBeCloseTo(potentialAbvFromBrix(res.body.predicted.brix), 6)
    const bad = await solve({ ...known, lots: [real(sharp)], alcoholMethod: 'guess' })
    expect(bad.status).toBe(400)
    expect(issuePaths(bad.body)).toEqual(['alcoholMethod'])
  })

  it('saves what the binding range says when the bound is moved and the blend solved again', async () => {
    const before = await solve({ ...known, lots: [real(sharp), real(mild)] })
    const saving = before.body.binding.find((b: { property: string }) => b.property === 'taGPerL').costPerUnit as number
    const after = await solve({ ...known, target: taRange(5, 6.6), lots: [real(sharp), real(mild)] })
    expect(after.body.status).toBe('optimal')
    // 0.1 g/L × 1,066.67 p = 106.67 p less: 113,493.33 p, rounded to a whole penny on each side.
    expect(before.body.cost - after.body.cost).toBeGreaterThanOrEqual(Math.floor(saving * 0.1) - 1)
    expect(before.body.cost - after.body.cost).toBeLessThanOrEqual(Math.ceil(saving * 0.1) + 1)
    expect(after.body.cost).toBe(113_493)
  })

  it('adds each lot\'s haulage to its cost', async () => {
    // Sharp at £210.00 + £15.00 haulage = £225.00 is now dearer than mild at £218.00: as little
    // sharp as TA ≥ 5.0 allows, 8a + 4(1 − a) = 5 → a = 0.25: 1,000 L = 1,333.3 kg, mild 3,000 L
    // = 4,000 kg. Cost 1.3333 t × 22,500 + 4 t × 21,800 = 30,000 + 87,200 = 117,200 p.
    const res = await solve({ ...known, lots: [real(sharp, { haulagePerTonne: 1500 }), real(mild)] })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body).toMatchObject({ status: 'optimal', cost: 117_200 })
    expect(lineOf(res.body, sharp)).toMatchObject({ kg: 1333.3, litres: 1000, share: 0.25 })
    expect(res.body.binding).toEqual([{ property: 'taGPerL', bound: 'min', costPerUnit: expect.any(Number) }])
  })

  it('gives the nearest mix, with each range it misses, when none fits', async () => {
    // No lot has TA above 8.0: the nearest is the sharp lot alone, 8.0 g/L against 9–10.
    const res = await solve({ target: taRange(9, 10), volumeL: 4000, lots: [real(sharp), real(mild)] })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.status).toBe('nearest')
    expect(res.body.misses).toEqual([{ property: 'taGPerL', min: 9, max: 10, achieved: expect.closeTo(8, 6) }])
    expect(lineOf(res.body, sharp)).toMatchObject({ kg: 5333.3, litres: 4000, share: 1 })
    expect(res.body.binding).toEqual([])
    // 20,000 L asked of 15,000 L of juice (2 × 10 t × 750 L): the volume is missed.
    const short = await solve({ target: taRange(5, 6.5), volumeL: 20_000, lots: [real(sharp), real(mild)] })
    expect(short.body.status).toBe('nearest')
    expect(short.body.misses).toContainEqual({ property: 'volumeL', min: 20_000, max: 20_000, achieved: 15_000 })
  })

  it('blends what-if lots typed in, alone or with real ones', async () => {
    // Two lots of 700 L a tonne, TA 8.0 at £200.00 and 4.0 at £250.00: a = 0.625 of 3,500 L, so
    // 2,187.5 L = 3,125 kg and 1,312.5 L = 1,875 kg; 3.125 × 20,000 + 1.875 × 25,000 = 109,375 p.
    const whatIf = (code: string, taGPerL: number, pricePerTonne: number) => ({ code, availableKg: 10_000, brix: 12, taGPerL, tanninGPerL: 2, pricePerTonne, juiceYieldLPerTonne: 700 })
    const res = await solve({ target: taRange(5, 6.5), volumeL: 3500, lots: [whatIf('IF-SHARP', 8, 20_000), whatIf('IF-MILD', 4, 25_000)] })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body).toMatchObject({ status: 'optimal', cost: 109_375 })
    expect(lineOf(res.body, 'IF-SHARP')).toEqual({ code: 'IF-SHARP', kg: 3125, litres: 2187.5, share: 0.625, freeKg: 10_000, pricePerTonne: 20_000 })
    expect(lineOf(res.body, 'IF-MILD')).toEqual({ code: 'IF-MILD', kg: 1875, litres: 1312.5, share: 0.375, freeKg: 10_000, pricePerTonne: 25_000 })
    // With the real sharp lot (£210.00 a tonne at 750 L: 28.0 p a litre) against the what-if mild
    // one (£250.00 at 700 L: 35.7 p a litre), the real lot's name comes back with its line.
    const mixed = await solve({ target: taRange(5, 6.5), volumeL: 3500, lots: [real(sharp), whatIf('IF-MILD', 4, 25_000)] })
    expect(mixed.body.status).toBe('optimal')
    expect(lineOf(mixed.body, sharp)).toMatchObject({ lotId: sharp, code: expect.stringMatching(/^T-BLS-/), litres: 2187.5 })
  })

  it('leaves a lot under its reject floor out and lists it, unless a price is typed for it', async () => {
    const left = await solve({ volumeL: 1000, lots: [real(sharp), real(low)] })
    expect(left.status, JSON.stringify(left.body)).toBe(200)
    expect(left.body.lines.map((l: { lotId: number }) => l.lotId)).toEqual([sharp])
    expect(left.body.rejected).toEqual([{ lotId: low, code: expect.stringMatching(/^T-BLS-/), reason: '9.0 °Brix is under the contract\'s reject floor of 9.5 °Brix' }])
    // At £150.00 a tonne (20.0 p a litre against the sharp lot's 28.0) it is the cheaper juice:
    // 1,000 L = 1,333.3 kg of it, 1.3333 t × 15,000 = 20,000 p.
    const priced = await solve({ volumeL: 1000, lots: [real(sharp), real(low, { pricePerTonne: 15_000 })] })
    expect(priced.body).toMatchObject({ status: 'optimal', cost: 20_000, rejected: [] })
    expect(priced.body.lines).toEqual([{ lotId: low, code: expect.any(String), kg: 1333.3, litres: 1000, share: 1, freeKg: 5000, pricePerTonne: 15_000 }])
  })

  it('lists a lot with no reading, or none of a property the target ranges, as left out', async () => {
    const res = await solve({ target: { tanninGPerL: { min: 1, max: 3 } }, volumeL: 1000, lots: [real(sharp), real(unread), real(noTannin)] })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.status).toBe('optimal')
    const reasons = new Map(res.body.rejected.map((r: { lotId: number, reason: string }) => [r.lotId, r.reason]))
    expect(reasons.get(unread)).toMatch(/No juice reading/)
    expect(reasons.get(noTannin)).toMatch(/tannin/)
    // Nothing left to blend: the nearest mix is no juice, short of the whole volume.
    const none = await solve({ volumeL: 1000, lots: [real(unread)] })
    expect(none.body).toMatchObject({ status: 'nearest', lines: [], cost: 0, misses: [{ property: 'volumeL', min: 1000, max: 1000, achieved: 0 }] })
  })

  it('answers 404 for a lot the maker may not see', async () => {
    const other = await solve({ volumeL: 1000, lots: [real(sharp), real(hollowmere)] })
    expect(other.status).toBe(404)
    expect((await solve({ volumeL: 1000, lots: [real(sharp)] }, 'maker2Owner')).status).toBe(404)
    expect((await solve({ volumeL: 1000, lots: [real(2_000_000_000)] })).status).toBe(404)
  })

  it('refuses bad input with 400 naming the field', async () => {
    const cases: [unknown, string][] = [
      [{ volumeL: 1000, lots: [] }, 'lots'],
      [{ volumeL: 1000 }, 'lots'],
      [{ volumeL: -5, lots: [real(sharp)] }, 'volumeL'],
      [{ target: taRange(7, 5), volumeL: 1000, lots: [real(sharp)] }, 'target.taGPerL.min'],
      [{ target: { ph: { min: 3, max: 4 } }, volumeL: 1000, lots: [real(sharp)] }, 'target.ph'],
      [{ volumeL: 1000, lots: [{ lotId: 'abc' }] }, 'lots.0.lotId'],
      [{ volumeL: 1000, lots: [{ lotId: -3 }] }, 'lots.0.lotId'],
      [{ volumeL: 1000, lots: [real(sharp, { haulagePerTonne: -100 })] }, 'lots.0.haulagePerTonne'],
      [{ volumeL: 1000, lots: [real(sharp), real(sharp)] }, 'lots.1.lotId'],
      [{ volumeL: 1000, lots: [{ code: 'IF-1', availableKg: -10, brix: 12, taGPerL: 6, tanninGPerL: 2, pricePerTonne: 20_000, juiceYieldLPerTonne: 700 }] }, 'lots.0.availableKg'],
      [{ volumeL: 1000, lots: [{ code: 'IF-1', availableKg: 1000, brix: 12, taGPerL: 6, pricePerTonne: 20_000, juiceYieldLPerTonne: 700 }] }, 'lots.0.tanninGPerL'],
      [{ volumeL: 1000, lots: [{ code: 'IF-1', availableKg: 1000, brix: 12, taGPerL: 6, tanninGPerL: 2, pricePerTonne: -1, juiceYieldLPerTonne: 700 }] }, 'lots.0.pricePerTonne'],
      [{ volumeL: 1000, lots: [real(sharp)], shares: [{ juiceClass: 'bittersharp', min: 0.8, max: 0.2 }] }, 'shares.0.min'],
      [{ volumeL: 1000, lots: [real(sharp)], shares: [{ min: 0.2 }] }, 'shares.0.varietyId'],
    ]
    for (const [body, path] of cases) {
      const res = await solve(body)
      expect(res.status, `${JSON.stringify(body)} → ${JSON.stringify(res.body)}`).toBe(400)
      expect(issuePaths(res.body), JSON.stringify(body)).toContain(path)
    }
  })

  it('answers junk with 4xx, never 500', async () => {
    for (const body of ['{', '[]', 'null', '"lots"', JSON.stringify({ volumeL: 1e308, lots: [{ lotId: 1e300 }] }), JSON.stringify({ volumeL: 1000, lots: Array.from({ length: 2001 }, (_, i) => ({ lotId: i + 1 })) })]) {
      const res = await (await as('makerOwner')).request('POST', '/api/blends/solve', body, { 'content-type': 'application/json' })
      expect(res.status, `${body.slice(0, 80)} → ${JSON.stringify(res.body).slice(0, 200)}`).toBeGreaterThanOrEqual(400)
      expect(res.status).toBeLessThan(500)
    }
  })

  it('honours a share rule by juice class', async () => {
    // The what-if lot's class from its acid and tannin (3.0 g/L, 1.0 g/L: sweet by the Long Ashton
    // thresholds of 4.5 g/L acid and 2.0 g/L tannin); the real lot's is its variety's, bittersharp.
    // The sweet juice is cheaper (£100.00 a tonne), so the bittersharp share sits at its 30 % least:
    // 300 L = 400 kg of the real lot, 700 L = 933.3 kg of the what-if one;
    // 0.4 t × 21,000 + 0.9333 t × 10,000 = 8,400 + 9,333.33 = 17,733 p.
    const whatIf = { code: 'IF-SWEET', availableKg: 10_000, brix: 12, taGPerL: 3, tanninGPerL: 1, pricePerTonne: 10_000, juiceYieldLPerTonne: 750 }
    const res = await solve({ volumeL: 1000, lots: [real(sharp), whatIf], shares: [{ juiceClass: 'bittersharp', min: 0.3 }] })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body).toMatchObject({ status: 'optimal', cost: 17_733 })
    expect(lineOf(res.body, sharp)).toMatchObject({ kg: 400, litres: 300, share: 0.3 })
    expect(lineOf(res.body, 'IF-SWEET')).toMatchObject({ kg: 933.3, litres: 700, share: 0.7 })
  })
})
