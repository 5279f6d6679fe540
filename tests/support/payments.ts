import Stripe from 'stripe'
import { ApiClient, as } from './http'

// Paying through the local fake processor as a person would (its hosted page, by HTTP), and
// sending the webhook events a processor would, signed with the stack's webhook secret.

export const paymentsUrl = () => process.env.POMEWRIGHT_PAYMENTS_URL ?? 'http://127.0.0.1:12121'
export const webhookSecret = () => process.env.STRIPE_WEBHOOK_SECRET ?? 'whsec_pomewright_local'

const signer = new Stripe('sk_test_signer_for_tests')

/** The fake's hosted page, then its Pay or Fail button: the answer is the redirect back to the app. */
export async function chooseOnHostedPage(checkoutUrl: string, choice: 'pay' | 'fail'): Promise<{ page: string, status: number, location: string | null }> {
  const page = await (await fetch(checkoutUrl)).text()
  const action = page.match(new RegExp(`action="([^"]+/${choice})"`))?.[1]
  if (!action) throw new Error(`the hosted page has no ${choice} button: ${page.slice(0, 300)}`)
  const res = await fetch(new URL(action, checkoutUrl), { method: 'POST', redirect: 'manual' })
  return { page, status: res.status, location: res.headers.get('location') }
}

/** Asks for a payment as `caller` and, unless told not to, pays it on the hosted page. */
export async function payFor(body: Record<string, unknown>, options: { caller?: Parameters<typeof as>[0], choice?: 'pay' | 'fail' | null } = {}) {
  const client = await as(options.caller ?? 'makerOwner')
  const asked = await client.post('/api/payments', body)
  if (asked.status !== 201 && asked.status !== 200) throw new Error(`could not ask for a payment: ${asked.status} ${JSON.stringify(asked.body)}`)
  const choice = options.choice === undefined ? 'pay' : options.choice
  if (choice) await chooseOnHostedPage(asked.body.checkoutUrl, choice)
  return asked.body as { id: number, checkoutUrl: string, amountMinor: number }
}

/** A signed event as the processor sends it (`secret` other than the stack's makes a forged one). */
export function signedEvent(type: string, object: Record<string, unknown>, options: { id?: string, secret?: string } = {}) {
  const body = JSON.stringify({ id: options.id ?? `evt_test_${Date.now().toString(36)}${Math.random().toString(36).slice(2, 8)}`, object: 'event', type, created: Math.floor(Date.now() / 1000), livemode: false, data: { object } })
  return { body, signature: signer.webhooks.generateTestHeaderString({ payload: body, secret: options.secret ?? webhookSecret() }) }
}

export function postEvent(body: string, signature?: string) {
  return new ApiClient().request('POST', '/api/webhooks/payments', body, signature ? { 'stripe-signature': signature } : {})
}

/** A Checkout Session completed and paid, for our payment `paymentId`. */
export const completedSession = (paymentId: number) => ({
  id: `cs_test_elsewhere_${paymentId}`, object: 'checkout.session', payment_status: 'paid', status: 'complete', metadata: { paymentId: String(paymentId) }, payment_intent: null,
})

/** A payment that failed, for our payment `paymentId`. */
export const failedIntent = (paymentId: number) => ({
  id: `pi_test_elsewhere_${paymentId}`, object: 'payment_intent', status: 'requires_payment_method', metadata: { paymentId: String(paymentId) },
  last_payment_error: { message: 'Your card has insufficient funds.' },
})
