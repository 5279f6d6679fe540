import { createServer, type Server, type Socket } from 'node:net'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { as, type ApiClient } from '../support/http'
import { startInstance, type Instance } from '../support/instance'

const NAMES = ['database', 'storage', 'mail', 'payments']

describe('GET /api/health/services on the test stack', () => {
  it('reports all four services up, each with its response time', async () => {
    const res = await (await as('anonymous')).get('/api/health/services')
    expect(res.status).toBe(200)
    expect(res.headers.get('cache-control')).toBe('no-store')
    expect(res.body).toEqual({
      ok: true,
      services: NAMES.map(name => ({ name, state: 'up', responseMs: expect.any(Number) })),
    })
    for (const service of res.body.services) expect(service.responseMs).toBeLessThan(2000)
  })

  it('leaves /api/health as it was: one database ping', async () => {
    const res = await (await as('anonymous')).get('/api/health')
    expect(res).toMatchObject({ status: 200, body: { ok: true } })
  })
})

// A second instance whose storage bucket is missing, whose mail relay refuses connections and
// whose payments API accepts connections but never answers.
describe('GET /api/health/services when services other than the database are down', () => {
  let app: Instance
  let silent: Server
  const sockets: Socket[] = []

  beforeAll(async () => {
    silent = createServer(socket => sockets.push(socket))
    await new Promise<void>(r => silent.listen(3599, '127.0.0.1', r))
    app = await startInstance(3597, {
      S3_BUCKET: 'no-such-bucket',
      SMTP_URL: 'smtp://127.0.0.1:3598',
      PAYMENTS_API_URL: 'http://127.0.0.1:3599',
      // Its relay is down: it must not take up the test stack's outbox.
      POMEWRIGHT_OUTBOX_SENDER: 'off',
    })
  })

  afterAll(async () => {
    await app?.stop()
    for (const socket of sockets) socket.destroy()
    await new Promise(r => silent?.close(r))
  })

  async function report(client?: ApiClient) {
    const cookie = client ? [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ') : ''
    const started = Date.now()
    const res = await fetch(`${app.url}/api/health/services`, { headers: cookie ? { cookie } : {} })
    return { status: res.status, ms: Date.now() - started, body: await res.json() }
  }

  it('answers 200 while the database is up, marks the rest down, and does not wait on the silent one', async () => {
    const { status, ms, body } = await report()
    expect(status).toBe(200)
    expect(body.services.map((s: { name: string, state: string }) => [s.name, s.state]))
      .toEqual([['database', 'up'], ['storage', 'down'], ['mail', 'down'], ['payments', 'down']])
    // Each check has 2 s; they run side by side.
    expect(ms).toBeLessThan(4000)
    expect(body.services[3].responseMs).toBeGreaterThanOrEqual(1900)
  })

  it('shows why to the platform admin only', async () => {
    const anonymous = await report()
    for (const service of anonymous.body.services) expect(service).not.toHaveProperty('error')
    const maker = await report(await as('makerOwner'))
    for (const service of maker.body.services) expect(service).not.toHaveProperty('error')

    const admin = await report(await as('admin'))
    const errors = Object.fromEntries(admin.body.services.map((s: { name: string, error?: string }) => [s.name, s.error]))
    expect(errors).toEqual({
      database: undefined,
      storage: 'bucket no-such-bucket answered HTTP 404',
      mail: expect.stringMatching(/ECONNREFUSED/),
      payments: 'no answer within 2 s',
    })
  })
})
