import { createHash } from 'node:crypto'
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs'
import { join, relative, resolve } from 'node:path'
import { runOrThrow } from './processes'

// What goes into the built app. Tests, scripts, fakes and migrations do not.
const SOURCES = ['app.vue', 'error.vue', 'app.config.ts', 'nuxt.config.ts', 'tailwind.config.ts', 'package-lock.json',
  'pages', 'components', 'layouts', 'middleware', 'composables', 'stores', 'plugins', 'server', 'shared', 'assets', 'public']

function files(root: string, entry: string): string[] {
  const path = join(root, entry)
  if (!existsSync(path)) return []
  if (statSync(path).isFile()) return [path]
  return readdirSync(path).sort().flatMap(name => files(root, join(entry, name)))
}

function sourceHash(root: string): string {
  const hash = createHash('sha256')
  for (const file of SOURCES.flatMap(entry => files(root, entry))) {
    hash.update(relative(root, file)).update('\0').update(readFileSync(file)).update('\0')
  }
  return hash.digest('hex')
}

/** Where the built app lives; POMEWRIGHT_OUTPUT_DIR moves it (nuxt.config.ts reads the same variable). */
export function outputDir(root: string): string {
  return resolve(root, process.env.POMEWRIGHT_OUTPUT_DIR || '.output')
}

/** Builds with `nuxt build` unless the output was built from exactly these sources. */
export async function buildIfStale(root: string): Promise<boolean> {
  const out = outputDir(root)
  const stampFile = join(out, '.pomewright-source-hash')
  const want = sourceHash(root)
  if (existsSync(join(out, 'server', 'index.mjs')) && existsSync(stampFile) && readFileSync(stampFile, 'utf8') === want) return false
  console.log('==> Building the app (nuxt build)')
  await runOrThrow(process.execPath, [join(root, 'node_modules', 'nuxt', 'bin', 'nuxt.mjs'), 'build'], { cwd: root, env: { NODE_ENV: 'production', NUXT_TELEMETRY_DISABLED: '1' } })
  writeFileSync(stampFile, want)
  return true
}
