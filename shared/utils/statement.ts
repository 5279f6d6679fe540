import type { FruitSpecies, JuiceClass } from './juiceClass'
import type { ContractYearSummary, Delivery, Statement, StatementLine, StatementParty } from '../types/delivery'
import { fruitContractWhat } from './contractDisplay'

// A self-billing statement: the maker (buyer) states what it owes the grower (seller) for the
// deliveries on it, from each delivery's settlement as it was worked and kept. Each line's base
// amount is the kept base rounded half up to the minor unit once, and its sugar adjustment is the
// amount less that base, so that every line's columns add up to its amount to the penny. A rejected
// load is paid on no kilograms: its lines are all 0. A disputed delivery stays on the statement,
// marked, but its money is held apart from the totals, which are what stands.

/** A delivery as the statement reads it: the weigh ticket, the reading, and the settlement kept. */
export type StatementDeliveryRow = Pick<Delivery, 'id' | 'deliveredOn' | 'lotCode' | 'varietyName' | 'ticketNo' | 'grossKg' | 'tareKg' | 'netKg'
  | 'readingBrix' | 'readingSampledOn' | 'state' | 'settlement' | 'amountMinor' | 'taxMinor' | 'totalMinor'>

export type StatementTotals = Statement['totals']

/** The contract a statement is worked on: its parties, what fruit, its years and its sugar terms. */
export interface StatementContract {
  id: number
  varietyName: string | null
  species: FruitSpecies | null
  juiceClass: JuiceClass | null
  years: number[]
  currency: string
  basePricePerTonneMinor: number
  baselineBrix: number
  bonusPerBrixPerTonneMinor: number
  deductionPerBrixPerTonneMinor: number
  rejectFloorBrix: number
}

/** One season of one contract as the list of the caller's statements shows it. */
export interface StatementSeason {
  fruitContractId: number
  harvestYear: number
  contractDescription: string
  buyer: string
  seller: string
  /** Every delivery of the season, disputed ones included. */
  deliveries: number
  /** What stands: the deliveries' totals, the disputed ones held apart. */
  totalMinor: number
  currency: string
}

export interface StatementSeasonList { items: StatementSeason[], total: number }

/** Kilograms to 0.1 kg, summed on whole tenths so that tickets add up exactly. */
const tenthsKg = (kg: number) => Math.round(kg * 10)

/** A sum that carries fractions of a minor unit, rounded half up once (exactly, for a figure worked to 6 places). */
const wholeMinor = (minor: number) => Math.round(Number(minor.toFixed(6)))

export function statementLine(row: StatementDeliveryRow): StatementLine {
  const s = row.settlement
  const rejected = s.rejected
  const baseAmountMinor = rejected ? 0 : wholeMinor(s.baseAmountMinor)
  const amountMinor = rejected ? 0 : row.amountMinor
  return {
    deliveryId: row.id,
    deliveredOn: row.deliveredOn,
    lotCode: row.lotCode,
    varietyName: row.varietyName,
    ticketNo: row.ticketNo,
    grossKg: row.grossKg,
    tareKg: row.tareKg,
    netKg: row.netKg,
    paidKg: rejected ? 0 : s.paidKg,
    readingBrix: row.readingBrix,
    readingSampledOn: row.readingSampledOn,
    brixPaid: s.brixPaid,
    brixDifference: s.brixDifference,
    pricePerTonneMinor: s.pricePerTonneMinor,
    baseAmountMinor,
    sugarAdjustmentMinor: amountMinor - baseAmountMinor,
    rejected,
    rejectedBecause: s.rejectedBecause,
    amountMinor,
    taxMinor: rejected ? 0 : row.taxMinor,
    totalMinor: rejected ? 0 : row.totalMinor,
    state: row.state,
  }
}

function sumLines(lines: StatementLine[]): StatementTotals {
  const sum = (pick: (l: StatementLine) => number) => lines.reduce((total, l) => total + pick(l), 0)
  return {
    netKg: sum(l => tenthsKg(l.netKg)) / 10,
    paidKg: sum(l => tenthsKg(l.paidKg)) / 10,
    baseAmountMinor: sum(l => l.baseAmountMinor),
    sugarAdjustmentMinor: sum(l => l.sugarAdjustmentMinor),
    amountMinor: sum(l => l.amountMinor),
    taxMinor: sum(l => l.taxMinor),
    totalMinor: sum(l => l.totalMinor),
  }
}

/** The lines that stand, summed: a disputed delivery is held apart. */
export function statementTotals(lines: StatementLine[]): StatementTotals {
  return sumLines(lines.filter(l => l.state !== 'disputed'))
}

/** What is held while disputed: the disputed lines, summed apart. */
export function heldWhileDisputed(lines: StatementLine[]): StatementTotals & { deliveries: number } {
  const disputed = lines.filter(l => l.state === 'disputed')
  return { ...sumLines(disputed), deliveries: disputed.length }
}

export function seasonReference(fruitContractId: number, harvestYear: number): string {
  return `SB-${fruitContractId}-${harvestYear}`
}

export function deliveryReference(fruitContractId: number, deliveryId: number): string {
  return `SB-${fruitContractId}-D${deliveryId}`
}

/** What the contract is for and its years: "bittersharp apples, harvests 2026–2030". */
export function statementContractDescription(contract: Pick<StatementContract, 'varietyName' | 'species' | 'juiceClass' | 'years'>): string {
  const years = [...contract.years].sort((a, b) => a - b)
  const what = fruitContractWhat(contract)
  if (!years.length) return what
  return years.length > 1 ? `${what}, harvests ${years[0]}–${years.at(-1)}` : `${what}, harvest ${years[0]}`
}

export interface StatementInput {
  kind: Statement['kind']
  /** The delivery of a delivery statement; its reference names it. */
  deliveryId?: number
  contract: StatementContract
  buyer: StatementParty
  seller: StatementParty
  harvestYear: number
  /** In delivery order. */
  rows: StatementDeliveryRow[]
  year: ContractYearSummary | null
  issuedOn: string
}

export function buildStatement(input: StatementInput): Statement {
  const { contract } = input
  const lines = input.rows.map(statementLine)
  return {
    reference: input.kind === 'season' ? seasonReference(contract.id, input.harvestYear) : deliveryReference(contract.id, input.deliveryId!),
    kind: input.kind,
    issuedOn: input.issuedOn,
    buyer: input.buyer,
    seller: input.seller,
    fruitContractId: contract.id,
    contractDescription: statementContractDescription(contract),
    harvestYear: input.harvestYear,
    currency: contract.currency,
    basePricePerTonneMinor: contract.basePricePerTonneMinor,
    baselineBrix: contract.baselineBrix,
    bonusPerBrixPerTonneMinor: contract.bonusPerBrixPerTonneMinor,
    deductionPerBrixPerTonneMinor: contract.deductionPerBrixPerTonneMinor,
    rejectFloorBrix: contract.rejectFloorBrix,
    lines,
    totals: statementTotals(lines),
    year: input.year,
  }
}

// ----- The CSV -----

/** Integer minor units in major units with two decimals, exactly: 258000 → "2580.00", −996 → "-9.96". */
export function csvMoney(minor: number): string {
  const whole = Math.round(minor)
  const abs = Math.abs(whole)
  return `${whole < 0 ? '-' : ''}${Math.floor(abs / 100)}.${String(abs % 100).padStart(2, '0')}`
}

/** A rate that may carry a tenth of a minor unit (a bonus of £10.05 × 0.1 °Brix): three decimals then, else two. */
export function csvRate(minor: number): string {
  const tenths = Math.round(minor * 10)
  if (tenths % 10 === 0) return csvMoney(tenths / 10)
  const abs = Math.abs(tenths)
  return `${tenths < 0 ? '-' : ''}${Math.floor(abs / 1000)}.${String(abs % 1000).padStart(3, '0')}`
}

const kgText = (kg: number | null) => (kg === null ? '' : String(tenthsKg(kg) / 10))
const brixText = (brix: number) => brix.toFixed(1)

export const STATEMENT_CSV_HEADER = [
  'Delivery', 'Delivered on', 'Lot', 'Variety', 'Weigh ticket', 'Gross kg', 'Tare kg', 'Net kg', 'Paid kg',
  'Reading °Brix', 'Reading sampled on', '°Brix paid', '°Brix difference', 'Price per tonne', 'Base amount',
  'Sugar adjustment', 'Rejected', 'Rejected because', 'Amount', 'Tax', 'Total', 'Currency', 'State',
] as const

export const STATEMENT_TOTALS_LABEL = 'Totals'
export const STATEMENT_HELD_LABEL = 'Held while disputed'

function sumRow(label: string, sums: StatementTotals, currency: string, state: string): string[] {
  return [
    label, '', '', '', '', '', '', kgText(sums.netKg), kgText(sums.paidKg), '', '', '', '', '', csvMoney(sums.baseAmountMinor),
    csvMoney(sums.sugarAdjustmentMinor), '', '', csvMoney(sums.amountMinor), csvMoney(sums.taxMinor), csvMoney(sums.totalMinor), currency, state,
  ]
}

/**
 * The statement as CSV rows: the header, one row per delivery in order, the totals that stand and,
 * when a delivery is disputed, what is held apart. Money in major units with two decimals.
 */
export function statementCsvRows(statement: Statement): string[][] {
  const rows: string[][] = [[...STATEMENT_CSV_HEADER]]
  for (const l of statement.lines) {
    rows.push([
      String(l.deliveryId), l.deliveredOn, l.lotCode, l.varietyName, l.ticketNo ?? '', kgText(l.grossKg), kgText(l.tareKg), kgText(l.netKg), kgText(l.paidKg),
      String(l.readingBrix), l.readingSampledOn, brixText(l.brixPaid), brixText(l.brixDifference), csvRate(l.pricePerTonneMinor), csvMoney(l.baseAmountMinor),
      csvMoney(l.sugarAdjustmentMinor), l.rejected ? 'yes' : 'no', l.rejectedBecause.join('; '), csvMoney(l.amountMinor), csvMoney(l.taxMinor), csvMoney(l.totalMinor),
      statement.currency, l.state,
    ])
  }
  rows.push(sumRow(STATEMENT_TOTALS_LABEL, statement.totals, statement.currency, 'stands'))
  const held = heldWhileDisputed(statement.lines)
  if (held.deliveries) rows.push(sumRow(STATEMENT_HELD_LABEL, held, statement.currency, 'disputed'))
  return rows
}

export function statementFileName(statement: Pick<Statement, 'reference'>): string {
  return `${statement.reference}.csv`
}

/**
 * Text a spreadsheet would run as a formula (=, +, -, @, a tab or a return first) is written with a
 * leading apostrophe; a plain signed number such as -9.96 is left as it is.
 */
export const CSV_FORMULA_START = /^(?![-+]?\d+(?:\.\d+)?$)[=+\-@\t\r]/
