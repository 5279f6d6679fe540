// Starts (and stops) everything Pomewright needs on this machine: MariaDB, the fakes, the app.
//   node --import tsx scripts/stack.ts start          → serves until Ctrl-C
//   node --import tsx scripts/stack.ts test [pattern] → runs the tests against a fresh test stack
//   node --import tsx scripts/stack.ts bench          → page weights and load figures on a fresh bench stack
import { existsSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { runBenchmarks } from './stack/bench'
import { buildIfStale, outputDir } from './stack/build'
import { migrateAndSeed } from './stack/database'
import { mariadbReady, prepareDatabase, startMariadb } from './stack/mariadb'
import { httpOk, isAlive, startService, stopService, waitFor, type Service } from './stack/processes'
import { appUrl, databaseUrl, loadProfile, serviceEnv, storageEnv, type Mode, type Profile } from './stack/profile'
import { restartPolicy, supervise, type Watched } from './stack/supervise'
import { runTests } from './stack/tests'

const root = resolve(fileURLToPath(new URL('..', import.meta.url)))
const mode = process.argv[2] as Mode
if (mode !== 'start' && mode !== 'test' && mode !== 'bench') {
  console.error('usage: stack.ts start | test [pattern…] | bench')
  process.exit(2)
}
const profile = loadProfile(mode, root)
const lockFile = join(profile.dataDir, 'stack.json')
const policy = restartPolicy()
const services: Service[] = []
// What the supervisor restarts when it exits, with how to tell it is back.
const watched: Watched[] = []
// Ends the test run when the stack under it gives up.
const testRun = new AbortController()
let stopping: Promise<void> | null = null

/** One stack per data folder: a second `npm start` reports the running one and leaves it alone. */
function takeLock(p: Profile): boolean {
  if (existsSync(lockFile)) {
    const held = JSON.parse(readFileSync(lockFile, 'utf8')) as { pid: number, url: string, children: number[] }
    if (isAlive(held.pid)) {
      console.log(`Pomewright is already running at ${held.url} (process ${held.pid}); stop it with Ctrl-C there first.`)
      return false
    }
    // Left behind by a stack that was killed outright: end what it started.
    for (const pid of held.children) {
      try {
        process.kill(-pid, 'SIGKILL')
      }
      catch { /* already gone */ }
    }
  }
  writeLock(p)
  return true
}

function writeLock(p: Profile) {
  writeFileSync(lockFile, JSON.stringify({ pid: process.pid, url: appUrl(p), children: services.map(s => s.child.pid) }))
}

function stopAll(): Promise<void> {
  stopping ??= (async () => {
    for (const service of [...services].reverse()) await stopService(service)
    rmSync(lockFile, { force: true })
  })()
  return stopping
}

async function up(p: Profile): Promise<void> {
  const echo = p.mode === 'start'
  const logDir = join(p.dataDir, 'logs')
  const dbUrl = databaseUrl(p)
  if (!p.externalDatabaseUrl) {
    console.log(`==> MariaDB on 127.0.0.1:${p.dbPort} (data in ${p.dataDir}/mariadb)`)
    const db = await startMariadb(p, false)
    if (db) {
      services.push(db)
      watched.push({ service: db, ready: () => mariadbReady(p, db) })
    }
    writeLock(p)
    await prepareDatabase(p)
  }
  const env = serviceEnv(p)
  console.log(`==> Local fakes: S3 :${p.s3Port}, payments :${p.paymentsPort}, SMTP :${p.smtpPort} (captured mail :${p.mailApiPort})`)
  const fakes = startService('fakes', process.execPath, ['--import', 'tsx', 'fakes/index.ts'], {
    cwd: p.root, logDir, echo: false,
    env: {
      ...env,
      FAKE_S3_PORT: String(p.s3Port), FAKE_S3_DIR: join(p.dataDir, 's3'),
      FAKE_PAYMENTS_PORT: String(p.paymentsPort), FAKE_PAYMENTS_DIR: join(p.dataDir, 'payments'), FAKE_SMTP_PORT: String(p.smtpPort), FAKE_MAIL_API_PORT: String(p.mailApiPort),
      FAKE_WEBHOOK_URL: `${appUrl(p)}/api/webhooks/payments`,
    },
  })
  services.push(fakes)
  writeLock(p)
  const fakesReady = () => waitFor('the local fakes', () => httpOk(`http://127.0.0.1:${p.mailApiPort}/health`), 30_000, fakes.child)
  watched.push({ service: fakes, ready: fakesReady })
  await fakesReady()

  console.log('==> Database migrations')
  // The demo's lab sheets go into the file store as they are seeded.
  Object.assign(process.env, storageEnv(p))
  const { seeded } = await migrateAndSeed(dbUrl)
  if (seeded) console.log('==> Seeded the demo scenario')

  await buildIfStale(p.root)
  const app = startService('app', process.execPath, [join(outputDir(p.root), 'server', 'index.mjs')], { cwd: p.root, env, logDir, echo })
  services.push(app)
  writeLock(p)
  const appReady = () => waitFor('the app', () => httpOk(`${appUrl(p)}/api/health`), 60_000, app.child)
  watched.push({ service: app, ready: appReady })
  await appReady()
}

/** From here on a service that exits unexpectedly is restarted; too many restarts stop the stack. */
function superviseAll(p: Profile) {
  supervise(watched, p.root, {
    stopping: () => stopping !== null,
    restarted: () => writeLock(p),
    policy,
    giveUp: (message) => {
      console.error(`\n==> ${message}`)
      // The test run ends, and main stops the stack and reports; `npm start` stops here.
      if (p.mode === 'test') testRun.abort()
      else void stopAll().then(() => process.exit(1))
    },
  })
}

function printWelcome(p: Profile) {
  console.log(`
Pomewright is running at ${appUrl(p)}
Demo sign-ins (password pomewright-demo):
  grower@demo.test         Hollowmere Orchard & Nursery (owner)
  grower-member@demo.test  Hollowmere Orchard & Nursery (member)
  grower2@demo.test        Tansy Row Fruit (owner)
  maker@demo.test          Quillhurst Cider Works (owner)
  viewer@demo.test         Quillhurst Cider Works (viewer)
  maker2@demo.test         Marrowby Perry House (owner, US units)
  admin@demo.test          platform admin
Captured e-mail: http://127.0.0.1:${p.mailApiPort}/messages
Press Ctrl-C to stop everything.`)
}

async function main() {
  if (!takeLock(profile)) process.exit(profile.mode === 'start' ? 0 : 1)
  for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) {
    process.on(signal, () => {
      console.log(`\n==> Stopping (${signal})`)
      void stopAll().then(() => process.exit(130))
    })
  }
  try {
    await up(profile)
  }
  catch (error) {
    console.error(`\nCould not start: ${(error as Error).message}\nLogs: ${join(profile.dataDir, 'logs')}`)
    await stopAll()
    process.exit(1)
  }
  superviseAll(profile)
  if (profile.mode === 'start') {
    printWelcome(profile)
    return
  }
  const code = profile.mode === 'bench' ? await runBenchmarks(profile) : await runTests(profile, process.argv.slice(3), testRun.signal)
  await stopAll()
  process.exit(code)
}

void main()
