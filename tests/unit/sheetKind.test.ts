import ExcelJS from 'exceljs'
import { describe, expect, it } from 'vitest'
import { judgeSheet } from '../../server/utils/sheetKind'

// A sheet's kind is read from its bytes; its name must agree. The signatures are the formats' own:
// PNG's eight bytes (ISO/IEC 15948, section 5.2), "%PDF-" (ISO 32000-1, section 7.5.2), a zip's
// "PK\x03\x04" local file header (PKWARE APPNOTE, section 4.3.7).
const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452', 'hex')
const PDF = Buffer.from('%PDF-1.7\n%%EOF\n')
const text = (s: string) => Buffer.from(s, 'utf8')

async function workbook(): Promise<Buffer> {
  const book = new ExcelJS.Workbook()
  book.addWorksheet('Results').addRow(['Lot', 'Brix'])
  return Buffer.from(await book.xlsx.writeBuffer())
}

describe('judgeSheet', () => {
  it('takes UTF-8 text with a delimiter, or a single line, as a CSV', async () => {
    expect(await judgeSheet('a.csv', text('Lot;Brix\r\nA;12,1\r\n'))).toEqual({ ok: true, kind: 'csv' })
    expect(await judgeSheet('a.txt', text('\uFEFFLot\tBrix\n'))).toEqual({ ok: true, kind: 'csv' })
    expect(await judgeSheet('one.csv', text('Lot'))).toEqual({ ok: true, kind: 'csv' })
  })

  it('refuses text that is not valid UTF-8 or holds NUL bytes', async () => {
    expect(await judgeSheet('latin.csv', Buffer.from([0x4C, 0x6F, 0x74, 0x2C, 0xE9, 0x0A]))).toMatchObject({ ok: false, message: /latin\.csv/ })
    expect(await judgeSheet('nul.csv', text('Lot,\0Brix\n'))).toMatchObject({ ok: false })
  })

  it('knows an XLSX workbook and a PDF by their bytes', async () => {
    expect(await judgeSheet('Lab.XLSX', await workbook())).toEqual({ ok: true, kind: 'xlsx' })
    expect(await judgeSheet('cert.pdf', PDF)).toEqual({ ok: true, kind: 'pdf' })
  })

  it('refuses a file whose name says one kind and whose bytes are another, naming both', async () => {
    expect(await judgeSheet('photo.csv', PNG)).toEqual({ ok: false, message: 'photo.csv is a PNG file: a lab sheet must be a CSV, XLSX or PDF file.' })
    expect(await judgeSheet('results.csv', PDF)).toEqual({ ok: false, message: 'results.csv is named as CSV but holds a PDF.' })
    expect(await judgeSheet('results.pdf', await workbook())).toEqual({ ok: false, message: 'results.pdf is named as PDF but holds an XLSX workbook.' })
    expect(await judgeSheet('notes.docx', text('a,b\n'))).toMatchObject({ ok: false, message: /not named as a CSV, XLSX or PDF/ })
  })

  it('refuses an empty file and a zip that is not a workbook', async () => {
    expect(await judgeSheet('empty.csv', Buffer.alloc(0))).toEqual({ ok: false, message: 'empty.csv is empty.' })
    // An empty zip archive: only its end-of-central-directory record (PKWARE APPNOTE, section 4.3.16).
    const zip = Buffer.from('504b0506000000000000000000000000000000000000', 'hex')
    expect(await judgeSheet('book.xlsx', zip)).toMatchObject({ ok: false, message: /book\.xlsx/ })
  })
})
