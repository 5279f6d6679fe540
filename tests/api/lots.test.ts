import { beforeAll, describe, expect, it } from 'vitest'
import { contractFixtures, orgId, varietyId } from '../support/contracts'
import { testDb } from '../support/db'
import { as } from '../support/http'
import { lotFixtures } from '../support/lots'

const db = testDb()
const MARK = 'T-LOT-'
const { lot, reading } = lotFixtures(MARK)
const { fruitContract } = contractFixtures('Lots test')
let seq = 0
const code = () => `${MARK}${Date.now().toString(36)}-${++seq}`

let ids: Record<'dabinett' | 'kingstonBlack' | 'foxwhelp' | 'brownsApple' | 'thorn' | 'hollowmere' | 'tansyRow' | 'marrowby' | 'longGround' | 'riverStrip', number>

beforeAll(async () => {
  const block = async (name: string) => (await db('orchard_blocks').where({ name }).first('id')).id as number
  ids = {
    dabinett: await varietyId('Dabinett'),
    kingstonBlack: await varietyId('Kingston Black'),
    foxwhelp: await varietyId('Foxwhelp'),
    brownsApple: await varietyId('Brown\'s Apple'),
    thorn: await varietyId('Thorn'),
    hollowmere: await orgId('hollowmere'),
    tansyRow: await orgId('tansyRow'),
    marrowby: await orgId('marrowby'),
    longGround: await block('Long Ground'),
    riverStrip: await block('River Strip'),
  }
})

const issuePaths = (body: { data?: { issues?: { path: string }[] } }) => (body.data?.issues ?? []).map(i => i.path)

describe('recording a lot', () => {
  it('answers 201 with the lot: variety, harvest year from the day picked, state available, no reading yet', async () => {
    const grower = await as('growerOwner')
    const res = await grower.post('/api/lots', { code: code(), varietyId: ids.dabinett, pickedOn: '2026-10-14', netKg: 4820.25, bins: 12, notes: 'Shaken, picked up the same day' })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body).toMatchObject({ varietyId: ids.dabinett, varietyName: 'Dabinett', species: 'apple', varietyClass: 'bittersweet', harvestYear: 2026, pickedOn: '2026-10-14', netKg: 4820.3, bins: 12, state: 'available', latestReading: null, juiceClass: null, blockId: null, orgName: 'Hollowmere Orchard & Nursery' })
  })

  it('takes the variety from the block when only a block is given', async () => {
    const res = await (await as('growerOwner')).post('/api/lots', { code: code(), blockId: ids.longGround, pickedOn: '2026-10-15', netKg: 900 })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body).toMatchObject({ blockId: ids.longGround, blockName: 'Long Ground', varietyId: ids.dabinett })
  })

  it('refuses a block of another variety, and another organisation\'s block, naming blockId', async () => {
    const grower = await as('growerOwner')
    const other = await grower.post('/api/lots', { code: code(), blockId: ids.longGround, varietyId: ids.kingstonBlack, pickedOn: '2026-10-15', netKg: 900 })
    expect(other.status).toBe(400)
    expect(issuePaths(other.body)).toEqual(['blockId'])
    expect(other.body.message).toContain('Dabinett')
    const theirs = await grower.post('/api/lots', { code: code(), blockId: ids.riverStrip, pickedOn: '2026-10-15', netKg: 900 })
    expect(theirs.status).toBe(400)
    expect(issuePaths(theirs.body)).toEqual(['blockId'])
  })

  it.each([
    [{ code: '' }, 'code'],
    [{ netKg: 0 }, 'netKg'],
    [{ netKg: 10_000_001 }, 'netKg'],
    [{ pickedOn: '2999-01-01' }, 'pickedOn'],
    [{ pickedOn: '2026-02-30' }, 'pickedOn'],
    [{ varietyId: undefined }, 'varietyId'],
    [{ varietyId: 99999999 }, 'varietyId'],
    [{ bins: -1 }, 'bins'],
    [{ colour: 'red' }, 'colour'],
  ])('refuses %j naming %s', async (change, field) => {
    const res = await (await as('growerOwner')).post('/api/lots', { code: code(), varietyId: ids.dabinett, pickedOn: '2026-10-01', netKg: 100, ...change })
    expect(res.status).toBe(400)
    expect(issuePaths(res.body)).toContain(field)
  })

  it('keeps the code unique in the organisation (409 naming code), while another grower may use it', async () => {
    const taken = code()
    const body = { code: taken, varietyId: ids.dabinett, pickedOn: '2026-10-01', netKg: 100 }
    expect((await (await as('growerOwner')).post('/api/lots', body)).status).toBe(201)
    const again = await (await as('growerMember')).post('/api/lots', body)
    expect(again.status).toBe(409)
    expect(issuePaths(again.body)).toEqual(['code'])
    expect((await (await as('grower2Owner')).post('/api/lots', { ...body, varietyId: ids.kingstonBlack })).status).toBe(201)
  })
})

describe('changing and deleting a lot', () => {
  it('moves the harvest year with the day picked and refuses a code already taken', async () => {
    const grower = await as('growerOwner')
    const id = await lot(ids.hollowmere, { variety_id: ids.dabinett })
    const moved = await grower.patch(`/api/lots/${id}`, { pickedOn: '2025-09-30', netKg: 1500 })
    expect(moved.status, JSON.stringify(moved.body)).toBe(200)
    expect(moved.body).toMatchObject({ pickedOn: '2025-09-30', harvestYear: 2025, netKg: 1500 })
    const otherCode = (await db('harvest_lots').where({ id: await lot(ids.hollowmere, { variety_id: ids.dabinett }) }).first('code')).code
    const clash = await grower.patch(`/api/lots/${id}`, { code: otherCode })
    expect(clash.status).toBe(409)
    expect(issuePaths(clash.body)).toEqual(['code'])
    const nothing = await grower.patch(`/api/lots/${id}`, {})
    expect(nothing.status).toBe(400)
  })

  it('deletes a lot nothing refers to, and refuses one with readings saying so (409)', async () => {
    const grower = await as('growerOwner')
    const bare = await lot(ids.hollowmere, { variety_id: ids.dabinett })
    expect((await grower.delete(`/api/lots/${bare}`)).status).toBe(204)
    expect((await grower.get(`/api/lots/${bare}`)).status).toBe(404)
    const read = await lot(ids.hollowmere, { variety_id: ids.dabinett })
    await reading(read, { brix: 11.5 })
    const refused = await grower.delete(`/api/lots/${read}`)
    expect(refused.status).toBe(409)
    expect(refused.body.message).toContain('1 juice reading')
    expect((await grower.get(`/api/lots/${read}`)).status).toBe(200)
  })

  it('answers 404 for another grower\'s lot, to read, change, delete or add a reading', async () => {
    const id = await lot(ids.hollowmere, { variety_id: ids.dabinett })
    const other = await as('grower2Owner')
    expect((await other.get(`/api/lots/${id}`)).status).toBe(404)
    expect((await other.get(`/api/lots/${id}/readings`)).status).toBe(404)
    expect((await other.patch(`/api/lots/${id}`, { bins: 1 })).status).toBe(404)
    expect((await other.delete(`/api/lots/${id}`)).status).toBe(404)
    expect((await other.post(`/api/lots/${id}/readings`, { sampledOn: '2026-10-02', brix: 12 })).status).toBe(404)
  })
})

describe('listing lots', () => {
  it('filters by variety, harvest year and text, with the count and net kg of the whole list', async () => {
    const tag = `${MARK}list-${Date.now().toString(36)}`
    await lot(ids.hollowmere, { code: `${tag}-a`, variety_id: ids.brownsApple, net_kg: 1200.5, picked_on: '2026-09-20' })
    await lot(ids.hollowmere, { code: `${tag}-b`, variety_id: ids.brownsApple, net_kg: 800, picked_on: '2026-09-21' })
    await lot(ids.hollowmere, { code: `${tag}-c`, variety_id: ids.brownsApple, net_kg: 300, picked_on: '2025-09-21' })
    const grower = await as('growerOwner')
    const res = await grower.get(`/api/lots?q=${encodeURIComponent(tag)}&varietyId=${ids.brownsApple}&harvestYear=2026&limit=1`)
    expect(res.status).toBe(200)
    expect(res.body.total).toBe(2)
    expect(res.body.totals).toEqual({ lots: 2, netKg: 2000.5 })
    expect(res.body.items).toHaveLength(1)
    expect(res.body.items[0].code).toBe(`${tag}-b`)
    const past = await grower.get(`/api/lots?q=${encodeURIComponent(tag)}&offset=10`)
    expect(past.body).toMatchObject({ items: [], total: 3, totals: { lots: 3, netKg: 2300.5 } })
    const sharp = await grower.get(`/api/lots?q=${encodeURIComponent(tag)}&juiceClass=bittersweet`)
    expect(sharp.body.total).toBe(0)
  })

  it('refuses a bad filter naming it', async () => {
    const res = await (await as('growerOwner')).get('/api/lots?state=eaten')
    expect(res.status).toBe(400)
    expect(issuePaths(res.body)).toEqual(['state'])
  })
})

describe('readings typed by hand', () => {
  it('corrects SG to the organisation\'s 20 °C hydrometer, keeps it as read, and stores TA as malic', async () => {
    const calibration = (await db('organisations').where({ id: ids.hollowmere }).first('hydrometer_calibration_c')).hydrometer_calibration_c
    expect(Number(calibration)).toBe(20)
    const id = await lot(ids.hollowmere, { variety_id: ids.dabinett })
    const grower = await as('growerMember')
    const res = await grower.post(`/api/lots/${id}/readings`, { sampledOn: '2026-10-03', sg: 1.05, tempC: 25, ta: 7.5, taAs: 'tartaric', tannin: 2500, tanninUnit: 'mg/L', ph: 3.4, notes: 'Press sample' })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    // Lyons, HBD #963: + 0.99823 − 0.99707 = +0.00116 at 25 °C on a 20 °C hydrometer.
    expect(res.body.sg).toBeCloseTo(1.0512, 4)
    expect(res.body.sgAsRead).toBe(1.05)
    expect(res.body.tempC).toBe(25)
    // AWRI, "Interconversion of acidity units": 7.5 × 67.04 / 75.04 = 6.70 g/L as malic.
    expect(res.body.taGPerL).toBeCloseTo(6.7, 2)
    expect(res.body).toMatchObject({ taReportedAs: 'tartaric', taReportedValue: 7.5, taReportedUnit: 'g/L', tanninGPerL: 2.5, ph: 3.4, labSheetId: null, notes: 'Press sample' })
    // Long Ashton: acid above 4.5 g/L and tannin above 2.0 g/L is bittersharp.
    expect(res.body.juiceClass).toBe('bittersharp')
    const shown = await grower.get(`/api/lots/${id}`)
    expect(shown.body.latestReading.id).toBe(res.body.id)
    expect(shown.body.juiceClass).toBe('bittersharp')
  })

  it('lists readings newest first, each with its class, pears by the perry pear classes', async () => {
    const id = await lot(ids.hollowmere, { variety_id: ids.thorn })
    const grower = await as('growerOwner')
    await grower.post(`/api/lots/${id}/readings`, { sampledOn: '2026-09-20', brix: 11, ta: 3, tannin: 1 })
    await grower.post(`/api/lots/${id}/readings`, { sampledOn: '2026-09-28', brix: 12 })
    const res = await grower.get(`/api/lots/${id}/readings`)
    expect(res.status).toBe(200)
    expect(res.body.total).toBe(2)
    expect(res.body.items.map((r: { sampledOn: string }) => r.sampledOn)).toEqual(['2026-09-28', '2026-09-20'])
    // Pollard & Beech: 3.0 g/L acid with 1.0 g/L tannin is medium sharp for a perry pear.
    expect(res.body.items.map((r: { juiceClass: string | null }) => r.juiceClass)).toEqual([null, 'medium sharp'])
  })

  it.each([
    [{ ph: 6 }, 'ph'],
    [{ brix: 35 }, 'brix'],
    [{ brix: 10, sg: 1.06 }, 'sg'],
    [{ ta: -1 }, 'ta'],
    [{}, 'brix'],
    [{ brix: 'twelve' }, 'brix'],
    [{ brix: 12, taAs: 'citric' }, 'taAs'],
    [{ brix: 12, sampledOn: '2999-01-01' }, 'sampledOn'],
  ])('refuses %j naming %s', async (change, field) => {
    const id = await lot(ids.hollowmere, { variety_id: ids.dabinett })
    const res = await (await as('growerOwner')).post(`/api/lots/${id}/readings`, { sampledOn: '2026-10-02', ...change })
    expect(res.status, JSON.stringify(res.body)).toBe(400)
    expect(issuePaths(res.body)).toContain(field)
    expect(await db('juice_readings').where({ lot_id: id }).count({ n: '*' })).toEqual([{ n: 0 }])
  })
})

describe('what a maker sees', () => {
  it('sees nothing of a grower without a covering contract', async () => {
    const id = await lot(ids.tansyRow, { variety_id: ids.kingstonBlack })
    const maker = await as('maker2Owner')
    expect((await maker.get(`/api/lots/${id}`)).status).toBe(404)
    expect((await maker.get(`/api/lots/${id}/readings`)).status).toBe(404)
    expect((await maker.get('/api/lots')).body).toMatchObject({ items: [], total: 0, totals: { lots: 0, netKg: 0 } })
  })

  it('sees exactly the lots its accepted contracts cover: the variety or class, the grower and a schedule year', async () => {
    const tag = `${MARK}mk-${Date.now().toString(36)}`
    let k = 0
    const mine = (org: number, variety: number, pickedOn: string) => lot(org, { code: `${tag}-${++k}`, variety_id: variety, picked_on: pickedOn })
    const covered = await mine(ids.tansyRow, ids.kingstonBlack, '2026-10-05')
    await mine(ids.tansyRow, ids.kingstonBlack, '2025-10-05')
    const foxwhelp = await mine(ids.tansyRow, ids.foxwhelp, '2026-10-05')
    await mine(ids.hollowmere, ids.kingstonBlack, '2026-10-05')
    const byClass = await mine(ids.hollowmere, ids.dabinett, '2026-10-06')
    await mine(ids.hollowmere, ids.brownsApple, '2026-10-06')
    await mine(ids.hollowmere, ids.thorn, '2026-10-06')
    await reading(covered, { brix: 12.2, ta_g_per_l: 6.1, tannin_g_per_l: 2.4 })
    // Marrowby buys Tansy Row's Kingston Black of 2026 and Hollowmere's bittersweet apples of 2026;
    // an offer not yet accepted covers nothing.
    const kingstonBlack = await fruitContract('accepted', { maker_org_id: ids.marrowby, variety_id: ids.kingstonBlack, juice_class: null, species: null }, [2026])
    await fruitContract('accepted', { maker_org_id: ids.marrowby, grower_org_id: ids.hollowmere, juice_class: 'bittersweet', species: 'apple' }, [2026, 2027])
    await fruitContract('offered', { maker_org_id: ids.marrowby, grower_org_id: ids.hollowmere, juice_class: 'sharp', species: 'apple' }, [2026])
    const maker = await as('maker2Owner')
    // Of this test's seven lots (the search keeps other tests' lots out of the count).
    const list = await maker.get(`/api/lots?q=${encodeURIComponent(tag)}`)
    expect(list.status).toBe(200)
    expect(list.body.items.map((l: { id: number }) => l.id).sort()).toEqual([covered, byClass].sort())
    expect((await (await as('maker2Owner')).get(`/api/lots?q=${encodeURIComponent(tag)}`)).body.total).toBe(2)
    // Quillhurst's demo contract buys Tansy Row's bittersharp apples of 2026–2030 by class: Kingston
    // Black and Foxwhelp (both published bittersharp) of 2026, not 2025's nor Hollowmere's.
    const quillhurst = await (await as('makerViewer')).get(`/api/lots?q=${encodeURIComponent(tag)}`)
    expect(quillhurst.body.items.map((l: { id: number }) => l.id).sort()).toEqual([covered, foxwhelp].sort())
    const one = await maker.get(`/api/lots/${covered}`)
    expect(one.status, JSON.stringify(one.body)).toBe(200)
    expect(one.body).toMatchObject({ orgName: 'Tansy Row Fruit', juiceClass: 'bittersharp' })
    expect((await maker.get(`/api/lots/${covered}/readings`)).body.total).toBe(1)
    expect((await maker.patch(`/api/lots/${covered}`, { bins: 2 })).status).toBe(403)
    // Once the last delivery window has closed the contract is fulfilled, and still covers its lots.
    await db('fruit_contracts').where({ id: kingstonBlack }).update({ state: 'fulfilled' })
    expect((await maker.get(`/api/lots/${covered}`)).status).toBe(200)
  })
})
