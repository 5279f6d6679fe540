import { describe, expect, it } from 'vitest'
import { accessTable } from '../support/access'
import { as, CALLERS, type Caller } from '../support/http'
import { freshCsv, labSheetFixtures, uploadSheets } from '../support/labSheets'

// Lab sheets, every route and every kind of caller. Growers' owners and members upload (Hollowmere
// and Tansy Row both grow fruit); a maker, a viewer or the platform admin may not (403), a
// signed-out caller is asked to sign in (401). Every tenant lists its sheets; another's sheet is
// not found (404), except by a maker whose accepted contract covers every lot on it: Quillhurst
// buys Tansy Row's Dabinett, so it (owner and viewer) sees and downloads Tansy Row's sheet of a
// Dabinett lot, while Marrowby, with no such contract, does not.
const MARK = 'Access lab sheets'
const { lot, readings, sheets } = labSheetFixtures(MARK)

type Expect = Record<Caller, number>
const tenants = (status: number): Expect => ({
  anonymous: 401, admin: 403, growerOwner: status, growerMember: status, grower2Owner: status, makerOwner: status, makerViewer: status, maker2Owner: status,
})
const hollowmereOnly = (status: number): Expect => ({ ...tenants(404), growerOwner: status, growerMember: status })
const tansyRowAndItsMaker = (status: number): Expect => ({ ...tenants(404), grower2Owner: status, makerOwner: status, makerViewer: status })
const uploaders: Expect = { ...tenants(403), anonymous: 401, growerOwner: 201, growerMember: 201, grower2Owner: 201 }

async function uploaded(caller: Caller): Promise<number> {
  const res = await uploadSheets(await as(caller), [{ name: `${MARK}.csv`, bytes: freshCsv() }])
  if (res.status !== 201) throw new Error(`upload as ${caller}: ${res.status} ${JSON.stringify(res.body)}`)
  sheets.push(res.body[0].id)
  return res.body[0].id
}

let hollowmereSheet: Promise<number> | undefined
let tansyRowSheet: Promise<number> | undefined
const ownSheet = () => (hollowmereSheet ??= uploaded('growerOwner'))
const coveredSheet = () => (tansyRowSheet ??= (async () => {
  const id = await uploaded('grower2Owner')
  await readings(id, [await lot('Dabinett')])
  return id
})())

const PDF = () => Buffer.from(`%PDF-1.4\n1 0 obj << /Type /Catalog /Pages 2 0 R >> endobj\n2 0 obj << /Type /Pages /Kids [] /Count 0 >> endobj\ntrailer << /Root 1 0 R >>\n% ${MARK} ${Date.now()} ${Math.random()}\n%%EOF\n`)
async function uploadedPdf(caller: Caller): Promise<number> {
  const res = await uploadSheets(await as(caller), [{ name: `${MARK}.pdf`, bytes: PDF() }])
  if (res.status !== 201) throw new Error(`upload as ${caller}: ${res.status} ${JSON.stringify(res.body)}`)
  sheets.push(res.body[0].id)
  return res.body[0].id
}
let hollowmerePdf: Promise<number> | undefined
let tansyRowPdf: Promise<number> | undefined
const ownPdf = () => (hollowmerePdf ??= uploadedPdf('growerOwner'))
// A PDF's readings are typed in by hand against the sheet; one of a lot the maker's contract covers.
const coveredPdf = () => (tansyRowPdf ??= (async () => {
  const id = await uploadedPdf('grower2Owner')
  await readings(id, [await lot('Dabinett')])
  return id
})())

describe('access control: uploading lab sheets', () => {
  for (const caller of CALLERS) {
    it(`POST /api/lab-sheets as ${caller} → ${uploaders[caller]}`, async () => {
      const res = await uploadSheets(await as(caller), [{ name: 'results.csv', bytes: freshCsv() }])
      if (res.status === 201) sheets.push(res.body[0].id)
      expect(res.status, JSON.stringify(res.body)).toBe(uploaders[caller])
    })
  }
})

accessTable('lab sheets', [
  { route: 'GET /api/lab-sheets', expect: tenants(200) },
  { route: 'GET /api/lab-sheets/:id', path: async () => `/api/lab-sheets/${await ownSheet()}`, expect: hollowmereOnly(200) },
  { route: 'GET /api/lab-sheets/:id/download', path: async () => `/api/lab-sheets/${await ownSheet()}/download`, expect: hollowmereOnly(302) },
  { route: 'GET /api/lab-sheets/:id (a lot a maker\'s contract covers)', path: async () => `/api/lab-sheets/${await coveredSheet()}`, expect: tansyRowAndItsMaker(200) },
  { route: 'GET /api/lab-sheets/:id/download (a lot a maker\'s contract covers)', path: async () => `/api/lab-sheets/${await coveredSheet()}/download`, expect: tansyRowAndItsMaker(302) },
  { route: 'GET /api/lab-sheets/:id/pdf', path: async () => `/api/lab-sheets/${await ownPdf()}/pdf`, expect: hollowmereOnly(200) },
  { route: 'GET /api/lab-sheets/:id/pdf (a lot a maker\'s contract covers)', path: async () => `/api/lab-sheets/${await coveredPdf()}/pdf`, expect: tansyRowAndItsMaker(200) },
  { route: 'GET /api/lab-sheets/:id (none)', path: async () => '/api/lab-sheets/999999999', expect: tenants(404) },
])
