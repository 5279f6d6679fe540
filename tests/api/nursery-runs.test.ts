import { beforeAll, describe, expect, it } from 'vitest'
import { hashPassword } from '../../server/utils/passwords'
import { contractFixtures, orgId, rootstockId, varietyId } from '../support/contracts'
import { testDb, uniqueEmail } from '../support/db'
import { DEMO_PASSWORD } from '../support/env'
import { ApiClient, as } from '../support/http'
import { nurseryFixtures } from '../support/nursery'

// The row map through the API: rows in a field, a run lined out from liner stock against a tree
// contract, its events from budding to the dig with the counts worked out live, the delivery from
// what was dug, and the tags that keep the labels true. Every refusal on the way names its field.
const MARK = 'Runs test'
const { treeContract } = contractFixtures(MARK)
const { field, row, run } = nurseryFixtures(MARK)
const db = testDb()

let ids: Record<'dabinett' | 'kingstonBlack' | 'yarlington' | 'mm106' | 'm9' | 'quinceA' | 'hollowmere' | 'tansyRow', number>

beforeAll(async () => {
  ids = {
    dabinett: await varietyId('Dabinett'), kingstonBlack: await varietyId('Kingston Black'), yarlington: await varietyId('Yarlington Mill'),
    mm106: await rootstockId('MM.106'), m9: await rootstockId('M.9'), quinceA: await rootstockId('Quince A'),
    hollowmere: await orgId('hollowmere'), tansyRow: await orgId('tansyRow'),
  }
})

/** The liners of a rootstock and grade the nursery has in stock: lots in, less runs lined out. */
async function inStock(rootstock: number, grade: string): Promise<number> {
  const [lots] = await db('liner_lots').where({ org_id: ids.hollowmere, rootstock_id: rootstock, grade }).sum({ n: 'count' }) as [{ n: number | null }]
  const [runs] = await db('nursery_runs').where({ org_id: ids.hollowmere, rootstock_id: rootstock, liner_grade: grade }).sum({ n: 'lined_out_count' }) as [{ n: number | null }]
  return Number(lots.n ?? 0) - Number(runs.n ?? 0)
}

async function linerLot(rootstock: number, grade: string, count: number): Promise<void> {
  await db('liner_lots').insert({ org_id: ids.hollowmere, rootstock_id: rootstock, grade, source: 'bought', supplier: 'Test supplier', count, received_on: '2025-02-01', notes: MARK })
}

async function budwoodLot(variety: number, org = ids.hollowmere): Promise<number> {
  const [id] = await db('budwood_lots').insert({ org_id: org, label: `${MARK} ${Math.random().toString(36).slice(2, 8)}`, variety_id: variety, cut_on: '2025-08-18', source_kind: 'own-block', sticks: 40 })
  return id!
}

async function rowName(id: number): Promise<string> {
  return (await db('nursery_rows').where({ id }).first('name')).name
}

const runBody = (rowId: number, extra: Record<string, unknown> = {}) => ({
  rowId, fromPosition: 1, toPosition: 100, rootstockId: ids.mm106, linedOutOn: '2025-03-20', linedOutCount: 100, varietyId: ids.dabinett, ...extra,
})

describe('rows of a nursery-row field', () => {
  it('adds a row to a field, lists it with the field name, and corrects it', async () => {
    const nursery = await as('growerOwner')
    const fieldId = await field()
    const created = await nursery.post('/api/nursery/rows', { fieldId, name: '12', positions: 400, spacingCm: 32.5, id: 7, fieldName: 'x' })
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    const fieldName = (await db('nursery_beds').where({ id: fieldId }).first('name')).name
    expect(created.body).toEqual({ id: expect.any(Number), fieldId, fieldName, name: '12', positions: 400, spacingCm: 32.5, notes: null })

    // "2" comes before "12" in the field: numbers as numbers.
    await nursery.post('/api/nursery/rows', { fieldId, name: '2', positions: 400 })
    const listed = await nursery.get(`/api/nursery/rows?fieldId=${fieldId}`)
    expect(listed.body.total).toBe(2)
    expect(listed.body.items.map((r: { name: string }) => r.name)).toEqual(['2', '12'])

    const same = await nursery.post('/api/nursery/rows', { fieldId, name: '12', positions: 10 })
    expect(same.status).toBe(409)
    expect(same.body.data.issues[0].path).toBe('name')

    // The field is read-only on a row; a run at positions 1–300 keeps the row at least that long.
    const other = await field()
    const patched = await nursery.patch(`/api/nursery/rows/${created.body.id}`, { fieldId: other, name: '12a', notes: 'Headland end wet' })
    expect(patched.body).toMatchObject({ fieldId, name: '12a', notes: 'Headland end wet' })
    expect((await nursery.post('/api/nursery/runs', runBody(created.body.id, { toPosition: 300, linedOutCount: 300 }))).status).toBe(201)
    const short = await nursery.patch(`/api/nursery/rows/${created.body.id}`, { positions: 299 })
    expect(short.status).toBe(400)
    expect(short.body.data.issues[0]).toEqual({ path: 'positions', message: 'Runs hold positions up to 300 of row 12a: the row needs at least 300 positions' })
    expect((await nursery.patch(`/api/nursery/rows/${created.body.id}`, { positions: 300 })).body.positions).toBe(300)
  })

  it('puts rows only in the nursery\'s own nursery-row fields', async () => {
    const nursery = await as('growerOwner')
    const stool = await field('hollowmere', 'stool')
    const stoolBed = await nursery.post('/api/nursery/rows', { fieldId: stool, name: '1', positions: 10 })
    expect(stoolBed.status).toBe(400)
    expect(stoolBed.body.data.issues[0].path).toBe('fieldId')
    expect(stoolBed.body.data.issues[0].message).toMatch(/is a stool bed, not a nursery-row field$/)
    const theirs = await nursery.post('/api/nursery/rows', { fieldId: await field('tansyRow'), name: '1', positions: 10 })
    expect(theirs.status).toBe(400)
    expect(theirs.body.data.issues[0]).toEqual({ path: 'fieldId', message: 'No field of your nursery has that id' })
    const unknown = await nursery.post('/api/nursery/rows', { fieldId: await field(), name: '1', positions: 10, colour: 'red' })
    expect(unknown.body.data.issues).toEqual([{ path: 'colour', message: 'Unknown field' }])
    expect((await nursery.get(`/api/nursery/rows/${await row({ org: 'tansyRow' })}`)).status).toBe(404)
  })
})

describe('one run from lining out to dug, against its contract', () => {
  it('keeps the counts, the expected trees and the contract\'s delivery in step with the events', async () => {
    const nursery = await as('growerOwner')
    const member = await as('growerMember')
    const contractId = await treeContract('accepted', { tree_count: 400, take_rate: 0.85, survival_rate: 0.9 })
    const rowId = await row({ positions: 500 })
    await linerLot(ids.mm106, '12mm+', 400)
    const stockBefore = await inStock(ids.mm106, '12mm+')

    const created = await nursery.post('/api/nursery/runs', runBody(rowId, { toPosition: 400, linedOutCount: 400, linerGrade: '12mm+', treeContractId: contractId, interstem: null }))
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    const id = created.body.id as number
    expect(created.body).toMatchObject({
      rowId, rowName: await rowName(rowId), fromPosition: 1, toPosition: 400, rootstockDesignation: 'MM.106', rootstockNeedsSupport: false,
      varietyName: 'Dabinett', linerGrade: '12mm+', linedOutOn: '2025-03-20', linedOutCount: 400, treeContractId: contractId, tagPrintedAt: null, warnings: [],
      contract: { id: contractId, buyerOrgName: 'Quillhurst Cider Works', varietyId: ids.dabinett, rootstockId: ids.mm106, treeCount: 400, takeRate: 0.85, survivalRate: 0.9, state: 'accepted' },
      counts: { linedOut: 400, worked: 0, taken: null, takeRate: null, losses: {}, lost: 0, dug: 0, standing: 400 },
      // ⌊400 × 0.85 × 0.9⌋ = ⌊306⌋ = 306.
      expected: { trees: 306, formula: '400 standing × 0.85 expected take × 0.9 survival to sale' },
    })
    expect(created.body.tagCode).toMatch(/^[0-9A-HJKMNP-TV-Z]{10}$/)
    // The run drew its 400 liners from stock.
    expect(await inStock(ids.mm106, '12mm+')).toBe(stockBefore - 400)

    const post = (body: Record<string, unknown>) => member.post(`/api/nursery/runs/${id}/events`, body)
    const lot = await budwoodLot(ids.dabinett)
    const budded = await post({ kind: 'budded', happenedOn: '2025-08-20', method: 'chip-bud', varietyId: ids.dabinett, budwoodLotId: lot, budHeightCm: 15, count: 390, dayOrder: 1 })
    expect(budded.status, JSON.stringify(budded.body)).toBe(201)
    expect(budded.body).toMatchObject({ runId: id, kind: 'budded', varietyName: 'Dabinett', budwoodLotId: lot, budHeightCm: 15, count: 390, byName: 'Tomas Reyne', clientKey: null })
    for (const body of [
      { kind: 'headed-back', happenedOn: '2026-03-10' },
      { kind: 'take-counted', happenedOn: '2026-04-20', count: 351 },
      { kind: 'shoots-removed', happenedOn: '2026-05-20', passNo: 1 },
      { kind: 'staked', happenedOn: '2026-05-25' },
      { kind: 'loss', happenedOn: '2026-07-01', count: 6, cause: 'rodents' },
    ]) expect((await post(body)).status).toBe(201)

    // 351 took of 390 budded: a take of 0.9; the 400 − 351 = 49 that stood and did not take are failed takes.
    // Expected: 0 dug + ⌊(351 − 6) × 0.9⌋ = ⌊310.5⌋ = 310.
    const beforeDig = (await nursery.get(`/api/nursery/runs/${id}`)).body
    expect(beforeDig.counts).toMatchObject({ worked: 390, taken: 351, losses: { 'failed-take': 49, 'rodents': 6 }, lost: 55, standing: 345 })
    expect(beforeDig.counts.takeRate).toBeCloseTo(0.9, 12)
    expect(beforeDig.expected.trees).toBe(310)

    // More dug than stands is refused, naming the grades.
    const overDug = await post({ kind: 'dug', happenedOn: '2026-11-15', grades: [{ caliperMm: 14, count: 300 }, { caliperMm: 11, count: 46 }] })
    expect(overDug.status).toBe(400)
    expect(overDug.body.data.issues[0]).toEqual({ path: 'grades', message: 'Only 345 stand in this run on 2026-11-15: more cannot be dug' })
    const dug = await post({ kind: 'dug', happenedOn: '2026-11-15', grades: [{ caliperMm: 14, heightCm: 160, feathered: true, count: 250 }, { caliperMm: 11, count: 90 }] })
    expect(dug.status, JSON.stringify(dug.body)).toBe(201)
    expect(dug.body.grades).toEqual([{ caliperMm: 14, heightCm: 160, feathered: true, count: 250 }, { caliperMm: 11, heightCm: null, feathered: false, count: 90 }])

    // 250 + 90 = 340 dug, 345 − 340 = 5 left; expected 340 + ⌊5 × 0.9⌋ = 344. Every liner is accounted for: 340 + 5 + 55 = 400.
    const afterDig = (await nursery.get(`/api/nursery/runs/${id}`)).body
    expect(afterDig.counts).toMatchObject({ linedOut: 400, dug: 340, standing: 5, lost: 55 })
    expect(afterDig.expected).toEqual({ trees: 344, formula: '340 dug + 5 standing × 0.9 survival to sale' })
    expect(afterDig.warnings).toEqual([])

    const events = await nursery.get(`/api/nursery/runs/${id}/events`)
    expect(events.body.total).toBe(8)
    expect(events.body.items.map((e: { kind: string }) => e.kind)).toEqual(['lined-out', 'budded', 'headed-back', 'take-counted', 'shoots-removed', 'staked', 'loss', 'dug'])
    expect(events.body.items[0]).toMatchObject({ kind: 'lined-out', happenedOn: '2025-03-20', count: 400, byName: 'Ines Varga' })

    // The contract delivers from what was dug: 341 is one more than the runs hold.
    expect((await nursery.post(`/api/tree-contracts/${contractId}/start-propagation`)).body.state).toBe('propagating')
    expect((await nursery.post(`/api/tree-contracts/${contractId}/mark-ready`)).body.state).toBe('ready')
    const tooMany = await nursery.post(`/api/tree-contracts/${contractId}/deliver`, { deliveredCount: 341, deliveredOn: '2026-11-20' })
    expect(tooMany.status).toBe(400)
    expect(tooMany.body.data.issues[0]).toEqual({ path: 'deliveredCount', message: '340 trees have been dug from this contract\'s runs: deliver at most that many' })
    const delivered = await nursery.post(`/api/tree-contracts/${contractId}/deliver`, { deliveredCount: 340, deliveredOn: '2026-11-20' })
    expect(delivered.body).toMatchObject({ state: 'delivered', deliveredCount: 340 })
    expect((await nursery.get(`/api/nursery/runs/${id}`)).body.contract.state).toBe('delivered')
    expect((await nursery.get(`/api/nursery/runs?treeContractId=${contractId}`)).body.items.map((r: { id: number }) => r.id)).toEqual([id])
  })
})

describe('lining out: what is refused', () => {
  it('refuses positions another run holds (409 naming it), and positions past the row\'s end', async () => {
    const nursery = await as('growerOwner')
    const rowId = await row({ positions: 200 })
    const first = await nursery.post('/api/nursery/runs', runBody(rowId, { toPosition: 150, linedOutCount: 150 }))
    expect(first.status).toBe(201)
    const clash = await nursery.post('/api/nursery/runs', runBody(rowId, { fromPosition: 150, toPosition: 200, linedOutCount: 51 }))
    expect(clash.status).toBe(409)
    expect(clash.body.message).toBe(`Positions 1–150 of row ${await rowName(rowId)} hold run ${first.body.id} (Dabinett on MM.106)`)
    expect(clash.body.data.runId).toBe(first.body.id)
    const past = await nursery.post('/api/nursery/runs', runBody(rowId, { fromPosition: 151, toPosition: 201, linedOutCount: 51 }))
    expect(past.status).toBe(400)
    expect(past.body.data.issues[0]).toEqual({ path: 'toPosition', message: `Row ${await rowName(rowId)} has 200 positions: the last position can be at most 200` })
    expect((await nursery.post('/api/nursery/runs', runBody(rowId, { fromPosition: 151, toPosition: 200, linedOutCount: 50 }))).status).toBe(201)

    // Moving a run onto another is refused the same way; along its own positions it may move.
    const moved = await nursery.patch(`/api/nursery/runs/${first.body.id}`, { toPosition: 151 })
    expect(moved.status).toBe(409)
    expect((await nursery.patch(`/api/nursery/runs/${first.body.id}`, { fromPosition: 2 })).body).toMatchObject({ fromPosition: 2, toPosition: 150 })
  })

  it('refuses a pear stock for an apple, a row, contract or liners that are not there', async () => {
    const nursery = await as('growerOwner')
    const rowId = await row()
    const pear = await nursery.post('/api/nursery/runs', runBody(rowId, { rootstockId: ids.quinceA }))
    expect(pear.status).toBe(400)
    expect(pear.body.data.issues[0].path).toBe('rootstockId')
    const theirRow = await nursery.post('/api/nursery/runs', runBody(await row({ org: 'tansyRow' })))
    expect(theirRow.body.data.issues[0]).toEqual({ path: 'rowId', message: 'No row of your nursery has that id' })
    const draft = await nursery.post('/api/nursery/runs', runBody(rowId, { treeContractId: await treeContract('offered') }))
    expect(draft.status).toBe(400)
    expect(draft.body.data.issues[0].path).toBe('treeContractId')
    expect(draft.body.data.issues[0].message).toMatch(/is offered: runs serve only accepted, propagating or ready contracts$/)
    const none = await nursery.post('/api/nursery/runs', runBody(rowId, { treeContractId: 99_999_999 }))
    expect(none.body.data.issues[0]).toEqual({ path: 'treeContractId', message: 'No tree contract with that id has your nursery as its nursery' })
  })

  it('lines out no more liners of a rootstock and grade than are in stock', async () => {
    const nursery = await as('growerOwner')
    await linerLot(ids.m9, '3-5mm', 20)
    const stock = await inStock(ids.m9, '3-5mm')
    const rowId = await row({ positions: stock + 50 })
    const over = await nursery.post('/api/nursery/runs', runBody(rowId, { rootstockId: ids.m9, linerGrade: '3-5mm', toPosition: stock + 1, linedOutCount: stock + 1 }))
    expect(over.status).toBe(400)
    expect(over.body.data.issues[0]).toEqual({ path: 'linedOutCount', message: `Only ${stock.toLocaleString('en-GB')} liners of M.9 3-5mm are in stock` })
    const all = await nursery.post('/api/nursery/runs', runBody(rowId, { rootstockId: ids.m9, linerGrade: '3-5mm', toPosition: stock, linedOutCount: stock }))
    expect(all.status, JSON.stringify(all.body)).toBe(201)
    // M.9 is a dwarfing stock: its trees need support.
    expect(all.body.rootstockNeedsSupport).toBe(true)
    const more = await nursery.post('/api/nursery/runs', runBody(rowId, { rootstockId: ids.m9, linerGrade: '3-5mm', fromPosition: stock + 1, toPosition: stock + 1, linedOutCount: 1 }))
    expect(more.body.data.issues[0]).toEqual({ path: 'linedOutCount', message: 'Only 0 liners of M.9 3-5mm are in stock' })
    // A run with no grade draws on no stock.
    expect((await nursery.post('/api/nursery/runs', runBody(rowId, { rootstockId: ids.m9, fromPosition: stock + 1, toPosition: stock + 1, linedOutCount: 1 }))).status).toBe(201)
  })

  it('refuses unknown keys by name and ignores the keys it reads back', async () => {
    const nursery = await as('growerOwner')
    const rowId = await row()
    const unknown = await nursery.post('/api/nursery/runs', { ...runBody(rowId), colour: 'red', tagColour: 'blue' })
    expect(unknown.status).toBe(400)
    expect(unknown.body.data.issues).toEqual([{ path: 'colour', message: 'Unknown field' }, { path: 'tagColour', message: 'Unknown field' }])
    const readBack = await nursery.post('/api/nursery/runs', { ...runBody(rowId), id: 1, tagCode: 'AAAAAAAAAA', tagPrintedAt: '2020-01-01T00:00:00Z', counts: { standing: 9 }, warnings: [], expected: null, varietyName: 'Thorn' })
    expect(readBack.status, JSON.stringify(readBack.body)).toBe(201)
    expect(readBack.body).toMatchObject({ tagPrintedAt: null, varietyName: 'Dabinett', counts: { standing: 100 } })
    expect(readBack.body.id).not.toBe(1)
    expect(readBack.body.tagCode).not.toBe('AAAAAAAAAA')
    // What lining out fixed (the row, the day, the count, the grade) is read-only on a correction.
    const patched = await nursery.patch(`/api/nursery/runs/${readBack.body.id}`, { linedOutCount: 5, rowId: 1, notes: 'North end' })
    expect(patched.body).toMatchObject({ linedOutCount: 100, rowId, notes: 'North end', counts: { standing: 100 } })
    const badEvent = await nursery.post(`/api/nursery/runs/${readBack.body.id}/events`, { kind: 'loss', happenedOn: '2025-06-01', count: 1, cause: 'rodents', weather: 'wet' })
    expect(badEvent.body.data.issues).toEqual([{ path: 'weather', message: 'Unknown field' }])
  })
})

describe('events on a run', () => {
  it('refuses a loss larger than what stands, naming the count, and events before lining out', async () => {
    const member = await as('growerMember')
    const id = await run({ linedOut: 100 })
    const loss = await member.post(`/api/nursery/runs/${id}/events`, { kind: 'loss', happenedOn: '2025-06-01', count: 101, cause: 'rodents' })
    expect(loss.status).toBe(400)
    expect(loss.body.data.issues[0]).toEqual({ path: 'count', message: 'Only 100 stand in this run on 2025-06-01: a loss cannot be larger' })
    const early = await member.post(`/api/nursery/runs/${id}/events`, { kind: 'staked', happenedOn: '2025-01-01' })
    expect(early.body.data.issues[0].path).toBe('happenedOn')
    const noKind = await member.post(`/api/nursery/runs/${id}/events`, { kind: 'lined-out', happenedOn: '2025-06-01' })
    expect(noKind.body.data.issues[0].path).toBe('kind')
    expect(await db('propagation_events').where({ run_id: id }).count({ n: '*' })).toEqual([{ n: 1 }])
  })

  it('counts twenty losses sent at once exactly, and refuses those that would take more than stands', async () => {
    const member = await as('growerMember')
    const id = await run({ linedOut: 100 })
    const loss = (count: number) => member.post(`/api/nursery/runs/${id}/events`, { kind: 'loss', happenedOn: '2025-06-01', count, cause: 'rodents' })
    const threes = await Promise.all(Array.from({ length: 20 }, () => loss(3)))
    expect(threes.map(r => r.status)).toEqual(Array(20).fill(201))
    expect((await member.get(`/api/nursery/runs/${id}`)).body.counts).toMatchObject({ lost: 60, standing: 40 })

    // 40 stand: of twenty losses of 4 at once, exactly ten fit.
    const fours = await Promise.all(Array.from({ length: 20 }, () => loss(4)))
    expect(fours.filter(r => r.status === 201)).toHaveLength(10)
    expect(fours.filter(r => r.status === 400 && r.body.data.issues[0].path === 'count')).toHaveLength(10)
    expect((await member.get(`/api/nursery/runs/${id}`)).body.counts).toMatchObject({ lost: 100, standing: 0 })
  })

  it('records an entry sent twice from a phone once', async () => {
    const member = await as('growerMember')
    const id = await run({ linedOut: 100 })
    const entry = { kind: 'loss', happenedOn: '2025-06-01', count: 7, cause: 'winter-injury', clientKey: `offline-${Date.now()}` }
    const first = await member.post(`/api/nursery/runs/${id}/events`, entry)
    expect(first.status).toBe(201)
    const again = await member.post(`/api/nursery/runs/${id}/events`, entry)
    expect(again.status).toBe(200)
    expect(again.body).toEqual(first.body)
    expect((await member.get(`/api/nursery/runs/${id}`)).body.counts.standing).toBe(93)
    expect((await member.get(`/api/nursery/runs/${id}/events`)).body.total).toBe(2)
    // The same key for another run is a mistake of the phone's, not a resend.
    const elsewhere = await member.post(`/api/nursery/runs/${await run()}/events`, entry)
    expect(elsewhere.status).toBe(409)
    expect(elsewhere.body.data.issues[0].path).toBe('clientKey')
  })

  it('checks the budwood lot and warns of buds that do not match the run', async () => {
    const nursery = await as('growerOwner')
    const id = await run({ linedOut: 100 })
    const bud = (extra: Record<string, unknown>) => nursery.post(`/api/nursery/runs/${id}/events`, { kind: 'budded', happenedOn: '2025-08-20', method: 't-bud', varietyId: ids.dabinett, count: 10, ...extra })
    const wrongLot = await bud({ budwoodLotId: await budwoodLot(ids.yarlington) })
    expect(wrongLot.status).toBe(400)
    expect(wrongLot.body.data.issues[0].path).toBe('budwoodLotId')
    expect(wrongLot.body.data.issues[0].message).toMatch(/ is Yarlington Mill, not Dabinett$/)
    const theirLot = await bud({ budwoodLotId: await budwoodLot(ids.dabinett, ids.tansyRow) })
    expect(theirLot.body.data.issues[0]).toEqual({ path: 'budwoodLotId', message: 'No budwood lot of your nursery has that id' })
    expect((await bud({ varietyId: 99_999_999 })).body.data.issues[0].path).toBe('varietyId')

    expect((await bud({})).status).toBe(201)
    expect((await bud({ varietyId: ids.yarlington, budwoodLotId: await budwoodLot(ids.yarlington), happenedOn: '2025-08-21' })).status).toBe(201)
    const warned = (await nursery.get(`/api/nursery/runs/${id}`)).body
    expect(warned.warnings).toEqual([
      { code: 'no-budwood-lot', message: 'Budded on 2025-08-20 with no budwood lot named: those buds cannot be traced to their source' },
      { code: 'budded-variety', message: 'Budded on 2025-08-21 with Yarlington Mill, not Dabinett' },
    ])
    expect((await nursery.get('/api/nursery/runs?hasWarnings=true&limit=200')).body.items.some((r: { id: number }) => r.id === id)).toBe(true)
    expect((await nursery.get('/api/nursery/runs?hasWarnings=false&limit=200')).body.items.some((r: { id: number }) => r.id === id)).toBe(false)
  })

  it('warns when the run is not what its contract orders', async () => {
    const nursery = await as('growerOwner')
    const contractId = await treeContract('propagating')
    const created = await nursery.post('/api/nursery/runs', runBody(await row(), { treeContractId: contractId, varietyId: ids.kingstonBlack, rootstockId: ids.m9 }))
    expect(created.status).toBe(201)
    expect(created.body.warnings).toEqual([
      { code: 'contract-variety', message: `Contract ${contractId} is for Dabinett; this run is meant for Kingston Black` },
      { code: 'contract-rootstock', message: `Contract ${contractId} is for trees on MM.106; this run is on M.9` },
    ])
    const corrected = await nursery.patch(`/api/nursery/runs/${created.body.id}`, { varietyId: ids.dabinett, rootstockId: ids.mm106 })
    expect(corrected.body.warnings).toEqual([])
  })
})

describe('tags', () => {
  it('gives the tag, finds the run by it, records printing only when asked, and warns of a stale tag', async () => {
    const nursery = await as('growerOwner')
    const created = await nursery.post('/api/nursery/runs', runBody(await row()))
    const id = created.body.id as number
    const code = created.body.tagCode as string

    const tag = await nursery.get(`/api/nursery/runs/${id}/tag`)
    expect(tag.status).toBe(200)
    expect(tag.body.code).toBe(code)
    expect(tag.body.url).toMatch(new RegExp(`^https?://[^/]+/nursery/t/${code}$`))
    expect(tag.body.qrSvg).toMatch(/^<svg[^>]*xmlns="http:\/\/www\.w3\.org\/2000\/svg"/)
    // Reading the tag is not printing it.
    expect((await nursery.get(`/api/nursery/runs/${id}`)).body.tagPrintedAt).toBeNull()

    // Typed from a label: lower case, in two groups.
    const typed = `${code.slice(0, 5)}-${code.slice(5)}`.toLowerCase()
    const found = await nursery.get(`/api/nursery/runs/by-tag/${typed}`)
    expect(found.status).toBe(200)
    expect(found.body.id).toBe(id)
    expect((await nursery.get('/api/nursery/runs/by-tag/not-a-code')).status).toBe(400)
    const theirs = await db('nursery_runs').where({ id: await run({ org: 'tansyRow' }) }).first('tag_code')
    expect((await nursery.get(`/api/nursery/runs/by-tag/${theirs.tag_code}`)).status).toBe(404)

    const printed = await nursery.post('/api/nursery/tags/printed', { runIds: [id, id] })
    expect(printed.status).toBe(200)
    expect(printed.body.total).toBe(1)
    expect(printed.body.items[0]).toMatchObject({ id, warnings: [] })
    expect(Date.parse(printed.body.items[0].tagPrintedAt)).toBeGreaterThan(Date.now() - 60_000)

    // The variety corrected after printing: the label on the row is wrong until printed again.
    const changed = await nursery.patch(`/api/nursery/runs/${id}`, { varietyId: ids.kingstonBlack })
    expect(changed.body.varietyName).toBe('Kingston Black')
    expect(changed.body.warnings.map((w: { code: string }) => w.code)).toEqual(['stale-tag'])
    expect(changed.body.warnings[0].message).toMatch(/^The tag was printed on \d{4}-\d{2}-\d{2}, before the variety or rootstock changed on \d{4}-\d{2}-\d{2}: print it again$/)
    // Notes are not who the tree is: they leave the tag good.
    const reprinted = await nursery.post('/api/nursery/tags/printed', { runIds: [id] })
    expect(reprinted.body.items[0].warnings).toEqual([])
    expect((await nursery.patch(`/api/nursery/runs/${id}`, { notes: 'Check the far end' })).body.warnings).toEqual([])
  })

  it('marks nothing printed when one of the runs is not the nursery\'s own', async () => {
    const nursery = await as('growerOwner')
    const own = await run()
    const theirs = await run({ org: 'tansyRow' })
    const refused = await nursery.post('/api/nursery/tags/printed', { runIds: [own, theirs] })
    expect(refused.status).toBe(404)
    expect((await db('nursery_runs').where({ id: own }).first('tag_printed_at')).tag_printed_at).toBeNull()
    expect((await nursery.post('/api/nursery/tags/printed', { runIds: [] })).body.data.issues[0].path).toBe('runIds')
  })
})

describe('the list and another tenant\'s runs', () => {
  it('filters by row, variety and rootstock, in order along the row', async () => {
    const nursery = await as('growerOwner')
    const rowId = await row({ positions: 300 })
    await nursery.post('/api/nursery/runs', runBody(rowId, { fromPosition: 201, toPosition: 300 }))
    await nursery.post('/api/nursery/runs', runBody(rowId, { fromPosition: 1, toPosition: 100, varietyId: ids.kingstonBlack }))
    const inRow = await nursery.get(`/api/nursery/runs?rowId=${rowId}`)
    expect(inRow.body.total).toBe(2)
    expect(inRow.body.items.map((r: { fromPosition: number }) => r.fromPosition)).toEqual([1, 201])
    const kb = await nursery.get(`/api/nursery/runs?rowId=${rowId}&varietyId=${ids.kingstonBlack}&rootstockId=${ids.mm106}`)
    expect(kb.body.items.map((r: { varietyName: string }) => r.varietyName)).toEqual(['Kingston Black'])
    const page = await nursery.get(`/api/nursery/runs?rowId=${rowId}&limit=1&offset=1`)
    expect(page.body).toMatchObject({ total: 2, items: [{ fromPosition: 201 }] })
  })

  it('answers 404 for another organisation\'s run, row and events', async () => {
    const nursery = await as('growerOwner')
    const theirs = await run({ org: 'tansyRow' })
    expect((await nursery.get(`/api/nursery/runs/${theirs}`)).status).toBe(404)
    expect((await nursery.patch(`/api/nursery/runs/${theirs}`, { notes: 'x' })).status).toBe(404)
    expect((await nursery.get(`/api/nursery/runs/${theirs}/events`)).status).toBe(404)
    expect((await nursery.post(`/api/nursery/runs/${theirs}/events`, { kind: 'staked', happenedOn: '2025-06-01' })).status).toBe(404)
    expect((await nursery.get(`/api/nursery/runs/${theirs}/tag`)).status).toBe(404)
    expect(((await nursery.get('/api/nursery/runs?limit=200')).body.items as { id: number }[]).some(r => r.id === theirs)).toBe(false)
    expect(await db('propagation_events').where({ run_id: theirs }).count({ n: '*' })).toEqual([{ n: 1 }])
  })

  it('lets a viewer of the nursery read the map but write nothing', async () => {
    const email = uniqueEmail('nursery-viewer')
    await db('users').insert({ email, name: 'Nursery Viewer', org_id: ids.hollowmere, role: 'viewer', units: 'metric', password_hash: await hashPassword(DEMO_PASSWORD), email_verified_at: new Date() })
    try {
      const viewer = new ApiClient()
      await viewer.signIn(email, DEMO_PASSWORD)
      expect(viewer.hasSession()).toBe(true)
      const id = await run()
      expect((await viewer.get(`/api/nursery/runs/${id}`)).status).toBe(200)
      expect((await viewer.get(`/api/nursery/runs/${id}/tag`)).status).toBe(200)
      expect((await viewer.post(`/api/nursery/runs/${id}/events`, { kind: 'staked', happenedOn: '2025-06-01' })).status).toBe(403)
      expect((await viewer.patch(`/api/nursery/runs/${id}`, { notes: 'x' })).status).toBe(403)
      expect((await viewer.post('/api/nursery/tags/printed', { runIds: [id] })).status).toBe(403)
    }
    finally {
      await db('users').where({ email }).delete()
    }
  })
})
