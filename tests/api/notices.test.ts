import { describe, expect, it } from 'vitest'
import { hashPassword } from '../../server/utils/passwords'
import { testDb, uniqueEmail } from '../support/db'
import { ApiClient, as } from '../support/http'
import { tokenFrom, waitForMail } from '../support/mail'

const PASSWORD = 'cellar-door-2026'

interface NoticeBody { id: number, kind: string, subject: string, body: string, link: string | null, readAt: string | null }

async function signedIn(email: string): Promise<ApiClient> {
  const client = new ApiClient()
  await client.signIn(email, PASSWORD)
  if (!client.hasSession()) throw new Error(`sign-in as ${email} failed`)
  return client
}

/** A new member of Hollowmere, invited by its owner and joined through the e-mailed link. */
async function newHollowmereMember(): Promise<{ email: string, id: number, client: ApiClient }> {
  const owner = await as('growerOwner')
  const email = uniqueEmail('presser')
  expect((await owner.post('/api/invitations', { email, role: 'member' })).status).toBe(201)
  const token = tokenFrom(await waitForMail(email, /invites you to Hollowmere/), '/invite')
  expect((await new ApiClient().post('/api/invitations/accept', { token, name: 'Wren Ashby', password: PASSWORD })).status).toBe(201)
  const id = (await testDb()('users').where({ email }).first('id')).id as number
  return { email, id, client: await signedIn(email) }
}

describe('notices', () => {
  it('tells the owners when an invitation is accepted, linking to the members', async () => {
    const owner = await as('growerOwner')
    const before = (await owner.get('/api/notices')).body.unread as number
    const { email } = await newHollowmereMember()
    const after = await owner.get('/api/notices')
    expect(after.status).toBe(200)
    expect(after.body.unread).toBe(before + 1)
    expect(after.body.items[0]).toMatchObject({ kind: 'member.joined', subject: 'Wren Ashby accepted the invitation to Hollowmere Orchard & Nursery', link: '/members', readAt: null })
    expect(after.body.items[0].body).toContain(email)
    // Another owner's organisation hears nothing of it.
    const tansy = (await (await as('grower2Owner')).get('/api/notices')).body.items as NoticeBody[]
    expect(tansy.some(n => n.body.includes(email))).toBe(false)
  })

  it('tells a member their role changed, in the bell and by e-mail; they mark one or all read', async () => {
    const owner = await as('growerOwner')
    const member = await newHollowmereMember()
    expect((await member.client.get('/api/notices')).body).toEqual({ items: [], total: 0, unread: 0 })

    expect((await owner.patch(`/api/members/${member.id}`, { role: 'viewer' })).status).toBe(200)
    const first = await member.client.get('/api/notices')
    expect(first.body).toMatchObject({ total: 1, unread: 1 })
    const notice = first.body.items[0] as NoticeBody
    expect(notice).toMatchObject({ kind: 'member.role_changed', subject: 'Your role in Hollowmere Orchard & Nursery is now viewer', link: '/members', readAt: null })
    const mail = await waitForMail(member.email, /Your role in Hollowmere/)
    expect(mail.text).toContain('from member to viewer')
    expect(mail.text).toMatch(/\/members/)

    // Setting the same role again tells nobody anything.
    await owner.patch(`/api/members/${member.id}`, { role: 'viewer' })
    expect((await member.client.get('/api/notices')).body.total).toBe(1)

    const read = await member.client.post(`/api/notices/${notice.id}/read`)
    expect(read.status).toBe(200)
    expect(read.body).toMatchObject({ id: notice.id, readAt: expect.any(String) })
    expect((await member.client.get('/api/notices')).body).toMatchObject({ total: 1, unread: 0 })
    // Reading it again keeps the first time.
    expect((await member.client.post(`/api/notices/${notice.id}/read`)).body.readAt).toBe(read.body.readAt)

    await owner.patch(`/api/members/${member.id}`, { role: 'member' })
    await owner.patch(`/api/members/${member.id}`, { role: 'viewer' })
    const three = await member.client.get('/api/notices?limit=2')
    expect(three.body).toMatchObject({ total: 3, unread: 2 })
    expect(three.body.items).toHaveLength(2)
    expect((await member.client.get('/api/notices?limit=2&offset=2')).body.items.map((n: NoticeBody) => n.id)).toEqual([notice.id])

    const all = await member.client.post('/api/notices/read-all')
    expect(all.body).toEqual({ marked: 2, unread: 0 })
    const after = (await member.client.get('/api/notices')).body
    expect(after.unread).toBe(0)
    expect(after.items.every((n: NoticeBody) => n.readAt)).toBe(true)
  })

  it('answers 404 for another person’s notice, and leaves it unread', async () => {
    const owner = await as('growerOwner')
    const member = await newHollowmereMember()
    await owner.patch(`/api/members/${member.id}`, { role: 'viewer' })
    const [notice] = (await member.client.get('/api/notices')).body.items as NoticeBody[]
    for (const other of [owner, await as('makerOwner'), await as('growerMember')]) {
      expect((await other.post(`/api/notices/${notice!.id}/read`)).status).toBe(404)
    }
    expect((await member.client.get('/api/notices')).body.unread).toBe(1)
    expect((await owner.post('/api/notices/99999999/read')).status).toBe(404)
  })

  it('e-mails a removed member at the address they had', async () => {
    const owner = await as('growerOwner')
    const member = await newHollowmereMember()
    expect((await owner.delete(`/api/members/${member.id}`)).status).toBe(204)
    const mail = await waitForMail(member.email, /You were removed from Hollowmere/)
    expect(mail.text).toContain('can no longer sign in')
  })

  it('tells an organisation’s owners when the platform suspends and reopens it', async () => {
    const [orgId] = await testDb()('organisations').insert({ name: 'Coldharbour Orchard', kind: 'grower', status: 'active' })
    const email = uniqueEmail('coldharbour')
    await testDb()('users').insert({ org_id: orgId, email, name: 'Cal Hart', role: 'owner', password_hash: await hashPassword(PASSWORD), email_verified_at: new Date() })
    const admin = await as('admin')
    expect((await admin.post(`/api/admin/organisations/${orgId}/suspend`, {})).status).toBe(200)
    expect((await waitForMail(email, /Coldharbour Orchard is suspended/)).text).toMatch(/cannot sign in until it is reopened/)
    expect((await admin.post(`/api/admin/organisations/${orgId}/reopen`, {})).status).toBe(200)
    await waitForMail(email, /Coldharbour Orchard is open again/)

    const notices = (await (await signedIn(email)).get('/api/notices')).body
    expect(notices).toMatchObject({ total: 2, unread: 2 })
    expect(notices.items.map((n: NoticeBody) => n.kind)).toEqual(['organisation.opened', 'organisation.suspended'])
  })
})

describe('the organisation’s outbox', () => {
  it('shows its owners what was sent to whom and when, newest first, without the bodies', async () => {
    const owner = await as('growerOwner')
    const email = uniqueEmail('outbox')
    await owner.post('/api/invitations', { email, role: 'viewer' })
    await waitForMail(email, /invites you/)
    const sent = await owner.get('/api/organisation/outbox?status=sent&limit=5')
    expect(sent.status).toBe(200)
    expect(sent.body.total).toBeGreaterThan(0)
    expect(sent.body.items.every((m: { status: string }) => m.status === 'sent')).toBe(true)
    const mine = sent.body.items.find((m: { recipient: string }) => m.recipient === email)
    expect(mine).toMatchObject({ kind: 'member.invited', status: 'sent', attempts: 1, error: null, sentAt: expect.any(String) })
    expect(mine).not.toHaveProperty('body')
    const times = sent.body.items.map((m: { createdAt: string }) => m.createdAt)
    expect([...times].sort().reverse()).toEqual(times)

    // Another organisation's owner sees none of it.
    const quillhurst = (await (await as('makerOwner')).get('/api/organisation/outbox?limit=200')).body.items
    expect(quillhurst.some((m: { recipient: string }) => m.recipient === email)).toBe(false)
  })

  it('refuses a state that is not one', async () => {
    const res = await (await as('growerOwner')).get('/api/organisation/outbox?status=lost')
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0].path).toBe('status')
  })
})
