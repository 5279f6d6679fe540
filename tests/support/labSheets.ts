import { randomBytes } from 'node:crypto'
import { HeadObjectCommand, S3Client } from '@aws-sdk/client-s3'
import { afterAll } from 'vitest'
import { contractFixtures, orgId, varietyId } from './contracts'
import { testDb } from './db'
import { testEnv } from './env'
import type { ApiClient, ApiResponse } from './http'

// Lab sheets for tests: multipart bodies built byte for byte (so the Content-Length is exact and a
// body can be made just over a limit), uploads through a signed-in client, the file store as the
// app sees it, and harvest lots with readings from a sheet, removed when the file ends.

export interface UploadFile { name: string, bytes: Uint8Array | string, type?: string }

export function multipart(files: UploadFile[], field = 'file'): { body: Buffer, contentType: string } {
  const boundary = `----pomewright${randomBytes(8).toString('hex')}`
  const chunks: Buffer[] = []
  for (const file of files) {
    chunks.push(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${field}"; filename="${file.name}"\r\nContent-Type: ${file.type ?? 'application/octet-stream'}\r\n\r\n`))
    chunks.push(Buffer.from(file.bytes))
    chunks.push(Buffer.from('\r\n'))
  }
  chunks.push(Buffer.from(`--${boundary}--\r\n`))
  return { body: Buffer.concat(chunks), contentType: `multipart/form-data; boundary=${boundary}` }
}

/** Posts files to /api/lab-sheets as the client's signed-in person. */
export async function uploadSheets(client: ApiClient, files: UploadFile[]): Promise<ApiResponse> {
  const { body, contentType } = multipart(files)
  const res = await fetch(`${client.baseUrl ?? testEnv.appUrl}/api/lab-sheets`, {
    method: 'POST',
    headers: { 'content-type': contentType, 'x-forwarded-for': client.address, 'cookie': [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ') },
    body: new Uint8Array(body),
  })
  const text = await res.text()
  let parsed: unknown = text
  try {
    parsed = JSON.parse(text)
  }
  catch { /* keep the text */ }
  return { status: res.status, body: parsed, headers: res.headers }
}

/** A CSV no other test (or earlier run) has uploaded, so it is never a duplicate by chance. */
export function freshCsv(lots = ['L1']): string {
  const tag = randomBytes(6).toString('hex')
  return `Sample,Date,Brix,TA\r\n${lots.map((lot, i) => `${lot},2026-10-0${i + 1},12.${i},4.5`).join('\r\n')}\r\n# ${tag}\r\n`
}

/** The file store the test stack's app writes to. */
export function testStorage(): { client: S3Client, bucket: string } {
  const client = new S3Client({
    endpoint: process.env.S3_ENDPOINT,
    region: process.env.S3_REGION || 'us-east-1',
    credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID || 'S3RVER', secretAccessKey: process.env.S3_SECRET_ACCESS_KEY || 'S3RVER' },
    forcePathStyle: true,
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  })
  return { client, bucket: process.env.S3_BUCKET || 'pomewright-files' }
}

export async function objectExists(key: string): Promise<boolean> {
  const { client, bucket } = testStorage()
  try {
    await client.send(new HeadObjectCommand({ Bucket: bucket, Key: key }))
    return true
  }
  catch (error) {
    if ((error as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode === 404) return false
    throw error
  }
}

/**
 * Tansy Row's lots, and Quillhurst's accepted contract for Dabinett from Tansy Row in the lots'
 * harvest year: a Dabinett lot of that year is one Quillhurst may see, a Yarlington Mill lot is not.
 * Readings point lots at sheets. Everything made is removed when the file ends.
 */
export function labSheetFixtures(mark: string) {
  const db = testDb()
  const { fruitContract } = contractFixtures(mark)
  const year = new Date().getUTCFullYear() + 2
  let contracted: Promise<number> | undefined
  const lots: number[] = []
  const sheets: number[] = []

  afterAll(async () => {
    if (lots.length) await db('juice_readings').whereIn('lot_id', lots).delete()
    if (lots.length) await db('harvest_lots').whereIn('id', lots).delete()
    if (sheets.length) await db('lab_sheets').whereIn('id', sheets).delete()
  })

  async function lot(variety: 'Dabinett' | 'Yarlington Mill'): Promise<number> {
    contracted ??= (async () => fruitContract('accepted', { variety_id: await varietyId('Dabinett') }, [year]))()
    await contracted
    const [id] = await db('harvest_lots').insert({
      org_id: await orgId('tansyRow'), code: `${mark.slice(0, 12)}-${randomBytes(4).toString('hex')}`, variety_id: await varietyId(variety),
      picked_on: `${year}-10-05`, harvest_year: year, net_kg: 1200, notes: mark,
    })
    lots.push(id!)
    return id!
  }

  /** A reading of each lot, as if imported from the sheet. */
  async function readings(sheetId: number, lotIds: number[]): Promise<void> {
    sheets.push(sheetId)
    const org = await orgId('tansyRow')
    await db('juice_readings').insert(lotIds.map((lotId, i) => ({
      org_id: org, lot_id: lotId, lab_sheet_id: sheetId, sheet_row: i + 2, sampled_on: `${year}-10-06`, brix: 12.5,
    })))
  }

  return { lot, readings, sheets }
}
