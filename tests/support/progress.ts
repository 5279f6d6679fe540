import { afterAll, expect } from 'vitest'
import { hashPassword } from '../../server/utils/passwords'
import { ORGS, userId } from './contracts'
import { testDb, uniqueEmail } from './db'
import { DEMO_PASSWORD } from './env'
import { ApiClient } from './http'

// What the tests of a tree contract's progress share: a nursery that is party to none of the demo's
// contracts, the notices and e-mails a contract's party was sent, and an event recorded through the
// API that must be accepted.
const db = testDb()

/** A nursery of its own with a signed-in owner; removed, with its people, when the file ends. */
export function scratchNursery(mark: string) {
  let made: { id: number, email: string } | undefined
  afterAll(async () => {
    if (!made) return
    await db('audit_events').where({ org_id: made.id }).delete()
    await db('sign_in_attempts').where({ email: made.email }).delete()
    await db('organisations').where({ id: made.id }).delete()
  })
  return async function nurseryOwner(): Promise<ApiClient> {
    const [id] = await db('organisations').insert({ name: `${mark} nursery ${Date.now().toString(36)}`, kind: 'grower', status: 'active', is_nursery: true })
    const email = uniqueEmail('progress-nursery')
    made = { id: id!, email }
    await db('users').insert({ email, name: 'Other Nursery Owner', org_id: id, role: 'owner', units: 'metric', password_hash: await hashPassword(DEMO_PASSWORD), email_verified_at: new Date() })
    const client = new ApiClient()
    await client.signIn(email, DEMO_PASSWORD)
    if (!client.hasSession()) throw new Error(`Sign-in failed for ${email}`)
    return client
  }
}

const contractLink = (contractId: number) => `/contracts/tree/${contractId}`

/** The in-app notices a person has about the contract, oldest first. */
export async function noticesAbout(email: string, contractId: number): Promise<{ kind: string, subject: string, body: string }[]> {
  return db('notices').where({ user_id: await userId(email), link: contractLink(contractId) }).orderBy('id').select('kind', 'subject', 'body')
}

/** The e-mails waiting in (or sent from) the outbox to an address about the contract, oldest first. */
export async function mailsAbout(address: string, contractId: number): Promise<{ kind: string, subject: string }[]> {
  return db('notifications').where({ recipient: address, link: contractLink(contractId) }).orderBy('id').select('kind', 'subject')
}

/** Records an event on a run through the API, which must take it. */
export async function recorded(client: ApiClient, runId: number, body: Record<string, unknown>): Promise<void> {
  const res = await client.post(`/api/nursery/runs/${runId}/events`, body)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
}

/** The demo's Dabinett tree contract, Quillhurst's 1,200 trees from Hollowmere (the first made: tests may add others). */
export async function demoDabinettContract(): Promise<number> {
  const row = await db('tree_contracts as c').join('varieties as v', 'v.id', 'c.variety_id').join('organisations as b', 'b.id', 'c.buyer_org_id')
    .join('organisations as n', 'n.id', 'c.nursery_org_id')
    .where({ 'v.name': 'Dabinett', 'b.name': ORGS.quillhurst, 'n.name': ORGS.hollowmere, 'c.tree_count': 1200 })
    .orderBy('c.id').first('c.id')
  if (!row) throw new Error('The demo has no Dabinett tree contract')
  return row.id as number
}
