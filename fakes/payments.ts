import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http'
import Stripe from 'stripe'
import { parseForm, textAt, textMap, type FormObject } from './payments/form'
import { hostedPage } from './payments/page'
import { FakeStore, now, type FakeSession } from './payments/store'

// A local stand-in for the payment processor. It answers only the calls the app makes: connected
// accounts (POST /v1/accounts), Checkout Sessions (POST /v1/checkout/sessions) and refunds
// (POST /v1/refunds), in the processor's own shapes, with its error shape
// `{ error: { type, message, param } }` for a bad request, and replays an answer to a repeated
// idempotency key. Its hosted page (`/pay/{session}`) lets a person pay or fail; the fake then
// posts the signed event (checkout.session.completed, payment_intent.payment_failed,
// charge.refunded) to the app's webhook and sends the person back. Any `acct_…` id it has not made
// is taken as an account connected elsewhere (the demo's accounts), and any `pi_…` it did not make
// as a charge made elsewhere when it is refunded (the demo's deposit), so it needs no seeding.

export interface PaymentsOptions {
  port: number
  /** Where its state file lives. */
  dir: string
  /** The app's webhook address; no events are sent when it is empty. */
  webhookUrl: string
  webhookSecret: string
}

class Refusal extends Error {
  constructor(public status: number, message: string, public param?: string, public type = 'invalid_request_error') {
    super(message)
  }
}

function send(res: ServerResponse, status: number, body: unknown) {
  res.statusCode = status
  res.setHeader('content-type', 'application/json')
  res.end(JSON.stringify(body))
}

function readBody(req: IncomingMessage): Promise<string> {
  return new Promise((resolve, reject) => {
    let text = ''
    req.setEncoding('utf8')
    req.on('data', (chunk: string) => (text += chunk))
    req.on('end', () => resolve(text))
    req.on('error', reject)
  })
}

function required(form: FormObject, path: string): string {
  const value = textAt(form, path)
  if (!value) throw new Refusal(400, `Missing required param: ${path}.`, path)
  return value
}

function wholeAmount(value: string, param: string): number {
  if (!/^\d+$/.test(value) || Number(value) < 1) throw new Refusal(400, `Invalid integer: ${value}`, param)
  return Number(value)
}

export function startPayments(options: PaymentsOptions): Promise<Server> {
  const store = new FakeStore(options.dir)
  const state = store.state
  const signer = new Stripe('sk_test_fake_signer')
  const base = `http://127.0.0.1:${options.port}`

  /** Signs the event as the processor does and posts it to the app; the app's answer is returned. */
  async function deliver(type: string, object: unknown): Promise<number | null> {
    if (!options.webhookUrl) return null
    const payload = JSON.stringify({ id: store.nextId('evt_'), object: 'event', type, created: now(), livemode: false, data: { object } })
    store.save()
    const signature = signer.webhooks.generateTestHeaderString({ payload, secret: options.webhookSecret })
    const res = await fetch(options.webhookUrl, { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': signature }, body: payload })
    return res.status
  }

  function destinationOf(form: FormObject): string {
    const param = 'payment_intent_data[transfer_data][destination]'
    const destination = required(form, param)
    if (!/^acct_[A-Za-z0-9_]+$/.test(destination)) throw new Refusal(400, `No such destination: '${destination}'`, param)
    return destination
  }

  function createSession(form: FormObject): FakeSession {
    if (textAt(form, 'mode') !== 'payment') throw new Refusal(400, 'Only mode=payment is supported here.', 'mode')
    const currency = required(form, 'line_items[0][price_data][currency]').toLowerCase()
    const unit = wholeAmount(required(form, 'line_items[0][price_data][unit_amount]'), 'line_items[0][price_data][unit_amount]')
    const quantity = wholeAmount(textAt(form, 'line_items[0][quantity]') ?? '1', 'line_items[0][quantity]')
    const id = store.nextId('cs_test_')
    const session: FakeSession = {
      id, object: 'checkout.session', mode: 'payment', status: 'open', payment_status: 'unpaid',
      amount_total: unit * quantity, currency,
      description: textAt(form, 'line_items[0][price_data][product_data][name]') ?? 'Payment',
      destination: destinationOf(form),
      success_url: required(form, 'success_url'), cancel_url: required(form, 'cancel_url'),
      url: `${base}/pay/${id}`,
      metadata: textMap(form.metadata),
      payment_intent: null,
      created: now(),
    }
    // The payment intent's metadata is what its own events carry.
    const piMetadata = textMap((form.payment_intent_data as FormObject | undefined)?.metadata)
    const piId = store.nextId('pi_')
    state.paymentIntents[piId] = {
      id: piId, object: 'payment_intent', amount: session.amount_total, currency, status: 'requires_payment_method',
      metadata: piMetadata, latest_charge: null, transfer_data: { destination: session.destination }, created: now(),
    }
    session.payment_intent = piId
    state.sessions[id] = session
    return session
  }

  function createRefund(form: FormObject) {
    const piId = required(form, 'payment_intent')
    // A payment intent it did not make (the demo's, paid before this fake's state began) is taken
    // as a charge made elsewhere, of the amount asked back.
    if (!state.paymentIntents[piId] && /^pi_[A-Za-z0-9_]+$/.test(piId) && textAt(form, 'amount')) {
      const amount = wholeAmount(textAt(form, 'amount')!, 'amount')
      state.paymentIntents[piId] = { id: piId, object: 'payment_intent', amount, currency: 'gbp', status: 'succeeded', metadata: textMap(form.metadata), latest_charge: store.nextId('ch_'), transfer_data: { destination: 'acct_elsewhere' }, created: now() }
    }
    const intent = state.paymentIntents[piId]
    if (!intent) throw new Refusal(404, `No such payment_intent: '${piId}'`, 'payment_intent')
    if (intent.status !== 'succeeded' || !intent.latest_charge) throw new Refusal(400, `PaymentIntent ${piId} has not succeeded, so there is nothing to refund.`, 'payment_intent')
    const already = Object.values(state.refunds).filter(r => r.payment_intent === piId).reduce((sum, r) => sum + r.amount, 0)
    const amount = textAt(form, 'amount') ? wholeAmount(textAt(form, 'amount')!, 'amount') : intent.amount - already
    if (amount + already > intent.amount) throw new Refusal(400, `Refund amount (${amount}) is greater than the unrefunded amount on the charge (${intent.amount - already}).`, 'amount')
    const id = store.nextId('re_')
    const refund = { id, object: 'refund' as const, amount, currency: intent.currency, payment_intent: piId, charge: intent.latest_charge, status: 'succeeded' as const, metadata: textMap(form.metadata), created: now() }
    state.refunds[id] = refund
    return refund
  }

  async function api(req: IncomingMessage, res: ServerResponse, path: string) {
    if (!/^Bearer sk_/.test(req.headers.authorization ?? '')) throw new Refusal(401, 'You did not provide an API key.', undefined, 'authentication_error')
    const key = req.headers['idempotency-key']
    const replay = typeof key === 'string' ? state.idempotent[`${req.method} ${path} ${key}`] : undefined
    if (replay) return send(res, replay.status, replay.body)
    const form = parseForm(await readBody(req))
    let body: unknown
    let after: (() => Promise<unknown>) | null = null
    if (req.method === 'POST' && path === '/v1/accounts') {
      const id = store.nextId('acct_')
      body = state.accounts[id] = { id, object: 'account', type: textAt(form, 'type') ?? 'express', country: textAt(form, 'country') ?? 'GB', email: textAt(form, 'email') ?? null, metadata: textMap(form.metadata), created: now() }
    }
    else if (req.method === 'POST' && path === '/v1/checkout/sessions') {
      body = createSession(form)
    }
    else if (req.method === 'POST' && path === '/v1/refunds') {
      const refund = createRefund(form)
      body = refund
      const intent = state.paymentIntents[refund.payment_intent]!
      after = () => deliver('charge.refunded', { id: refund.charge, object: 'charge', amount: intent.amount, amount_refunded: refund.amount, refunded: true, currency: intent.currency, payment_intent: intent.id, metadata: intent.metadata })
    }
    else {
      throw new Refusal(404, `Unrecognized request URL (${req.method}: ${path}).`)
    }
    if (typeof key === 'string') state.idempotent[`${req.method} ${path} ${key}`] = { status: 200, body }
    store.save()
    send(res, 200, body)
    // The processor sends the refund's event after it has answered the request.
    if (after) after().catch((error: Error) => console.error(`payments fake: the refund's event was not delivered: ${error.message}`))
  }

  /** The payer's choice on the hosted page: the event goes to the app first, then the payer is sent back. */
  async function choose(res: ServerResponse, id: string, choice: 'pay' | 'fail') {
    const session = state.sessions[id]
    if (!session) throw new Refusal(404, `No such checkout.session: '${id}'`, 'id')
    if (session.status !== 'open') throw new Refusal(400, `This Checkout Session is ${session.status}.`, 'id')
    const intent = state.paymentIntents[session.payment_intent!]!
    if (choice === 'pay') {
      session.status = 'complete'
      session.payment_status = 'paid'
      intent.status = 'succeeded'
      intent.latest_charge = store.nextId('ch_')
      store.save()
      await deliver('checkout.session.completed', session)
    }
    else {
      store.save()
      await deliver('payment_intent.payment_failed', { ...intent, last_payment_error: { type: 'card_error', code: 'card_declined', message: 'Your card was declined.' } })
    }
    res.statusCode = 303
    res.setHeader('location', (choice === 'pay' ? session.success_url : session.cancel_url).replace('{CHECKOUT_SESSION_ID}', session.id))
    res.end()
  }

  const server = createServer((req, res) => {
    const path = (req.url ?? '/').split('?')[0]!
    const handle = async () => {
      if (path === '/health') return send(res, 200, { ok: true })
      const page = path.match(/^\/pay\/([^/]+)$/)
      if (page && req.method === 'GET') {
        const session = state.sessions[decodeURIComponent(page[1]!)]
        res.setHeader('content-type', 'text/html; charset=utf-8')
        res.statusCode = session ? 200 : 404
        return res.end(session ? hostedPage(session) : '<!doctype html><title>Not found</title><p>No such payment.</p>')
      }
      const chosen = path.match(/^\/pay\/([^/]+)\/(pay|fail)$/)
      if (chosen && req.method === 'POST') return choose(res, decodeURIComponent(chosen[1]!), chosen[2] as 'pay' | 'fail')
      if (path.startsWith('/v1/')) return api(req, res, path)
      throw new Refusal(404, `Unrecognized request URL (${req.method}: ${path}).`)
    }
    handle().catch((error: Error) => {
      if (error instanceof Refusal) return send(res, error.status, { error: { type: error.type, message: error.message, ...(error.param ? { param: error.param } : {}) } })
      send(res, 500, { error: { type: 'api_error', message: error.message } })
    })
  })
  return new Promise((resolve, reject) => {
    server.on('error', reject)
    server.listen(options.port, '127.0.0.1', () => resolve(server))
  })
}
