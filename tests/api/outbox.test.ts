import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startMailSink } from '../../fakes/mail'
import { ApiClient, type ApiResponse } from '../support/http'
import { DEMO_PASSWORD, testEnv } from '../support/env'
import { startInstance, type Instance } from '../support/instance'
import { scratchDatabase, sidePort, type ScratchDb } from '../support/scratchDb'

// App instances beside the test stack, each on a database of its own (so the stack's sender takes
// none of their messages), with short retry settings and a relay that is down, comes back, or is shared.
let scratch: ScratchDb
const instances: Instance[] = []

beforeAll(async () => {
  scratch = await scratchDatabase('pomewright_outbox_check')
})

afterAll(async () => {
  await Promise.all(instances.map(i => i.stop()))
  await scratch?.drop()
})

async function instance(offset: number, env: Record<string, string>): Promise<Instance> {
  const app = await startInstance(sidePort(offset), { DATABASE_URL: scratch.url, POMEWRIGHT_OUTBOX_INTERVAL_MS: '100', ...env })
  instances.push(app)
  return app
}

async function signedIn(app: Instance, email: string): Promise<ApiClient> {
  const client = new ApiClient(undefined, app.url)
  await client.signIn(email, DEMO_PASSWORD)
  if (!client.hasSession()) throw new Error(`sign-in as ${email} failed on ${app.url}`)
  return client
}

interface Row { id: number, status: string, attempts: number, error: string | null, claimed_by: string | null, locked_until: Date | null, recipient: string }

function messageTo(recipient: string): Promise<Row | undefined> {
  return scratch.db('notifications').where({ recipient }).orderBy('id', 'desc').first()
}

async function until<T>(what: string, read: () => Promise<T>, ok: (value: T) => boolean, timeoutMs = 20_000): Promise<T> {
  const deadline = Date.now() + timeoutMs
  let value = await read()
  while (!ok(value)) {
    if (Date.now() > deadline) throw new Error(`${what} did not happen within ${timeoutMs} ms; last seen ${JSON.stringify(value)}`)
    await new Promise(r => setTimeout(r, 100))
    value = await read()
  }
  return value
}

const closedPort = () => `smtp://127.0.0.1:${sidePort(19)}`

describe('the outbox when the relay is down', () => {
  it('an invitation still succeeds; its message waits queued, then fails after the last try with its error kept', async () => {
    const app = await instance(11, { SMTP_URL: closedPort(), POMEWRIGHT_OUTBOX_MAX_ATTEMPTS: '3', POMEWRIGHT_OUTBOX_BACKOFF_MS: '400' })
    const owner = await signedIn(app, 'grower@demo.test')
    const email = `invitee-${Date.now().toString(36)}@example.test`

    const invited: ApiResponse = await owner.post('/api/invitations', { email, role: 'member' })
    expect(invited.status, JSON.stringify(invited.body)).toBe(201)
    expect(await messageTo(email)).toMatchObject({ status: 'queued' })

    const failed = await until('the message failing', () => messageTo(email), row => row?.status === 'failed')
    expect(failed).toMatchObject({ status: 'failed', attempts: 3 })
    expect(failed!.error).toMatch(/ECONNREFUSED/)

    // The owner sees it among the organisation's messages, with why it failed, and without its body.
    const outbox = await owner.get('/api/organisation/outbox?status=failed')
    expect(outbox.status).toBe(200)
    const listed = outbox.body.items.find((m: { recipient: string }) => m.recipient === email)
    expect(listed).toMatchObject({ status: 'failed', attempts: 3, kind: 'member.invited', error: expect.stringMatching(/ECONNREFUSED/) })
    expect(listed).not.toHaveProperty('body')
    await app.stop()
  })

  it('a queued message arrives exactly once after the relay comes back', async () => {
    const smtpPort = sidePort(17)
    const app = await instance(12, { SMTP_URL: `smtp://127.0.0.1:${smtpPort}`, POMEWRIGHT_OUTBOX_MAX_ATTEMPTS: '50', POMEWRIGHT_OUTBOX_BACKOFF_MS: '200', POMEWRIGHT_OUTBOX_BACKOFF_MAX_MS: '400' })
    const email = 'grower2@demo.test'
    expect((await new ApiClient(undefined, app.url).post('/api/password/forgot', { email })).status).toBe(200)
    // Two tries over, not one under way: a try counts when claimed and lets go of its lock when done.
    await until('two failed tries', () => messageTo(email), row => (row?.attempts ?? 0) >= 2 && row?.status === 'queued' && row.locked_until === null)

    const sink = await startMailSink(smtpPort, sidePort(18))
    try {
      const sent = await until('the message being sent', () => messageTo(email), row => row?.status === 'sent')
      expect(sent!.attempts).toBeGreaterThanOrEqual(3)
      // Long enough for a second send, were there to be one.
      await new Promise(r => setTimeout(r, 1_500))
      const captured = await (await fetch(`http://127.0.0.1:${sidePort(18)}/messages?to=${email}`)).json() as { items: { subject: string }[] }
      expect(captured.items.map(m => m.subject)).toEqual(['Reset your Pomewright password'])
    }
    finally {
      await app.stop()
      await new Promise(r => sink.smtp.close(() => r(null)))
      await new Promise(r => sink.api.close(() => r(null)))
    }
  })
})

describe('several instances sending one outbox', () => {
  it('two instances send each of 200 queued messages exactly once', async () => {
    const run = `bulk${Date.now().toString(36)}`
    const env = { SMTP_URL: process.env.SMTP_URL!, POMEWRIGHT_OUTBOX_INTERVAL_MS: '50', POMEWRIGHT_OUTBOX_BATCH: '5' }
    const [a, b] = await Promise.all([instance(13, env), instance(14, env)])
    const recipients = Array.from({ length: 200 }, (_, i) => `${run}-${i}@example.test`)
    await scratch.db('notifications').insert(recipients.map(recipient => ({ recipient, kind: 'test.bulk', subject: `Message for ${recipient}`, body: 'One of two hundred.' })))

    const ofRun = () => scratch.db('notifications').where('recipient', 'like', `${run}-%`)
    await until('all 200 sent', async () => (await ofRun().clone().where({ status: 'sent' }).count({ n: '*' }))[0]!.n as number, n => Number(n) === 200, 60_000)
    await new Promise(r => setTimeout(r, 1_000))

    const res = await fetch(`${testEnv.mailApiUrl}/messages?toContains=${run}`)
    const captured = (await res.json() as { items: { to: string[] }[] }).items
    const perRecipient = new Map<string, number>()
    for (const m of captured) for (const to of m.to) perRecipient.set(to, (perRecipient.get(to) ?? 0) + 1)
    expect(captured).toHaveLength(200)
    expect(recipients.filter(r => perRecipient.get(r) !== 1)).toEqual([])

    // Both instances took part (each row names the instance that sent it).
    const senders = await ofRun().clone().distinct('claimed_by') as { claimed_by: string }[]
    expect(new Set(senders.map(s => s.claimed_by.split(':').slice(0, 2).join(':'))).size).toBe(2)
    await Promise.all([a.stop(), b.stop()])
  })
})
