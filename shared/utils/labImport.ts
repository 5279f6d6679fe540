import type { TaAcid, TaUnit, TanninUnit } from '../types/lot'
import type { FruitSpecies } from './juiceClass'

// Importing a lab sheet: which of the sheet's columns holds which reading, how its dates and
// numbers are written, and every row checked before any of it is kept. Labs lay their sheets out
// in their own ways, so nothing here knows a column by position; the person maps them, and the
// mapping is offered again when a sheet with the same headers comes back.

/** The readings a column may be mapped to; lot code and sampling day are always needed. */
export const COLUMN_FIELDS = ['lotCode', 'sampledOn', 'brix', 'sg', 'tempC', 'ta', 'ph', 'tannin', 'yan'] as const
export type ColumnField = typeof COLUMN_FIELDS[number]
export const REQUIRED_COLUMNS = ['lotCode', 'sampledOn'] as const satisfies readonly ColumnField[]
export const NUMBER_COLUMNS = ['brix', 'sg', 'tempC', 'ta', 'ph', 'tannin', 'yan'] as const satisfies readonly ColumnField[]
export type NumberColumn = typeof NUMBER_COLUMNS[number]

export const COLUMN_LABELS: Record<ColumnField, string> = {
  lotCode: 'Lot code', sampledOn: 'Sampled on', brix: '°Brix', sg: 'Specific gravity', tempC: 'Sample temperature (°C)',
  ta: 'Titratable acidity', ph: 'pH', tannin: 'Tannin', yan: 'YAN (mg/L)',
}

export const DATE_FORMATS = ['YYYY-MM-DD', 'DD/MM/YYYY', 'MM/DD/YYYY'] as const
export type DateFormat = typeof DATE_FORMATS[number]

/** Each field names a header of the sheet; the acid and units say how the lab reported TA and tannin. */
export interface ColumnMapping {
  lotCode: string
  sampledOn: string
  brix?: string
  sg?: string
  tempC?: string
  ta?: string
  ph?: string
  tannin?: string
  yan?: string
  taAs: TaAcid
  taUnit: TaUnit
  tanninUnit: TanninUnit
}

export interface ImportOptions {
  dateFormat: DateFormat
  decimalComma: boolean
}

export interface RowIssue {
  /** The sheet's row: the header is row 1. */
  row: number
  field: ColumnField
  message: string
}

// ----- Dates and numbers -----

const ISO = /^(\d{4})-(\d{1,2})-(\d{1,2})$/
const SLASHED = /^(\d{1,2})[/.-](\d{1,2})[/.-](\d{4})$/

function isoDate(y: number, m: number, d: number): string | null {
  if (m < 1 || m > 12 || d < 1) return null
  const days = new Date(Date.UTC(y, m, 0)).getUTCDate()
  if (d > days) return null
  return `${String(y).padStart(4, '0')}-${String(m).padStart(2, '0')}-${String(d).padStart(2, '0')}`
}

/**
 * A sheet's date as YYYY-MM-DD, read by the chosen format; null when it is not a day of the
 * calendar in that format (31/02 is refused, not rolled on to March). A date written year first
 * cannot be misread, so it is taken whatever the format (XLSX date cells come that way).
 */
export function parseSheetDate(text: string, format: DateFormat): string | null {
  const value = text.trim()
  const iso = ISO.exec(value)
  if (iso) return isoDate(Number(iso[1]), Number(iso[2]), Number(iso[3]))
  if (format === 'YYYY-MM-DD') return null
  const parts = SLASHED.exec(value)
  if (!parts) return null
  const [a, b, y] = [Number(parts[1]), Number(parts[2]), Number(parts[3])]
  return format === 'DD/MM/YYYY' ? isoDate(y, b, a) : isoDate(y, a, b)
}

export type NumberRead = { ok: true, value: number | null } | { ok: false, message: string }

const POINT_PLAIN = /^[+-]?(\d+(\.\d+)?|\.\d+)$/
const POINT_GROUPED = /^[+-]?\d{1,3}(,\d{3})+(\.\d+)?$/
const COMMA_PLAIN = /^[+-]?(\d+(,\d+)?|,\d+)$/
const COMMA_GROUPED = /^[+-]?\d{1,3}(\.\d{3})+,\d+$/

/**
 * A sheet's number; an empty cell is null. With a decimal comma "1.234,5" is 1234.5, and a number
 * written with a decimal point ("1.050") is refused rather than guessed at; without one, "12,5"
 * is refused the same way, so a wrong setting shows on the first row instead of in the readings.
 */
export function parseSheetNumber(text: string, decimalComma: boolean): NumberRead {
  const value = text.trim().replace(/\s/g, '')
  if (value === '') return { ok: true, value: null }
  if (decimalComma) {
    if (COMMA_PLAIN.test(value)) return { ok: true, value: Number(value.replace(',', '.')) }
    if (COMMA_GROUPED.test(value)) return { ok: true, value: Number(value.replace(/\./g, '').replace(',', '.')) }
    if (POINT_PLAIN.test(value)) return { ok: false, message: `"${text.trim()}" has a decimal point, but the sheet is set to a decimal comma` }
  }
  else {
    if (POINT_PLAIN.test(value)) return { ok: true, value: Number(value) }
    if (POINT_GROUPED.test(value)) return { ok: true, value: Number(value.replace(/,/g, '')) }
    if (COMMA_PLAIN.test(value)) return { ok: false, message: `"${text.trim()}" has a decimal comma: choose "decimal comma" for this sheet` }
  }
  return { ok: false, message: `"${text.trim()}" is not a number` }
}

// ----- Headers -----

/** The header row as the saved mappings know it: trimmed, lower case, joined by tabs (hashed with sha-256 to key it). */
export function headersKeyText(headers: readonly string[]): string {
  return headers.map(h => h.trim().toLowerCase()).join('\t')
}

// Header names labs use, matched after lower-casing and dropping everything but letters and digits.
const HEADER_NAMES: [ColumnField, RegExp][] = [
  ['lotCode', /^(lot|lotcode|lotno|lotnumber|lotid|lotref|sample|sampleid|sampleref|samplecode|batch|batchcode)$/],
  ['sampledOn', /^(date|sampled|sampledon|sampledate|datesampled|dateofsample|sampling|samplingdate|day)$/],
  ['brix', /^(brix|bx|degbx|brixdeg|degbrix|degreesbrix|ssc|solublesolids|tss)$/],
  ['sg', /^(sg|specificgravity|gravity|og|density|sgasread)$/],
  ['tempC', /^(temp|tempc|temperature|temperaturec|degc|sampletemp|sampletemperature)$/],
  ['ta', /^(ta|acid|acidity|titratableacidity|totalacid|totalacidity|tagl|tapct|malic|malicacid|tamalic|tatartaric|tasulfuric|tasulphuric)$/],
  ['ph', /^ph$/],
  ['tannin', /^(tannin|tannins|tanninpct|tanningl|tanninmgl|polyphenols|totalpolyphenols|phenolics)$/],
  ['yan', /^(yan|yanmgl|fan|yeastassimilablenitrogen|assimilablenitrogen)$/],
]

// A header is tried whole, then by its first word and first two words ("TA (% w/v tartaric)" → "ta").
function candidates(header: string): string[] {
  const words = header.toLowerCase().replace(/°/g, 'deg').split(/[^a-z0-9]+/).filter(Boolean)
  return [words.join(''), words[0] ?? '', words.slice(0, 2).join('')]
}

/** A first mapping from the header names alone, for a sheet whose headers have not been seen before. */
export function suggestMapping(headers: readonly string[]): Partial<Record<ColumnField, string>> {
  const found: Partial<Record<ColumnField, string>> = {}
  for (const header of headers) {
    const names = candidates(header)
    const match = HEADER_NAMES.find(([field, pattern]) => found[field] === undefined && names.some(n => pattern.test(n)))
    if (match) found[match[0]] = header
  }
  return found
}

/** What the header names say of the units, where they say it ("TA (% w/v tartaric)", "Tannin mg/L"). */
export function suggestUnits(headers: readonly string[], mapping: Partial<Record<ColumnField, string>>): Pick<ColumnMapping, 'taAs' | 'taUnit' | 'tanninUnit'> {
  const ta = (mapping.ta ?? '').toLowerCase()
  const tannin = (mapping.tannin ?? '').toLowerCase()
  return {
    taAs: /tartaric/.test(ta) ? 'tartaric' : /sul(f|ph)uric/.test(ta) ? 'sulfuric' : 'malic',
    taUnit: /%|w\/v|pct|percent/.test(ta) ? '% w/v' : 'g/L',
    tanninUnit: /mg/.test(tannin) ? 'mg/L' : /%|pct|percent/.test(tannin) ? '%' : 'g/L',
  }
}

/** The mapped columns that are not headers of this sheet, as `mapping.<field>` issues. */
export function mappingHeaderIssues(mapping: ColumnMapping, headers: readonly string[]): { path: string, message: string }[] {
  const known = new Set(headers)
  return COLUMN_FIELDS.flatMap((field) => {
    const header = mapping[field]
    return header === undefined || known.has(header) ? [] : [{ path: `mapping.${field}`, message: `The sheet has no column "${header}"` }]
  })
}

// ----- Rows -----

/** A lot as the import needs it: its id, the day it was picked and its fruit's species. */
export interface ImportLot { id: number, pickedOn: string, species: FruitSpecies }

/** One row's values as read, before the trade's ranges and corrections. */
export interface RowValues {
  row: number
  lot: ImportLot
  sampledOn: string
  values: Record<NumberColumn, number | null>
}

export interface RowsChecked {
  good: RowValues[]
  issues: RowIssue[]
  /** The sheet rows with at least one issue, in order. */
  badRows: number[]
}

const lotKey = (code: string) => code.trim().toUpperCase()

/** The lots by code as the sheet's rows name them: codes are matched ignoring case and spaces around them. */
export function lotsByCode(lots: readonly (ImportLot & { code: string })[]): Map<string, ImportLot> {
  return new Map(lots.map(l => [lotKey(l.code), { id: l.id, pickedOn: l.pickedOn, species: l.species }]))
}

/**
 * Reads every row by the mapping and checks what needs the sheet as a whole: a lot code the
 * organisation has, a day that is neither in the future nor before the lot was picked, one row per
 * lot and day, and numbers written as the options say. `normalise` then checks each reading's
 * values against the trade's ranges; its issues are reported by the row and the mapped field.
 */
export function checkRows(
  table: { headers: readonly string[], rows: readonly (readonly string[])[] },
  mapping: ColumnMapping,
  options: ImportOptions,
  context: { lots: Map<string, ImportLot>, today: string },
  normalise: (row: RowValues) => { field: ColumnField, message: string }[],
): RowsChecked {
  const column = (field: ColumnField) => (mapping[field] === undefined ? -1 : table.headers.indexOf(mapping[field]!))
  const lotAt = column('lotCode')
  const dateAt = column('sampledOn')
  const numbers = NUMBER_COLUMNS.map(field => [field, column(field)] as const).filter(([, at]) => at >= 0)
  const good: RowValues[] = []
  const issues: RowIssue[] = []
  const badRows: number[] = []
  const seen = new Map<string, number>()

  table.rows.forEach((cells, i) => {
    const row = i + 2
    if (cells.every(c => c.trim() === '')) return
    const found: RowIssue[] = []
    const say = (field: ColumnField, message: string) => found.push({ row, field, message })

    const code = (cells[lotAt] ?? '').trim()
    const lot = code ? context.lots.get(lotKey(code)) : undefined
    if (!code) say('lotCode', 'No lot code')
    else if (!lot) say('lotCode', `No lot of yours has the code "${code}"`)

    const dateText = (cells[dateAt] ?? '').trim()
    const sampledOn = dateText ? parseSheetDate(dateText, options.dateFormat) : null
    if (!dateText) say('sampledOn', 'No sampling date')
    else if (!sampledOn) say('sampledOn', `"${dateText}" is not a date written ${options.dateFormat}`)
    else if (sampledOn > context.today) say('sampledOn', `${sampledOn} is in the future`)
    else if (lot && sampledOn < lot.pickedOn) say('sampledOn', `${sampledOn} is before the lot was picked (${lot.pickedOn})`)

    const values = { brix: null, sg: null, tempC: null, ta: null, ph: null, tannin: null, yan: null } as Record<NumberColumn, number | null>
    for (const [field, at] of numbers) {
      const read = parseSheetNumber(cells[at] ?? '', options.decimalComma)
      if (read.ok) values[field] = read.value
      else say(field, read.message)
    }

    if (!found.length && lot && sampledOn) {
      const reading = { row, lot, sampledOn, values }
      for (const issue of normalise(reading)) say(issue.field, issue.message)
      // A second good row of one lot and day is the fault; a bad row before it would not be kept.
      const key = `${lot.id}|${sampledOn}`
      const earlier = seen.get(key)
      if (!found.length && earlier !== undefined) say('sampledOn', `Row ${earlier} already has lot ${code} on ${sampledOn}`)
      if (!found.length) {
        seen.set(key, row)
        good.push(reading)
      }
    }
    if (found.length) {
      issues.push(...found)
      badRows.push(row)
    }
  })
  return { good, issues, badRows }
}
