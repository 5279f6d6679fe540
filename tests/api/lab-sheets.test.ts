import { createHash } from 'node:crypto'
import { request } from 'node:http'
import ExcelJS from 'exceljs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { orgId } from '../support/contracts'
import { testDb } from '../support/db'
import { testEnv, DEMO_PASSWORD } from '../support/env'
import { ApiClient, as, DEMO_USERS } from '../support/http'
import { startInstance, type Instance } from '../support/instance'
import { freshCsv, labSheetFixtures, objectExists, uploadSheets } from '../support/labSheets'

// Lab sheets through the API: a file stored unchanged and fetched back through a short-lived link,
// its sha-256 and its table's first rows; the same bytes twice as one sheet; a file refused for
// what its bytes are, for its size, or because the file store is down (leaving nothing behind);
// and who may see and download a sheet.
const MARK = 'Lab sheets test'
const { lot, readings, sheets } = labSheetFixtures(MARK)
const db = testDb()
const MiB = 1024 * 1024
const sha = (bytes: Uint8Array | string) => createHash('sha256').update(bytes).digest('hex')
const PNG = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d49444154789c6360000002000154a24f5d0000000049454e44ae426082', 'hex')
const PDF = Buffer.from('%PDF-1.4\n1 0 obj << /Type /Catalog /Pages 2 0 R >> endobj\n2 0 obj << /Type /Pages /Kids [] /Count 0 >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n')

async function xlsx(rows: (string | number | Date)[][]): Promise<Buffer> {
  const book = new ExcelJS.Workbook()
  const sheet = book.addWorksheet('Results')
  for (const row of rows) sheet.addRow(row)
  return Buffer.from(await book.xlsx.writeBuffer())
}

async function grower() {
  return as('grower2Owner')
}

/** Uploads as Tansy Row's owner, remembering each new sheet for removal. */
async function upload(files: Parameters<typeof uploadSheets>[1], client?: ApiClient) {
  const res = await uploadSheets(client ?? await grower(), files)
  if (res.status === 201) for (const s of res.body as { id: number }[]) sheets.push(s.id)
  return res
}

describe('uploading a sheet', () => {
  it('stores the file unchanged: the download link gives back the same bytes, with its sha-256 and first rows', async () => {
    const csv = freshCsv(['TR-1', 'TR-2'])
    const res = await upload([{ name: 'October results.csv', bytes: csv, type: 'text/csv' }])
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    const [sheet] = res.body
    expect(sheet).toMatchObject({
      name: 'October results.csv', kind: 'csv', contentType: 'text/csv', sizeBytes: Buffer.byteLength(csv), sha256: sha(csv),
      headers: ['Sample', 'Date', 'Brix', 'TA'],
    })
    expect(sheet.preview.slice(0, 2)).toEqual([['TR-1', '2026-10-01', '12.0', '4.5'], ['TR-2', '2026-10-02', '12.1', '4.5']])
    expect(sheet).not.toHaveProperty('duplicateOf')

    const row = await db('lab_sheets').where({ id: sheet.id }).first()
    expect(row).toMatchObject({ org_id: await orgId('tansyRow'), sha256: sha(csv), size_bytes: Buffer.byteLength(csv), kind: 'csv', uploaded_by_name: expect.any(String) })
    expect(row.uploaded_by_user_id).toBeTypeOf('number')
    expect(await objectExists(row.object_key)).toBe(true)

    const link = await (await grower()).get(`/api/lab-sheets/${sheet.id}/download`)
    expect(link.status).toBe(302)
    const url = new URL(link.headers.get('location')!)
    expect(url.searchParams.get('X-Amz-Expires')).toBe('300')
    const file = await fetch(url)
    expect(file.status).toBe(200)
    const bytes = Buffer.from(await file.arrayBuffer())
    expect(sha(bytes)).toBe(sha(csv))
    expect(bytes.equals(Buffer.from(csv))).toBe(true)
  })

  it('reads an XLSX workbook\'s header and rows, and keeps a PDF as it is', async () => {
    const book = await xlsx([['Lot', 'Sampled', 'SG'], [`X-${Date.now()}`, new Date(Date.UTC(2026, 9, 3)), 1.052]])
    const res = await upload([{ name: 'lab.xlsx', bytes: book }, { name: 'certificate.pdf', bytes: Buffer.concat([PDF, Buffer.from(`% ${Date.now()}\n`)]) }])
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    const [workbook, pdf] = res.body
    expect(workbook).toMatchObject({ kind: 'xlsx', contentType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet', headers: ['Lot', 'Sampled', 'SG'] })
    expect(workbook.preview[0].slice(1)).toEqual(['2026-10-03', '1.052'])
    expect(pdf).toMatchObject({ kind: 'pdf', contentType: 'application/pdf' })
    expect(pdf).not.toHaveProperty('headers')

    const detail = await (await grower()).get(`/api/lab-sheets/${workbook.id}`)
    expect(detail.status).toBe(200)
    expect(detail.body).toMatchObject({ id: workbook.id, headers: ['Lot', 'Sampled', 'SG'], importedAt: null, preview: { rowCount: 1 }, problem: null })
  })

  it('serves a PDF sheet from the app itself, inline and framable by its own pages only', async () => {
    const pdfBytes = Buffer.concat([PDF, Buffer.from(`% inline ${Date.now()}\n`)])
    const res = await upload([{ name: 'Bench certificate.pdf', bytes: pdfBytes }, { name: 'with it.csv', bytes: freshCsv() }])
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    const [pdf, csv] = res.body
    const shown = await (await grower()).get(`/api/lab-sheets/${pdf.id}/pdf`)
    expect(shown.status).toBe(200)
    expect(shown.headers.get('content-type')).toBe('application/pdf')
    expect(shown.headers.get('content-disposition')).toMatch(/^inline; filename="Bench certificate\.pdf"/)
    expect(shown.headers.get('x-frame-options')).toBe('SAMEORIGIN')
    expect(shown.headers.get('content-security-policy')).toMatch(/frame-ancestors 'self'/)
    expect(shown.headers.get('cache-control')).toMatch(/no-store/)
    // The sheet's page is cross-origin isolated; a frame without the same policy would be blocked.
    expect(shown.headers.get('cross-origin-embedder-policy')).toBe('credentialless')
    const bytes = Buffer.from(await (await fetch(`${testEnv.appUrl}/api/lab-sheets/${pdf.id}/pdf`, { headers: { cookie: [...(await grower()).cookies].map(([k, v]) => `${k}=${v}`).join('; ') } })).arrayBuffer())
    expect(bytes.equals(pdfBytes)).toBe(true)
    // Every other answer still refuses to be framed at all.
    const sheet = await (await grower()).get(`/api/lab-sheets/${pdf.id}`)
    expect(sheet.headers.get('x-frame-options')).toBe('DENY')
    // A CSV is read into the preview, not shown as a file; another organisation's PDF is not there.
    expect((await (await grower()).get(`/api/lab-sheets/${csv.id}/pdf`)).status).toBe(404)
    expect((await (await as('growerOwner')).get(`/api/lab-sheets/${pdf.id}/pdf`)).status).toBe(404)

    // A reading typed in beside the PDF keeps the sheet it came from; only an own PDF may be named.
    const [lotId] = await db('harvest_lots').insert({
      org_id: await orgId('tansyRow'), code: `PDF-${Date.now().toString(36)}`, variety_id: (await db('varieties').where({ name: 'Dabinett' }).first('id')).id,
      picked_on: '2026-10-01', harvest_year: 2026, net_kg: 800, notes: MARK,
    })
    try {
      const typed = await (await grower()).post(`/api/lots/${lotId}/readings`, { sampledOn: '2026-10-03', brix: 12.4, labSheetId: pdf.id })
      expect(typed.status, JSON.stringify(typed.body)).toBe(201)
      expect(typed.body.labSheetId).toBe(pdf.id)
      expect((await db('juice_readings').where({ id: typed.body.id }).first()).lab_sheet_id).toBe(pdf.id)
      const fromCsv = await (await grower()).post(`/api/lots/${lotId}/readings`, { sampledOn: '2026-10-03', brix: 12.4, labSheetId: csv.id })
      expect(fromCsv.status).toBe(400)
      expect(fromCsv.body.data.issues[0]).toMatchObject({ path: 'labSheetId', message: expect.stringMatching(/only from a PDF/) })
      const theirs = await upload([{ name: 'theirs.pdf', bytes: Buffer.concat([PDF, Buffer.from(`% theirs ${Date.now()}\n`)]) }], await as('growerOwner'))
      const fromTheirs = await (await grower()).post(`/api/lots/${lotId}/readings`, { sampledOn: '2026-10-03', brix: 12.4, labSheetId: theirs.body[0].id })
      expect(fromTheirs.status).toBe(400)
      expect(fromTheirs.body.data.issues[0].path).toBe('labSheetId')
      expect(await db('juice_readings').where({ lot_id: lotId }).count({ n: '*' })).toEqual([{ n: 1 }])
    }
    finally {
      await db('juice_readings').where({ lot_id: lotId }).delete()
      await db('harvest_lots').where({ id: lotId }).delete()
    }
  })

  it('stores a CSV whose table cannot be read, and says why', async () => {
    const res = await upload([{ name: 'broken.csv', bytes: `\r\n\r\nnot a header ${Date.now()}\r\n` }])
    expect(res.status).toBe(201)
    expect(res.body[0].problem).toMatch(/first row is empty/)
  })

  it('knows the same file again: no second sheet and no second object, but the earlier sheet named', async () => {
    const csv = freshCsv()
    const first = await upload([{ name: 'a.csv', bytes: csv }])
    const again = await upload([{ name: 'a copy.csv', bytes: csv }])
    expect(again.status).toBe(201)
    expect(again.body[0]).toMatchObject({ id: first.body[0].id, duplicateOf: first.body[0].id, sha256: sha(csv) })
    expect(await db('lab_sheets').where({ sha256: sha(csv) }).count({ n: '*' })).toEqual([{ n: 1 }])
    // Another organisation's copy of the same bytes is its own sheet.
    const theirs = await upload([{ name: 'a.csv', bytes: csv }], await as('growerOwner'))
    expect(theirs.status).toBe(201)
    expect(theirs.body[0].id).not.toBe(first.body[0].id)
    expect(theirs.body[0]).not.toHaveProperty('duplicateOf')
  })

  it('refuses a file whose bytes are not what its name says (415, naming the file), and stores none of the upload', async () => {
    const csv = freshCsv()
    const res = await upload([{ name: 'good.csv', bytes: csv }, { name: 'readings.csv', bytes: PNG }])
    expect(res.status).toBe(415)
    expect(res.body.message).toMatch(/readings\.csv is a PNG file/)
    expect(await db('lab_sheets').where({ sha256: sha(csv) }).first()).toBeUndefined()

    const misnamed = await upload([{ name: 'results.csv', bytes: PDF }])
    expect(misnamed.status).toBe(415)
    expect(misnamed.body.message).toMatch(/results\.csv is named as CSV but holds a PDF/)
    const garbage = await upload([{ name: 'book.xlsx', bytes: Buffer.from([0xFF, 0x00, 0x13, 0x37, 0x00, 0xFE]) }])
    expect(garbage.status).toBe(415)
    expect(garbage.body.message).toMatch(/book\.xlsx/)
    const other = await upload([{ name: 'photo.png', bytes: PNG }])
    expect(other.status).toBe(415)
    expect(other.body.message).toMatch(/CSV, XLSX or PDF/)
  })

  it('refuses an empty upload by its field', async () => {
    const res = await upload([])
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0].path).toBe('file')
  })

  it('refuses a file just over 10 MiB with 413, before storing anything', async () => {
    const big = Buffer.alloc(10 * MiB + 1, 'a,b\r\n')
    const res = await upload([{ name: 'huge.csv', bytes: big }])
    expect(res.status).toBe(413)
    expect(res.body.message).toMatch(/huge\.csv is larger than 10 MiB/)
    expect(await db('lab_sheets').where({ sha256: sha(big) }).first()).toBeUndefined()
    // A file of exactly 10 MiB is within the limit.
    const most = Buffer.alloc(10 * MiB, `x,${Date.now()}\n`)
    const ok = await upload([{ name: 'most.csv', bytes: most }])
    expect(ok.status, JSON.stringify(ok.body)).toBe(201)
    expect(ok.body[0].sizeBytes).toBe(10 * MiB)
  }, 60_000)

  it('refuses a request whose Content-Length is over the most an upload may be, before reading its body', async () => {
    const cookie = [...(await grower()).cookies].map(([k, v]) => `${k}=${v}`).join('; ')
    // 60 MiB announced, a few bytes sent: the answer comes without the rest being waited for.
    const status = await new Promise<number>((resolve, reject) => {
      const req = request(`${testEnv.appUrl}/api/lab-sheets`, {
        method: 'POST', headers: { 'content-type': 'multipart/form-data; boundary=x', 'content-length': String(60 * MiB), cookie },
      }, (res) => {
        resolve(res.statusCode!)
        res.resume()
        req.destroy()
      })
      req.on('error', reject)
      req.write('--x\r\n')
    })
    expect(status).toBe(413)
  })
})

describe('when the file store is down', () => {
  let app: Instance
  const port = Number(new URL(testEnv.appUrl).port) + 8

  beforeAll(async () => {
    app = await startInstance(port, { S3_ENDPOINT: `http://127.0.0.1:${port + 1}` })
  }, 40_000)

  afterAll(async () => {
    await app?.stop()
  })

  it('an upload answers 503 with a message, and leaves no sheet and no object', async () => {
    const client = new ApiClient(undefined, app.url)
    await client.signIn(DEMO_USERS.grower2Owner, DEMO_PASSWORD)
    expect(client.hasSession()).toBe(true)
    const csv = freshCsv()
    const res = await uploadSheets(client, [{ name: 'while down.csv', bytes: csv }])
    expect(res.status).toBe(503)
    expect(res.body.message).toMatch(/File storage is not answering/)
    expect(await db('lab_sheets').where({ sha256: sha(csv) }).first()).toBeUndefined()
    expect(await objectExists(`lab-sheets/${await orgId('tansyRow')}/${sha(csv)}`)).toBe(false)
  }, 30_000)
})

describe('when the database fails after the file was stored', () => {
  // A trigger makes the database refuse the sheet's row, as a failing server would, after the
  // file has gone to the store: the object must not be left behind without its row.
  const TRIGGER = 'lab_sheets_refused_in_test'
  beforeAll(async () => {
    await db.raw(`DROP TRIGGER IF EXISTS ${TRIGGER}`)
    await db.raw(`CREATE TRIGGER ${TRIGGER} BEFORE INSERT ON lab_sheets FOR EACH ROW BEGIN
      IF NEW.name LIKE 'refused by the database%' THEN SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'refused in a test'; END IF; END`)
  })
  afterAll(async () => {
    await db.raw(`DROP TRIGGER IF EXISTS ${TRIGGER}`)
  })

  it('removes the stored object and keeps no row', async () => {
    const csv = freshCsv()
    const key = `lab-sheets/${await orgId('tansyRow')}/${sha(csv)}`
    const res = await upload([{ name: 'refused by the database.csv', bytes: csv }])
    // Not the person's fault and not an outage the app recognises: an internal error, said plainly.
    expect(res.status).toBe(500)
    expect(await db('lab_sheets').where({ sha256: sha(csv) }).first()).toBeUndefined()
    expect(await objectExists(key)).toBe(false)
    // The same file under another name goes through.
    const again = await upload([{ name: 'accepted.csv', bytes: csv }])
    expect(again.status, JSON.stringify(again.body)).toBe(201)
    expect(await objectExists(key)).toBe(true)
  })
})

describe('who sees a sheet', () => {
  it('lists an organisation\'s own sheets newest first, with paging, and not another\'s', async () => {
    const a = await upload([{ name: 'older.csv', bytes: freshCsv() }])
    const b = await upload([{ name: 'newer.csv', bytes: freshCsv() }])
    const list = await (await grower()).get('/api/lab-sheets?limit=2')
    expect(list.status).toBe(200)
    expect(list.body.items.map((s: { id: number }) => s.id)).toEqual([b.body[0].id, a.body[0].id])
    expect(list.body.total).toBeGreaterThanOrEqual(2)
    const next = await (await grower()).get('/api/lab-sheets?limit=1&offset=1')
    expect(next.body.items[0].id).toBe(a.body[0].id)

    const hollowmere = await (await as('growerOwner')).get('/api/lab-sheets?limit=200')
    expect(hollowmere.body.items.map((s: { id: number }) => s.id)).not.toContain(a.body[0].id)
    expect((await (await as('growerOwner')).get(`/api/lab-sheets/${a.body[0].id}`)).status).toBe(404)
    expect((await (await as('growerOwner')).get(`/api/lab-sheets/${a.body[0].id}/download`)).status).toBe(404)
  })

  it('a maker downloads a sheet only when every lot on it is one its contracts cover', async () => {
    const covered = await lot('Dabinett')
    const uncovered = await lot('Yarlington Mill')
    const [whole, part, none] = await Promise.all([
      upload([{ name: 'whole.csv', bytes: freshCsv() }]), upload([{ name: 'part.csv', bytes: freshCsv() }]), upload([{ name: 'none.csv', bytes: freshCsv() }]),
    ]).then(all => all.map(r => r.body[0].id as number))
    await readings(whole!, [covered])
    await readings(part!, [covered, uncovered])

    const maker = await as('makerOwner')
    const list = await maker.get('/api/lab-sheets?limit=200')
    const seen = list.body.items.map((s: { id: number }) => s.id)
    expect(seen).toEqual(expect.arrayContaining([whole, part]))
    expect(seen).not.toContain(none)

    expect((await maker.get(`/api/lab-sheets/${whole}/download`)).status).toBe(302)
    expect((await maker.get(`/api/lab-sheets/${part}/download`)).status).toBe(404)
    expect((await maker.get(`/api/lab-sheets/${none}/download`)).status).toBe(404)
    const partly = await maker.get(`/api/lab-sheets/${part}`)
    expect(partly.status).toBe(200)
    expect(partly.body).toMatchObject({ preview: null, headers: null })
    expect((await maker.get(`/api/lab-sheets/${none}`)).status).toBe(404)

    // A maker without a contract with the grower sees none of it.
    const other = await as('maker2Owner')
    expect((await other.get(`/api/lab-sheets/${whole}`)).status).toBe(404)
    expect((await other.get(`/api/lab-sheets/${whole}/download`)).status).toBe(404)
  })
})
