import { createHash } from 'node:crypto'
import { PutObjectCommand, S3Client } from '@aws-sdk/client-s3'
import ExcelJS from 'exceljs'
import type { Knex } from 'knex'
import { convertAcid } from '../../../shared/utils/acid'
import { normaliseReading, type RawReading } from '../../../shared/utils/juiceReading'
import type { FruitSpecies } from '../../../shared/utils/juiceClass'
import { headersKeyText, type ColumnMapping, type ImportOptions } from '../../../shared/utils/labImport'
import { textPdf } from './data/labCertificate'

// This season's harvest lots at Hollowmere and Tansy Row, and the lab sheets their juice was tested
// on, kept in the file store as uploaded with the readings imported from them. The two labs write
// different layouts: the Estry Valley juice lab sends a CSV with semicolons, decimal commas, day-first
// dates and TA as tartaric acid; the Coldwater bench lab a workbook with SG read at a temperature,
// TA in % w/v as malic and tannin in mg/L. Each grower has one sheet of each, imported through a
// column mapping the grower keeps for the next sheet of that layout. Hollowmere's last pick was
// tested by the Pennock Hill bench, which sends a PDF: its reading was typed in beside the sheet.
// The figures are the demo's own (invented, in the usual range of each class). Written once; seeds
// run through the database edge (camelCase both ways).

const HOLLOWMERE = 'Hollowmere Orchard & Nursery'
const TANSY_ROW = 'Tansy Row Fruit'
type Grower = typeof HOLLOWMERE | typeof TANSY_ROW
const OWNER: Record<Grower, string> = { [HOLLOWMERE]: 'grower@demo.test', [TANSY_ROW]: 'grower2@demo.test' }

interface DemoLot { org: Grower, code: string, block: string, pickedOn: string, netKg: number, bins: number, notes?: string }

export const DEMO_LOTS: DemoLot[] = [
  { org: HOLLOWMERE, code: 'HM-26-011', block: 'Long Ground', pickedOn: '2026-10-19', netKg: 6420, bins: 16 },
  { org: HOLLOWMERE, code: 'HM-26-012', block: 'Long Ground', pickedOn: '2026-10-27', netKg: 7180, bins: 18, notes: 'Second shake; some ground fruit sorted out.' },
  { org: HOLLOWMERE, code: 'HM-26-013', block: 'Chapel Piece', pickedOn: '2026-10-22', netKg: 5230, bins: 13 },
  { org: HOLLOWMERE, code: 'HM-26-014', block: 'Well Field', pickedOn: '2026-09-29', netKg: 3940, bins: 10 },
  { org: HOLLOWMERE, code: 'HM-26-015', block: 'Hedge Acre', pickedOn: '2026-10-14', netKg: 4870, bins: 12 },
  { org: HOLLOWMERE, code: 'HM-26-016', block: 'Hedge Acre', pickedOn: '2026-11-03', netKg: 2950, bins: 8, notes: 'Last pick; tested at the Pennock Hill bench (a PDF), typed in by hand.' },
  { org: TANSY_ROW, code: 'TR-26-001', block: 'River Strip', pickedOn: '2026-10-08', netKg: 5610, bins: 14 },
  { org: TANSY_ROW, code: 'TR-26-002', block: 'River Strip', pickedOn: '2026-10-20', netKg: 6050, bins: 15 },
  { org: TANSY_ROW, code: 'TR-26-003', block: 'Osier Bed', pickedOn: '2026-09-24', netKg: 3320, bins: 9 },
  { org: TANSY_ROW, code: 'TR-26-004', block: 'Osier Bed', pickedOn: '2026-10-05', netKg: 2880, bins: 8, notes: 'Wet week at picking; low sugar.' },
  { org: TANSY_ROW, code: 'TR-26-005', block: 'Top Flats', pickedOn: '2026-10-12', netKg: 1940, bins: 5, notes: 'First real crop of the trellis.' },
]

/** One lab's row: the lot, the day, and the juice as malic acid and g/L, before each lab writes it its own way. */
interface Juice { lot: string, on: string, brix: number, taMalic: number, ph: number, tannin: number, yan?: number }

// Estry Valley juice lab (CSV): the first samples of each lot.
const ESTRY: Record<Grower, Juice[]> = {
  [HOLLOWMERE]: [
    { lot: 'HM-26-011', on: '2026-10-21', brix: 12.6, taMalic: 2.1, ph: 4.35, tannin: 3.1, yan: 92 },
    { lot: 'HM-26-012', on: '2026-10-29', brix: 12.9, taMalic: 2.0, ph: 4.4, tannin: 3.3, yan: 85 },
    { lot: 'HM-26-013', on: '2026-10-24', brix: 12.2, taMalic: 2.4, ph: 4.2, tannin: 3.4, yan: 110 },
  ],
  [TANSY_ROW]: [
    { lot: 'TR-26-001', on: '2026-10-10', brix: 13.4, taMalic: 5.9, ph: 3.5, tannin: 2.2, yan: 130 },
    { lot: 'TR-26-003', on: '2026-09-26', brix: 11.8, taMalic: 7.6, ph: 3.3, tannin: 2.3, yan: 145 },
  ],
}

// Coldwater bench lab (XLSX): SG read at the bench's temperature.
const COLDWATER: Record<Grower, (Juice & { sgAsRead: number, tempC: number })[]> = {
  [HOLLOWMERE]: [
    { lot: 'HM-26-014', on: '2026-10-01', brix: 11.1, taMalic: 6.6, ph: 3.3, tannin: 1.2, sgAsRead: 1.0446, tempC: 20 },
    { lot: 'HM-26-015', on: '2026-10-16', brix: 13.2, taMalic: 2.2, ph: 4.3, tannin: 3.6, sgAsRead: 1.0532, tempC: 20 },
  ],
  [TANSY_ROW]: [
    { lot: 'TR-26-002', on: '2026-10-22', brix: 13.1, taMalic: 5.7, ph: 3.5, tannin: 2.1, sgAsRead: 1.0528, tempC: 20 },
    { lot: 'TR-26-004', on: '2026-10-07', brix: 9.6, taMalic: 7.9, ph: 3.2, tannin: 2.2, sgAsRead: 1.0383, tempC: 20 },
    { lot: 'TR-26-005', on: '2026-10-14', brix: 12.4, taMalic: 6.3, ph: 3.4, tannin: 2.6, sgAsRead: 1.0498, tempC: 20 },
  ],
}

const dayFirst = (iso: string) => `${iso.slice(8, 10)}/${iso.slice(5, 7)}/${iso.slice(0, 4)}`
const comma = (n: number, digits: number) => n.toFixed(digits).replace('.', ',')

/** The Estry lab's CSV: a byte-order mark, semicolons, decimal commas, day-first dates, TA as tartaric. */
function estryCsv(rows: Juice[]): string {
  const lines = ['Sample ref;Date sampled;Brix (°Bx);TA (g/L tartaric);pH;Tannin (g/L);YAN (mg/L)']
  for (const r of rows) {
    lines.push([r.lot, dayFirst(r.on), comma(r.brix, 1), comma(convertAcid(r.taMalic, 'malic').tartaric, 2), comma(r.ph, 2), comma(r.tannin, 2), String(r.yan ?? '')].join(';'))
  }
  return `\uFEFF${lines.join('\r\n')}\r\n`
}

async function coldwaterXlsx(rows: (Juice & { sgAsRead: number, tempC: number })[]): Promise<Uint8Array> {
  const book = new ExcelJS.Workbook()
  book.created = new Date('2026-10-23T09:00:00Z')
  const sheet = book.addWorksheet('Results')
  sheet.addRow(['Lot', 'Sampled', 'SG', 'Temp °C', 'Titratable acidity (% w/v as malic)', 'pH', 'Total polyphenols (mg/L)'])
  for (const r of rows) sheet.addRow([r.lot, new Date(`${r.on}T00:00:00Z`), r.sgAsRead, r.tempC, Number((r.taMalic / 10).toFixed(3)), r.ph, Math.round(r.tannin * 1000)])
  return new Uint8Array(await book.xlsx.writeBuffer() as ArrayBuffer)
}

const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet'

function storage(): { client: S3Client, bucket: string } {
  const client = new S3Client({
    endpoint: process.env.S3_ENDPOINT || 'http://127.0.0.1:4568',
    region: process.env.S3_REGION || 'us-east-1',
    credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID || 'S3RVER', secretAccessKey: process.env.S3_SECRET_ACCESS_KEY || 'S3RVER' },
    forcePathStyle: true,
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  })
  return { client, bucket: process.env.S3_BUCKET || 'pomewright-files' }
}

interface Sheet {
  name: string
  bytes: Uint8Array
  contentType: string
  kind: 'csv' | 'xlsx' | 'pdf'
  headers: string[] | null
  /** How the grower mapped the columns, kept for the next sheet with these headers. */
  saved?: { mapping: ColumnMapping, options: ImportOptions }
  uploadedAt: string
  /** `row` is the sheet's row (the header is 1), or null for a reading typed in from a PDF. */
  readings: { lot: string, on: string, row: number | null, raw: RawReading }[]
}

// Pennock Hill bench (PDF): one sample of Hollowmere's last pick, typed in from the sheet.
const PENNOCK = { lot: 'HM-26-016', on: '2026-11-05', brix: 13.5, taMalic: 2.3, ph: 4.3, tannin: 3.2 }

function pennockPdf(): Uint8Array {
  const r = PENNOCK
  return textPdf([
    { text: 'Pennock Hill Juice Bench', bold: true, size: 16 },
    { text: 'Certificate of analysis: pressed apple juice', size: 12 },
    { text: 'Client: Hollowmere Orchard & Nursery', gapBefore: 10 },
    { text: `Sample: lot ${r.lot}, received 2026-11-05, tested ${dayFirst(r.on)}` },
    { text: 'Result               Value       Method', bold: true, mono: true, size: 10, gapBefore: 14 },
    { text: `Soluble solids       ${r.brix.toFixed(1)} °Brix  refractometer, 20 °C`, mono: true, size: 10 },
    { text: `Titratable acidity   ${r.taMalic.toFixed(1)} g/L     as malic acid, to pH 8.2`, mono: true, size: 10 },
    { text: `pH                   ${r.ph.toFixed(2)}        glass electrode`, mono: true, size: 10 },
    { text: `Tannin               ${r.tannin.toFixed(1)} g/L     as tannic acid equivalent`, mono: true, size: 10 },
    { text: 'Results relate only to the sample as received.', size: 9, gapBefore: 18 },
  ])
}

async function sheetsOf(org: Grower): Promise<Sheet[]> {
  const estry = ESTRY[org]
  const cold = COLDWATER[org]
  const csv = estryCsv(estry)
  return [
    {
      name: `estry-valley-juice-lab-${org === HOLLOWMERE ? 'hollowmere' : 'tansy-row'}-2026-10.csv`,
      bytes: new TextEncoder().encode(csv),
      contentType: 'text/csv',
      kind: 'csv',
      headers: csv.replace(/^\uFEFF/, '').split('\r\n')[0]!.split(';'),
      saved: {
        mapping: { lotCode: 'Sample ref', sampledOn: 'Date sampled', brix: 'Brix (°Bx)', ta: 'TA (g/L tartaric)', ph: 'pH', tannin: 'Tannin (g/L)', yan: 'YAN (mg/L)', taAs: 'tartaric', taUnit: 'g/L', tanninUnit: 'g/L' },
        options: { dateFormat: 'DD/MM/YYYY', decimalComma: true },
      },
      uploadedAt: `${estry.at(-1)!.on}T16:00:00Z`,
      readings: estry.map((r, i) => ({
        lot: r.lot, on: r.on, row: i + 2,
        raw: { brix: r.brix, ta: Number(convertAcid(r.taMalic, 'malic').tartaric.toFixed(2)), taAs: 'tartaric', taUnit: 'g/L', ph: r.ph, tannin: r.tannin, tanninUnit: 'g/L', yan: r.yan ?? null },
      })),
    },
    {
      name: `coldwater-bench-results-${org === HOLLOWMERE ? 'hollowmere' : 'tansy-row'}.xlsx`,
      bytes: await coldwaterXlsx(cold),
      contentType: XLSX_TYPE,
      kind: 'xlsx',
      headers: ['Lot', 'Sampled', 'SG', 'Temp °C', 'Titratable acidity (% w/v as malic)', 'pH', 'Total polyphenols (mg/L)'],
      saved: {
        mapping: { lotCode: 'Lot', sampledOn: 'Sampled', sg: 'SG', tempC: 'Temp °C', ta: 'Titratable acidity (% w/v as malic)', ph: 'pH', tannin: 'Total polyphenols (mg/L)', taAs: 'malic', taUnit: '% w/v', tanninUnit: 'mg/L' },
        options: { dateFormat: 'YYYY-MM-DD', decimalComma: false },
      },
      uploadedAt: `${cold.at(-1)!.on}T17:30:00Z`,
      readings: cold.map((r, i) => ({
        lot: r.lot, on: r.on, row: i + 2,
        raw: { sg: r.sgAsRead, tempC: r.tempC, ta: Number((r.taMalic / 10).toFixed(3)), taAs: 'malic', taUnit: '% w/v', ph: r.ph, tannin: Math.round(r.tannin * 1000), tanninUnit: 'mg/L' },
      })),
    },
    ...(org === HOLLOWMERE
      ? [{
          name: 'pennock-hill-certificate-HM-26-016.pdf',
          bytes: pennockPdf(),
          contentType: 'application/pdf',
          kind: 'pdf' as const,
          headers: null,
          uploadedAt: '2026-11-06T11:20:00Z',
          readings: [{ lot: PENNOCK.lot, on: PENNOCK.on, row: null, raw: { brix: PENNOCK.brix, ta: PENNOCK.taMalic, taAs: 'malic', taUnit: 'g/L', ph: PENNOCK.ph, tannin: PENNOCK.tannin, tanninUnit: 'g/L' } as RawReading }],
        }]
      : []),
  ]
}

export async function seed(knex: Knex): Promise<void> {
  const orgs = await knex('organisations').whereIn('name', [HOLLOWMERE, TANSY_ROW]).select('id', 'name', 'hydrometerCalibrationC') as { id: number, name: Grower, hydrometerCalibrationC: string }[]
  if (orgs.length !== 2) {
    console.warn('Demo lots skipped: Hollowmere or Tansy Row is not there (seed the demo accounts first).')
    return
  }
  if (await knex('harvestLots').whereIn('orgId', orgs.map(o => o.id)).first('id')) {
    console.warn('Demo lots skipped: the growers already have lots.')
    return
  }
  const s3 = storage()
  await knex.transaction(async (trx) => {
    for (const org of orgs) {
      const owner = await trx('users').where({ email: OWNER[org.name] }).first('id', 'name') as { id: number, name: string } | undefined
      const lots = new Map<string, { id: number, species: FruitSpecies }>()
      for (const lot of DEMO_LOTS.filter(l => l.org === org.name)) {
        const block = await trx('orchardBlocks as b').join('varieties as v', 'v.id', 'b.varietyId').where({ 'b.orgId': org.id, 'b.name': lot.block })
          .first('b.id', 'b.varietyId', 'v.species') as { id: number, varietyId: number, species: FruitSpecies } | undefined
        if (!block) throw new Error(`Demo lots: ${org.name} has no block ${lot.block}`)
        const [id] = await trx('harvestLots').insert({
          orgId: org.id, code: lot.code, blockId: block.id, varietyId: block.varietyId, pickedOn: lot.pickedOn, harvestYear: Number(lot.pickedOn.slice(0, 4)),
          netKg: lot.netKg, bins: lot.bins, notes: lot.notes ?? null, state: 'available', createdByUserId: owner?.id ?? null,
          createdAt: new Date(`${lot.pickedOn}T18:00:00Z`), updatedAt: new Date(`${lot.pickedOn}T18:00:00Z`),
        })
        lots.set(lot.code, { id: id!, species: block.species })
      }
      for (const sheet of await sheetsOf(org.name)) {
        const sha256 = createHash('sha256').update(sheet.bytes).digest('hex')
        const objectKey = `lab-sheets/${org.id}/${sha256}`
        await s3.client.send(new PutObjectCommand({ Bucket: s3.bucket, Key: objectKey, Body: sheet.bytes, ContentType: sheet.contentType, ContentLength: sheet.bytes.length, Metadata: { sha256 } }))
        const [sheetId] = await trx('labSheets').insert({
          orgId: org.id, name: sheet.name, objectKey, sha256, sizeBytes: sheet.bytes.length, contentType: sheet.contentType, kind: sheet.kind,
          headers: sheet.headers && JSON.stringify(sheet.headers), uploadedByUserId: owner?.id ?? null, uploadedByName: owner?.name ?? 'Demo',
          uploadedAt: new Date(sheet.uploadedAt),
          // A PDF is never imported: its readings were typed in by hand against it.
          ...(sheet.kind === 'pdf' ? {} : { importedAt: new Date(sheet.uploadedAt), importedCount: sheet.readings.length, skippedCount: 0 }),
        })
        if (sheet.saved && sheet.headers) {
          await trx('sheetMappings').insert({
            orgId: org.id, headersKey: createHash('sha256').update(headersKeyText(sheet.headers)).digest('hex'), headers: JSON.stringify(sheet.headers),
            mapping: JSON.stringify(sheet.saved.mapping), options: JSON.stringify(sheet.saved.options), updatedAt: new Date(sheet.uploadedAt),
          })
        }
        for (const r of sheet.readings) {
          const lot = lots.get(r.lot)!
          const normal = normaliseReading(r.raw, { calibrationC: Number(org.hydrometerCalibrationC), species: lot.species })
          if (!normal.ok) throw new Error(`Demo lots: ${r.lot} on ${r.on}: ${normal.issues.map(i => i.message).join('; ')}`)
          await trx('juiceReadings').insert({
            orgId: org.id, lotId: lot.id, labSheetId: sheetId, sheetRow: r.row, sampledOn: r.on, ...normal.reading,
            enteredByUserId: owner?.id ?? null, createdAt: new Date(sheet.uploadedAt),
          })
        }
      }
    }
  })
}
