import { execFile } from 'node:child_process'
import { createHash, randomBytes } from 'node:crypto'
import { appendFileSync, cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { DeleteObjectCommand, GetObjectCommand, ListObjectsV2Command, PutObjectCommand, S3Client } from '@aws-sdk/client-s3'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Manifest } from '../../scripts/stack/backup'
import { testDb } from '../support/db'
import { DEMO_PASSWORD, testEnv } from '../support/env'
import { ApiClient, DEMO_USERS } from '../support/http'

// `npm run backup` and `npm run restore` against the test stack. The restore puts the shared test
// database back as it was at the backup, before this file changed anything, so later files see
// what they would have seen without it.
const root = resolve(import.meta.dirname, '../..')
const db = testDb()
const bucket = process.env.S3_BUCKET!
const s3 = new S3Client({
  endpoint: process.env.S3_ENDPOINT, region: process.env.S3_REGION, forcePathStyle: true,
  credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID!, secretAccessKey: process.env.S3_SECRET_ACCESS_KEY! },
  requestChecksumCalculation: 'WHEN_REQUIRED', responseChecksumValidation: 'WHEN_REQUIRED',
})

const OBJECTS = {
  'lab-sheets/2026/hollowmere/press 1.bin': { body: Buffer.concat([Buffer.from(Array.from({ length: 256 }, (_, i) => i)), randomBytes(40_000)]), type: 'application/octet-stream' },
  'lab-sheets/2026/notes.txt': { body: Buffer.from('Dabinett, 12.4 °Brix, TA 2.1 g/L as malic — pressed on the 3rd\n'), type: 'text/plain; charset=utf-8' },
  'backup-test/empty': { body: Buffer.alloc(0), type: 'application/octet-stream' },
}

interface Result { code: number, stdout: string, stderr: string }

/** Runs one of the scripts as a person would, on the test stack's profile. */
function script(name: 'backup' | 'restore', ...args: string[]): Promise<Result> {
  return new Promise((done) => {
    execFile(process.execPath, ['--no-warnings', '--import', 'tsx', `scripts/${name}.ts`, '--profile', 'test', ...args], { cwd: root, env: process.env }, (error, stdout, stderr) => {
      done({ code: error ? (typeof error.code === 'number' ? error.code : 1) : 0, stdout, stderr })
    })
  })
}

/** Every table: its definition (with its next AUTO_INCREMENT) and all rows ordered by primary key. */
async function tables(): Promise<Record<string, { definition: string, rows: unknown[] }>> {
  const [names] = await db.raw('SELECT TABLE_NAME AS name FROM information_schema.TABLES WHERE TABLE_SCHEMA = DATABASE() AND TABLE_TYPE = \'BASE TABLE\' ORDER BY TABLE_NAME') as [{ name: string }[]]
  const [keys] = await db.raw('SELECT TABLE_NAME AS t, COLUMN_NAME AS c FROM information_schema.KEY_COLUMN_USAGE WHERE TABLE_SCHEMA = DATABASE() AND CONSTRAINT_NAME = \'PRIMARY\' ORDER BY ORDINAL_POSITION') as [{ t: string, c: string }[]]
  const result: Record<string, { definition: string, rows: unknown[] }> = {}
  for (const { name } of names) {
    const primary = keys.filter(k => k.t === name).map(k => k.c)
    expect(primary, `${name} has a primary key`).not.toEqual([])
    const [[created]] = await db.raw('SHOW CREATE TABLE ??', [name]) as [[{ 'Create Table': string }]]
    result[name] = { definition: created['Create Table'], rows: await db(name).select('*').orderBy(primary) }
  }
  return result
}

async function objects(): Promise<Record<string, { sha256: string, size: number, type?: string }>> {
  const listed = await s3.send(new ListObjectsV2Command({ Bucket: bucket }))
  const result: Record<string, { sha256: string, size: number, type?: string }> = {}
  for (const { Key } of listed.Contents ?? []) {
    const res = await s3.send(new GetObjectCommand({ Bucket: bucket, Key }))
    const bytes = Buffer.from(await res.Body!.transformToByteArray())
    result[Key!] = { sha256: createHash('sha256').update(bytes).digest('hex'), size: bytes.length, type: res.ContentType }
  }
  return result
}

const put = (key: string, body: Buffer, type: string) => s3.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: body, ContentType: type }))

/** What a day of use might do: rows changed, deleted and added in several tables; files deleted, overwritten, added. */
async function changeEverything() {
  await db('users').where({ email: DEMO_USERS.growerOwner }).update({ name: 'Someone Else', units: 'us' })
  await db('organisations').where({ name: 'Quillhurst Cider Works' }).update({ region: 'elsewhere', default_juice_yield_l_per_t: 1 })
  // Deleting an organisation takes its people and blocks with it (ON DELETE CASCADE).
  await db('organisations').where({ name: 'Tansy Row Fruit' }).delete()
  await db('orchard_blocks').limit(2).delete()
  const [orgId] = await db('organisations').insert({ name: 'Backup Test Cidery', kind: 'maker' })
  await db('users').insert({ org_id: orgId, email: 'backup-test@example.test', name: 'Not In The Backup', password_hash: 'x', role: 'owner' })
  await db('audit_events').delete()
  await s3.send(new DeleteObjectCommand({ Bucket: bucket, Key: 'lab-sheets/2026/notes.txt' }))
  await put('lab-sheets/2026/hollowmere/press 1.bin', Buffer.from('overwritten'), 'text/plain')
  await put('lab-sheets/2026/not-in-backup.txt', Buffer.from('new'), 'text/plain')
}

const dir = mkdtempSync(join(tmpdir(), 'pomewright-backup-test-'))
let folder: string
let manifest: Manifest
let atBackup: { tables: Awaited<ReturnType<typeof tables>>, objects: Awaited<ReturnType<typeof objects>> }

beforeAll(async () => {
  for (const [key, { body, type }] of Object.entries(OBJECTS)) await put(key, body, type)
  atBackup = { tables: await tables(), objects: await objects() }
  const backup = await script('backup', dir)
  expect(backup.code, backup.stderr).toBe(0)
  folder = backup.stdout.trim().split('\n').at(-1)!
  manifest = JSON.parse(readFileSync(join(folder, 'manifest.json'), 'utf8')) as Manifest
})

afterAll(async () => {
  for (const key of Object.keys(OBJECTS)) await s3.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }))
  rmSync(dir, { recursive: true, force: true })
})

describe('npm run backup', () => {
  it('writes a dated folder whose manifest lists every table’s rows and every object’s size and SHA-256', () => {
    expect(folder).toMatch(new RegExp(`^${dir}/\\d{4}-\\d\\d-\\d\\dT\\d\\d-\\d\\d-\\d\\dZ$`))
    expect(atBackup.tables.users!.rows.length, 'the demo people are there').toBeGreaterThanOrEqual(Object.keys(DEMO_USERS).length)
    expect(manifest.database.name).toBe(new URL(testEnv.databaseUrl).pathname.slice(1))
    expect(manifest.database.tables).toEqual(Object.fromEntries(Object.entries(atBackup.tables).map(([name, t]) => [name, t.rows.length])))
    expect(Object.fromEntries(manifest.bucket.objects.map(o => [o.key, { sha256: o.sha256, size: o.size, type: o.contentType }]))).toEqual(atBackup.objects)
    const dump = readFileSync(join(folder, 'database.sql'))
    expect(manifest.files['database.sql']).toEqual({ size: dump.length, sha256: createHash('sha256').update(dump).digest('hex') })
    for (const object of manifest.bucket.objects) expect(manifest.files[object.file]?.sha256).toBe(object.sha256)
  })
})

describe('npm run restore', () => {
  let changed: typeof atBackup

  it('refuses without a folder, without --yes and with a damaged backup, and changes nothing', async () => {
    await changeEverything()
    changed = { tables: await tables(), objects: await objects() }
    expect(changed.tables).not.toEqual(atBackup.tables)
    expect(changed.objects).not.toEqual(atBackup.objects)

    const damaged = join(dir, 'damaged')
    cpSync(folder, damaged, { recursive: true })
    appendFileSync(join(damaged, 'database.sql'), '-- one more line\n')
    const notes = manifest.bucket.objects.find(o => o.key === 'lab-sheets/2026/notes.txt')!
    writeFileSync(join(damaged, notes.file), 'Dabinett, 12.4 °Brix, TA 9.9 g/L as malic — pressed on the 3rd\n')
    // Read-only refusals: run side by side.
    const [noFolder, noYes, refused] = await Promise.all([script('restore', '--yes'), script('restore', folder), script('restore', damaged, '--yes')])
    expect(noFolder.code).toBe(2)
    expect(noFolder.stderr).toMatch(/Say which backup to restore/)
    expect(noYes.code).toBe(1)
    expect(noYes.stderr).toMatch(/intact[\s\S]*--yes/)
    expect(refused.code).toBe(1)
    expect(refused.stderr).toMatch(/damaged[\s\S]*database\.sql does not match its SHA-256/)
    expect(refused.stderr).toContain(`${notes.file} does not match its SHA-256`)

    expect(await tables()).toEqual(changed.tables)
    expect(await objects()).toEqual(changed.objects)
  })

  it('brings back every row of every table and every object’s bytes as they were at the backup', async () => {
    const restore = await script('restore', folder, '--yes')
    expect(restore.code, restore.stderr).toBe(0)
    expect(await tables()).toEqual(atBackup.tables)
    expect(await objects()).toEqual(atBackup.objects)
  })

  it('leaves the running app answering from the restored data', async () => {
    expect((await fetch(`${testEnv.appUrl}/api/health`)).status).toBe(200)
    const client = new ApiClient()
    await client.signIn(DEMO_USERS.growerOwner, DEMO_PASSWORD)
    expect(client.hasSession()).toBe(true)
    expect((await client.get('/api/me')).body).toMatchObject({ name: 'Ines Varga' })
  })
})
