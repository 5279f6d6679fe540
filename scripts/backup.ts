// Backs up the running stack's database and file storage into a dated folder.
//   npm run backup [-- <parent folder>] [--profile test]
// The folder defaults to backups/ in the data folder (.data/dev/backups); the last line printed is
// the new backup's path.
import { join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { parseArgs } from 'node:util'
import { requireRunning, targetOf, writeBackup } from './stack/backup'
import { loadProfile, type Mode } from './stack/profile'

const root = resolve(fileURLToPath(new URL('..', import.meta.url)))

async function main() {
  const { values, positionals } = parseArgs({ options: { profile: { type: 'string', default: 'start' } }, allowPositionals: true })
  if ((values.profile !== 'start' && values.profile !== 'test') || positionals.length > 1) {
    console.error('usage: npm run backup [-- <folder>] [--profile start|test]')
    process.exit(2)
  }
  const profile = loadProfile(values.profile as Mode, root)
  const target = targetOf(profile)
  await requireRunning(target)
  const parent = positionals[0] ? resolve(positionals[0]) : join(profile.dataDir, 'backups')
  const { folder, manifest } = await writeBackup(target, parent)
  const rows = Object.values(manifest.database.tables).reduce((a, b) => a + b, 0)
  const tables = Object.keys(manifest.database.tables).length
  console.log(`Backed up database ${manifest.database.name} (${tables} tables, ${rows} rows) and ${manifest.bucket.objects.length} object(s) from bucket ${manifest.bucket.name} into`)
  console.log(folder)
}

main().catch((error: Error) => {
  console.error(`Backup failed: ${error.message}`)
  process.exit(1)
})
