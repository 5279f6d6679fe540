import { existsSync, readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { portOpen } from '../../scripts/stack/processes'
import { interrupt, root, startScript, until } from '../support/startScript'

// `npm start` on ports and a data folder of its own, with its services failing under it. It reuses
// the test run's build (the same POMEWRIGHT_OUTPUT_DIR, built from the same sources).
const dataDir = resolve(root, '.data/supervised-check')
const ports = { PORT: 3591, DB_PORT: 3592, S3_PORT: 3593, PAYMENTS_PORT: 3594, SMTP_PORT: 3595, MAIL_API_PORT: 3596 }
const appUrl = `http://127.0.0.1:${ports.PORT}`
const { start, mariadbPids, clear } = startScript(dataDir, ports)
const lockedChildren = () => (JSON.parse(readFileSync(resolve(dataDir, 'stack.json'), 'utf8')) as { children: number[] }).children

async function healthStatus(): Promise<number> {
  try {
    return (await fetch(`${appUrl}/api/health`, { signal: AbortSignal.timeout(3000) })).status
  }
  catch {
    return 0
  }
}

async function everythingGone() {
  for (const port of Object.values(ports)) expect(await portOpen(port), `port ${port}`).toBe(false)
  expect(mariadbPids()).toEqual([])
  expect(existsSync(resolve(dataDir, 'stack.json'))).toBe(false)
}

describe('npm start watches its services', () => {
  it('restarts a database that was killed, and the app answers again without a restart of its own', async () => {
    clear()
    const stack = start()
    await until(stack, `Pomewright is running at ${appUrl}`)
    expect(stack.output()).not.toContain('Building the app')
    expect(await healthStatus()).toBe(200)
    const [mariadb] = mariadbPids()
    expect(lockedChildren()).toContain(mariadb)
    const appPid = lockedChildren().at(-1)

    process.kill(mariadb!, 'SIGKILL')
    await until(stack, 'mariadb stopped unexpectedly: it was killed by SIGKILL (log: .data/supervised-check/logs/mariadb-error.log)', 10_000)
    expect(stack.output()).toMatch(/Restarting mariadb in \d+ s \(restart 1 of 5 allowed in 10 minutes\)/)

    const deadline = Date.now() + 90_000
    while (await healthStatus() !== 200) {
      expect(Date.now(), `the app did not answer again:\n${stack.output()}`).toBeLessThan(deadline)
      await new Promise(r => setTimeout(r, 250))
    }
    await until(stack, /mariadb is running again \(process \d+\)/, 10_000)
    const [restarted] = mariadbPids()
    expect(restarted).not.toBe(mariadb)
    expect(lockedChildren()).toContain(restarted)
    expect(lockedChildren()).not.toContain(mariadb)
    // The app kept its process: its connection pool dropped the dead connections by itself.
    expect(lockedChildren().at(-1)).toBe(appPid)
    expect((await fetch(`${appUrl}/api/health/services`)).status).toBe(200)

    // A deliberate stop restarts nothing.
    expect(await interrupt(stack)).toBe(130)
    expect(stack.output().match(/stopped unexpectedly/g)).toHaveLength(1)
    await everythingGone()
  }, 300_000)

  it('stops everything with a non-zero exit when a service keeps stopping', async () => {
    const stack = start({ POMEWRIGHT_MAX_RESTARTS: '0' })
    await until(stack, `Pomewright is running at ${appUrl}`)
    const fakes = lockedChildren()[1]!
    process.kill(-fakes, 'SIGKILL')
    expect(await stack.exited).toBe(1)
    expect(stack.output()).toMatch(/fakes stopped unexpectedly: it was killed by SIGKILL \(log: \.data\/supervised-check\/logs\/fakes\.log\)/)
    expect(stack.output()).toContain('Giving up on fakes: it keeps stopping (0 restarts in 10 minutes is the limit). Stopping everything')
    await everythingGone()
  }, 300_000)
})
