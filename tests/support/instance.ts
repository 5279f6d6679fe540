import { spawn, type ChildProcess } from 'node:child_process'
import { resolve } from 'node:path'

const root = resolve(import.meta.dirname, '../..')

export interface Instance { url: string, stop: () => Promise<void> }

/**
 * A second app instance from the test run's build, beside the test stack, with some of its
 * environment changed (a database or service it cannot reach). Resolves once it answers HTTP.
 */
export async function startInstance(port: number, env: Record<string, string>): Promise<Instance> {
  const url = `http://127.0.0.1:${port}`
  const entry = resolve(root, process.env.POMEWRIGHT_OUTPUT_DIR || '.output', 'server/index.mjs')
  const app: ChildProcess = spawn(process.execPath, [entry], {
    cwd: root,
    env: { ...process.env, PORT: String(port), NITRO_PORT: String(port), AUTH_ORIGIN: `${url}/api/auth`, NEXTAUTH_URL: `${url}/api/auth`, ...env },
    stdio: 'ignore',
  })
  const exited = new Promise<void>(done => app.once('exit', () => done()))
  /** Asks the instance to stop, as a process manager would, and waits until it has. */
  const stop = () => {
    if (app.exitCode === null && app.signalCode === null) app.kill('SIGTERM')
    return exited
  }
  const deadline = Date.now() + 30_000
  while (Date.now() < deadline) {
    try {
      await fetch(`${url}/api/health`)
      return { url, stop }
    }
    catch { await new Promise(r => setTimeout(r, 200)) }
  }
  await stop()
  throw new Error(`the instance on port ${port} did not start`)
}
