import { createHash } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { convertAcid } from '../../shared/utils/acid'
import { DEMO_LOTS } from '../../server/db/seeds/08_demo_lots'
import { testDb } from '../support/db'
import { testEnv } from '../support/env'
import { as } from '../support/http'

// This season's lots and lab sheets as the demo seeds them, read through the API as each party
// sees them. Other tests add lots of their own, so only the seeded codes are looked at.
const db = testDb()
const SEEDED = new Set(DEMO_LOTS.map(l => l.code))

interface Lot { id: number, code: string, orgName: string, varietyName: string, varietyClass: string, juiceClass: string | null, latestReading: { taGPerL: number | null, taReportedAs: string | null, sg: number | null, tanninGPerL: number | null } | null }

async function seededLots(caller: Parameters<typeof as>[0]): Promise<Lot[]> {
  const res = await (await as(caller)).get('/api/lots?harvestYear=2026&limit=200')
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  return (res.body.items as Lot[]).filter(l => SEEDED.has(l.code))
}

describe('the demo\'s harvest lots', () => {
  it('gives Hollowmere six lots of this season, each with a reading from a sheet', async () => {
    const lots = await seededLots('growerOwner')
    expect(lots.map(l => l.code).sort()).toEqual(['HM-26-011', 'HM-26-012', 'HM-26-013', 'HM-26-014', 'HM-26-015', 'HM-26-016'])
    expect(lots.filter(l => l.latestReading).length).toBe(6)
    // The Estry lab's TA as tartaric, stored as malic: 2.1 g/L malic wrote as 2.35 tartaric
    // (equivalent weights 67.04 and 75.04, AWRI "Interconversion of acidity units").
    const dabinett = lots.find(l => l.code === 'HM-26-011')!
    expect(dabinett.latestReading).toMatchObject({ taReportedAs: 'tartaric' })
    expect(dabinett.latestReading!.taGPerL).toBeCloseTo(convertAcid(2.35, 'tartaric').malic, 2)
    expect(dabinett.juiceClass).toBe('bittersweet')
    // Brown's Apple, a sharp: TA 6.6 g/L as malic, tannin 1.2 g/L (Long Ashton thresholds 4.5 and 2.0).
    expect(lots.find(l => l.code === 'HM-26-014')!.juiceClass).toBe('sharp')
  })

  it('lets Quillhurst see exactly Tansy Row\'s bittersharp lots its fruit contract covers, and Marrowby none', async () => {
    const quillhurst = await seededLots('makerOwner')
    expect(quillhurst.map(l => l.code).sort()).toEqual(['TR-26-001', 'TR-26-002', 'TR-26-003', 'TR-26-004', 'TR-26-005'])
    expect(new Set(quillhurst.map(l => l.varietyClass))).toEqual(new Set(['bittersharp']))
    expect(await seededLots('maker2Owner')).toEqual([])
  })

  it('keeps two lab sheets per grower in the file store, as uploaded, with their readings', async () => {
    for (const [caller, org] of [['growerOwner', 'Hollowmere Orchard & Nursery'], ['grower2Owner', 'Tansy Row Fruit']] as const) {
      const { id: orgId } = await db('organisations').where({ name: org }).first('id')
      const sheets = await db('lab_sheets').where({ org_id: orgId }).whereIn('name', await seededNames(orgId)).select('id', 'kind', 'sha256', 'imported_count')
      expect(sheets.map(s => s.kind).sort()).toEqual(['csv', 'xlsx'])
      const client = await as(caller)
      for (const sheet of sheets) {
        expect(sheet.imported_count).toBe(Number((await db('juice_readings').where({ lab_sheet_id: sheet.id }).count({ n: '*' }))[0]!.n))
        const res = await client.get(`/api/lab-sheets/${sheet.id}/download`)
        expect(res.status).toBe(302)
        const bytes = new Uint8Array(await (await fetch(res.headers.get('location')!)).arrayBuffer())
        expect(createHash('sha256').update(bytes).digest('hex')).toBe(sheet.sha256)
      }
    }
  })
})

describe('the demo\'s PDF sheet and kept mappings', () => {
  it('shows Hollowmere the Pennock Hill certificate inline, with the reading typed in from it', async () => {
    const client = await as('growerOwner')
    const pdf = await db('lab_sheets').where({ name: 'pennock-hill-certificate-HM-26-016.pdf' }).first('id', 'kind', 'sha256', 'imported_at')
    expect(pdf).toMatchObject({ kind: 'pdf', imported_at: null })
    const shown = await client.get(`/api/lab-sheets/${pdf.id}/pdf`)
    expect(shown.status).toBe(200)
    expect(shown.headers.get('content-type')).toBe('application/pdf')
    const cookie = [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
    const bytes = new Uint8Array(await (await fetch(`${testEnv.appUrl}/api/lab-sheets/${pdf.id}/pdf`, { headers: { cookie } })).arrayBuffer())
    expect(createHash('sha256').update(bytes).digest('hex')).toBe(pdf.sha256)
    expect(Buffer.from(bytes.subarray(0, 5)).toString('latin1')).toBe('%PDF-')
    const lot = (await seededLots('growerOwner')).find(l => l.code === 'HM-26-016')!
    const readings = await client.get(`/api/lots/${lot.id}/readings`)
    expect(readings.body.items).toEqual([expect.objectContaining({ labSheetId: pdf.id, sheetRow: null, sampledOn: '2026-11-05', brix: 13.5 })])
  })

  it('offers each grower its kept mapping for the two layouts it imported', async () => {
    for (const [caller, org] of [['growerOwner', 'Hollowmere Orchard & Nursery'], ['grower2Owner', 'Tansy Row Fruit']] as const) {
      const { id: orgId } = await db('organisations').where({ name: org }).first('id')
      const client = await as(caller)
      for (const name of await seededNames(orgId)) {
        const sheet = await db('lab_sheets').where({ org_id: orgId, name }).first('id', 'kind')
        const res = await client.get(`/api/lab-sheets/${sheet.id}/mapping`)
        expect(res.status, JSON.stringify(res.body)).toBe(200)
        expect(res.body.saved).toBe(true)
        expect(res.body.mapping).toMatchObject(sheet.kind === 'csv'
          ? { lotCode: 'Sample ref', sampledOn: 'Date sampled', ta: 'TA (g/L tartaric)', taAs: 'tartaric' }
          : { lotCode: 'Lot', sg: 'SG', tempC: 'Temp °C', taUnit: '% w/v', tanninUnit: 'mg/L' })
        expect({ dateFormat: res.body.dateFormat, decimalComma: res.body.decimalComma }).toEqual(sheet.kind === 'csv' ? { dateFormat: 'DD/MM/YYYY', decimalComma: true } : { dateFormat: 'YYYY-MM-DD', decimalComma: false })
      }
    }
  })
})

async function seededNames(orgId: number): Promise<string[]> {
  const rows = await db('lab_sheets').where({ org_id: orgId }).andWhere(q => q.where('name', 'like', 'estry-valley-juice-lab-%').orWhere('name', 'like', 'coldwater-bench-results-%')).select('name')
  return rows.map(r => r.name as string)
}
