import Papa from 'papaparse'
import { beforeAll, describe, expect, it } from 'vitest'
import type { Statement, StatementLine } from '../../shared/types/delivery'
import { orgId } from '../support/contracts'
import { as, type Caller } from '../support/http'
import { statementFixtures } from '../support/statements'

// Self-billing statements of a fruit contract of the tests' own (Quillhurst buys Hollowmere's
// bittersweet fruit: £250.00 a tonne at 11.0 °Brix, +£8.00 / −£10.00 a tonne per °Brix, rejected
// under 9.0 °Brix, 30 t a year ± 10 %; Hollowmere charges 20 % tax). Every figure is worked by hand.
const { contract, delivery } = statementFixtures('T-SB-')

let contractId: number
let offeredContract: number
const ids: Record<'small' | 'big' | 'rejected' | 'disputed', number> = { small: 0, big: 0, rejected: 0, disputed: 0 }

beforeAll(async () => {
  contractId = await contract([2024, 2025])
  // Delivered in this order of days (the rows are written in another): small, big, rejected, disputed.
  ids.big = await delivery(contractId, { netKg: 10_000, brix: 12.0, deliveredOn: '2025-10-05', grossKg: 12_400, tareKg: 2_400, ticketNo: 'QW-2025-0007' })
  ids.small = await delivery(contractId, { netKg: 1_234.5, brix: 11.25, deliveredOn: '2025-10-02', state: 'recorded' })
  ids.rejected = await delivery(contractId, { netKg: 3_000, brix: 8.8, deliveredOn: '2025-10-09', state: 'recorded' })
  ids.disputed = await delivery(contractId, { netKg: 5_000, brix: 10.5, deliveredOn: '2025-10-12', state: 'disputed' })
  offeredContract = await contract([2025], 'offered')
})

const season = (caller: Caller, query = `season=2025&contractId=${contractId}`) => as(caller).then(c => c.get(`/api/statements?${query}`))

/** Major units with two decimals back to minor units, exactly. */
const minor = (text: string) => {
  const [whole, fraction = ''] = text.replace('-', '').split('.')
  const value = Number(whole) * 100 + Number(fraction.padEnd(2, '0'))
  return text.startsWith('-') ? -value : value
}
const kgOrNull = (text: string) => (text === '' ? null : Number(text))

describe('a season\'s self-billing statement', () => {
  it('states every delivery of the year in delivery order, worked on the contract\'s terms, and the totals that stand', async () => {
    const res = await season('makerOwner')
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    const s = res.body as Statement
    expect(s).toMatchObject({
      reference: `SB-${contractId}-2025`, kind: 'season', fruitContractId: contractId, harvestYear: 2025, currency: 'GBP',
      contractDescription: 'bittersweet apples, harvests 2024–2025', issuedOn: '2025-10-12',
      basePricePerTonneMinor: 25_000, baselineBrix: 11, bonusPerBrixPerTonneMinor: 800, deductionPerBrixPerTonneMinor: 1_000, rejectFloorBrix: 9,
    })
    // The buyer issues it for the seller, each as its settings stand.
    expect(s.buyer).toEqual({ orgId: await orgId('quillhurst'), name: 'Quillhurst Cider Works', contactName: 'Olu Brandt', email: 'fruit@quillhurst.demo.test', phone: '01632 960 530', taxRatePct: 20 })
    expect(s.seller).toMatchObject({ orgId: await orgId('hollowmere'), name: 'Hollowmere Orchard & Nursery', contactName: 'Ines Varga', email: 'orders@hollowmere.demo.test', taxRatePct: 20 })
    expect(s.lines.map(l => l.deliveryId)).toEqual([ids.small, ids.big, ids.rejected, ids.disputed])
    const [small, big, rejected, disputed] = s.lines as [StatementLine, StatementLine, StatementLine, StatementLine]
    // 1,234.5 kg at 11.25 °Bx, paid on 11.3: 1.2345 × £252.40 = £311.5878 → £311.59; base 1.2345 × £250.00
    // = £308.625 → £308.63, sugar £2.96; tax 20 % £62.318 → £62.32; £373.91.
    expect(small).toMatchObject({ netKg: 1_234.5, paidKg: 1_234.5, brixPaid: 11.3, brixDifference: 0.3, pricePerTonneMinor: 25_240, baseAmountMinor: 30_863, sugarAdjustmentMinor: 296, amountMinor: 31_159, taxMinor: 6_232, totalMinor: 37_391, state: 'recorded' })
    // 10 t at 12.0 °Bx: 10 × (£250.00 + £8.00) = £2,580.00; tax £516.00; £3,096.00.
    expect(big).toMatchObject({ ticketNo: 'QW-2025-0007', grossKg: 12_400, tareKg: 2_400, netKg: 10_000, readingBrix: 12, readingSampledOn: '2025-10-05', baseAmountMinor: 250_000, sugarAdjustmentMinor: 8_000, amountMinor: 258_000, taxMinor: 51_600, totalMinor: 309_600, state: 'settled', rejected: false })
    expect(rejected).toMatchObject({ rejected: true, paidKg: 0, amountMinor: 0, taxMinor: 0, totalMinor: 0, rejectedBecause: ['8.8 °Brix is under the contract\'s reject floor of 9.0 °Brix'] })
    // 5 t at 10.5 °Bx: 5 × (£250.00 − £5.00) = £1,225.00, tax £245.00: on the statement, held apart.
    expect(disputed).toMatchObject({ state: 'disputed', amountMinor: 122_500, taxMinor: 24_500, totalMinor: 147_000 })
    expect(s.totals).toEqual({ netKg: 14_234.5, paidKg: 11_234.5, baseAmountMinor: 280_863, sugarAdjustmentMinor: 8_296, amountMinor: 289_159, taxMinor: 57_832, totalMinor: 346_991 })
    // 30 t ± 10 % is 27–33 t; all four loads weigh 19,234.5 kg (19.235 t to the kg), 7,765.5 kg short.
    expect(s.year).toMatchObject({ contractedTonnes: 30, tolerancePct: 10, lowestTonnes: 27, highestTonnes: 33, deliveredTonnes: 19.235, shortfallTonnes: 7.766, excessTonnes: 0, cropFailure: 'owed' })
    expect(s.year!.shortfallMeans).toBe('The shortfall of 7.766 t is owed by the grower, crop failure or not, as the contract\'s terms set out.')
  })

  it('is the same statement for both parties and every role', async () => {
    const maker = (await season('makerOwner')).body
    for (const caller of ['makerViewer', 'growerOwner', 'growerMember'] as const) {
      const res = await season(caller)
      expect(res.status, caller).toBe(200)
      expect(res.body, caller).toEqual(maker)
    }
  })

  it('downloads as CSV that reads back to the same figures', async () => {
    const json = (await season('growerOwner')).body as Statement
    const res = await season('growerOwner', `season=2025&contractId=${contractId}&format=csv`)
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8')
    expect(res.headers.get('content-disposition')).toBe(`attachment; filename="SB-${contractId}-2025.csv"`)
    const rows = Papa.parse<Record<string, string>>(res.body as string, { header: true, skipEmptyLines: true }).data
    expect(rows).toHaveLength(json.lines.length + 2)
    json.lines.forEach((line, i) => {
      const row = rows[i]!
      expect({
        deliveryId: Number(row['Delivery']), deliveredOn: row['Delivered on'], lotCode: row['Lot'], varietyName: row['Variety'], ticketNo: row['Weigh ticket'] || null,
        grossKg: kgOrNull(row['Gross kg']!), tareKg: kgOrNull(row['Tare kg']!), netKg: Number(row['Net kg']), paidKg: Number(row['Paid kg']),
        readingBrix: Number(row['Reading °Brix']), readingSampledOn: row['Reading sampled on'], brixPaid: Number(row['°Brix paid']), brixDifference: Number(row['°Brix difference']),
        pricePerTonneMinor: minor(row['Price per tonne']!), baseAmountMinor: minor(row['Base amount']!), sugarAdjustmentMinor: minor(row['Sugar adjustment']!),
        rejected: row['Rejected'] === 'yes', rejectedBecause: row['Rejected because'] ? row['Rejected because']!.split('; ') : [],
        amountMinor: minor(row['Amount']!), taxMinor: minor(row['Tax']!), totalMinor: minor(row['Total']!), state: row['State'],
      }, `row ${i + 2}`).toEqual(line)
      expect(row['Currency']).toBe('GBP')
    })
    const sums = (row: Record<string, string>) => ({
      netKg: Number(row['Net kg']), paidKg: Number(row['Paid kg']), baseAmountMinor: minor(row['Base amount']!), sugarAdjustmentMinor: minor(row['Sugar adjustment']!),
      amountMinor: minor(row['Amount']!), taxMinor: minor(row['Tax']!), totalMinor: minor(row['Total']!),
    })
    const [totals, held] = rows.slice(-2) as [Record<string, string>, Record<string, string>]
    expect(totals['Delivery']).toBe('Totals')
    expect(sums(totals)).toEqual(json.totals)
    expect(held['Delivery']).toBe('Held while disputed')
    const disputed = json.lines.find(l => l.state === 'disputed')!
    expect(sums(held)).toMatchObject({ netKg: disputed.netKg, amountMinor: disputed.amountMinor, taxMinor: disputed.taxMinor, totalMinor: disputed.totalMinor })
    expect(totals['Amount']).toBe('2891.59')
  })

  it('states a year with no deliveries yet as nothing delivered, the whole band short', async () => {
    const res = await season('makerOwner', `season=2024&contractId=${contractId}`)
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ reference: `SB-${contractId}-2024`, lines: [], totals: { netKg: 0, amountMinor: 0, totalMinor: 0 }, year: { deliveredTonnes: 0, shortfallTonnes: 27 } })
  })

  it('is not there for another organisation, a year the contract does not have, or a contract never accepted', async () => {
    for (const caller of ['grower2Owner', 'maker2Owner'] as const) {
      expect((await season(caller)).status, caller).toBe(404)
      expect((await season(caller, `season=2025&contractId=${contractId}&format=csv`)).status, caller).toBe(404)
    }
    expect((await season('makerOwner', `season=2023&contractId=${contractId}`)).status).toBe(404)
    expect((await season('makerOwner', `season=2025&contractId=${offeredContract}`)).status).toBe(404)
    expect((await season('makerOwner', 'season=2025&contractId=999999999')).status).toBe(404)
  })

  it('refuses a bad query, naming the field', async () => {
    const cases: [string, string][] = [
      [`contractId=${contractId}`, 'season'],
      [`season=abc&contractId=${contractId}`, 'season'],
      [`season=1850&contractId=${contractId}`, 'season'],
      ['season=2025&contractId=x', 'contractId'],
      [`season=2025&contractId=${contractId}&format=pdf`, 'format'],
      ['format=csv', 'contractId'],
      ['limit=0', 'limit'],
    ]
    for (const [query, field] of cases) {
      const res = await season('makerOwner', query)
      expect(res.status, query).toBe(400)
      expect(res.body.data.issues.map((i: { path: string }) => i.path), query).toContain(field)
    }
  })
})

describe('one delivery\'s self-billing statement', () => {
  const statement = (caller: Caller, id: number | string, query = '') => as(caller).then(c => c.get(`/api/deliveries/${id}/statement${query}`))

  it('states the one delivery, by its own reference, with its totals', async () => {
    const res = await statement('growerMember', ids.big)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body).toMatchObject({
      reference: `SB-${contractId}-D${ids.big}`, kind: 'delivery', harvestYear: 2025, year: null, issuedOn: '2025-10-05',
      totals: { netKg: 10_000, paidKg: 10_000, baseAmountMinor: 250_000, sugarAdjustmentMinor: 8_000, amountMinor: 258_000, taxMinor: 51_600, totalMinor: 309_600 },
    })
    expect(res.body.lines).toHaveLength(1)
    expect(res.body).toEqual((await statement('makerViewer', ids.big)).body)
  })

  it('holds a disputed delivery\'s money apart: its statement stands at nothing', async () => {
    const res = await statement('makerOwner', ids.disputed)
    expect(res.body.lines[0]).toMatchObject({ state: 'disputed', totalMinor: 147_000 })
    expect(res.body.totals).toMatchObject({ amountMinor: 0, taxMinor: 0, totalMinor: 0 })
  })

  it('downloads as CSV that reads back to the same figures', async () => {
    const res = await statement('makerOwner', ids.rejected, '?format=csv')
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8')
    expect(res.headers.get('content-disposition')).toBe(`attachment; filename="SB-${contractId}-D${ids.rejected}.csv"`)
    const [header, line, totals] = Papa.parse<string[]>(res.body as string, { skipEmptyLines: true }).data as [string[], string[], string[]]
    const at = (row: string[], name: string) => row[header.indexOf(name)]
    expect([at(line, 'Delivery'), at(line, 'Net kg'), at(line, 'Paid kg'), at(line, '°Brix paid'), at(line, 'Rejected'), at(line, 'Amount'), at(line, 'State')])
      .toEqual([String(ids.rejected), '3000', '0', '8.8', 'yes', '0.00', 'recorded'])
    expect([at(totals, 'Delivery'), at(totals, 'Net kg'), at(totals, 'Total')]).toEqual(['Totals', '3000', '0.00'])
  })

  it('is not there for another organisation or an unknown delivery, and refuses a bad id or format', async () => {
    for (const caller of ['grower2Owner', 'maker2Owner'] as const) expect((await statement(caller, ids.big)).status, caller).toBe(404)
    expect((await statement('makerOwner', 999_999_999)).status).toBe(404)
    const bad = await statement('makerOwner', 'abc')
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues[0].path).toBe('id')
    const format = await statement('makerOwner', ids.big, '?format=xml')
    expect(format.status).toBe(400)
    expect(format.body.data.issues[0].path).toBe('format')
  })
})

describe('the caller\'s seasons', () => {
  it('lists each contract\'s season with its deliveries and what stands, to both parties, newest first', async () => {
    for (const caller of ['makerOwner', 'growerOwner'] as const) {
      const res = await (await as(caller)).get('/api/statements?limit=200')
      expect(res.status).toBe(200)
      const mine = res.body.items.filter((s: { fruitContractId: number }) => s.fruitContractId === contractId)
      // 4 deliveries; £3,096.00 + £373.91 + £0 stand, the disputed £1,470.00 held apart.
      expect(mine, caller).toEqual([{
        fruitContractId: contractId, harvestYear: 2025, contractDescription: 'bittersweet apples, harvests 2024–2025',
        buyer: 'Quillhurst Cider Works', seller: 'Hollowmere Orchard & Nursery', deliveries: 4, totalMinor: 346_991, currency: 'GBP',
      }])
      const years = res.body.items.map((s: { harvestYear: number }) => s.harvestYear)
      expect(years).toEqual([...years].sort((a, b) => b - a))
      expect(res.body.total).toBe(res.body.items.length)
    }
  })

  it('filters by season, and shows nobody else\'s', async () => {
    const maker = await as('makerOwner')
    expect((await maker.get('/api/statements?season=2025')).body.items.map((s: { fruitContractId: number }) => s.fruitContractId)).toContain(contractId)
    expect((await maker.get('/api/statements?season=2024')).body.items.map((s: { fruitContractId: number }) => s.fruitContractId)).not.toContain(contractId)
    for (const caller of ['grower2Owner', 'maker2Owner'] as const) {
      const res = await (await as(caller)).get('/api/statements?limit=200')
      expect(res.body.items.map((s: { fruitContractId: number }) => s.fruitContractId), caller).not.toContain(contractId)
    }
  })
})
