import { beforeAll, describe, expect, it } from 'vitest'
import { orgId, userId } from '../support/contracts'
import { testDb } from '../support/db'
import { deliveryFixtures } from '../support/deliveries'
import { as } from '../support/http'

// Deliveries at the press, recorded by Quillhurst against fruit contracts of this file's own with
// Hollowmere (whose settings charge 20 % tax on sales) and Tansy Row (0 %). Unless a test says
// otherwise a contract is the fixtures' default: bittersharp apples of 2026, 100 t within 10 %,
// £210.00 a tonne at a 12.0 °Brix baseline, +£8.00 a tonne per °Brix above and −£12.00 below,
// rejected under 9.5 °Brix, at most 5 % rot and 10 % damage. Every sum below is worked by hand
// from those terms in the comment beside it.
const db = testDb()
const MARK = 'T-DLV-'
const { contract, lot, testedLot, reading, record } = deliveryFixtures(MARK)

const issuePaths = (body: { data?: { issues?: { path: string }[] } }) => (body.data?.issues ?? []).map(i => i.path)

let hollowmereContract: number
let tansyRowContract: number

beforeAll(async () => {
  // The demo's tax rates the sums below rest on.
  expect(Number((await db('organisations').where({ id: await orgId('hollowmere') }).first('tax_rate_pct')).tax_rate_pct)).toBe(20)
  expect(Number((await db('organisations').where({ id: await orgId('tansyRow') }).first('tax_rate_pct')).tax_rate_pct)).toBe(0)
  hollowmereContract = await contract({ grower: 'hollowmere' })
  tansyRowContract = await contract()
})

describe('recording a delivery, with its settlement', () => {
  it('pays a load above the baseline its bonus, with the grower\'s tax, and keeps the weigh ticket and the reading', async () => {
    const maker = await as('makerOwner')
    const lotId = await testedLot('hollowmere', 'Kingston Black', 12.8)
    const res = await record(maker, { fruitContractId: hollowmereContract, lotId, ticketNo: 'WT-0412', grossKg: 9_650, tareKg: 1_200, netKg: 8_450 })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    // 8,450 kg at 12.8 °Bx: £210.00 + 0.8 × £8.00 = £216.40 a tonne; 8.45 t × 21,640 p = 182,858 p;
    // tax 20 % = 36,571.6 p → 36,572 p; 219,430 p in all.
    expect(res.body).toMatchObject({
      fruitContractId: hollowmereContract, lotId, state: 'recorded', version: 1, deliveredOn: '2026-10-20', ticketNo: 'WT-0412',
      grossKg: 9_650, tareKg: 1_200, netKg: 8_450, readingBrix: 12.8, readingSampledOn: '2026-10-02', harvestYear: 2026,
      varietyName: 'Kingston Black', growerOrgName: 'Hollowmere Orchard & Nursery', makerOrgName: 'Quillhurst Cider Works',
      currency: 'GBP', amountMinor: 182_858, taxRatePct: 20, taxMinor: 36_572, totalMinor: 219_430, excessKg: 0, excessDecision: null,
      side: 'maker', moves: ['edit', 'settle', 'dispute'], disputedBy: null, settledAt: null, paidAt: null,
    })
    expect(res.body.settlement).toMatchObject({ netKg: 8_450, paidKg: 8_450, brixPaid: 12.8, brixDifference: 0.8, pricePerTonneMinor: 21_640, totalMinor: 182_858, rejected: false, rejectedBecause: [] })
    expect(res.body.history).toMatchObject([{ action: 'recorded', version: 1, byName: 'Olu Brandt', byOrgName: 'Quillhurst Cider Works', changes: [] }])
    // 8.45 t of the 100 t contracted, whose band is 90–110 t: 81.55 t still short.
    expect(res.body.year).toMatchObject({ harvestYear: 2026, contractedTonnes: 100, lowestTonnes: 90, highestTonnes: 110, deliveredTonnes: 8.45, shortfallTonnes: 81.55, excessTonnes: 0 })
    // The columns statements read straight from the table.
    const row = await db('deliveries').where({ id: res.body.id }).first()
    expect(row).toMatchObject({ amount_minor: 182_858, tax_minor: 36_572, total_minor: 219_430, currency: 'GBP', state: 'recorded', reading_sampled_on: '2026-10-02' })
    expect(Number(row.tax_rate_pct)).toBe(20)
    expect(Number(row.reading_brix)).toBe(12.8)
    expect(typeof row.settlement === 'string' ? JSON.parse(row.settlement) : row.settlement).toMatchObject({ paidKg: 8_450, totalMinor: 182_858 })
  })

  it('takes the deduction from a load below the baseline', async () => {
    const lotId = await testedLot('hollowmere', 'Kingston Black', 11.25)
    const res = await record(await as('makerOwner'), { fruitContractId: hollowmereContract, lotId, netKg: 6_000 })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    // 11.25 °Bx is paid on 11.3: 0.7 below; £210.00 − 0.7 × £12.00 = £201.60 a tonne;
    // 6 t × 20,160 p = 120,960 p; tax 20 % = 24,192 p; 145,152 p in all.
    expect(res.body).toMatchObject({ amountMinor: 120_960, taxMinor: 24_192, totalMinor: 145_152 })
    expect(res.body.settlement).toMatchObject({ brixPaid: 11.3, brixDifference: -0.7, pricePerTonneMinor: 20_160, rejected: false })
  })

  it('records a load under the reject floor and pays nothing for it, saying why', async () => {
    const lotId = await testedLot('hollowmere', 'Kingston Black', 9.4)
    const res = await record(await as('makerOwner'), { fruitContractId: hollowmereContract, lotId, netKg: 4_000 })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body).toMatchObject({ amountMinor: 0, taxMinor: 0, totalMinor: 0 })
    expect(res.body.settlement).toMatchObject({ rejected: true, rejectReasons: ['below-floor'], rejectedBecause: ['9.4 °Brix is under the contract\'s reject floor of 9.5 °Brix'] })
  })

  it('records a load refused for its quality with the reason, and pays nothing whatever its sugar', async () => {
    const lotId = await testedLot('hollowmere', 'Kingston Black', 13.0)
    const res = await record(await as('makerOwner'), { fruitContractId: hollowmereContract, lotId, netKg: 3_000, rotPct: 2, qualityRejectReason: 'Bins full of leaves and stones' })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body).toMatchObject({ qualityRejectReason: 'Bins full of leaves and stones', rotPct: 2, amountMinor: 0, totalMinor: 0 })
    expect(res.body.settlement).toMatchObject({ rejected: true, qualityRejectReason: 'Bins full of leaves and stones', rejectedBecause: ['Refused for quality: Bins full of leaves and stones'] })
    // Rot over the contract's 5 % refuses a load too.
    const rotten = await record(await as('makerOwner'), { fruitContractId: hollowmereContract, lotId, netKg: 1_000, rotPct: 7.5 })
    expect(rotten.body.settlement.rejectedBecause).toEqual(['7.5 % rot is over the contract\'s limit of 5 %'])
  })

  it('adds no tax for a grower whose settings charge none', async () => {
    const lotId = await testedLot('tansyRow', 'Kingston Black', 12.0)
    const res = await record(await as('makerOwner'), { fruitContractId: tansyRowContract, lotId, netKg: 5_000 })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    // 5 t × 21,000 p = 105,000 p at the baseline, 0 % tax.
    expect(res.body).toMatchObject({ amountMinor: 105_000, taxRatePct: 0, taxMinor: 0, totalMinor: 105_000, growerOrgName: 'Tansy Row Fruit' })
  })
})

describe('the weigh ticket and the other figures', () => {
  it.each([
    [{ grossKg: 9_650, tareKg: 1_200, netKg: 8_400 }, 'netKg'],
    [{ tareKg: 1_200, netKg: 8_450 }, 'grossKg'],
    [{ grossKg: 1_200, tareKg: 1_200, netKg: 100 }, 'tareKg'],
    [{ grossKg: 1_000, tareKg: 1_500, netKg: 100 }, 'tareKg'],
    [{ netKg: 100.25 }, 'netKg'],
    [{ netKg: 0 }, 'netKg'],
    [{ netKg: undefined }, 'netKg'],
    [{ netKg: 'lots' }, 'netKg'],
    [{ deliveredOn: '2999-01-01' }, 'deliveredOn'],
    [{ deliveredOn: '2026-02-30' }, 'deliveredOn'],
    [{ deliveredOn: '2026-09-15' }, 'deliveredOn'],
    [{ rotPct: 101 }, 'rotPct'],
    [{ damagePct: -1 }, 'damagePct'],
    [{ readingId: 0 }, 'readingId'],
    [{ ticketNo: 'x'.repeat(41) }, 'ticketNo'],
    [{ colour: 'red' }, 'colour'],
  ])('refuses %j naming %s, and records nothing', async (change, field) => {
    const lotId = await testedLot('tansyRow', 'Kingston Black', 12.0)
    const res = await record(await as('makerOwner'), { fruitContractId: tansyRowContract, lotId, netKg: 500, ...change })
    expect(res.status, JSON.stringify(res.body)).toBe(400)
    expect(issuePaths(res.body)).toContain(field)
    expect(await db('deliveries').where({ lot_id: lotId }).count({ n: '*' })).toEqual([{ n: 0 }])
  })

  it('takes gross less tare to 0.1 kg', async () => {
    const lotId = await testedLot('tansyRow', 'Kingston Black', 12.0)
    const res = await record(await as('makerOwner'), { fruitContractId: tansyRowContract, lotId, grossKg: 1_000.3, tareKg: 200.1, netKg: 800.2 })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body).toMatchObject({ grossKg: 1_000.3, tareKg: 200.1, netKg: 800.2 })
  })
})

describe('which contracts and lots a delivery may be recorded against', () => {
  it('refuses a lot of another grower without saying more about it', async () => {
    const lotId = await testedLot('hollowmere', 'Kingston Black', 12.0)
    const res = await record(await as('makerOwner'), { fruitContractId: tansyRowContract, lotId, netKg: 500 })
    expect(res.status).toBe(400)
    expect(issuePaths(res.body)).toEqual(['lotId'])
    expect(res.body.data.issues[0].message).toBe('That is not a lot of this contract\'s grower (Tansy Row Fruit)')
    const none = await record(await as('makerOwner'), { fruitContractId: tansyRowContract, lotId: 99_999_999, netKg: 500 })
    expect(none.body.data.issues).toEqual(res.body.data.issues)
  })

  it('refuses the grower\'s lot of a year the contract does not cover, or of other fruit, naming lotId', async () => {
    const maker = await as('makerOwner')
    const lastYear = await lot('tansyRow', 'Kingston Black', 1_000, '2025-10-01')
    await reading(lastYear, { brix: 12, sampled_on: '2025-10-02' })
    const old = await record(maker, { fruitContractId: tansyRowContract, lotId: lastYear, netKg: 500 })
    expect(old.status).toBe(400)
    expect(issuePaths(old.body)).toEqual(['lotId'])
    expect(old.body.data.issues[0].message).toContain('was harvested in 2025; the contract covers the 2026 harvest')
    // Dabinett is a bittersweet, not the contract's bittersharp apples.
    const bittersweet = await testedLot('tansyRow', 'Dabinett', 12.0)
    const other = await record(maker, { fruitContractId: tansyRowContract, lotId: bittersweet, netKg: 500 })
    expect(other.status).toBe(400)
    expect(issuePaths(other.body)).toEqual(['lotId'])
    expect(other.body.data.issues[0].message).toContain('is Dabinett, which is not the contract\'s fruit (bittersharp apples)')
  })

  it('holds a contract for one variety to that variety', async () => {
    const kingstonBlack = await contract({ columns: { variety_id: (await db('varieties').where({ name: 'Kingston Black' }).first('id')).id, juice_class: null, species: null } })
    const maker = await as('makerOwner')
    // Foxwhelp is a bittersharp too, but not the variety this contract buys.
    const foxwhelp = await record(maker, { fruitContractId: kingstonBlack, lotId: await testedLot('tansyRow', 'Foxwhelp', 12.0), netKg: 500 })
    expect(foxwhelp.status).toBe(400)
    expect(issuePaths(foxwhelp.body)).toEqual(['lotId'])
    expect((await record(maker, { fruitContractId: kingstonBlack, lotId: await testedLot('tansyRow', 'Kingston Black', 12.0), netKg: 500 })).status).toBe(201)
  })

  it('takes deliveries against an accepted or fulfilled contract only (409 naming its state), and only the maker\'s own (404)', async () => {
    const maker = await as('makerOwner')
    const lotId = await testedLot('tansyRow', 'Kingston Black', 12.0)
    for (const state of ['offered', 'cancelled', 'draft']) {
      const res = await record(maker, { fruitContractId: await contract({ state }), lotId, netKg: 100 })
      expect(res.status, state).toBe(409)
      expect(res.body.data.state).toBe(state)
    }
    expect((await record(maker, { fruitContractId: await contract({ state: 'fulfilled' }), lotId, netKg: 100 })).status).toBe(201)
    const marrowbys = await contract({ maker: 'marrowby' })
    const theirs = await record(maker, { fruitContractId: marrowbys, lotId, netKg: 100 })
    expect(theirs.status).toBe(404)
    expect(issuePaths(theirs.body)).toEqual(['fruitContractId'])
    expect((await record(maker, { fruitContractId: 99_999_999, lotId, netKg: 100 })).status).toBe(404)
  })
})

describe('a lot is never delivered beyond its net kg', () => {
  it('refuses a load larger than what is left, naming netKg, and marks the lot delivered once it all is', async () => {
    const maker = await as('makerOwner')
    const lotId = await testedLot('tansyRow', 'Kingston Black', 12.0, 5_000)
    const first = await record(maker, { fruitContractId: tansyRowContract, lotId, netKg: 3_000 })
    expect(first.status).toBe(201)
    const over = await record(maker, { fruitContractId: tansyRowContract, lotId, netKg: 2_500 })
    expect(over.status).toBe(400)
    expect(issuePaths(over.body)).toEqual(['netKg'])
    expect(over.body.data.issues[0].message).toContain('2,000 kg left to deliver of its 5,000 kg')
    expect((await (await as('grower2Owner')).get(`/api/lots/${lotId}`)).body.state).toBe('available')
    const rest = await record(maker, { fruitContractId: tansyRowContract, lotId, netKg: 2_000 })
    expect(rest.status).toBe(201)
    expect((await (await as('grower2Owner')).get(`/api/lots/${lotId}`)).body.state).toBe('delivered')
    // A correction is held to the lot too, and one that gives kilograms back makes it available again.
    const tooMuch = await maker.patch(`/api/deliveries/${first.body.id}`, { netKg: 3_500 })
    expect(tooMuch.status).toBe(400)
    expect(issuePaths(tooMuch.body)).toEqual(['netKg'])
    expect((await maker.patch(`/api/deliveries/${first.body.id}`, { netKg: 2_500 })).status).toBe(200)
    expect((await db('harvest_lots').where({ id: lotId }).first('state')).state).toBe('available')
  })

  it('keeps the grower from weighing a lot below what has been delivered of it, naming netKg', async () => {
    const maker = await as('makerOwner')
    const grower = await as('grower2Owner')
    const lotId = await testedLot('tansyRow', 'Kingston Black', 12.0, 4_000)
    expect((await record(maker, { fruitContractId: tansyRowContract, lotId, netKg: 3_000 })).status).toBe(201)
    const under = await grower.patch(`/api/lots/${lotId}`, { netKg: 2_999.9 })
    expect(under.status).toBe(400)
    expect(issuePaths(under.body)).toEqual(['netKg'])
    expect(under.body.data.issues[0].message).toContain('3,000 kg of this lot have been delivered')
    expect(Number((await db('harvest_lots').where({ id: lotId }).first('net_kg')).net_kg)).toBe(4_000)
    // Down to exactly what was delivered: the lot is all delivered; more again: it is available.
    expect((await grower.patch(`/api/lots/${lotId}`, { netKg: 3_000 })).status).toBe(200)
    expect((await grower.get(`/api/lots/${lotId}`)).body).toMatchObject({ netKg: 3_000, state: 'delivered' })
    expect((await grower.patch(`/api/lots/${lotId}`, { netKg: 3_200 })).status).toBe(200)
    expect((await grower.get(`/api/lots/${lotId}`)).body).toMatchObject({ netKg: 3_200, state: 'available' })
  })

  it('lets one of twenty loads posted at once of most of a lot through, and refuses the rest', async () => {
    const maker = await as('makerOwner')
    const lotId = await testedLot('tansyRow', 'Kingston Black', 12.0, 1_000)
    const answers = await Promise.all(Array.from({ length: 20 }, () => record(maker, { fruitContractId: tansyRowContract, lotId, netKg: 600 })))
    const statuses = answers.map(a => a.status)
    expect(statuses.filter(s => s === 201), JSON.stringify(answers.filter(a => a.status !== 201 && a.status !== 400).map(a => a.body))).toHaveLength(1)
    expect(statuses.filter(s => s === 400)).toHaveLength(19)
    for (const refused of answers.filter(a => a.status === 400)) expect(issuePaths(refused.body)).toEqual(['netKg'])
    const [sum] = await db('deliveries').where({ lot_id: lotId }).sum({ kg: 'net_kg' })
    expect(Number(sum?.kg)).toBe(600)
  })
})

describe('the reading paid on', () => {
  it('is the one chosen, or else the lot\'s latest with a °Brix or SG; none at all is refused', async () => {
    const maker = await as('makerOwner')
    const lotId = await lot('tansyRow', 'Kingston Black', 10_000)
    const noReading = await record(maker, { fruitContractId: tansyRowContract, lotId, netKg: 100 })
    expect(noReading.status).toBe(400)
    expect(issuePaths(noReading.body)).toEqual(['readingId'])
    expect(noReading.body.data.issues[0].message).toContain('test the lot first')

    const early = await reading(lotId, { sampled_on: '2026-10-01', brix: 11.0 })
    await reading(lotId, { sampled_on: '2026-10-05', brix: 12.5 })
    // Entered after the one above on the same day: the latest. Its SG gives the °Brix: SG 1.040 is
    // 9.99 °Bx (Wikipedia "Brix": 9.99325 °Bx from the NBS-table polynomial).
    const bySg = await reading(lotId, { sampled_on: '2026-10-05', sg: 1.04 })
    // A later reading without sugar is not one to pay on.
    const acidOnly = await reading(lotId, { sampled_on: '2026-10-07', ph: 3.4 })

    const latest = await record(maker, { fruitContractId: tansyRowContract, lotId, netKg: 100 })
    expect(latest.status, JSON.stringify(latest.body)).toBe(201)
    expect(latest.body).toMatchObject({ readingId: bySg, readingBrix: 9.99, readingSampledOn: '2026-10-05' })
    expect(latest.body.settlement.brixPaid).toBe(10)

    const chosen = await record(maker, { fruitContractId: tansyRowContract, lotId, netKg: 100, readingId: early })
    expect(chosen.body).toMatchObject({ readingId: early, readingBrix: 11, readingSampledOn: '2026-10-01' })

    const noSugar = await record(maker, { fruitContractId: tansyRowContract, lotId, netKg: 100, readingId: acidOnly })
    expect(noSugar.status).toBe(400)
    expect(issuePaths(noSugar.body)).toEqual(['readingId'])
    const otherLot = await reading(await lot('tansyRow', 'Kingston Black'), { brix: 12 })
    const notOfLot = await record(maker, { fruitContractId: tansyRowContract, lotId, netKg: 100, readingId: otherLot })
    expect(notOfLot.status).toBe(400)
    expect(issuePaths(notOfLot.body)).toEqual(['readingId'])
  })
})

describe('disputes, corrections and settling', () => {
  it('a grower\'s dispute is answered by the maker\'s correction, a new version with its changes, and then settled', async () => {
    const maker = await as('makerOwner')
    const grower = await as('growerOwner')
    const { body: recorded } = await record(maker, { fruitContractId: hollowmereContract, lotId: await testedLot('hollowmere', 'Kingston Black', 12.0), netKg: 5_000 })
    // 5 t × 21,000 p = 105,000 p; tax 20 % = 21,000 p; 126,000 p in all.
    expect(recorded).toMatchObject({ amountMinor: 105_000, totalMinor: 126_000 })
    const path = `/api/deliveries/${recorded.id}`

    const noReason = await grower.post(`${path}/dispute`, { reason: '  ' })
    expect(noReason.status).toBe(400)
    expect(issuePaths(noReason.body)).toEqual(['reason'])
    const disputed = await grower.post(`${path}/dispute`, { reason: 'Our copy of the ticket says 5,400 kg net' })
    expect(disputed.status, JSON.stringify(disputed.body)).toBe(200)
    expect(disputed.body).toMatchObject({ state: 'disputed', disputedBy: 'grower', disputeReason: 'Our copy of the ticket says 5,400 kg net', side: 'grower', moves: ['withdraw-dispute'] })

    const settleNow = await maker.post(`${path}/settle`, {})
    expect(settleNow.status).toBe(409)
    expect(settleNow.body.data.state).toBe('disputed')
    expect((await grower.patch(path, { netKg: 5_400 })).status).toBe(403)

    const corrected = await maker.patch(path, { netKg: 5_400, ticketNo: 'WT-0533' })
    expect(corrected.status, JSON.stringify(corrected.body)).toBe(200)
    // 5.4 t × 21,000 p = 113,400 p; tax 20 % = 22,680 p; 136,080 p in all.
    expect(corrected.body).toMatchObject({ state: 'recorded', version: 2, disputedBy: null, disputeReason: null, netKg: 5_400, ticketNo: 'WT-0533', amountMinor: 113_400, taxMinor: 22_680, totalMinor: 136_080 })
    expect(corrected.body.settlement).toMatchObject({ netKg: 5_400, paidKg: 5_400, totalMinor: 113_400 })
    expect(corrected.body.history.map((e: { action: string, version: number }) => `${e.action} v${e.version}`)).toEqual(['recorded v1', 'disputed v1', 'corrected v2'])
    expect(corrected.body.history[1]).toMatchObject({ byName: 'Ines Varga', byOrgName: 'Hollowmere Orchard & Nursery', reason: 'Our copy of the ticket says 5,400 kg net' })
    expect(corrected.body.history[2].changes).toEqual([
      { field: 'ticketNo', from: null, to: 'WT-0533' },
      { field: 'netKg', from: 5_000, to: 5_400 },
      { field: 'totalMinor', from: 126_000, to: 136_080 },
    ])
    const same = await maker.patch(path, { netKg: 5_400 })
    expect(same.status).toBe(400)
    expect(issuePaths(same.body)).toEqual(['netKg'])
    const badTicket = await maker.patch(path, { grossKg: 6_000, tareKg: 500 })
    expect(badTicket.status).toBe(400)
    expect(issuePaths(badTicket.body)).toEqual(['netKg'])

    const settled = await maker.post(`${path}/settle`, {})
    expect(settled.status, JSON.stringify(settled.body)).toBe(200)
    expect(settled.body).toMatchObject({ state: 'settled', version: 2, excessDecision: null, totalMinor: 136_080, moves: ['dispute'] })
    expect(settled.body.settledAt).toMatch(/^\d{4}-\d{2}-\d{2}T/)
    expect(settled.body.history.at(-1)).toMatchObject({ action: 'settled', byName: 'Olu Brandt' })
    const again = await maker.patch(path, { netKg: 5_300 })
    expect(again.status).toBe(409)
    expect(again.body.data.state).toBe('settled')
    expect((await maker.post(`${path}/settle`, {})).status).toBe(409)
  })

  it('a dispute is withdrawn by the side that raised it, never by the other', async () => {
    const maker = await as('makerOwner')
    const grower = await as('growerMember')
    const { body } = await record(maker, { fruitContractId: hollowmereContract, lotId: await testedLot('hollowmere', 'Kingston Black', 12.0), netKg: 1_000 })
    const path = `/api/deliveries/${body.id}`
    expect((await grower.post(`${path}/withdraw-dispute`, {})).status).toBe(409)
    expect((await grower.post(`${path}/dispute`, { reason: 'Two bins were left off the ticket' })).status).toBe(200)
    const notTheirs = await maker.post(`${path}/withdraw-dispute`, {})
    expect(notTheirs.status).toBe(403)
    expect(notTheirs.body.message).toBe('The grower disputed this delivery, so only the grower can withdraw the dispute.')
    const withdrawn = await grower.post(`${path}/withdraw-dispute`, { reason: 'Found them on the next ticket' })
    expect(withdrawn.status, JSON.stringify(withdrawn.body)).toBe(200)
    expect(withdrawn.body).toMatchObject({ state: 'recorded', version: 1, disputedBy: null, disputeReason: null, totalMinor: 25_200 })
    expect(withdrawn.body.history.map((e: { action: string }) => e.action)).toEqual(['recorded', 'disputed', 'dispute-withdrawn'])
    expect(withdrawn.body.history[2]).toMatchObject({ byName: 'Tomas Reyne', reason: 'Found them on the next ticket' })
    // The maker may dispute its own settled load too, and withdraw that.
    expect((await maker.post(`${path}/settle`, {})).status).toBe(200)
    expect((await maker.post(`${path}/dispute`, { reason: 'Weighbridge found out of calibration' })).body).toMatchObject({ state: 'disputed', disputedBy: 'maker' })
    expect((await grower.post(`${path}/withdraw-dispute`, {})).status).toBe(403)
    expect((await maker.post(`${path}/withdraw-dispute`, {})).body.state).toBe('recorded')
  })

  it('a viewer reads a delivery and makes no move', async () => {
    const { body } = await record(await as('makerOwner'), { fruitContractId: tansyRowContract, lotId: await testedLot('tansyRow', 'Kingston Black', 12.0), netKg: 700 })
    const viewer = await as('makerViewer')
    const read = await viewer.get(`/api/deliveries/${body.id}`)
    expect(read.status).toBe(200)
    expect(read.body).toMatchObject({ side: 'maker', moves: [] })
    expect((await viewer.post(`/api/deliveries/${body.id}/dispute`, { reason: 'no' })).status).toBe(403)
    expect((await viewer.post(`/api/deliveries/${body.id}/settle`, {})).status).toBe(403)
    expect((await (await as('grower2Owner')).get(`/api/deliveries/${body.id}`)).body).toMatchObject({ side: 'grower', moves: ['dispute'] })
  })
})

describe('tonnes past the contract year\'s tolerance', () => {
  it('counts each load\'s excess in the order delivered, needs the maker\'s decision to settle it, and pays no refused kilogram', async () => {
    // 10 t within 10 %: the band is 9,000–11,000 kg.
    const contractId = await contract({ grower: 'hollowmere', years: { 2026: 10 } })
    const maker = await as('makerOwner')
    const [lot1, lot2, lot3] = await Promise.all([1, 2, 3].map(() => testedLot('hollowmere', 'Kingston Black', 12.0, 6_000)))
    const get = async (id: number) => (await maker.get(`/api/deliveries/${id}`)).body
    const d1 = (await record(maker, { fruitContractId: contractId, lotId: lot1, netKg: 6_000, deliveredOn: '2026-10-10' })).body.id
    const d2 = (await record(maker, { fruitContractId: contractId, lotId: lot2, netKg: 6_000, deliveredOn: '2026-10-11' })).body.id
    // 6,000 + 6,000 − 11,000 = 1,000 kg of the second load is past the top.
    expect((await get(d1)).excessKg).toBe(0)
    const second = await get(d2)
    expect(second).toMatchObject({ excessKg: 1_000, excessDecision: null, amountMinor: 126_000 })
    expect(second.year).toMatchObject({ contractedTonnes: 10, highestTonnes: 11, deliveredTonnes: 12, excessTonnes: 1 })

    // Correcting the first load to 5,500 kg leaves 500 kg of the second past the top.
    expect((await maker.patch(`/api/deliveries/${d1}`, { netKg: 5_500 })).status).toBe(200)
    expect((await get(d2)).excessKg).toBe(500)
    // A load delivered before both comes first: 1,000 + 5,500 + 6,000 − 11,000 = 1,500 kg of the last.
    const d3 = (await record(maker, { fruitContractId: contractId, lotId: lot3, netKg: 1_000, deliveredOn: '2026-10-09' })).body.id
    expect([(await get(d3)).excessKg, (await get(d1)).excessKg, (await get(d2)).excessKg]).toEqual([0, 0, 1_500])

    const undecided = await maker.post(`/api/deliveries/${d2}/settle`, {})
    expect(undecided.status).toBe(400)
    expect(issuePaths(undecided.body)).toEqual(['excess'])
    expect(issuePaths((await maker.post(`/api/deliveries/${d2}/settle`, { excess: 'sideways' })).body)).toEqual(['excess'])
    const refused = await maker.post(`/api/deliveries/${d2}/settle`, { excess: 'refuse' })
    expect(refused.status, JSON.stringify(refused.body)).toBe(200)
    // 6,000 kg less 1,500 kg refused: 4.5 t × 21,000 p = 94,500 p; tax 20 % = 18,900 p; 113,400 p in all.
    expect(refused.body).toMatchObject({ state: 'settled', excessDecision: 'refused', excessKg: 1_500, amountMinor: 94_500, taxMinor: 18_900, totalMinor: 113_400 })
    expect(refused.body.settlement).toMatchObject({ netKg: 6_000, paidKg: 4_500 })
    expect(await db('deliveries').where({ id: d2 }).first('excess_decision', 'amount_minor', 'total_minor')).toEqual({ excess_decision: 'refused', amount_minor: 94_500, total_minor: 113_400 })
    // The first load has no excess, so it settles without a decision: 5.5 t × 21,000 p = 115,500 p + 23,100 p tax.
    expect((await maker.post(`/api/deliveries/${d1}/settle`, {})).body).toMatchObject({ state: 'settled', excessDecision: null, totalMinor: 138_600 })

    // A settled load keeps what it was settled with: a load recorded later, though delivered earlier,
    // takes the rest of the year's excess with the open load after it. 14,500 kg is 3,500 kg past the
    // top; 1,500 kg of that was refused with the settled load, so the open loads carry 2,000 kg, the
    // latest delivered first: 1,000 kg of the 1,000 kg load of 9 October, 1,000 kg of this one.
    const d4 = (await record(maker, { fruitContractId: contractId, lotId: lot3, netKg: 2_000, deliveredOn: '2026-10-08' })).body.id
    expect([(await get(d4)).excessKg, (await get(d3)).excessKg, (await get(d2)).excessKg, (await get(d1)).excessKg]).toEqual([1_000, 1_000, 1_500, 0])
    expect((await get(d2)).totalMinor).toBe(113_400)
    const accepted = await maker.post(`/api/deliveries/${d4}/settle`, { excess: 'accept' })
    // Accepted, all 2,000 kg are paid: 2 t × 21,000 p = 42,000 p + 8,400 p tax.
    expect(accepted.body).toMatchObject({ excessDecision: 'accepted', amountMinor: 42_000, totalMinor: 50_400 })
  })

  it('never lets two loads recorded at once both fit under the top', async () => {
    const contractId = await contract({ years: { 2026: 10 } })
    const maker = await as('makerOwner')
    const lots = await Promise.all([1, 2].map(() => testedLot('tansyRow', 'Kingston Black', 12.0, 6_000)))
    const answers = await Promise.all(lots.map(lotId => record(maker, { fruitContractId: contractId, lotId, netKg: 6_000 })))
    expect(answers.map(a => a.status)).toEqual([201, 201])
    const stored = await db('deliveries').where({ fruit_contract_id: contractId }).select('excess_kg') as { excess_kg: number }[]
    // 12,000 kg against a top of 11,000 kg: 1,000 kg past it, on one load.
    expect(stored.map(r => Number(r.excess_kg)).sort((a, b) => a - b)).toEqual([0, 1_000])
  })
})

describe('telling the other side', () => {
  const noticesOf = async (id: number) => (await db('notices').where({ link: `/deliveries/${id}` }).orderBy('id').select('user_id', 'kind', 'subject')) as { user_id: number, kind: string, subject: string }[]

  it('tells the grower\'s owners and members of a delivery at once, and the maker of the grower\'s dispute', async () => {
    const maker = await as('makerOwner')
    const { body } = await record(maker, { fruitContractId: hollowmereContract, lotId: await testedLot('hollowmere', 'Kingston Black', 12.0), netKg: 2_000 })
    // Hollowmere's owners and members as they stand (other tests may have added people to it).
    const writers = (await db('users').where({ org_id: await orgId('hollowmere'), active: true }).whereIn('role', ['owner', 'member']).pluck('id') as number[]).sort((a, b) => a - b)
    expect(writers).toEqual(expect.arrayContaining([await userId('grower@demo.test'), await userId('grower-member@demo.test')]))
    const hollowmere = [await userId('grower@demo.test'), await userId('grower-member@demo.test')].sort()
    const recorded = await noticesOf(body.id)
    expect(recorded.map(n => n.user_id).sort((a, b) => a - b)).toEqual(writers)
    expect(recorded.map(n => n.kind)).toEqual(writers.map(() => 'delivery.recorded'))
    expect(recorded[0]!.subject).toContain('Quillhurst Cider Works recorded a delivery of lot T-DLV-')
    // E-mails wait in the outbox with the same news.
    expect(await db('notifications').where({ link: `/deliveries/${body.id}` }).count({ n: '*' })).toEqual([{ n: writers.length }])

    await (await as('growerMember')).post(`/api/deliveries/${body.id}/dispute`, { reason: 'Wrong lot on the ticket' })
    // Quillhurst's owners and members hear of it (as they stand: other tests add people); its viewer does not.
    const disputed = (await noticesOf(body.id)).filter(n => n.kind === 'delivery.disputed')
    const quillhurst = (await db('users').where({ org_id: await orgId('quillhurst'), active: true }).whereIn('role', ['owner', 'member']).pluck('id') as number[]).sort((a, b) => a - b)
    expect(quillhurst).toContain(await userId('maker@demo.test'))
    expect(quillhurst).not.toContain(await userId('viewer@demo.test'))
    expect(disputed.map(n => n.user_id).sort((a, b) => a - b)).toEqual(quillhurst)
    expect(disputed[0]!.subject).toContain('Hollowmere Orchard & Nursery disputed a delivery')

    await maker.patch(`/api/deliveries/${body.id}`, { notes: 'Lot checked against the bin tags' })
    await maker.post(`/api/deliveries/${body.id}/settle`, {})
    const told = (await noticesOf(body.id)).filter(n => n.user_id === hollowmere[0]).map(n => n.kind)
    expect(told).toEqual(['delivery.recorded', 'delivery.corrected', 'delivery.settled'])
  })
})

describe('reading deliveries', () => {
  it('lists a party\'s deliveries newest delivered first, filtered and paged; another tenant sees none of them', async () => {
    const contractId = await contract()
    const maker = await as('makerOwner')
    const lotId = await testedLot('tansyRow', 'Kingston Black', 12.0)
    const ids: number[] = []
    for (const deliveredOn of ['2026-10-12', '2026-10-14', '2026-10-13']) ids.push((await record(maker, { fruitContractId: contractId, lotId, netKg: 100, deliveredOn })).body.id)
    const list = await maker.get(`/api/deliveries?fruitContractId=${contractId}&limit=2`)
    expect(list.status).toBe(200)
    expect(list.body.total).toBe(3)
    expect(list.body.items.map((d: { id: number }) => d.id)).toEqual([ids[1], ids[2]])
    expect(list.body.items[0]).toMatchObject({ side: 'maker', lotId, deliveredOn: '2026-10-14' })
    expect((await maker.get(`/api/deliveries?fruitContractId=${contractId}&offset=2`)).body.items.map((d: { id: number }) => d.id)).toEqual([ids[0]])
    await maker.post(`/api/deliveries/${ids[0]}/settle`, {})
    expect((await maker.get(`/api/deliveries?lotId=${lotId}&state=settled`)).body).toMatchObject({ total: 1, items: [{ id: ids[0], state: 'settled' }] })
    expect((await maker.get(`/api/deliveries?fruitContractId=${contractId}&harvestYear=2025`)).body).toEqual({ items: [], total: 0 })
    const grower = await as('grower2Owner')
    const theirs = await grower.get(`/api/deliveries?fruitContractId=${contractId}&makerOrgId=${await orgId('quillhurst')}&growerOrgId=${await orgId('tansyRow')}`)
    expect(theirs.body.total).toBe(3)
    expect(theirs.body.items.every((d: { side: string }) => d.side === 'grower')).toBe(true)
    for (const outsider of ['maker2Owner', 'growerOwner'] as const) {
      const client = await as(outsider)
      expect((await client.get(`/api/deliveries?fruitContractId=${contractId}`)).body).toEqual({ items: [], total: 0 })
      expect((await client.get(`/api/deliveries/${ids[0]}`)).status).toBe(404)
    }
    const bad = await maker.get('/api/deliveries?state=eaten')
    expect(bad.status).toBe(400)
    expect(issuePaths(bad.body)).toEqual(['state'])
  })
})

describe('the lots a maker sees', () => {
  it('sees a lot delivered to it, whatever becomes of the contract', async () => {
    // 2025's fruit, which no other contract of Quillhurst's with Hollowmere covers.
    const contractId = await contract({ grower: 'hollowmere', years: { 2025: 100 } })
    const maker = await as('makerOwner')
    const [delivered, notDelivered] = await Promise.all([1, 2].map(async () => {
      const id = await lot('hollowmere', 'Kingston Black', 10_000, '2025-10-01')
      await reading(id, { brix: 12, sampled_on: '2025-10-02' })
      return id
    }))
    expect((await maker.get(`/api/lots/${notDelivered}`)).status).toBe(200)
    expect((await record(maker, { fruitContractId: contractId, lotId: delivered, netKg: 400, deliveredOn: '2025-10-20' })).status).toBe(201)
    // Once the contract no longer covers them, the lot it took stays the maker's to see; the other does not.
    await db('fruit_contracts').where({ id: contractId }).update({ state: 'cancelled' })
    const seen = await maker.get(`/api/lots/${delivered}`)
    expect(seen.status, JSON.stringify(seen.body)).toBe(200)
    expect(seen.body).toMatchObject({ id: delivered, orgName: 'Hollowmere Orchard & Nursery', latestReading: { brix: 12 } })
    expect((await maker.get(`/api/lots/${delivered}/readings`)).body.total).toBe(1)
    expect((await maker.get(`/api/lots/${notDelivered}`)).status).toBe(404)
    // Nobody else gains a view of it.
    expect((await (await as('maker2Owner')).get(`/api/lots/${delivered}`)).status).toBe(404)
    expect((await (await as('grower2Owner')).get(`/api/lots/${delivered}`)).status).toBe(404)
  })
})
