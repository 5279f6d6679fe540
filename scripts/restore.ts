// Restores a backup made by `npm run backup` into the running stack, replacing its database and
// every file in its bucket.
//   npm run restore -- <backup folder> --yes [--profile test]
// Without --yes it checks the backup and says what it would replace, and changes nothing.
import { resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { parseArgs } from 'node:util'
import { readBackup, requireRunning, restoreBackup, targetOf } from './stack/backup'
import { loadProfile, type Mode } from './stack/profile'

const root = resolve(fileURLToPath(new URL('..', import.meta.url)))
const USAGE = 'usage: npm run restore -- <backup folder> --yes [--profile start|test]'

async function main() {
  const { values, positionals } = parseArgs({ options: { profile: { type: 'string', default: 'start' }, yes: { type: 'boolean', default: false } }, allowPositionals: true })
  if ((values.profile !== 'start' && values.profile !== 'test') || positionals.length !== 1) {
    console.error(positionals.length === 0 ? `Say which backup to restore.\n${USAGE}` : USAGE)
    process.exit(2)
  }
  const folder = resolve(positionals[0]!)
  const manifest = await readBackup(folder)
  const target = targetOf(loadProfile(values.profile as Mode, root))
  await requireRunning(target)
  const what = `database ${target.db.database} at ${target.db.host}:${target.db.port} and every object in bucket ${target.storage.bucket}`
  if (!values.yes) {
    console.error(`The backup of ${manifest.createdAt} in ${folder} is intact.\nRestoring it replaces ${what}. Run again with --yes to go ahead.`)
    process.exit(1)
  }
  await restoreBackup(target, folder, manifest)
  const rows = Object.values(manifest.database.tables).reduce((a, b) => a + b, 0)
  console.log(`Restored the backup of ${manifest.createdAt} into ${what}: ${rows} rows, ${manifest.bucket.objects.length} object(s), all as the manifest lists them.`)
}

main().catch((error: Error) => {
  console.error(`Restore failed: ${error.message}`)
  process.exit(1)
})
