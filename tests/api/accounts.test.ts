import { describe, expect, it } from 'vitest'
import { hashPassword } from '../../server/utils/passwords'
import { hashToken } from '../../server/utils/tokens'
import { testDb, uniqueEmail } from '../support/db'
import { ApiClient, as } from '../support/http'
import { messagesTo, tokenFrom, waitForMail } from '../support/mail'

const PASSWORD = 'cellar-door-2026'

async function signedIn(email: string, password: string): Promise<ApiClient> {
  const client = new ApiClient()
  await client.signIn(email, password)
  return client
}

describe('inviting a member', () => {
  it('e-mails a one-time link; the invited person sets a password and joins with the role given', async () => {
    const owner = await as('growerOwner')
    const email = uniqueEmail('picker')
    const invited = await owner.post('/api/invitations', { email, role: 'member' })
    expect(invited.status).toBe(201)
    expect((await owner.get('/api/invitations')).body.items.map((i: { email: string }) => i.email)).toContain(email)

    const mail = await waitForMail(email, /invites you to Hollowmere/)
    const token = tokenFrom(mail, '/invite')
    const stored = await testDb()('invitations').where({ email }).first()
    expect(stored.token_hash).toBe(hashToken(token))
    expect(stored.token_hash).not.toContain(token)

    const lookup = await new ApiClient().get(`/api/invitations/accept?token=${token}`)
    expect(lookup.body).toEqual({ email, role: 'member', organisationName: 'Hollowmere Orchard & Nursery' })

    const tooShort = await new ApiClient().post('/api/invitations/accept', { token, name: 'Ada Picker', password: 'short' })
    expect(tooShort.status).toBe(400)
    expect(tooShort.body.data.issues[0].path).toBe('password')

    expect((await new ApiClient().post('/api/invitations/accept', { token, name: 'Ada Picker', password: PASSWORD })).status).toBe(201)
    const member = await signedIn(email, PASSWORD)
    expect((await member.get('/api/auth/session')).body.user).toMatchObject({ email, role: 'member', orgKind: 'grower' })
    const list = await owner.get('/api/members')
    expect(list.body.items.find((m: { email: string }) => m.email === email)).toMatchObject({ name: 'Ada Picker', role: 'member' })

    // The link works once.
    const reused = await new ApiClient().post('/api/invitations/accept', { token, name: 'Someone Else', password: PASSWORD })
    expect(reused.status).toBe(400)
    expect(reused.body.message).toMatch(/expired or was already used/)
  })

  it('refuses an expired invitation link', async () => {
    const owner = await as('makerOwner')
    const email = uniqueEmail('late')
    await owner.post('/api/invitations', { email, role: 'viewer' })
    const token = tokenFrom(await waitForMail(email, /invites you/), '/invite')
    await testDb()('invitations').where({ token_hash: hashToken(token) }).update({ expires_at: new Date(Date.now() - 60_000) })
    expect((await new ApiClient().get(`/api/invitations/accept?token=${token}`)).status).toBe(400)
    expect((await new ApiClient().post('/api/invitations/accept', { token, name: 'Late Comer', password: PASSWORD })).status).toBe(400)
  })

  it('lets an owner withdraw an invitation, and another owner’s invitation answers 404', async () => {
    const owner = await as('makerOwner')
    const email = uniqueEmail('withdrawn')
    const { body } = await owner.post('/api/invitations', { email, role: 'member' })
    const other = await as('maker2Owner')
    expect((await other.delete(`/api/invitations/${body.id}`)).status).toBe(404)
    expect((await owner.delete(`/api/invitations/${body.id}`)).status).toBe(204)
    const token = tokenFrom(await waitForMail(email, /invites you/), '/invite')
    expect((await new ApiClient().get(`/api/invitations/accept?token=${token}`)).status).toBe(400)
  })

  it('does not invite someone who already has an account', async () => {
    const owner = await as('makerOwner')
    const res = await owner.post('/api/invitations', { email: 'grower@demo.test', role: 'member' })
    expect(res.status).toBe(409)
    expect(res.body.data.issues[0].path).toBe('email')
  })
})

describe('managing members', () => {
  async function joinHollowmere(role: 'member' | 'viewer' | 'owner') {
    const owner = await as('growerOwner')
    const email = uniqueEmail(role)
    await owner.post('/api/invitations', { email, role })
    const token = tokenFrom(await waitForMail(email, /invites you/), '/invite')
    await new ApiClient().post('/api/invitations/accept', { token, name: `New ${role}`, password: PASSWORD })
    const id = (await owner.get('/api/members?limit=200')).body.items.find((m: { email: string }) => m.email === email).id as number
    return { email, id }
  }

  it('an owner changes a role, and the change applies at once', async () => {
    const owner = await as('growerOwner')
    const { email, id } = await joinHollowmere('member')
    const person = await signedIn(email, PASSWORD)
    expect((await owner.patch(`/api/members/${id}`, { role: 'viewer' })).body).toMatchObject({ id, role: 'viewer' })
    expect((await person.get('/api/me')).body.role).toBe('viewer')
    expect((await person.post('/api/invitations', { email: uniqueEmail('x'), role: 'member' })).status).toBe(403)
  })

  it('an owner removes a member, who is signed out everywhere at once', async () => {
    const owner = await as('growerOwner')
    const { email, id } = await joinHollowmere('member')
    const person = await signedIn(email, PASSWORD)
    expect((await person.get('/api/me')).status).toBe(200)
    expect((await owner.delete(`/api/members/${id}`)).status).toBe(204)
    expect((await person.get('/api/me')).status).toBe(401)
    expect((await owner.get('/api/members?limit=200')).body.items.map((m: { id: number }) => m.id)).not.toContain(id)
  })

  it('keeps at least one owner (409)', async () => {
    const owner = await as('grower2Owner')
    const self = (await owner.get('/api/me')).body.id
    const res = await owner.patch(`/api/members/${self}`, { role: 'member' })
    expect(res.status).toBe(409)
    expect(res.body.message).toMatch(/at least one owner/)
    expect((await owner.delete(`/api/members/${self}`)).status).toBe(409)
  })

  it('another organisation’s member answers 404, and members cannot manage', async () => {
    const otherOwner = await as('makerOwner')
    const hollowmereMember = (await (await as('growerOwner')).get('/api/members')).body.items.find((m: { email: string }) => m.email === 'grower-member@demo.test').id
    expect((await otherOwner.patch(`/api/members/${hollowmereMember}`, { role: 'viewer' })).status).toBe(404)
    expect((await otherOwner.delete(`/api/members/${hollowmereMember}`)).status).toBe(404)
    const member = await as('growerMember')
    expect((await member.patch(`/api/members/${hollowmereMember}`, { role: 'viewer' })).status).toBe(403)
  })
})

describe('the platform admin', () => {
  it('lists the organisations and how many people each has, and none of their records', async () => {
    const admin = await as('admin')
    const { body } = await admin.get('/api/admin/organisations?limit=200')
    const hollowmere = body.items.find((o: { name: string }) => o.name === 'Hollowmere Orchard & Nursery')
    expect(hollowmere).toMatchObject({ kind: 'grower', isNursery: true, status: 'active' })
    expect(hollowmere.members).toBeGreaterThanOrEqual(2)
    expect(body.total).toBeGreaterThanOrEqual(4)
    expect(Object.keys(hollowmere).sort()).toEqual(['createdAt', 'id', 'isNursery', 'kind', 'members', 'name', 'region', 'status'])
  })
})

describe('suspending an organisation', () => {
  it('signs its people out at once and lets them back in when reopened; each change is audited', async () => {
    const [orgId] = await testDb()('organisations').insert({ name: 'Brackenfold Growers', kind: 'grower', status: 'active' })
    const email = uniqueEmail('bracken')
    await testDb()('users').insert({ org_id: orgId, email, name: 'Bea Bracken', role: 'owner', password_hash: await hashPassword(PASSWORD), email_verified_at: new Date() })
    const person = await signedIn(email, PASSWORD)
    expect((await person.get('/api/me')).status).toBe(200)

    const admin = await as('admin')
    expect((await admin.patch(`/api/admin/organisations/${orgId}`, { status: 'suspended' })).body).toMatchObject({ id: orgId, status: 'suspended' })
    expect((await person.get('/api/me')).status).toBe(401)
    expect((await signedIn(email, PASSWORD)).hasSession()).toBe(false)

    const bad = await admin.patch(`/api/admin/organisations/${orgId}`, { status: 'closed' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues[0].path).toBe('status')

    await admin.patch(`/api/admin/organisations/${orgId}`, { status: 'active' })
    expect((await person.get('/api/me')).status).toBe(200)
    const audit = await testDb()('audit_events').where({ org_id: orgId, object_type: 'organisation' }).orderBy('id').pluck('action')
    expect(audit).toEqual(['organisation.suspended', 'organisation.opened'])
  })
})

describe('the organisation moves, one route each', () => {
  it('suspends, reopens and opens by the state table; a move from the wrong state is a 409 naming the state', async () => {
    const [orgId] = await testDb()('organisations').insert({ name: 'Fernhollow Fruit', kind: 'grower', status: 'pending' })
    const admin = await as('admin')

    const suspendPending = await admin.post(`/api/admin/organisations/${orgId}/suspend`, {})
    expect(suspendPending.status).toBe(409)
    expect(suspendPending.body.data.state).toBe('pending')
    expect(suspendPending.body.message).toContain('pending')

    expect((await admin.post(`/api/admin/organisations/${orgId}/open`, {})).body).toEqual({ id: orgId, name: 'Fernhollow Fruit', status: 'active' })
    expect((await admin.post(`/api/admin/organisations/${orgId}/open`, {})).status).toBe(409)
    expect((await admin.post(`/api/admin/organisations/${orgId}/suspend`, {})).body).toMatchObject({ status: 'suspended' })
    const twice = await admin.post(`/api/admin/organisations/${orgId}/suspend`, {})
    expect(twice.status).toBe(409)
    expect(twice.body.data.state).toBe('suspended')
    expect((await admin.post(`/api/admin/organisations/${orgId}/reopen`, {})).body).toMatchObject({ status: 'active' })

    expect((await testDb()('organisations').where({ id: orgId }).first('status')).status).toBe('active')
    const audit = await testDb()('audit_events').where({ org_id: orgId, object_type: 'organisation' }).orderBy('id').pluck('action')
    expect(audit).toEqual(['organisation.opened', 'organisation.suspended', 'organisation.opened'])
  })

  it('lets only one of two simultaneous suspensions through', async () => {
    const [orgId] = await testDb()('organisations').insert({ name: 'Twinbrook Orchard', kind: 'grower', status: 'active' })
    const admin = await as('admin')
    const answers = await Promise.all([1, 2, 3].map(() => admin.post(`/api/admin/organisations/${orgId}/suspend`, {})))
    expect(answers.map(a => a.status).sort()).toEqual([200, 409, 409])
    expect(await testDb()('audit_events').where({ org_id: orgId, action: 'organisation.suspended' }).count({ n: '*' })).toEqual([{ n: 1 }])
  })
})

describe('signing up a new organisation', () => {
  it('stays closed until the e-mail is confirmed, then opens with the owner signed in', async () => {
    const email = uniqueEmail('founder')
    const res = await new ApiClient().post('/api/signup', { orgName: 'Wrenfold Press', orgKind: 'maker', name: 'Ivo Wren', email, password: PASSWORD })
    expect(res.status).toBe(201)

    const early = new ApiClient()
    const attempt = await early.signIn(email, PASSWORD)
    expect(new URL(attempt.body.url!).searchParams.get('error')).toBe('EmailNotVerified')
    expect(early.hasSession()).toBe(false)

    const token = tokenFrom(await waitForMail(email, /Confirm your e-mail/), '/verify')
    expect((await new ApiClient().post('/api/signup/verify', { token })).status).toBe(200)
    const owner = await signedIn(email, PASSWORD)
    expect((await owner.get('/api/me')).body).toMatchObject({ email, role: 'owner', orgKind: 'maker', organisation: { name: 'Wrenfold Press', kind: 'maker' } })

    expect((await new ApiClient().post('/api/signup/verify', { token })).status).toBe(400)
  })

  it('sends a fresh link when someone signs up again before confirming, and changes nothing else', async () => {
    const email = uniqueEmail('twice')
    await new ApiClient().post('/api/signup', { orgName: 'Twice Told Orchard', orgKind: 'grower', name: 'Tam Twice', email, password: PASSWORD })
    const again = await new ApiClient().post('/api/signup', { orgName: 'Another Name', orgKind: 'maker', name: 'Someone Else', email, password: 'a-different-password' })
    expect(again.status).toBe(201)
    await expect.poll(async () => (await messagesTo(email)).length).toBe(2)
    const [first, second] = await messagesTo(email)
    expect(second!.text).toContain('Twice Told Orchard')
    expect(tokenFrom(second!, '/verify')).not.toBe(tokenFrom(first!, '/verify'))
    expect((await new ApiClient().post('/api/signup/verify', { token: tokenFrom(second!, '/verify') })).status).toBe(200)
    expect((await signedIn(email, PASSWORD)).hasSession()).toBe(true)
    expect(await testDb()('organisations').where({ name: 'Another Name' }).first()).toBeUndefined()
    // Once confirmed, the address is taken.
    expect((await new ApiClient().post('/api/signup', { orgName: 'Third Go', orgKind: 'maker', name: 'Tam', email, password: PASSWORD })).status).toBe(409)
  })

  it('refuses an expired confirmation link', async () => {
    const email = uniqueEmail('slow')
    await new ApiClient().post('/api/signup', { orgName: 'Slowbrook Orchard', orgKind: 'grower', isNursery: true, name: 'Pat Slow', email, password: PASSWORD })
    const token = tokenFrom(await waitForMail(email, /Confirm your e-mail/), '/verify')
    await testDb()('user_tokens').where({ token_hash: hashToken(token) }).update({ expires_at: new Date(Date.now() - 1000) })
    const res = await new ApiClient().post('/api/signup/verify', { token })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0].path).toBe('token')
  })

  it('names each bad field, and refuses an e-mail already registered', async () => {
    const bad = await new ApiClient().post('/api/signup', { orgName: '', orgKind: 'brewery', name: 'X', email: 'nope', password: 'short' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues.map((i: { path: string }) => i.path)).toEqual(expect.arrayContaining(['orgName', 'orgKind', 'email', 'password']))
    const nurseryMaker = await new ApiClient().post('/api/signup', { orgName: 'Odd One', orgKind: 'maker', isNursery: true, name: 'Odd', email: uniqueEmail('odd'), password: PASSWORD })
    expect(nurseryMaker.status).toBe(400)
    expect(nurseryMaker.body.data.issues[0].path).toBe('isNursery')
    const taken = await new ApiClient().post('/api/signup', { orgName: 'Copycat Cider', orgKind: 'maker', name: 'Copy', email: 'maker@demo.test', password: PASSWORD })
    expect(taken.status).toBe(409)
  })
})

describe('resetting a password', () => {
  async function freshAccount() {
    const email = uniqueEmail('forgetful')
    await new ApiClient().post('/api/signup', { orgName: 'Forgetful Farm', orgKind: 'grower', name: 'Fen Forgets', email, password: PASSWORD })
    await new ApiClient().post('/api/signup/verify', { token: tokenFrom(await waitForMail(email, /Confirm your e-mail/), '/verify') })
    return email
  }

  it('e-mails a one-time link that sets a new password', async () => {
    const email = await freshAccount()
    expect((await new ApiClient().post('/api/password/forgot', { email })).status).toBe(200)
    const token = tokenFrom(await waitForMail(email, /Reset your Pomewright password/), '/reset-password')

    const weak = await new ApiClient().post('/api/password/reset', { token, password: '123' })
    expect(weak.status).toBe(400)
    expect(weak.body.data.issues[0].path).toBe('password')

    expect((await new ApiClient().post('/api/password/reset', { token, password: 'a-brand-new-secret' })).status).toBe(200)
    expect((await signedIn(email, PASSWORD)).hasSession()).toBe(false)
    expect((await signedIn(email, 'a-brand-new-secret')).hasSession()).toBe(true)
    expect((await new ApiClient().post('/api/password/reset', { token, password: 'yet-another-secret' })).status).toBe(400)
  })

  it('refuses an expired reset link', async () => {
    const email = await freshAccount()
    await new ApiClient().post('/api/password/forgot', { email })
    const token = tokenFrom(await waitForMail(email, /Reset your/), '/reset-password')
    await testDb()('user_tokens').where({ token_hash: hashToken(token) }).update({ expires_at: new Date(Date.now() - 1000) })
    expect((await new ApiClient().post('/api/password/reset', { token, password: 'a-brand-new-secret' })).status).toBe(400)
    expect((await signedIn(email, PASSWORD)).hasSession()).toBe(true)
  })

  it('answers the same for an unknown address and sends nothing', async () => {
    const email = uniqueEmail('stranger')
    const res = await new ApiClient().post('/api/password/forgot', { email })
    expect(res.status).toBe(200)
    await new Promise(r => setTimeout(r, 500))
    expect(await messagesTo(email)).toHaveLength(0)
  })
})
