import { describe, expect, it } from 'vitest'
import { hashPassword } from '../../server/utils/passwords'
import { testDb, uniqueEmail } from '../support/db'
import { DEMO_PASSWORD } from '../support/env'
import { ApiClient, as, randomAddress } from '../support/http'

/** An extra account in the first maker organisation, so limit tests do not lock out the demo people. */
async function makeAccount(password: string): Promise<string> {
  const email = uniqueEmail('limit')
  const org = await testDb()('organisations').where({ name: 'Quillhurst Cider Works' }).first()
  await testDb()('users').insert({ org_id: org.id, email, name: 'Limit Tester', role: 'member', password_hash: await hashPassword(password), email_verified_at: new Date() })
  return email
}

describe('sign-in', () => {
  it('signs in with the right password and the session carries who and where', async () => {
    const client = new ApiClient()
    const res = await client.signIn('grower@demo.test', DEMO_PASSWORD)
    expect(res.status).toBe(200)
    expect(new URL(res.body.url!).searchParams.get('error')).toBeNull()
    expect(client.hasSession()).toBe(true)
    const session = await client.get('/api/auth/session')
    expect(session.body.user).toMatchObject({ email: 'grower@demo.test', orgKind: 'grower', isNursery: true, role: 'owner' })
    expect(session.body.user.id).toBeTypeOf('number')
    expect(session.body.user.orgId).toBeTypeOf('number')
  })

  it('gives each demo person the role and organisation kind the demo describes', async () => {
    const cases = [
      ['grower2@demo.test', 'grower', false, 'owner'],
      ['maker@demo.test', 'maker', false, 'owner'],
      ['viewer@demo.test', 'maker', false, 'viewer'],
      ['maker2@demo.test', 'maker', false, 'owner'],
      ['grower-member@demo.test', 'grower', true, 'member'],
    ] as const
    for (const [email, orgKind, isNursery, role] of cases) {
      const client = new ApiClient()
      await client.signIn(email, DEMO_PASSWORD)
      const { body } = await client.get('/api/auth/session')
      expect(body.user, email).toMatchObject({ email, orgKind, isNursery, role })
    }
    const admin = await as('admin')
    expect((await admin.get('/api/auth/session')).body.user).toMatchObject({ role: 'admin', orgId: null, orgKind: null })
  })

  it('refuses a wrong password: no session, and the reason comes back', async () => {
    const client = new ApiClient()
    const res = await client.signIn('grower@demo.test', 'not-the-password')
    expect(res.status).toBe(401)
    expect(new URL(res.body.url!).searchParams.get('error')).toBe('CredentialsSignin')
    expect(client.hasSession()).toBe(false)
    expect((await client.get('/api/me')).status).toBe(401)
  })

  it('refuses an unknown account the same way', async () => {
    const client = new ApiClient()
    const res = await client.signIn('nobody@example.test', DEMO_PASSWORD)
    expect(new URL(res.body.url!).searchParams.get('error')).toBe('CredentialsSignin')
    expect(client.hasSession()).toBe(false)
  })

  it('signs out', async () => {
    const client = new ApiClient()
    await client.signIn('maker@demo.test', DEMO_PASSWORD)
    expect((await client.get('/api/me')).status).toBe(200)
    const csrf = await client.get('/api/auth/csrf')
    await client.post('/api/auth/signout', new URLSearchParams({ csrfToken: csrf.body.csrfToken, json: 'true' }))
    expect(client.hasSession()).toBe(false)
    expect((await client.get('/api/me')).status).toBe(401)
  })
})

describe('protected routes', () => {
  it('answer 401 signed out, before reading the body', async () => {
    const anonymous = new ApiClient()
    const res = await anonymous.request('POST', '/api/invitations', '{not json', { 'content-type': 'application/json' })
    expect(res.status).toBe(401)
    expect(res.body).toMatchObject({ statusCode: 401, statusMessage: 'Unauthorized', message: expect.stringMatching(/sign in/i) })
  })

  it('answer 403 for the wrong role or organisation kind, with a message', async () => {
    const viewer = await as('makerViewer')
    const res = await viewer.post('/api/invitations', { email: uniqueEmail('x'), role: 'member' })
    expect(res.status).toBe(403)
    expect(res.body.message).toMatch(/viewer/)
    const admin = await as('admin')
    expect((await admin.get('/api/members')).status).toBe(403)
    const grower = await as('growerOwner')
    expect((await grower.get('/api/admin/organisations')).status).toBe(403)
  })

  it('answer 400 with the field at fault for bad input', async () => {
    const owner = await as('makerOwner')
    const res = await owner.post('/api/invitations', { email: 'not-an-email', role: 'chief' })
    expect(res.status).toBe(400)
    const paths = res.body.data.issues.map((i: { path: string }) => i.path)
    expect(paths).toEqual(expect.arrayContaining(['email', 'role']))
  })

  it('keep the units preference on the profile', async () => {
    const client = new ApiClient()
    await client.signIn('grower-member@demo.test', DEMO_PASSWORD)
    expect((await client.patch('/api/me', { units: 'us' })).body.units).toBe('us')
    expect((await client.get('/api/me')).body.units).toBe('us')
    const bad = await client.patch('/api/me', { units: 'imperial' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues[0].path).toBe('units')
    await client.patch('/api/me', { units: 'metric' })
  })
})

describe('failed sign-ins are limited', () => {
  it('per account: after 10 failures even the right password answers 429, until the window passes', async () => {
    const email = await makeAccount('right-password-1')
    for (let i = 0; i < 10; i++) {
      const res = await new ApiClient(randomAddress()).signIn(email, `wrong-${i}`)
      expect(res.status).toBe(401)
    }
    const limited = new ApiClient(randomAddress())
    const res = await limited.signIn(email, 'right-password-1')
    expect(res.status).toBe(429)
    expect(res.body.message).toMatch(/too many/i)
    expect(res.headers.get('retry-after')).toBe('900')
    expect(limited.hasSession()).toBe(false)

    // Let the 15-minute window pass.
    await testDb()('sign_in_attempts').where({ email }).update({ created_at: new Date(Date.now() - 16 * 60_000) })
    const later = new ApiClient(randomAddress())
    await later.signIn(email, 'right-password-1')
    expect(later.hasSession()).toBe(true)
  })

  it('per address: 10 failures from one address block it for every account, not other addresses', async () => {
    const address = randomAddress()
    for (let i = 0; i < 10; i++) await new ApiClient(address).signIn(uniqueEmail('ghost'), 'whatever-it-is')
    const blocked = new ApiClient(address)
    expect((await blocked.signIn('maker@demo.test', DEMO_PASSWORD)).status).toBe(429)
    const elsewhere = new ApiClient(randomAddress())
    await elsewhere.signIn('maker@demo.test', DEMO_PASSWORD)
    expect(elsewhere.hasSession()).toBe(true)
    await testDb()('sign_in_attempts').where({ ip: address }).update({ created_at: new Date(Date.now() - 16 * 60_000) })
    await blocked.signIn('maker@demo.test', DEMO_PASSWORD)
    expect(blocked.hasSession()).toBe(true)
  })

  it('counts attempts in the database, where every app instance sees them', async () => {
    const email = await makeAccount('another-password')
    await new ApiClient().signIn(email, 'nope-nope-nope')
    const rows = await testDb()('sign_in_attempts').where({ email })
    expect(rows).toHaveLength(1)
    expect(rows[0]).toMatchObject({ succeeded: false })
  })
})
