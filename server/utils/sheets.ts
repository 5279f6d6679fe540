import ExcelJS from 'exceljs'
import Papa from 'papaparse'

// A lab or juice sheet's table, read from its bytes: the header row and the rows under it, each
// cell as text. Labs write sheets in their own layouts, so nothing here knows the columns: the
// import maps them. A CSV may start with a byte-order mark, use commas, semicolons or tabs, and end
// in blank rows; an XLSX sheet's first worksheet is read, its dates as YYYY-MM-DD and its numbers
// as written with a decimal point.

export interface SheetTable {
  headers: string[]
  /** The rows under the header, blank ones at the end left off; row i is the sheet's row i + 2. */
  rows: string[][]
}

export class SheetUnreadable extends Error {}

const blank = (row: readonly string[]) => row.every(cell => cell.trim() === '')

function table(all: string[][]): SheetTable {
  while (all.length && blank(all[all.length - 1]!)) all.pop()
  const [first, ...rows] = all
  if (!first || blank(first)) throw new SheetUnreadable('The sheet has no header row: its first row is empty')
  const headers = first.map(h => h.trim())
  return { headers, rows: rows.map(r => headers.map((_, i) => (r[i] ?? '').trim())) }
}

export function readCsv(bytes: Uint8Array): SheetTable {
  const text = new TextDecoder('utf-8').decode(bytes).replace(/^\uFEFF/, '')
  const parsed = Papa.parse<string[]>(text, { delimitersToGuess: [',', ';', '\t', '|'], skipEmptyLines: false })
  const fatal = parsed.errors.find(e => e.type === 'Quotes')
  if (fatal) throw new SheetUnreadable(`The CSV could not be read at row ${(fatal.row ?? 0) + 1}: ${fatal.message}`)
  return table(parsed.data.map(r => r.map(c => String(c ?? ''))))
}

function cellText(value: ExcelJS.CellValue): string {
  if (value === null || value === undefined) return ''
  if (value instanceof Date) return value.toISOString().slice(0, 10)
  if (typeof value === 'number' || typeof value === 'boolean') return String(value)
  if (typeof value === 'string') return value
  if (typeof value === 'object') {
    if ('result' in value) return cellText(value.result as ExcelJS.CellValue)
    if ('richText' in value) return value.richText.map(t => t.text).join('')
    if ('text' in value) return String(value.text)
    if ('error' in value) return ''
  }
  return String(value)
}

export async function readXlsx(bytes: Uint8Array): Promise<SheetTable> {
  const book = new ExcelJS.Workbook()
  try {
    await book.xlsx.load(Buffer.from(bytes) as unknown as ArrayBuffer)
  }
  catch {
    throw new SheetUnreadable('The XLSX file could not be opened: it may be damaged or not a workbook')
  }
  const sheet = book.worksheets[0]
  if (!sheet) throw new SheetUnreadable('The workbook has no worksheet')
  const all: string[][] = []
  sheet.eachRow({ includeEmpty: true }, (row, n) => {
    const values = row.values as ExcelJS.CellValue[]
    all[n - 1] = values.slice(1).map(cellText)
  })
  for (let i = 0; i < all.length; i++) all[i] ??= []
  return table(all)
}

export function readSheet(kind: 'csv' | 'xlsx', bytes: Uint8Array): Promise<SheetTable> {
  return kind === 'csv' ? Promise.resolve().then(() => readCsv(bytes)) : readXlsx(bytes)
}
