import { beforeAll, describe, expect, it } from 'vitest'
import { testDb } from '../support/db'
import { as } from '../support/http'
import { labImportFixtures } from '../support/labImport'

// Lab sheets in six layouts imported by Hollowmere's owner through mappings: the suggestion from
// the headers, then the one saved for the same headers; a sheet with bad rows refused whole, or its
// good rows kept when asked. Lots FX-101…103 are Hollowmere's for this file; FX-104 is Tansy Row's.
const db = testDb()
const { lot, sheet } = labImportFixtures('lab import')
const lotIds: Record<string, number> = {}

beforeAll(async () => {
  lotIds['FX-101'] = await lot('FX-101', 'Dabinett', '2025-10-01')
  lotIds['FX-102'] = await lot('FX-102', 'Kingston Black', '2025-10-06')
  lotIds['FX-103'] = await lot('FX-103', 'Blakeney Red', '2025-09-25')
  await lot('FX-104', 'Dabinett', '2025-10-01', 'tansyRow')
})

const readingsOf = (sheetId: number) => db('juice_readings').where({ lab_sheet_id: sheetId }).orderBy('sheet_row')
const num = (v: unknown) => (v === null ? null : Number(v))

describe('a sheet imported through the mapping suggested from its headers', () => {
  it('offers the columns by their names and imports every reading', async () => {
    const grower = await as('growerOwner')
    const id = await sheet('ashcombe-lab.csv')
    const offered = await grower.get(`/api/lab-sheets/${id}/mapping`)
    expect(offered.status).toBe(200)
    expect(offered.body.saved).toBe(false)
    expect(offered.body.headers).toEqual(['Lot', 'Date', 'Brix', 'SG', 'Temp', 'TA', 'pH', 'Tannin', 'YAN'])
    expect(offered.body.preview[0]).toEqual(['FX-101', '2025-10-08', '12.4', '1.0501', '20', '2.1', '3.9', '2.6', '110'])
    expect(offered.body.mapping).toEqual({
      lotCode: 'Lot', sampledOn: 'Date', brix: 'Brix', sg: 'SG', tempC: 'Temp', ta: 'TA', ph: 'pH', tannin: 'Tannin', yan: 'YAN',
      taAs: 'malic', taUnit: 'g/L', tanninUnit: 'g/L',
    })

    const res = await grower.post(`/api/lab-sheets/${id}/import`, { mapping: offered.body.mapping })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body).toMatchObject({ imported: 3, skipped: 0, errors: [] })
    const rows = await readingsOf(id)
    expect(rows.map(r => [r.sheet_row, r.lot_id, r.sampled_on])).toEqual([
      [2, lotIds['FX-101'], '2025-10-08'], [3, lotIds['FX-102'], '2025-10-09'], [4, lotIds['FX-103'], '2025-10-10'],
    ])
    // Read at 20 °C, Hollowmere's calibration temperature: no correction (common practice).
    expect(num(rows[0].sg)).toBe(1.0501)
    expect(num(rows[0].ta_g_per_l)).toBe(2.1)
    expect(num(rows[0].yan_mg_per_l)).toBe(110)
    // Read at 19.5 °C: the corrected SG stays within a ten-thousandth of the reading (from memory: about 0.0001 a degree near 20 °C).
    expect(num(rows[1].sg_as_read)).toBe(1.053)
    expect(Math.abs(num(rows[1].sg)! - 1.053)).toBeLessThanOrEqual(0.0001)
    const sheetRow = await db('lab_sheets').where({ id }).first()
    expect(sheetRow.imported_at).not.toBeNull()
    expect([sheetRow.imported_count, sheetRow.skipped_count]).toEqual([3, 0])
  })

  it('reads a workbook, its date cells as days', async () => {
    const grower = await as('growerOwner')
    const id = await sheet('pressroom-lab.xlsx')
    const offered = await grower.get(`/api/lab-sheets/${id}/mapping`)
    expect(offered.body.mapping).toMatchObject({ lotCode: 'Lot code', sampledOn: 'Sample date', brix: 'Brix', sg: 'SG', tempC: 'Temp °C', ta: 'Acidity (g/L malic)', tannin: 'Tannin (g/L)', taAs: 'malic', taUnit: 'g/L' })
    const res = await grower.post(`/api/lab-sheets/${id}/import`, { mapping: offered.body.mapping })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.imported).toBe(2)
    const rows = await readingsOf(id)
    expect(rows.map(r => [r.sampled_on, num(r.ta_g_per_l), num(r.tannin_g_per_l)])).toEqual([['2025-10-25', 7.2, 2.1], ['2025-10-26', 2.3, 1.7]])
  })

  it('converts TA given as sulfuric in % w/v and tannin in mg/L, dates month first', async () => {
    const grower = await as('growerOwner')
    const id = await sheet('northfield-lab.csv')
    const offered = await grower.get(`/api/lab-sheets/${id}/mapping`)
    expect(offered.body.mapping).toMatchObject({ lotCode: 'Lot No', sampledOn: 'Sample Date', ta: 'TA % w/v (as sulfuric)', taAs: 'sulfuric', taUnit: '% w/v', tannin: 'Tannin mg/L', tanninUnit: 'mg/L', yan: 'YAN mg/L' })
    const res = await grower.post(`/api/lab-sheets/${id}/import`, { mapping: offered.body.mapping, dateFormat: 'MM/DD/YYYY' })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    const [first] = await readingsOf(id)
    expect(first.sampled_on).toBe('2025-10-20')
    // 0.14 % w/v = 1.4 g/L as sulfuric; × 134.09/98.08 (both diprotic: CRC Handbook molar masses) = 1.91 g/L as malic.
    expect(num(first.ta_g_per_l)).toBeCloseTo(1.91, 2)
    expect([first.ta_reported_as, num(first.ta_reported_value), first.ta_reported_unit]).toEqual(['sulfuric', 0.14, '% w/v'])
    expect(num(first.tannin_g_per_l)).toBe(2.4) // 2400 mg/L = 2.4 g/L (common practice)
  })
})

describe('a saved mapping', () => {
  const fernleigh = {
    lotCode: 'Sample ref', sampledOn: 'Sampled', brix: '°Bx', ta: 'TA (g/L tartaric)', ph: 'pH', tannin: 'Tannin (%)',
    taAs: 'tartaric', taUnit: 'g/L', tanninUnit: '%',
  }

  it('is offered again for the next sheet with the same headers, with its date format and decimal comma', async () => {
    const grower = await as('growerOwner')
    const october = await sheet('fernleigh-lab-2025-10.csv')
    const first = await grower.get(`/api/lab-sheets/${october}/mapping`)
    expect(first.body.saved).toBe(false)
    expect(first.body.mapping).toMatchObject({ ...fernleigh, ph: 'pH' })
    const imported = await grower.post(`/api/lab-sheets/${october}/import`, { mapping: fernleigh, dateFormat: 'DD/MM/YYYY', decimalComma: true })
    expect(imported.status, JSON.stringify(imported.body)).toBe(200)
    expect(imported.body.imported).toBe(2)
    const [row] = await readingsOf(october)
    expect(row.sampled_on).toBe('2025-10-14')
    expect(num(row.brix)).toBe(12.6)
    expect(num(row.ph)).toBe(3.85)
    // 2.5 g/L as tartaric × 134.09/150.09 (CRC Handbook molar masses, both diprotic) = 2.23 g/L as malic.
    expect(num(row.ta_g_per_l)).toBeCloseTo(2.23, 2)
    expect(num(row.tannin_g_per_l)).toBe(2.5) // 0.25 % w/v = 2.5 g/L (common practice)

    const november = await sheet('fernleigh-lab-2025-11.csv')
    const offered = await grower.get(`/api/lab-sheets/${november}/mapping`)
    expect(offered.status).toBe(200)
    expect(offered.body).toMatchObject({ saved: true, mapping: fernleigh, dateFormat: 'DD/MM/YYYY', decimalComma: true })
    const again = await grower.post(`/api/lab-sheets/${november}/import`, { mapping: offered.body.mapping, dateFormat: offered.body.dateFormat, decimalComma: offered.body.decimalComma })
    expect(again.status, JSON.stringify(again.body)).toBe(200)
    expect((await readingsOf(november)).map(r => r.sampled_on)).toEqual(['2025-11-04', '2025-11-05'])
  })

  it('is not offered to another organisation with the same headers', async () => {
    const tansy = await as('grower2Owner')
    const id = await sheet('fernleigh-lab-2025-10.csv', { org: 'tansyRow' })
    const offered = await tansy.get(`/api/lab-sheets/${id}/mapping`)
    expect(offered.status).toBe(200)
    expect(offered.body.saved).toBe(false)
    expect(offered.body.decimalComma).toBe(false)
  })
})

describe('bad rows', () => {
  const mapping = { lotCode: 'Lot', sampledOn: 'Date', brix: 'Brix', ta: 'TA', ph: 'pH' }

  it('refuse the whole sheet, naming each row and field, and nothing is kept', async () => {
    const grower = await as('growerOwner')
    const id = await sheet('bad-rows.csv')
    const res = await grower.post(`/api/lab-sheets/${id}/import`, { mapping })
    expect(res.status).toBe(422)
    expect(res.body.data.errors.map((e: { row: number, field: string }) => [e.row, e.field])).toEqual([
      [3, 'lotCode'], // FX-999: no such lot
      [4, 'sampledOn'], // 31 February
      [5, 'sampledOn'], // before FX-103 was picked
      [6, 'sampledOn'], // in the future
      [7, 'brix'], // 85 °Brix: no juice
      [8, 'sampledOn'], // FX-101 on 2025-10-12 again (row 2)
    ])
    const messages = res.body.data.errors.map((e: { message: string }) => e.message)
    expect(messages[0]).toMatch(/FX-999/)
    expect(messages[2]).toMatch(/before the lot was picked/)
    expect(messages[5]).toMatch(/Row 2/)
    expect(await readingsOf(id)).toHaveLength(0)
    expect((await db('lab_sheets').where({ id }).first()).imported_at).toBeNull()

    const skipped = await grower.post(`/api/lab-sheets/${id}/import`, { mapping, skipBadRows: true })
    expect(skipped.status, JSON.stringify(skipped.body)).toBe(200)
    expect(skipped.body).toMatchObject({ imported: 2, skipped: 6 })
    expect(skipped.body.errors.map((e: { row: number }) => e.row)).toEqual([3, 4, 5, 6, 7, 8])
    expect((await readingsOf(id)).map(r => r.sheet_row)).toEqual([2, 9])
    const row = await db('lab_sheets').where({ id }).first()
    expect([row.imported_count, row.skipped_count]).toEqual([2, 6])
  })

  it('include a lot code of another organisation, which is no lot of this one', async () => {
    const grower = await as('growerOwner')
    const id = await sheet('other-lot.csv', { bytes: new TextEncoder().encode('Lot,Date,Brix\nFX-104,2025-10-12,12.0\n') })
    const res = await grower.post(`/api/lab-sheets/${id}/import`, { mapping: { lotCode: 'Lot', sampledOn: 'Date', brix: 'Brix' } })
    expect(res.status).toBe(422)
    expect(res.body.data.errors).toEqual([{ row: 2, field: 'lotCode', message: 'No lot of yours has the code "FX-104"' }])
  })

  it('include a decimal point on a sheet set to decimal comma, named by row and field', async () => {
    const grower = await as('growerOwner')
    const id = await sheet('ashcombe-lab.csv')
    const res = await grower.post(`/api/lab-sheets/${id}/import`, { mapping: { lotCode: 'Lot', sampledOn: 'Date', brix: 'Brix' }, decimalComma: true })
    expect(res.status).toBe(422)
    expect(res.body.data.errors[0]).toEqual({ row: 2, field: 'brix', message: '"12.4" has a decimal point, but the sheet is set to a decimal comma' })
  })
})

describe('refusals', () => {
  it('a second import of one sheet is 409, and the readings stay once', async () => {
    const grower = await as('growerOwner')
    const id = await sheet('pressroom-lab.xlsx')
    const mapping = { lotCode: 'Lot code', sampledOn: 'Sample date', brix: 'Brix' }
    expect((await grower.post(`/api/lab-sheets/${id}/import`, { mapping })).status).toBe(200)
    const twice = await grower.post(`/api/lab-sheets/${id}/import`, { mapping })
    expect(twice.status).toBe(409)
    expect(twice.body.message).toMatch(/imported/)
    expect(await readingsOf(id)).toHaveLength(2)
  })

  it('a PDF sheet is 409: its readings are typed by hand', async () => {
    const grower = await as('growerOwner')
    const id = await sheet('results.pdf', { bytes: new TextEncoder().encode('%PDF-1.4\n%%EOF\n') })
    const res = await grower.post(`/api/lab-sheets/${id}/import`, { mapping: { lotCode: 'Lot', sampledOn: 'Date' } })
    expect(res.status).toBe(409)
    expect(res.body.message).toMatch(/by hand/)
    const offered = await grower.get(`/api/lab-sheets/${id}/mapping`)
    expect(offered.status).toBe(200)
    expect([offered.body.sheet.kind, offered.body.headers]).toEqual(['pdf', []])
  })

  it('another organisation\'s sheet is not found', async () => {
    const grower = await as('growerOwner')
    const id = await sheet('ashcombe-lab.csv', { org: 'tansyRow' })
    expect((await grower.get(`/api/lab-sheets/${id}/mapping`)).status).toBe(404)
    expect((await grower.post(`/api/lab-sheets/${id}/import`, { mapping: { lotCode: 'Lot', sampledOn: 'Date' } })).status).toBe(404)
    expect(await readingsOf(id)).toHaveLength(0)
  })

  it('a sheet whose file is gone from the store is not found, on both routes', async () => {
    const grower = await as('growerOwner')
    const id = await sheet('ashcombe-lab.csv')
    await db('lab_sheets').where({ id }).update({ object_key: `lab-sheets/missing-${id}/ashcombe-lab.csv` })
    const offered = await grower.get(`/api/lab-sheets/${id}/mapping`)
    expect(offered.status).toBe(404)
    expect(offered.body.message).toMatch(/file of that lab sheet/)
    expect((await grower.post(`/api/lab-sheets/${id}/import`, { mapping: { lotCode: 'Lot', sampledOn: 'Date' } })).status).toBe(404)
  })

  it('a mapping to a column the sheet does not have is 400 naming the field', async () => {
    const grower = await as('growerOwner')
    const id = await sheet('ashcombe-lab.csv')
    const res = await grower.post(`/api/lab-sheets/${id}/import`, { mapping: { lotCode: 'Lot', sampledOn: 'Date', brix: 'Sugar' } })
    expect(res.status).toBe(400)
    expect(res.body.data.issues).toEqual([{ path: 'mapping.brix', message: 'The sheet has no column "Sugar"' }])
    const noLot = await grower.post(`/api/lab-sheets/${id}/import`, { mapping: { sampledOn: 'Date' } })
    expect(noLot.status).toBe(400)
    expect(noLot.body.data.issues.map((i: { path: string }) => i.path)).toContain('mapping.lotCode')
    const badFormat = await grower.post(`/api/lab-sheets/${id}/import`, { mapping: { lotCode: 'Lot', sampledOn: 'Date' }, dateFormat: 'DD.MM.YY' })
    expect(badFormat.status).toBe(400)
    expect(badFormat.body.data.issues[0].path).toBe('dateFormat')
    expect(await readingsOf(id)).toHaveLength(0)
  })
})
