import { beforeAll, describe, expect, it } from 'vitest'
import type { Statement } from '../../shared/types/delivery'
import { FRUIT_CONTRACT } from '../../server/db/seeds/data/demoContracts'
import { testDb } from '../support/db'
import { as } from '../support/http'

// This season's deliveries of Tansy Row's bittersharp fruit to Quillhurst as the demo seeds them,
// read through the statements as each party sees them. The amounts are worked here by hand from the
// demo contract's terms: £210.00 a tonne at a 12.0 °Brix baseline, +£10.00 a tonne for each °Brix
// above, −£15.00 a tonne for each °Brix below, rejected under 9.5 °Brix; Tansy Row charges no tax.
const db = testDb()
let contractId: number

beforeAll(async () => {
  const row = await db('fruit_contracts').where({ notes: FRUIT_CONTRACT.terms.notes, state: 'accepted' }).orderBy('id').first('id')
  contractId = row.id
})

const season = async (caller: Parameters<typeof as>[0], query = '') => (await as(caller)).get(`/api/statements?season=2026&contractId=${contractId}${query}`)

describe('the demo\'s deliveries, Tansy Row → Quillhurst', () => {
  it('gives the 2026 season three deliveries: below the baseline, under the floor and above it', async () => {
    const res = await season('makerOwner')
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    const s = res.body as Statement
    expect(s).toMatchObject({ reference: `SB-${contractId}-2026`, kind: 'season', currency: 'GBP', contractDescription: 'bittersharp apples, harvests 2026–2030' })
    expect(s.buyer.name).toBe('Quillhurst Cider Works')
    expect(s.seller).toMatchObject({ name: 'Tansy Row Fruit', contactName: 'Priya Halloran', taxRatePct: 0 })
    expect(s.lines.map(l => [l.lotCode, l.deliveredOn, l.state])).toEqual([
      ['TR-26-003', '2026-10-02', 'paid'],
      ['TR-26-004', '2026-10-09', 'recorded'],
      ['TR-26-001', '2026-11-02', 'settled'],
    ])
    const [below, rejected, above] = s.lines
    // TR-26-003: 5,460 − 2,140 = 3,320 kg at 11.8 °Bx, 0.2 under: £210.00 − 0.2 × £15.00 = £207.00 a tonne;
    // 3.32 t × £207.00 = £687.24 (the base 3.32 × £210.00 = £697.20, less £9.96).
    expect(below).toMatchObject({ grossKg: 5_460, tareKg: 2_140, netKg: 3_320, brixPaid: 11.8, brixDifference: -0.2, pricePerTonneMinor: 20_700, baseAmountMinor: 69_720, sugarAdjustmentMinor: -996, amountMinor: 68_724, taxMinor: 0, totalMinor: 68_724 })
    // TR-26-004: 4,890 − 2,010 = 2,880 kg, re-tested at 9.3 °Bx on the day, under the 9.5 floor: nothing.
    expect(rejected).toMatchObject({ netKg: 2_880, readingBrix: 9.3, readingSampledOn: '2026-10-09', rejected: true, paidKg: 0, amountMinor: 0, totalMinor: 0 })
    expect(rejected!.rejectedBecause).toEqual(['9.3 °Brix is under the contract\'s reject floor of 9.5 °Brix'])
    // TR-26-001: 8,030 − 2,420 = 5,610 kg at 13.4 °Bx, 1.4 over: £210.00 + 1.4 × £10.00 = £224.00 a tonne;
    // 5.61 t × £224.00 = £1,256.64 (the base 5.61 × £210.00 = £1,178.10, plus £78.54).
    expect(above).toMatchObject({ grossKg: 8_030, tareKg: 2_420, netKg: 5_610, brixPaid: 13.4, brixDifference: 1.4, pricePerTonneMinor: 22_400, baseAmountMinor: 117_810, sugarAdjustmentMinor: 7_854, amountMinor: 125_664, totalMinor: 125_664 })
    for (const line of s.lines) expect(line.ticketNo).toMatch(/^QCW-26-\d{4}$/)
    // £687.24 + £0 + £1,256.64 = £1,943.88, no tax.
    expect(s.totals).toEqual({ netKg: 11_810, paidKg: 8_930, baseAmountMinor: 187_530, sugarAdjustmentMinor: 6_858, amountMinor: 194_388, taxMinor: 0, totalMinor: 194_388 })
    // 40 t ± 10 % is 36–44 t; 11.81 t delivered is 24.19 t short, carried to 2027 if the crop failed.
    expect(s.year).toMatchObject({ contractedTonnes: 40, lowestTonnes: 36, highestTonnes: 44, deliveredTonnes: 11.81, shortfallTonnes: 24.19, cropFailure: 'carried' })
    expect(s.year!.shortfallMeans).toContain('carried to the 2027 harvest')
  })

  it('is the same statement for Tansy Row, and nobody else\'s', async () => {
    const maker = (await season('makerOwner')).body
    expect((await season('grower2Owner')).body).toEqual(maker)
    for (const caller of ['growerOwner', 'maker2Owner'] as const) expect((await season(caller)).status, caller).toBe(404)
  })

  it('lists the season among Tansy Row\'s statements with what stands', async () => {
    const res = await (await as('grower2Owner')).get('/api/statements?season=2026')
    expect(res.body.items).toContainEqual({
      fruitContractId: contractId, harvestYear: 2026, contractDescription: 'bittersharp apples, harvests 2026–2030',
      buyer: 'Quillhurst Cider Works', seller: 'Tansy Row Fruit', deliveries: 3, totalMinor: 194_388, currency: 'GBP',
    })
  })

  it('gives each delivery its own statement, the CSV of the season totalling £1,943.88', async () => {
    const { lines } = (await season('grower2Owner')).body as Statement
    const client = await as('grower2Owner')
    for (const line of lines) {
      const one = await client.get(`/api/deliveries/${line.deliveryId}/statement`)
      expect(one.status).toBe(200)
      expect(one.body).toMatchObject({ reference: `SB-${contractId}-D${line.deliveryId}`, lines: [line], totals: { totalMinor: line.totalMinor } })
    }
    const csv = await season('grower2Owner', '&format=csv')
    expect(csv.headers.get('content-disposition')).toBe(`attachment; filename="SB-${contractId}-2026.csv"`)
    expect(String(csv.body).trim().split('\r\n').at(-1)).toMatch(/^Totals,.*,1943\.88,GBP,stands$/)
  })

  it('keeps each delivery as the delivery service would: version 1, no excess, recorded and settled in its history (and paid, for the one paid), the lots delivered', async () => {
    const rows = await db('deliveries as d').join('harvest_lots as l', 'l.id', 'd.lot_id').where('d.fruit_contract_id', contractId).orderBy('d.delivered_on')
      .select('d.id', 'l.code', 'l.state as lot_state', 'l.net_kg as lot_kg', 'd.net_kg', 'd.version', 'd.excess_kg', 'd.tax_rate_pct', 'd.settled_at', 'd.reading_id')
    expect(rows.map(r => [r.code, r.version, r.excess_kg, r.tax_rate_pct, r.lot_state, r.lot_kg === r.net_kg])).toEqual([
      ['TR-26-003', 1, 0, 0, 'delivered', true],
      ['TR-26-004', 1, 0, 0, 'delivered', true],
      ['TR-26-001', 1, 0, 0, 'delivered', true],
    ])
    for (const r of rows) {
      const events = await db('delivery_events').where({ delivery_id: r.id }).orderBy('id').select('action', 'version', 'by_name')
      // TR-26-003's settlement was paid through the processor, which Pomewright records as its own move.
      const paid = r.code === 'TR-26-003' ? [{ action: 'paid', version: 1, by_name: 'Pomewright' }] : []
      expect(events, r.code).toEqual(r.settled_at
        ? [{ action: 'recorded', version: 1, by_name: 'Olu Brandt' }, { action: 'settled', version: 1, by_name: 'Olu Brandt' }, ...paid]
        : [{ action: 'recorded', version: 1, by_name: 'Olu Brandt' }])
    }
    // The rejected load was paid on the re-test of the day, the lot's latest reading.
    const retest = await db('juice_readings').where({ id: rows[1]!.reading_id }).first('brix', 'sampled_on', 'lab_sheet_id')
    expect(retest).toEqual({ brix: 9.3, sampled_on: '2026-10-09', lab_sheet_id: null })
  })

  it('told Tansy Row of each delivery in its notices', async () => {
    // Other tests tell Tansy Row of their own moves, so the demo's notices may lie past the first page.
    const client = await as('grower2Owner')
    const subjects: string[] = []
    for (let offset = 0; ; offset += 100) {
      const res = await client.get(`/api/notices?limit=100&offset=${offset}`)
      expect(res.status).toBe(200)
      subjects.push(...res.body.items.map((n: { subject: string }) => n.subject))
      if (!res.body.items.length || subjects.length >= res.body.total) break
    }
    expect(subjects).toEqual(expect.arrayContaining([
      'Quillhurst Cider Works settled your delivery of TR-26-003: £687.24',
      'Quillhurst Cider Works recorded your delivery of TR-26-004: rejected',
      'Quillhurst Cider Works settled your delivery of TR-26-001: £1,256.64',
    ]))
  })
})
