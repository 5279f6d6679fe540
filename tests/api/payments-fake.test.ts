import Stripe from 'stripe'
import { describe, expect, it } from 'vitest'
import { paymentsUrl } from '../support/payments'

// The local fake processor through the processor's own SDK, as the app calls it: its error shape
// for a bad request, and the first answer replayed to a repeated idempotency key.
const url = new URL(paymentsUrl())
const stripe = new Stripe('sk_test_fake_check', { host: url.hostname, port: url.port, protocol: 'http', maxNetworkRetries: 0 })
const session = (destination: string): Stripe.Checkout.SessionCreateParams => ({
  mode: 'payment', success_url: 'http://127.0.0.1/ok', cancel_url: 'http://127.0.0.1/no',
  line_items: [{ quantity: 1, price_data: { currency: 'gbp', unit_amount: 1234, product_data: { name: 'A test' } } }],
  payment_intent_data: { transfer_data: { destination } },
})

describe('the fake payment processor', () => {
  it('answers a bad request in the processor\'s error format, naming the parameter', async () => {
    const refused = await stripe.checkout.sessions.create(session('not-an-account')).catch((e: unknown) => e)
    expect(refused).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError)
    expect(refused).toMatchObject({ statusCode: 400, type: 'StripeInvalidRequestError', param: 'payment_intent_data[transfer_data][destination]' })
    const raw = await fetch(`${paymentsUrl()}/v1/refunds`, { method: 'POST', headers: { 'authorization': 'Bearer sk_test_x', 'content-type': 'application/x-www-form-urlencoded' }, body: '' })
    expect(raw.status).toBe(400)
    expect(await raw.json()).toEqual({ error: { type: 'invalid_request_error', message: 'Missing required param: payment_intent.', param: 'payment_intent' } })
    expect((await fetch(`${paymentsUrl()}/v1/accounts`, { method: 'POST' })).status).toBe(401)
  })

  it('replays the first answer to a repeated idempotency key, and makes a new one otherwise', async () => {
    const key = `fake-check-${Date.now().toString(36)}`
    const first = await stripe.checkout.sessions.create(session('acct_elsewhere'), { idempotencyKey: key })
    const again = await stripe.checkout.sessions.create(session('acct_elsewhere'), { idempotencyKey: key })
    const other = await stripe.checkout.sessions.create(session('acct_elsewhere'), { idempotencyKey: `${key}-2` })
    expect(again.id).toBe(first.id)
    expect(other.id).not.toBe(first.id)
    expect(first).toMatchObject({ amount_total: 1234, currency: 'gbp', status: 'open', url: `${paymentsUrl()}/pay/${first.id}` })
  })
})
