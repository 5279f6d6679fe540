import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { hashPassword } from '../../server/utils/passwords'
import { contractFixtures, orgId } from '../support/contracts'
import { testDb, uniqueEmail } from '../support/db'
import { deliveryFixtures } from '../support/deliveries'
import { DEMO_PASSWORD, testEnv } from '../support/env'
import { ApiClient, as } from '../support/http'
import { chooseOnHostedPage, completedSession, failedIntent, payFor, paymentsUrl, postEvent, signedEvent } from '../support/payments'

// Payments through the local fake processor: Quillhurst (buyer, maker) pays Hollowmere (nursery)
// for trees and Tansy Row (grower) for deliveries; both sellers have the demo's connected accounts.
// The tree contracts here are 100 Dabinett at £14.50 with a 20 % deposit, no royalty (the fixture's
// terms): total 100 × £14.50 = £1,450.00, deposit £1,450.00 × 20 % = £290.00 (29,000 pence).
const db = testDb()
const { treeContract } = contractFixtures('T-PAY-')
const deliveries = deliveryFixtures('T-PYD-')
const DEPOSIT_MINOR = 29_000

const deposit = (treeContractId: number) => ({ purpose: 'deposit', treeContractId })
const paymentOf = async (id: number, caller: Parameters<typeof as>[0] = 'makerOwner') => (await (await as(caller)).get(`/api/payments/${id}`)).body
const eventsOf = (id: number) => db('payment_events').where({ payment_id: id }).orderBy('id').select('action', 'from_state', 'to_state', 'applied')

describe('a deposit paid on the processor\'s page', () => {
  it('goes from pending to succeeded by the signed event the fake sends, and both sides see it', async () => {
    const contractId = await treeContract('accepted')
    const maker = await as('makerOwner')
    const asked = await maker.post('/api/payments', deposit(contractId))
    expect(asked.status, JSON.stringify(asked.body)).toBe(201)
    expect(asked.body).toMatchObject({ purpose: 'deposit', treeContractId: contractId, amountMinor: DEPOSIT_MINOR, currency: 'GBP', state: 'pending', side: 'payer', moves: ['pay'], payeeOrgName: 'Hollowmere Orchard & Nursery' })
    expect(asked.body.checkoutUrl).toMatch(new RegExp(`^${paymentsUrl()}/pay/cs_test_`))
    const row = await db('payments').where({ id: asked.body.id }).first()
    expect(row).toMatchObject({ payment_account_id: 'acct_demo_hollowmere', state: 'pending' })
    expect(row.idempotency_key).toMatch(new RegExp(`^pw-payment-${asked.body.id}-[0-9a-f]{12}$`))

    const { page, status, location } = await chooseOnHostedPage(asked.body.checkoutUrl, 'pay')
    expect(page).toContain('£290.00')
    expect(page).toContain('acct_demo_hollowmere')
    expect(status).toBe(303)
    expect(location).toBe(`${testEnv.appUrl}/payments/${asked.body.id}?returned=paid`)

    const paid = await paymentOf(asked.body.id)
    expect(paid).toMatchObject({ state: 'succeeded', checkoutUrl: null, moves: [] })
    expect(paid.paymentIntentId).toMatch(/^pi_/)
    expect(paid.history.map((e: { action: string }) => e.action)).toEqual(['created', 'succeeded'])
    expect(await paymentOf(asked.body.id, 'growerOwner')).toMatchObject({ state: 'succeeded', side: 'payee' })
    const notices = (await (await as('growerOwner')).get('/api/notices?limit=50')).body.items as { subject: string, link: string }[]
    expect(notices).toContainEqual(expect.objectContaining({ subject: 'Payment succeeded: Deposit on 100 Dabinett on MM.106', link: `/payments/${asked.body.id}` }))
  })

  it('is one payment however often it is asked for, at once or after', async () => {
    const contractId = await treeContract('accepted')
    const maker = await as('makerOwner')
    const [a, b] = await Promise.all([maker.post('/api/payments', deposit(contractId)), maker.post('/api/payments', deposit(contractId))])
    expect([a.status, b.status].sort()).toEqual([200, 201])
    expect(a.body.id).toBe(b.body.id)
    const again = await maker.post('/api/payments', deposit(contractId))
    expect(again.status).toBe(200)
    expect(again.body).toMatchObject({ id: a.body.id, state: 'pending', checkoutUrl: a.body.checkoutUrl })
    await chooseOnHostedPage(a.body.checkoutUrl, 'pay')
    const afterPaid = await maker.post('/api/payments', deposit(contractId))
    expect(afterPaid).toMatchObject({ status: 200, body: { id: a.body.id, state: 'succeeded' } })
    expect(await db('payments').where({ tree_contract_id: contractId }).count({ n: '*' })).toEqual([{ n: 1 }])
  })

  it('a second live payment for the same deposit is refused by the database itself', async () => {
    const contractId = await treeContract('accepted')
    const { id } = await payFor(deposit(contractId), { choice: null })
    const row = await db('payments').where({ id }).first()
    const { id: _id, live_key: _k, checkout_session_id: _s, payment_intent_id: _p, idempotency_key: _i, ...copy } = row
    await expect(db('payments').insert({ ...copy, idempotency_key: `copy-${id}` })).rejects.toThrow(/Duplicate entry/)
  })
})

describe('a payment that fails', () => {
  it('is failed, with the reason, and paying again makes a new payment', async () => {
    const contractId = await treeContract('accepted')
    const first = await payFor(deposit(contractId), { choice: null })
    const { status, location } = await chooseOnHostedPage(first.checkoutUrl, 'fail')
    expect(status).toBe(303)
    expect(location).toBe(`${testEnv.appUrl}/payments/${first.id}?returned=cancelled`)
    expect(await paymentOf(first.id)).toMatchObject({ state: 'failed', failureReason: 'Your card was declined.' })
    const again = await (await as('makerOwner')).post('/api/payments', deposit(contractId))
    expect(again.status).toBe(201)
    expect(again.body.id).not.toBe(first.id)
    expect(again.body.state).toBe('pending')
  })
})

describe('the webhook', () => {
  it('changes nothing twice when an event is replayed', async () => {
    const contractId = await treeContract('accepted')
    const { id } = await payFor(deposit(contractId), { choice: null })
    const event = signedEvent('checkout.session.completed', completedSession(id))
    const first = await postEvent(event.body, event.signature)
    expect(first).toMatchObject({ status: 200, body: { received: true, handled: true, applied: true } })
    const replay = await postEvent(event.body, event.signature)
    expect(replay).toMatchObject({ status: 200, body: { received: true, handled: true, applied: false } })
    expect(await eventsOf(id)).toEqual([
      { action: 'created', from_state: null, to_state: 'pending', applied: true },
      { action: 'succeeded', from_state: 'pending', to_state: 'succeeded', applied: true },
    ])
  })

  it('keeps a succeeded payment succeeded when a failure arrives after it, and lets a success follow a failure', async () => {
    const contractId = await treeContract('accepted')
    const { id } = await payFor(deposit(contractId), { choice: null })
    const success = signedEvent('checkout.session.completed', completedSession(id))
    const lateFailure = signedEvent('payment_intent.payment_failed', failedIntent(id))
    expect((await postEvent(success.body, success.signature)).body.applied).toBe(true)
    expect((await postEvent(lateFailure.body, lateFailure.signature)).body.applied).toBe(false)
    expect((await paymentOf(id)).state).toBe('succeeded')
    const history = (await paymentOf(id)).history
    expect(history.at(-1)).toMatchObject({ action: 'failed', fromState: 'succeeded', toState: 'succeeded', applied: false })

    // The other order: the payer's first card failed, the second went through.
    const other = await payFor(deposit(await treeContract('accepted')), { choice: null })
    const failure = signedEvent('payment_intent.payment_failed', failedIntent(other.id))
    const thenSuccess = signedEvent('checkout.session.completed', completedSession(other.id))
    await postEvent(failure.body, failure.signature)
    expect((await paymentOf(other.id)).state).toBe('failed')
    await postEvent(thenSuccess.body, thenSuccess.signature)
    expect(await paymentOf(other.id)).toMatchObject({ state: 'succeeded', failureReason: null })
  })

  it('answers 400 to a forged, unsigned or altered event and changes nothing', async () => {
    const contractId = await treeContract('accepted')
    const { id } = await payFor(deposit(contractId), { choice: null })
    const forged = signedEvent('checkout.session.completed', completedSession(id), { secret: 'whsec_someone_else' })
    const genuine = signedEvent('checkout.session.completed', completedSession(id))
    const altered = genuine.body.replace('"paid"', '"paid" ')
    for (const [body, signature] of [[forged.body, forged.signature], [genuine.body, undefined], [altered, genuine.signature], [genuine.body, 't=1,v1=deadbeef']] as const) {
      const res = await postEvent(body, signature)
      expect(res.status, String(signature)).toBe(400)
    }
    expect((await paymentOf(id)).state).toBe('pending')
    expect(await eventsOf(id)).toHaveLength(1)
  })

  it('answers 400 to junk, and 200 to a signed event about no payment of ours', async () => {
    for (const junk of ['{', '[]', 'null', '']) expect((await postEvent(junk)).status).toBe(400)
    const stranger = signedEvent('checkout.session.completed', { id: 'cs_test_not_ours', object: 'checkout.session', payment_status: 'paid', metadata: {} })
    expect(await postEvent(stranger.body, stranger.signature)).toMatchObject({ status: 200, body: { handled: false, applied: false } })
  })
})

describe('who may pay and see a payment', () => {
  it('refuses the seller paying its own invoice (403) and shows another tenant nothing (404)', async () => {
    const contractId = await treeContract('accepted')
    expect((await (await as('growerOwner')).post('/api/payments', deposit(contractId))).status).toBe(403)
    const { id } = await payFor(deposit(contractId), { choice: null })
    for (const caller of ['maker2Owner', 'grower2Owner'] as const) {
      expect((await (await as(caller)).get(`/api/payments/${id}`)).status, caller).toBe(404)
      expect((await (await as(caller)).post('/api/payments', deposit(contractId))).status, caller).toBe(404)
      const listed = (await (await as(caller)).get(`/api/payments?treeContractId=${contractId}`)).body
      expect(listed, caller).toEqual({ items: [], total: 0 })
    }
  })

  it('asks nothing of a contract that owes nothing yet (409), and names the field for a bad body (400)', async () => {
    const offered = await treeContract('offered')
    const res = await (await as('makerOwner')).post('/api/payments', deposit(offered))
    expect(res.status).toBe(409)
    expect(res.body.message).toContain('a deposit is paid once it is accepted')
    // The amount is never the payer's to say.
    const priced = await (await as('makerOwner')).post('/api/payments', { ...deposit(offered), amountMinor: 1 })
    expect(priced.status).toBe(400)
    expect(priced.body.data.issues).toEqual([{ path: 'amountMinor', message: 'Unknown field' }])
    const mixed = await (await as('makerOwner')).post('/api/payments', { purpose: 'settlement', treeContractId: offered })
    expect(mixed.status).toBe(400)
    expect(mixed.body.data.issues.map((i: { path: string }) => i.path).sort()).toEqual(['deliveryId', 'treeContractId'])
  })
})

describe('a balance', () => {
  it('is due pro rata to the trees delivered, less the deposit', async () => {
    // 90 of 100 trees delivered: 90 × £14.50 = £1,305.00, less the £290.00 deposit = £1,015.00.
    const contractId = await treeContract('delivered', { delivered_count: 90, delivered_on: '2026-11-20' })
    const asked = await (await as('makerOwner')).post('/api/payments', { purpose: 'balance', treeContractId: contractId })
    expect(asked.status, JSON.stringify(asked.body)).toBe(201)
    expect(asked.body).toMatchObject({ amountMinor: 101_500, description: 'Balance of 100 Dabinett on MM.106, pro rata to the trees delivered' })
  })
})

describe('refunds', () => {
  it('refunds the deposit on the processor when the nursery cancels under terms that return it', async () => {
    const contractId = await treeContract('accepted', { deposit_if_nursery_cancels: 'refunded' })
    const { id } = await payFor(deposit(contractId))
    expect((await paymentOf(id)).state).toBe('succeeded')
    const cancelled = await (await as('growerOwner')).post(`/api/tree-contracts/${contractId}/cancel`, { reason: 'The MM.106 liners failed this spring.' })
    expect(cancelled.status, JSON.stringify(cancelled.body)).toBe(200)
    const refunded = await paymentOf(id)
    expect(refunded).toMatchObject({ state: 'refunded', refundedMinor: DEPOSIT_MINOR })
    expect(refunded.refundId).toMatch(/^re_/)
    expect(await paymentOf(id, 'growerOwner')).toMatchObject({ state: 'refunded' })
    // The fake's charge.refunded event follows; it changes nothing more.
    await expect.poll(async () => (await eventsOf(id)).length).toBe(4)
    expect((await eventsOf(id)).slice(2)).toEqual([
      { action: 'refunded', from_state: 'succeeded', to_state: 'refunded', applied: true },
      { action: 'refunded', from_state: 'refunded', to_state: 'refunded', applied: false },
    ])
  })

  it('keeps the deposit when the buyer cancels under terms that keep it', async () => {
    const contractId = await treeContract('accepted', { deposit_if_buyer_cancels: 'kept' })
    const { id } = await payFor(deposit(contractId))
    expect((await (await as('makerOwner')).post(`/api/tree-contracts/${contractId}/cancel`, {})).status).toBe(200)
    expect((await paymentOf(id)).state).toBe('succeeded')
    const refund = await (await as('growerOwner')).post(`/api/payments/${id}/refund`, {})
    expect(refund.status).toBe(409)
  })

  it('lets the nursery\'s owner refund a returned deposit by hand, once, and never the buyer', async () => {
    const contractId = await treeContract('accepted', { deposit_if_buyer_cancels: 'refunded' })
    const { id } = await payFor(deposit(contractId))
    // Cancelled while the processor was away: the refund was not sent then.
    await db('tree_contracts').where({ id: contractId }).update({ state: 'cancelled', cancelled_by: 'buyer' })
    expect((await paymentOf(id, 'growerOwner')).moves).toEqual(['refund'])
    expect((await (await as('makerOwner')).post(`/api/payments/${id}/refund`, {})).status).toBe(403)
    const done = await (await as('growerOwner')).post(`/api/payments/${id}/refund`, { reason: 'Returned as the terms say.' })
    expect(done.status, JSON.stringify(done.body)).toBe(200)
    expect(done.body).toMatchObject({ state: 'refunded', refundedMinor: DEPOSIT_MINOR, moves: [] })
    expect((await (await as('growerOwner')).post(`/api/payments/${id}/refund`, {})).status).toBe(409)
  })
})

describe('a settled delivery', () => {
  it('becomes paid in the same transaction as its payment succeeds, once', async () => {
    const contractId = await deliveries.contract()
    const lotId = await deliveries.testedLot('tansyRow', 'Kingston Black', 12.0, 5_000)
    const maker = await as('makerOwner')
    const recorded = await deliveries.record(maker, { fruitContractId: contractId, lotId, netKg: 1_000 })
    const deliveryId = recorded.body.id
    expect((await maker.post('/api/payments', { purpose: 'settlement', deliveryId })).status).toBe(409)
    await maker.post(`/api/deliveries/${deliveryId}/settle`, {})
    // 1 t at the 12.0 °Brix baseline and £210.00 a tonne, Tansy Row charging no tax: £210.00.
    const { id, amountMinor } = await payFor({ purpose: 'settlement', deliveryId })
    expect(amountMinor).toBe(21_000)
    const delivery = (await (await as('grower2Owner')).get(`/api/deliveries/${deliveryId}`)).body
    expect(delivery.state).toBe('paid')
    expect(delivery.paidAt).not.toBeNull()
    expect(delivery.history.at(-1)).toMatchObject({ action: 'paid', byName: 'Pomewright' })
    expect((await paymentOf(id, 'grower2Owner')).state).toBe('succeeded')
    const replay = signedEvent('checkout.session.completed', completedSession(id))
    await postEvent(replay.body, replay.signature)
    expect(await db('delivery_events').where({ delivery_id: deliveryId, action: 'paid' }).count({ n: '*' })).toEqual([{ n: 1 }])
  })
})

describe('a seller with no payment account', () => {
  const made: { orgId?: number, email?: string } = {}
  afterAll(async () => {
    if (!made.orgId) return
    await db('tree_contracts').where({ nursery_org_id: made.orgId }).delete()
    await db('audit_events').where({ org_id: made.orgId }).delete()
    await db('organisations').where({ id: made.orgId }).delete()
  })
  beforeAll(async () => {
    const [id] = await db('organisations').insert({ name: `Payments test nursery ${Date.now().toString(36)}`, kind: 'grower', is_nursery: true, status: 'active', currency: 'GBP' })
    made.orgId = id
    made.email = uniqueEmail('payments-nursery')
    await db('users').insert({ email: made.email, name: 'Nursery owner', org_id: id, role: 'owner', units: 'metric', password_hash: await hashPassword(DEMO_PASSWORD), email_verified_at: new Date() })
  })

  it('cannot be paid yet: 409 saying what the seller must do, and its owners are told', async () => {
    const contractId = await treeContract('accepted', { nursery_org_id: made.orgId })
    const res = await (await as('makerOwner')).post('/api/payments', deposit(contractId))
    expect(res.status).toBe(409)
    expect(res.body.message).toMatch(/has not connected a payment account.*settings page/)
    expect(await db('payments').where({ tree_contract_id: contractId }).first()).toBeUndefined()
    const owner = await db('users').where({ email: made.email }).first('id')
    const notice = await db('notices').where({ user_id: owner.id, kind: 'payment.account-needed' }).first()
    expect(notice).toMatchObject({ link: '/settings', subject: 'Quillhurst Cider Works wants to pay you: connect a payment account' })
  })

  it('connects an account from its settings, once, and can be paid then', async () => {
    const client = new ApiClient()
    await client.signIn(made.email!, DEMO_PASSWORD)
    const connected = await client.post('/api/organisation/payment-account', {})
    expect(connected.status, JSON.stringify(connected.body)).toBe(200)
    expect(connected.body.paymentAccountId).toMatch(/^acct_/)
    const again = await client.post('/api/organisation/payment-account', {})
    expect(again.body.paymentAccountId).toBe(connected.body.paymentAccountId)
    const contractId = await treeContract('accepted', { nursery_org_id: made.orgId })
    const asked = await (await as('makerOwner')).post('/api/payments', deposit(contractId))
    expect(asked.status).toBe(201)
    expect(await db('payments').where({ id: asked.body.id }).first('payment_account_id')).toEqual({ payment_account_id: connected.body.paymentAccountId })
  })
})

describe('what is owed', () => {
  it('lists a deposit owed with no payment yet on both sides, and not once it is paid', async () => {
    const contractId = await treeContract('accepted')
    const owes = async (caller: 'makerOwner' | 'growerOwner') => ((await (await as(caller)).get('/api/payments/due')).body.items as { treeContractId: number, purpose: string, side: string, amountMinor: number }[])
      .filter(d => d.treeContractId === contractId)
    expect(await owes('makerOwner')).toEqual([expect.objectContaining({ purpose: 'deposit', side: 'payer', amountMinor: DEPOSIT_MINOR })])
    expect(await owes('growerOwner')).toEqual([expect.objectContaining({ purpose: 'deposit', side: 'payee', amountMinor: DEPOSIT_MINOR })])
    await payFor(deposit(contractId))
    expect(await owes('makerOwner')).toEqual([])
  })
})

beforeAll(async () => {
  // The demo's sellers are connected; a file run alone on an old test database still needs them to be.
  expect(await db('organisations').where({ id: await orgId('hollowmere') }).first('payment_account_id')).toEqual({ payment_account_id: 'acct_demo_hollowmere' })
})
