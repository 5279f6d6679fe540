import { spawn, type ChildProcess } from 'node:child_process'
import { createWriteStream, existsSync, mkdirSync, readFileSync } from 'node:fs'
import { createConnection } from 'node:net'
import { join } from 'node:path'

export interface Service { name: string, child: ChildProcess }

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
    if (child && child.exitCode !== null) throw new Error(`${what} exited with code ${child.exitCode} while starting`)
    if (await check().catch(() => false)) return
    await sleep(250)
  }
  throw new Error(`${what} did not become ready within ${Math.round(timeoutMs / 1000)} s`)
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
  const log = createWriteStream(join(opts.logDir, `${name}.log`), { flags: 'a' })
  const child = spawn(command, args, { cwd: opts.cwd, env: { ...process.env, ...opts.env }, detached: true, stdio: ['ignore', 'pipe', 'pipe'] })
  for (const stream of [child.stdout!, child.stderr!]) {
    stream.pipe(log, { end: false })
    if (opts.echo) stream.on('data', (chunk: Buffer) => process.stdout.write(chunk.toString().replace(/^(?=.)/gm, `[${name}] `)))
  }
  return { name, child }
}

export async function stopService(service: Service, timeoutMs = 20_000): Promise<void> {
  const { child } = service
  if (child.exitCode !== null || child.signalCode !== null || !child.pid) return
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

/** Runs a command to completion, inheriting our console; rejects on a non-zero exit. */
export function run(command: string, args: string[], opts: { cwd: string, env?: Record<string, string>, quiet?: boolean }): Promise<number> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, { cwd: opts.cwd, env: { ...process.env, ...opts.env }, stdio: opts.quiet ? 'ignore' : 'inherit' })
    child.once('error', reject)
    child.once('exit', code => resolve(code ?? 1))
  })
}

export async function runOrThrow(command: string, args: string[], opts: { cwd: string, env?: Record<string, string>, quiet?: boolean }): Promise<void> {
  const code = await run(command, args, opts)
  if (code !== 0) throw new Error(`${command} ${args.join(' ')} failed with exit code ${code}`)
}
