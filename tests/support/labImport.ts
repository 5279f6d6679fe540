import { randomBytes } from 'node:crypto'
import { readFileSync } from 'node:fs'
import { DeleteObjectCommand, PutObjectCommand } from '@aws-sdk/client-s3'
import { afterAll } from 'vitest'
import { useS3 } from '../../server/utils/s3'
import { readSheet } from '../../server/utils/sheets'
import type { ORGS } from './contracts'
import { orgId, userId, varietyId } from './contracts'
import { testDb } from './db'

// Lab sheets put in place as an upload leaves them (the object in the file store, its row in
// lab_sheets) and harvest lots for their rows, removed with their readings and saved mappings when
// the file ends.

const FIXTURES = new URL('../fixtures/lab-sheets/', import.meta.url)
const CONTENT_TYPES = { csv: 'text/csv', xlsx: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet', pdf: 'application/pdf' } as const

export const fixtureBytes = (name: string) => new Uint8Array(readFileSync(new URL(name, FIXTURES)))

export function labImportFixtures(mark: string) {
  const db = testDb()
  const startedAt = new Date()
  const lots: number[] = []
  const sheets: number[] = []
  const keys: string[] = []
  const orgs = new Set<number>()

  afterAll(async () => {
    if (sheets.length) await db('juice_readings').whereIn('lab_sheet_id', sheets).delete()
    if (lots.length) await db('juice_readings').whereIn('lot_id', lots).delete()
    if (sheets.length) await db('lab_sheets').whereIn('id', sheets).delete()
    if (lots.length) await db('harvest_lots').whereIn('id', lots).delete()
    if (orgs.size) await db('sheet_mappings').whereIn('org_id', [...orgs]).where('updated_at', '>=', startedAt).delete()
    const { client, bucket } = useS3()
    for (const key of keys) await client.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }))
  })

  /** A harvest lot of the organisation (Hollowmere unless named). */
  async function lot(code: string, variety: string, pickedOn: string, org: keyof typeof ORGS = 'hollowmere'): Promise<number> {
    const [id] = await db('harvest_lots').insert({
      org_id: await orgId(org), code, variety_id: await varietyId(variety), picked_on: pickedOn, harvest_year: Number(pickedOn.slice(0, 4)), net_kg: 1200,
    })
    lots.push(id!)
    return id!
  }

  /** A sheet as uploaded by the organisation's owner: a fixture file by name, or bytes of its own. */
  async function sheet(file: string, options: { org?: keyof typeof ORGS, bytes?: Uint8Array, name?: string } = {}): Promise<number> {
    const kind = file.endsWith('.xlsx') ? 'xlsx' : file.endsWith('.pdf') ? 'pdf' : 'csv'
    const bytes = options.bytes ?? fixtureBytes(file)
    const org = await orgId(options.org ?? 'hollowmere')
    orgs.add(org)
    const key = `lab-sheets/${org}/test-${randomBytes(8).toString('hex')}/${file}`
    const { client, bucket } = useS3()
    await client.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: bytes, ContentType: CONTENT_TYPES[kind] }))
    keys.push(key)
    const headers = kind === 'pdf' ? null : (await readSheet(kind, bytes)).headers
    const [id] = await db('lab_sheets').insert({
      org_id: org, name: options.name ?? file, object_key: key, sha256: randomBytes(32).toString('hex'), size_bytes: bytes.length,
      content_type: CONTENT_TYPES[kind], kind, headers: headers && JSON.stringify(headers),
      uploaded_by_user_id: await userId(options.org === 'tansyRow' ? 'grower2@demo.test' : 'grower@demo.test'), uploaded_by_name: `Test ${mark}`,
    })
    sheets.push(id!)
    return id!
  }

  return { lot, sheet }
}
