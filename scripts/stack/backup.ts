import { createHash } from 'node:crypto'
import { createReadStream, existsSync, mkdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs'
import { isAbsolute, join, normalize } from 'node:path'
import knexFactory, { type Knex } from 'knex'
import { knexConfig } from '../../server/db/config'
import { databaseAddress, type DatabaseAddress } from '../../server/db/config'
import { dumpDatabase, loadDatabase, quoteName, rowsInDump } from './dump'
import { databaseUrl, type Profile } from './profile'
import { downloadObject, emptyBucket, listObjects, openStorage, requireBucket, uploadObject, type Storage, type StoredObject } from './storage'

const MANIFEST = 'manifest.json'
const DUMP_FILE = 'database.sql'
const OBJECTS_DIR = 'objects'

/** What `manifest.json` in a backup folder says. */
export interface Manifest {
  format: 1
  createdAt: string
  database: { name: string, characterSet: string, collation: string, file: string, tables: Record<string, number> }
  bucket: { name: string, objects: (StoredObject & { file: string })[] }
  /** Every other file in the folder, by its path in the folder. */
  files: Record<string, { size: number, sha256: string }>
}

/** The database and bucket of one running stack. */
export interface Target { profile: Profile, db: DatabaseAddress, storage: Storage }

export function targetOf(p: Profile): Target {
  return { profile: p, db: databaseAddress(databaseUrl(p)), storage: openStorage(p) }
}

function notRunning(t: Target): string {
  const where = `${t.db.host}:${t.db.port}`
  if (t.profile.externalDatabaseUrl) return `The database server at ${where} does not answer`
  if (t.profile.mode === 'test') return `The test stack is not running (it runs only while \`npm test\` does): nothing answers at ${where}`
  return `Pomewright is not running: nothing answers at ${where}. Start it with \`npm start\` in another terminal, then run this again`
}

/** A short-lived connection to the server, with no database chosen (restore drops the app's). */
async function withServer<T>(t: Target, work: (knex: Knex) => Promise<T>): Promise<T> {
  const url = new URL(databaseUrl(t.profile))
  url.pathname = '/'
  // Quiet: a server that does not answer is reported once, by the caller, with what to do.
  const quiet = () => {}
  const knex = knexFactory({ ...knexConfig(url.toString(), { caseConversion: false }), pool: { min: 0, max: 1 }, log: { warn: quiet, error: quiet, debug: quiet, deprecate: quiet } })
  try {
    return await work(knex)
  }
  finally {
    await knex.destroy()
  }
}

/** Refuses, with what to do, unless the stack's database and bucket both answer. */
export async function requireRunning(t: Target): Promise<void> {
  await withServer(t, knex => knex.raw('SELECT 1')).catch((error: Error) => {
    throw new Error(`${notRunning(t)} (${error.message}).`)
  })
  await requireBucket(t.storage, notRunning(t))
}

async function databaseCharset(t: Target): Promise<{ characterSet: string, collation: string }> {
  const [rows] = await withServer(t, knex => knex.raw('SELECT DEFAULT_CHARACTER_SET_NAME AS cs, DEFAULT_COLLATION_NAME AS coll FROM information_schema.SCHEMATA WHERE SCHEMA_NAME = ?', [t.db.database])) as [{ cs: string, coll: string }[]]
  if (!rows[0]) throw new Error(`There is no database "${t.db.database}" at ${t.db.host}:${t.db.port}.`)
  return { characterSet: rows[0].cs, collation: rows[0].coll }
}

/** Rows per table of the database as it is now. */
async function tableCounts(t: Target): Promise<Record<string, number>> {
  return withServer(t, async (knex) => {
    const [tables] = await knex.raw('SELECT TABLE_NAME AS name FROM information_schema.TABLES WHERE TABLE_SCHEMA = ? AND TABLE_TYPE = \'BASE TABLE\' ORDER BY TABLE_NAME', [t.db.database]) as [{ name: string }[]]
    const counts: Record<string, number> = {}
    for (const { name } of tables) {
      const [[row]] = await knex.raw(`SELECT COUNT(*) AS n FROM ${quoteName(t.db.database)}.${quoteName(name)}`) as [[{ n: number }]]
      counts[name] = Number(row.n)
    }
    return counts
  })
}

async function hashFile(path: string): Promise<{ size: number, sha256: string }> {
  const hash = createHash('sha256')
  for await (const chunk of createReadStream(path)) hash.update(chunk as Buffer)
  return { size: statSync(path).size, sha256: hash.digest('hex') }
}

/** Runs `work` over the items, a few at a time. */
async function eachLimited<T, R>(items: T[], limit: number, work: (item: T) => Promise<R>): Promise<R[]> {
  const results: R[] = new Array(items.length)
  let next = 0
  const worker = async () => {
    while (next < items.length) {
      const i = next++
      results[i] = await work(items[i]!)
    }
  }
  await Promise.all(Array.from({ length: Math.min(limit, items.length) }, worker))
  return results
}

/** `2026-12-01T21:50:00.123Z` → `2026-12-01T21-50-00Z`: sorts by time and is a valid name everywhere. */
export const folderName = (at: Date) => at.toISOString().replace(/\.\d{3}Z$/, 'Z').replaceAll(':', '-')

/**
 * Writes a backup into a new dated folder under `parent`: the database first (one consistent
 * snapshot), then every object in the bucket. In that order, every file a dumped row names is in
 * the bucket by the time it is listed, as long as the app stores a file before the row naming it
 * and deletes the row before the file. The folder gets its name only when complete.
 */
export async function writeBackup(t: Target, parent: string, at = new Date()): Promise<{ folder: string, manifest: Manifest }> {
  const folder = join(parent, folderName(at))
  const partial = `${folder}.partial`
  if (existsSync(folder)) throw new Error(`${folder} already exists.`)
  rmSync(partial, { recursive: true, force: true })
  mkdirSync(join(partial, OBJECTS_DIR), { recursive: true })
  try {
    const charset = await databaseCharset(t)
    await dumpDatabase(t.db, join(partial, DUMP_FILE))
    const tables = await rowsInDump(join(partial, DUMP_FILE))
    const keys = (await listObjects(t.storage)).map(o => o.key)
    const objects = await eachLimited(keys, 8, async (key) => {
      const object = await downloadObject(t.storage, key, join(partial, OBJECTS_DIR))
      return { ...object, file: `${OBJECTS_DIR}/${object.sha256}` }
    })
    const files: Manifest['files'] = {}
    for (const file of [DUMP_FILE, ...new Set(objects.map(o => o.file))].sort()) files[file] = await hashFile(join(partial, file))
    const manifest: Manifest = {
      format: 1,
      createdAt: at.toISOString(),
      database: { name: t.db.database, ...charset, file: DUMP_FILE, tables },
      bucket: { name: t.storage.bucket, objects },
      files,
    }
    writeFileSync(join(partial, MANIFEST), `${JSON.stringify(manifest, null, 2)}\n`)
    renameSync(partial, folder)
    return { folder, manifest }
  }
  catch (error) {
    rmSync(partial, { recursive: true, force: true })
    throw error
  }
}

/** A path from the manifest, kept inside the folder. */
function inside(folder: string, file: string): string {
  const path = normalize(file)
  if (isAbsolute(path) || path.startsWith('..')) throw new Error(`The manifest names a file outside the backup: ${file}`)
  return join(folder, path)
}

/** Reads a backup's manifest and checks every file against its size and SHA-256; refuses a damaged one. */
export async function readBackup(folder: string): Promise<Manifest> {
  const manifestFile = join(folder, MANIFEST)
  if (!existsSync(manifestFile)) throw new Error(`${folder} is not a backup: it has no ${MANIFEST}.`)
  let manifest: Manifest
  try {
    manifest = JSON.parse(readFileSync(manifestFile, 'utf8')) as Manifest
  }
  catch (error) {
    throw new Error(`The backup in ${folder} is damaged: ${MANIFEST} is not JSON (${(error as Error).message}).`)
  }
  if (manifest.format !== 1 || !manifest.database?.tables || !manifest.bucket?.objects || !manifest.files) {
    throw new Error(`${folder}/${MANIFEST} is not a backup manifest this version can read.`)
  }
  const problems: string[] = []
  for (const file of [manifest.database.file, ...manifest.bucket.objects.map(o => o.file)]) {
    if (!manifest.files[file]) problems.push(`${file} is not listed among the files`)
  }
  for (const object of manifest.bucket.objects) {
    if (manifest.files[object.file] && manifest.files[object.file]!.sha256 !== object.sha256) problems.push(`${object.file} is listed with another checksum than object "${object.key}"`)
  }
  for (const [file, want] of Object.entries(manifest.files)) {
    const path = inside(folder, file)
    if (!existsSync(path)) problems.push(`${file} is missing`)
    else {
      const got = await hashFile(path)
      if (got.size !== want.size || got.sha256 !== want.sha256) problems.push(`${file} does not match its SHA-256 (${got.size} bytes, ${want.size} expected)`)
    }
  }
  if (problems.length) throw new Error(`The backup in ${folder} is damaged, so nothing was restored:\n  ${problems.join('\n  ')}`)
  return manifest
}

/**
 * Brings the stack back to the backup: the database dropped and loaded from the dump, the bucket
 * emptied and filled with the backup's objects; then checks rows and objects against the manifest.
 */
export async function restoreBackup(t: Target, folder: string, manifest: Manifest): Promise<void> {
  await loadDatabase(t.db, join(folder, manifest.database.file), manifest.database)
  await emptyBucket(t.storage)
  await eachLimited(manifest.bucket.objects, 8, object => uploadObject(t.storage, object, inside(folder, object.file)))

  const problems: string[] = []
  const counts = await tableCounts(t)
  for (const table of new Set([...Object.keys(manifest.database.tables), ...Object.keys(counts)])) {
    const want = manifest.database.tables[table]
    const got = counts[table]
    if (want !== got) problems.push(`table ${table}: ${got ?? 'missing'} rows, ${want ?? 'none'} in the backup`)
  }
  const sizes = new Map((await listObjects(t.storage)).map(o => [o.key, o.size]))
  for (const object of manifest.bucket.objects) {
    if (sizes.get(object.key) !== object.size) problems.push(`object "${object.key}": ${sizes.get(object.key) ?? 'missing'} bytes, ${object.size} in the backup`)
    sizes.delete(object.key)
  }
  for (const key of sizes.keys()) problems.push(`object "${key}" is not in the backup`)
  if (problems.length) throw new Error(`The restore does not match the backup:\n  ${problems.join('\n  ')}`)
}
