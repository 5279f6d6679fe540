import Papa from 'papaparse'
import { describe, expect, it } from 'vitest'
import type { DeliveryState, StatementParty } from '#shared/types/delivery'
import { settleLoad } from '#shared/utils/deliverySettlement'
import type { FruitPriceTerms } from '#shared/utils/settlement'
import {
  buildStatement, CSV_FORMULA_START, heldWhileDisputed, csvMoney, csvRate, statementContractDescription, statementCsvRows,
  statementFileName, statementLine, STATEMENT_CSV_HEADER, type StatementContract, type StatementDeliveryRow,
} from '#shared/utils/statement'

// Invented terms for the worked examples (demo only): £250.00 a tonne at an 11.0 °Brix baseline,
// +£8.00 a tonne for each °Brix above, −£10.00 a tonne for each °Brix below, rejected under
// 9.0 °Brix; the seller charges 20 % tax on its sales. Every figure below is worked by hand.
const TERMS: FruitPriceTerms = { basePricePerTonneMinor: 25_000, baselineBrix: 11.0, bonusPerBrixPerTonneMinor: 800, deductionPerBrixPerTonneMinor: 1_000, rejectFloorBrix: 9.0 }
const TAX = 20

const CONTRACT: StatementContract = { id: 7, varietyName: null, species: 'apple', juiceClass: 'bittersharp', years: [2027, 2026, 2028], currency: 'GBP', ...TERMS }
const party = (orgId: number, name: string): StatementParty => ({ orgId, name, contactName: null, email: null, phone: null, taxRatePct: null })

let nextId = 100
/** A delivery as the repository reads it, its settlement worked and kept as the service keeps it. */
function delivery(lotCode: string, netKg: number, brix: number, state: DeliveryState = 'settled'): StatementDeliveryRow {
  const settled = settleLoad(TERMS, { netKg, brix }, TAX)
  return {
    id: ++nextId, deliveredOn: '2026-10-14', lotCode, varietyName: 'Foxwhelp', ticketNo: `WT-${nextId}`, grossKg: netKg + 2_000, tareKg: 2_000, netKg,
    readingBrix: brix, readingSampledOn: '2026-10-12', state, settlement: settled.settlement,
    amountMinor: settled.amountMinor, taxMinor: settled.taxMinor, totalMinor: settled.totalMinor,
  }
}

const ROWS = [
  // 10 t at 12.0 °Bx: 10 × (£250.00 + 1.0 × £8.00) = £2,580.00; tax 20 % = £516.00; £3,096.00.
  delivery('TS-1', 10_000, 12.0),
  // 1,234.5 kg at 11.25 °Bx, paid on 11.3: 1.2345 × 25,240 p = 31,158.78 p → £311.59; the base alone
  // 1.2345 × 25,000 p = 30,862.5 p → £308.63, so the sugar is £311.59 − £308.63 = £2.96;
  // tax 31,159 p × 20 % = 6,231.8 p → £62.32; £373.91.
  delivery('TS-2', 1_234.5, 11.25),
  // 3 t at 8.8 °Bx: under the 9.0 floor, rejected: nothing paid, every money column 0.
  delivery('TS-3', 3_000, 8.8),
  // 5 t at 10.5 °Bx, disputed: 5 × (£250.00 − 0.5 × £10.00) = £1,225.00, tax £245.00, £1,470.00 held apart.
  delivery('TS-4', 5_000, 10.5, 'disputed'),
]

const statement = buildStatement({
  kind: 'season', contract: CONTRACT, buyer: party(1, 'A cider works'), seller: party(2, 'An orchard'), harvestYear: 2026,
  rows: ROWS, year: null, issuedOn: '2026-11-30',
})

describe('a statement line, worked by hand', () => {
  it('pays above the baseline the base and the bonus', () => {
    expect(statement.lines[0]).toMatchObject({
      paidKg: 10_000, brixPaid: 12, brixDifference: 1, pricePerTonneMinor: 25_800,
      baseAmountMinor: 250_000, sugarAdjustmentMinor: 8_000, amountMinor: 258_000, taxMinor: 51_600, totalMinor: 309_600, rejected: false,
    })
  })

  it('rounds the base once and makes the sugar adjustment what is left, so the line adds up to the penny', () => {
    const line = statement.lines[1]!
    expect(line).toMatchObject({ brixPaid: 11.3, pricePerTonneMinor: 25_240, baseAmountMinor: 30_863, sugarAdjustmentMinor: 296, amountMinor: 31_159, taxMinor: 6_232, totalMinor: 37_391 })
    expect(line.baseAmountMinor + line.sugarAdjustmentMinor).toBe(line.amountMinor)
  })

  it('pays a load under the reject floor nothing, on no kilograms, and says why', () => {
    expect(statement.lines[2]).toMatchObject({ netKg: 3_000, paidKg: 0, baseAmountMinor: 0, sugarAdjustmentMinor: 0, amountMinor: 0, taxMinor: 0, totalMinor: 0, rejected: true })
    expect(statement.lines[2]!.rejectedBecause).toEqual(['8.8 °Brix is under the contract\'s reject floor of 9.0 °Brix'])
  })

  it('keeps a disputed delivery on the statement, marked, with its figures', () => {
    expect(statement.lines[3]).toMatchObject({ state: 'disputed', baseAmountMinor: 125_000, sugarAdjustmentMinor: -2_500, amountMinor: 122_500, taxMinor: 24_500, totalMinor: 147_000 })
  })

  it('keeps a delivery\'s paid kilograms when the maker refused its excess', () => {
    // 2,000 kg of which 500 kg past the band were refused: paid on 1,500 kg at the baseline:
    // 1.5 × £250.00 = £375.00.
    const settled = settleLoad(TERMS, { netKg: 2_000, brix: 11, excessKg: 500, excessDecision: 'refused' }, null)
    const line = statementLine({ ...ROWS[0]!, netKg: 2_000, settlement: settled.settlement, amountMinor: settled.amountMinor, taxMinor: 0, totalMinor: settled.totalMinor })
    expect(line).toMatchObject({ netKg: 2_000, paidKg: 1_500, baseAmountMinor: 37_500, sugarAdjustmentMinor: 0, amountMinor: 37_500 })
  })
})

describe('a statement\'s totals, worked by hand', () => {
  it('sums what stands and holds the disputed delivery apart', () => {
    // Net 10,000 + 1,234.5 + 3,000 kg; paid 10,000 + 1,234.5 kg; base £2,500.00 + £308.63;
    // sugar £80.00 + £2.96; amount £2,580.00 + £311.59; tax £516.00 + £62.32; total £3,096.00 + £373.91.
    expect(statement.totals).toEqual({
      netKg: 14_234.5, paidKg: 11_234.5, baseAmountMinor: 280_863, sugarAdjustmentMinor: 8_296, amountMinor: 289_159, taxMinor: 57_832, totalMinor: 346_991,
    })
    expect(heldWhileDisputed(statement.lines)).toEqual({
      deliveries: 1, netKg: 5_000, paidKg: 5_000, baseAmountMinor: 125_000, sugarAdjustmentMinor: -2_500, amountMinor: 122_500, taxMinor: 24_500, totalMinor: 147_000,
    })
  })

  it('adds tenths of a kilogram exactly', () => {
    const rows = [delivery('TS-5', 0.1, 11), delivery('TS-6', 0.2, 11)]
    expect(buildStatement({ ...statementInput(), rows }).totals.netKg).toBe(0.3)
  })

  it('names itself by its contract and year, or by its delivery', () => {
    expect(statement).toMatchObject({ reference: 'SB-7-2026', kind: 'season', currency: 'GBP', baselineBrix: 11, rejectFloorBrix: 9, contractDescription: 'bittersharp apples, harvests 2026–2028' })
    const one = buildStatement({ ...statementInput(), kind: 'delivery', deliveryId: ROWS[3]!.id, rows: [ROWS[3]!] })
    expect(one.reference).toBe(`SB-7-D${ROWS[3]!.id}`)
    expect(statementFileName(one)).toBe(`SB-7-D${ROWS[3]!.id}.csv`)
    // A disputed delivery's own statement stands at nothing until the dispute is settled.
    expect(one.totals.totalMinor).toBe(0)
    expect(statementContractDescription({ varietyName: 'Dabinett', species: 'apple', juiceClass: 'bittersweet', years: [2029] })).toBe('Dabinett, harvest 2029')
  })
})

function statementInput() {
  return { kind: 'season' as const, contract: CONTRACT, buyer: party(1, 'A'), seller: party(2, 'B'), harvestYear: 2026, rows: ROWS, year: null, issuedOn: '2026-11-30' }
}

describe('the statement as CSV rows', () => {
  const rows = statementCsvRows(statement)
  const column = (name: typeof STATEMENT_CSV_HEADER[number]) => STATEMENT_CSV_HEADER.indexOf(name)

  it('writes money in major units with two decimals', () => {
    expect(csvMoney(258_000)).toBe('2580.00')
    expect(csvMoney(-996)).toBe('-9.96')
    expect(csvMoney(5)).toBe('0.05')
    expect(csvRate(25_240)).toBe('252.40')
    // A bonus of £10.05 a °Brix on 0.1 °Brix adds 100.5 p a tonne: kept to the tenth of a penny.
    expect(csvRate(25_100.5)).toBe('251.005')
  })

  it('has a header, one row per delivery in order, the totals and what is held', () => {
    expect(rows[0]).toEqual([...STATEMENT_CSV_HEADER])
    expect(rows.slice(1, 5).map(r => r[column('Lot')])).toEqual(['TS-1', 'TS-2', 'TS-3', 'TS-4'])
    expect(rows[2]).toEqual([
      String(ROWS[1]!.id), '2026-10-14', 'TS-2', 'Foxwhelp', `WT-${ROWS[1]!.id}`, '3234.5', '2000', '1234.5', '1234.5', '11.25', '2026-10-12', '11.3', '0.3',
      '252.40', '308.63', '2.96', 'no', '', '311.59', '62.32', '373.91', 'GBP', 'settled',
    ])
    const rejected = rows[3]!
    expect([rejected[column('Paid kg')], rejected[column('Rejected')], rejected[column('Amount')], rejected[column('Total')]]).toEqual(['0', 'yes', '0.00', '0.00'])
    expect(rejected[column('Rejected because')]).toContain('reject floor')
    expect(rows[4]![column('State')]).toBe('disputed')
    expect(rows[5]).toEqual(['Totals', '', '', '', '', '', '', '14234.5', '11234.5', '', '', '', '', '', '2808.63', '82.96', '', '', '2891.59', '578.32', '3469.91', 'GBP', 'stands'])
    expect(rows[6]).toEqual(['Held while disputed', '', '', '', '', '', '', '5000', '5000', '', '', '', '', '', '1250.00', '-25.00', '', '', '1225.00', '245.00', '1470.00', 'GBP', 'disputed'])
    expect(rows).toHaveLength(7)
  })

  it('has no held row when nothing is disputed', () => {
    const settledOnly = statementCsvRows(buildStatement({ ...statementInput(), rows: ROWS.slice(0, 2) }))
    expect(settledOnly.at(-1)![0]).toBe('Totals')
    expect(settledOnly).toHaveLength(4)
  })

  it('reads back through papaparse as written, text that looks like a formula defused and signed sums left alone', () => {
    const odd = { ...ROWS[3]!, lotCode: '=HYPERLINK("x")', ticketNo: '-2+3+cmd' }
    const csv = Papa.unparse(statementCsvRows(buildStatement({ ...statementInput(), rows: [odd] })), { escapeFormulae: CSV_FORMULA_START })
    const parsed = Papa.parse<string[]>(csv).data
    expect(parsed[1]![column('Lot')]).toBe('\'=HYPERLINK("x")')
    expect(parsed[1]![column('Weigh ticket')]).toBe('\'-2+3+cmd')
    expect(parsed[1]![column('Sugar adjustment')]).toBe('-25.00')
  })
})
