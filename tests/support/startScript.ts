import { execFileSync, spawn, type ChildProcess } from 'node:child_process'
import { rmSync } from 'node:fs'
import { resolve } from 'node:path'
import { afterAll } from 'vitest'

// `npm start` as a person runs it, on ports and a data folder of a test's own.

export const root = resolve(import.meta.dirname, '../..')

export type StartPorts = Record<'PORT' | 'DB_PORT' | 'S3_PORT' | 'PAYMENTS_PORT' | 'SMTP_PORT' | 'MAIL_API_PORT', number>

// The test run's own services and settings must not leak into the stack under test.
const LEAKS = new Set(['DATABASE_URL', 'S3_ENDPOINT', 'SMTP_URL', 'PAYMENTS_API_URL', 'APP_URL', 'NUXT_AUTH_SECRET', 'AUTH_ORIGIN', 'NEXTAUTH_URL', 'NITRO_PORT', 'NITRO_HOST', 'TRUST_PROXY', 'POMEWRIGHT_MAX_RESTARTS'])

export interface Run { child: ChildProcess, output: () => string, exited: Promise<number | null> }

/** Ctrl-C in a terminal: SIGINT to the foreground process group. */
export async function interrupt(run: Run) {
  process.kill(-run.child.pid!, 'SIGINT')
  return run.exited
}

/** Whatever it wants to start, a test gets its own data folder, cleared before and after, and every run stopped. */
export function startScript(dataDir: string, ports: StartPorts) {
  const running: Run[] = []
  afterAll(async () => {
    for (const run of running) if (run.child.exitCode === null) await interrupt(run)
    rmSync(dataDir, { recursive: true, force: true })
  })

  function start(extra: Record<string, string> = {}): Run {
    const base = Object.entries({ ...process.env, POMEWRIGHT_DATA_DIR: dataDir, HOST: '127.0.0.1' }).filter(([name]) => !LEAKS.has(name))
    const env: NodeJS.ProcessEnv = { ...Object.fromEntries(base), ...extra }
    for (const [name, port] of Object.entries(ports)) env[name] = String(port)
    let output = ''
    const child = spawn('bash', ['scripts/start.sh'], { cwd: root, env, detached: true, stdio: ['ignore', 'pipe', 'pipe'] })
    const keep = (d: Buffer) => {
      output += d.toString()
    }
    child.stdout!.on('data', keep)
    child.stderr!.on('data', keep)
    const exited = new Promise<number | null>(r => child.once('exit', code => r(code)))
    const run = { child, output: () => output, exited }
    running.push(run)
    return run
  }

  /** The pids of MariaDB servers on this data folder. */
  const mariadbPids = () => processesOf(`mariadbd .*--datadir=${dataDir}/mariadb`)

  return { start, mariadbPids, clear: () => rmSync(dataDir, { recursive: true, force: true }) }
}

/** Waits until the run has printed the text (or matched the pattern); fails if it exits first or times out. */
export async function until(run: Run, text: string | RegExp, timeoutMs = 180_000) {
  const deadline = Date.now() + timeoutMs
  const seen = () => typeof text === 'string' ? run.output().includes(text) : text.test(run.output())
  while (!seen()) {
    if (run.child.exitCode !== null) throw new Error(`start exited early:\n${run.output()}`)
    if (Date.now() > deadline) throw new Error(`timed out waiting for "${text}":\n${run.output()}`)
    await new Promise(r => setTimeout(r, 100))
  }
}

export function processesOf(pattern: string): number[] {
  try {
    return execFileSync('pgrep', ['-f', pattern]).toString().trim().split('\n').filter(Boolean).map(Number)
  }
  catch {
    return []
  }
}
