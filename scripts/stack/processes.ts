import { spawn, type ChildProcess } from 'node:child_process'
import { createWriteStream, existsSync, mkdirSync, readFileSync } from 'node:fs'
import { createConnection } from 'node:net'
import { join } from 'node:path'

export interface Service {
  name: string
  /** The running process; `respawn` replaces it. */
  child: ChildProcess
  /** Where to look when it fails. */
  logFile: string
  /** Starts the same command again (after it exited) and makes it `child`. */
  respawn: () => ChildProcess
}

/** A child that has ended, either by itself (exit code) or by a signal. */
export const hasExited = (child: ChildProcess) => child.exitCode !== null || child.signalCode !== null

export const sleep = (ms: number) => new Promise(r => setTimeout(r, ms))

export function isAlive(pid: number): boolean {
  try {
    process.kill(pid, 0)
    return true
  }
  catch {
    return false
  }
}

export function readPid(file: string): number | null {
  if (!existsSync(file)) return null
  const pid = Number(readFileSync(file, 'utf8').trim())
  return Number.isInteger(pid) && pid > 0 ? pid : null
}

export function portOpen(port: number, host = '127.0.0.1'): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = createConnection({ port, host })
    socket.once('connect', () => {
      socket.destroy()
      resolve(true)
    })
    socket.once('error', () => resolve(false))
  })
}

export async function waitFor(what: string, check: () => Promise<boolean>, timeoutMs: number, child?: ChildProcess): Promise<void> {
  const deadline = Date.now() + timeoutMs
  while (Date.now() < deadline) {
    if (child && hasExited(child)) throw new Error(`${what} ${describeExit(child.exitCode, child.signalCode)} while starting`)
    if (await check().catch(() => false)) return
    await sleep(250)
  }
  throw new Error(`${what} did not become ready within ${Math.round(timeoutMs / 1000)} s`)
}

export function describeExit(code: number | null, signal: NodeJS.Signals | null): string {
  return signal ? `was killed by ${signal}` : `exited with code ${code}`
}

export async function httpOk(url: string): Promise<boolean> {
  const res = await fetch(url, { signal: AbortSignal.timeout(2000) })
  return res.ok
}

/**
 * Starts a long-running child in its own process group (so a terminal's Ctrl-C reaches only us,
 * and we stop the children in order). Output goes to a log file, and to our console when `echo`.
 */
export function startService(name: string, command: string, args: string[], opts: { env?: Record<string, string>, cwd: string, logDir: string, echo: boolean }): Service {
  mkdirSync(opts.logDir, { recursive: true })
  const logFile = join(opts.logDir, `${name}.log`)
  const log = createWriteStream(logFile, { flags: 'a' })
  const spawnChild = () => {
    const child = spawn(command, args, { cwd: opts.cwd, env: { ...process.env, ...opts.env }, detached: true, stdio: ['ignore', 'pipe', 'pipe'] })
    for (const stream of [child.stdout!, child.stderr!]) {
      stream.pipe(log, { end: false })
      if (opts.echo) stream.on('data', (chunk: Buffer) => process.stdout.write(chunk.toString().replace(/^(?=.)/gm, `[${name}] `)))
    }
    return child
  }
  const service: Service = { name, logFile, child: spawnChild(), respawn: () => (service.child = spawnChild()) }
  return service
}

export async function stopService(service: Service, timeoutMs = 20_000): Promise<void> {
  const { child } = service
  if (hasExited(child) || !child.pid) return
  const exited = new Promise<void>(resolve => child.once('exit', () => resolve()))
  try {
    process.kill(-child.pid, 'SIGTERM')
  }
  catch {
    return
  }
  const timer = setTimeout(() => {
    try {
      process.kill(-child.pid!, 'SIGKILL')
    }
    catch { /* already gone */ }
  }, timeoutMs)
  await exited
  clearTimeout(timer)
}

/** Runs a command to completion, inheriting our console. `signal` ends it early (it then counts as failed). */
export function run(command: string, args: string[], opts: { cwd: string, env?: Record<string, string>, quiet?: boolean, signal?: AbortSignal }): Promise<number> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, { cwd: opts.cwd, env: { ...process.env, ...opts.env }, stdio: opts.quiet ? 'ignore' : 'inherit', signal: opts.signal })
    child.once('error', (error) => {
      if (error.name !== 'AbortError') reject(error)
    })
    child.once('exit', code => resolve(code ?? 1))
  })
}

export async function runOrThrow(command: string, args: string[], opts: { cwd: string, env?: Record<string, string>, quiet?: boolean }): Promise<void> {
  const code = await run(command, args, opts)
  if (code !== 0) throw new Error(`${command} ${args.join(' ')} failed with exit code ${code}`)
}
