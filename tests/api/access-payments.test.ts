import { describe, expect, it } from 'vitest'
import { accessTable } from '../support/access'
import { contractFixtures } from '../support/contracts'
import { testDb } from '../support/db'
import { as, CALLERS, type Caller } from '../support/http'
import { payFor, signedEvent } from '../support/payments'

// Payments are Quillhurst's (the buyer: makerOwner, makerViewer) to pay and Hollowmere's (the
// nursery: growerOwner, growerMember) to be paid, on tree contracts of this file's own. Both parties
// read them; only the payer's owners pay (the payee's people 403, a viewer or member 403 by role);
// only the payee's owners refund a deposit the cancellation returns (the payer 403). Anyone else's
// answer is 404, the platform admin's 403 (it has no organisation), a signed-out caller's 401.
// Each write acts on a fresh contract or payment, so every answer depends only on who asks.
const db = testDb()
const { treeContract } = contractFixtures('T-ACP-')

type Expect = Record<Caller, number>
const outsiders = { anonymous: 401, admin: 403, grower2Owner: 404, maker2Owner: 404 } as const
const everyone: Expect = { ...outsiders, growerOwner: 200, growerMember: 200, makerOwner: 200, makerViewer: 200, grower2Owner: 200, maker2Owner: 200 }
const parties: Expect = { ...outsiders, growerOwner: 200, growerMember: 200, makerOwner: 200, makerViewer: 200 }

/** A pending deposit payment on a fresh accepted contract. */
const pendingPayment = async () => (await payFor({ purpose: 'deposit', treeContractId: await treeContract('accepted') }, { choice: null })).id

/** A paid deposit whose contract the buyer then cancelled under terms that return it (written straight in: no refund was sent yet). */
async function refundablePayment(): Promise<number> {
  const contractId = await treeContract('accepted', { deposit_if_buyer_cancels: 'refunded' })
  const { id } = await payFor({ purpose: 'deposit', treeContractId: contractId })
  await db('tree_contracts').where({ id: contractId }).update({ state: 'cancelled', cancelled_by: 'buyer' })
  return id
}

accessTable('payments', [
  { route: 'GET /api/payments', expect: everyone },
  { route: 'GET /api/payments/due', expect: everyone },
  { route: 'GET /api/payments/:id', path: async () => `/api/payments/${await pendingPayment()}`, expect: parties },
  {
    route: 'POST /api/payments',
    body: async () => ({ purpose: 'deposit', treeContractId: await treeContract('accepted') }),
    expect: { ...outsiders, makerOwner: 201, makerViewer: 403, growerOwner: 403, growerMember: 403 },
  },
  {
    route: 'POST /api/payments/:id/refund',
    path: async () => `/api/payments/${await refundablePayment()}/refund`,
    expect: { ...outsiders, growerOwner: 200, growerMember: 403, makerOwner: 403, makerViewer: 403 },
  },
  // Sellers connect; the demo's are connected already, so asking again keeps their account.
  {
    route: 'POST /api/organisation/payment-account',
    expect: { anonymous: 401, admin: 403, growerOwner: 200, growerMember: 403, grower2Owner: 200, makerOwner: 403, makerViewer: 403, maker2Owner: 403 },
  },
])

describe('access control: the processor\'s webhook', () => {
  // No session is asked for: the signature is the proof, whoever's cookies come with it.
  for (const caller of CALLERS) {
    it(`POST /api/webhooks/payments as ${caller}: 200 signed, 400 unsigned`, async () => {
      const client = await as(caller)
      const event = signedEvent('checkout.session.completed', { id: 'cs_test_access', object: 'checkout.session', payment_status: 'paid', metadata: {} })
      expect((await client.request('POST', '/api/webhooks/payments', event.body, { 'stripe-signature': event.signature })).status).toBe(200)
      expect((await client.request('POST', '/api/webhooks/payments', event.body)).status).toBe(400)
    })
  }
})
