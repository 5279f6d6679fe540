import { randomBytes } from 'node:crypto'
import type { Knex } from 'knex'
import type Stripe from 'stripe'
import type { PaymentCreateInput, PaymentListQuery, PaymentRefundInput } from '#shared/schemas/payment'
import type { Payment, PaymentDetail, PaymentDue, PaymentDueList, PaymentList, PaymentPurpose, PaymentSide, PaymentState } from '#shared/types/payment'
import { formatContractMoney } from '#shared/utils/contractDisplay'
import { checkDeliveryMove, DELIVERY_SYSTEM } from '#shared/utils/deliveryStatus'
import { depositRefund, settlementDue, treeContractDue, type TreeContractFacts } from '#shared/utils/paymentAmount'
import { checkPaymentMove, paymentActionsFor, PAYMENT_SYSTEM, type PaymentActor, type PaymentMoveAction } from '#shared/utils/paymentStatus'
import { catalogueSpecies } from '../repositories/catalogue'
import { lockContractRow, TREE_PARTIES } from '../repositories/contracts'
import { insertDeliveryEvent, lockDeliveryRow, updateDeliveryRow } from '../repositories/deliveries'
import { lockSettings, setPaymentAccount } from '../repositories/organisations'
import {
  findPaymentForProcessor, findPaymentRow, insertPayment, insertPaymentEvent, listPaymentEvents, listPaymentRows, lockLivePayment, lockPayment,
  owingTreeContracts, paymentAccountOf, paymentsOf, settledDeliveries, succeededDeposit, updatePayment, type PaymentRow,
} from '../repositories/payments'
import type { TreeContractRow } from '../repositories/treeContracts'
import { recordAudit } from '../utils/audit'
import { transactionRetried, useDb } from '../utils/db'
import { appLink } from '../utils/mail'
import { withProcessor } from '../utils/paymentProcessor'
import { notFound } from '../utils/validation'
import { tellParty, type Member } from './contracts'
import { queueNotice } from './notices'
import { ownerIds } from '../repositories/notices'

// Payments through the processor. The payer's owners ask for a payment of a deposit, a balance or
// a settlement; the amount is worked here from the object (shared/utils/paymentAmount.ts), a
// Checkout Session is made on the processor naming the seller's connected account, and its hosted
// page is where the payer pays. The processor's signed events then move the payment
// (shared/utils/paymentStatus.ts): each event once, in one transaction with the object's row and
// the payment's row locked (in that order, as every write here takes them), and a settled
// delivery becomes paid in the same transaction. Every request to the processor carries the
// payment's idempotency key with a suffix for the call, so a retried request never charges twice.

const POMEWRIGHT = 'Pomewright'

const money = (minor: number, currency: string) => formatContractMoney(minor, currency)
const iso = (value: Date | null) => (value ? new Date(value).toISOString() : null)

function describe(row: Pick<PaymentRow, 'purpose' | 'treeCount' | 'varietyName' | 'rootstockDesignation' | 'lotCode' | 'deliveredOn'>): string {
  if (row.purpose === 'settlement') return `Settlement of lot ${row.lotCode ?? '—'} delivered on ${row.deliveredOn ?? '—'}`
  const trees = `${(row.treeCount ?? 0).toLocaleString('en-GB')} ${row.varietyName ?? 'trees'} on ${row.rootstockDesignation ?? 'their rootstock'}`
  return row.purpose === 'deposit' ? `Deposit on ${trees}` : `Balance of ${trees}, pro rata to the trees delivered`
}

function factsOf(row: Pick<TreeContractRow, 'state' | 'treeCount' | 'unitPriceMinor' | 'royaltyPerTreeMinor' | 'depositPct' | 'depositIfBuyerCancels' | 'depositIfNurseryCancels' | 'deliveredCount' | 'cancelledBy' | 'acceptedVersion'>): TreeContractFacts {
  return {
    state: row.state, treeCount: row.treeCount, unitPriceMinor: row.unitPriceMinor, royaltyPerTreeMinor: row.royaltyPerTreeMinor, depositPct: row.depositPct,
    depositIfBuyerCancels: row.depositIfBuyerCancels, depositIfNurseryCancels: row.depositIfNurseryCancels, deliveredCount: row.deliveredCount,
    cancelledBy: row.cancelledBy, acceptedVersion: row.acceptedVersion,
  }
}

/** What a cancellation gives back of this payment now, or null when nothing is to be refunded. */
function refundDue(row: PaymentRow): number | null {
  if (row.purpose !== 'deposit' || row.state !== 'succeeded' || row.refundId || row.treeContractState === null) return null
  return depositRefund(factsOf({
    state: row.treeContractState as TreeContractRow['state'], treeCount: row.treeCount!, unitPriceMinor: row.unitPriceMinor!, royaltyPerTreeMinor: row.royaltyPerTreeMinor!,
    depositPct: row.depositPct!, depositIfBuyerCancels: row.depositIfBuyerCancels!, depositIfNurseryCancels: row.depositIfNurseryCancels!, deliveredCount: null,
    cancelledBy: row.cancelledBy, acceptedVersion: row.acceptedVersion,
  }), row.amountMinor)
}

const sideOf = (row: Pick<PaymentRow, 'payerOrgId'>, orgId: number): PaymentSide => (row.payerOrgId === orgId ? 'payer' : 'payee')
const actorOf = (user: Member, side: PaymentSide): PaymentActor => ({ role: user.role as 'owner' | 'member' | 'viewer', side })

function toPayment(row: PaymentRow, user: Member): Payment {
  const side = sideOf(row, user.orgId)
  return {
    id: row.id, purpose: row.purpose, treeContractId: row.treeContractId, deliveryId: row.deliveryId, description: describe(row),
    payerOrgId: row.payerOrgId, payerOrgName: row.payerOrgName, payeeOrgId: row.payeeOrgId, payeeOrgName: row.payeeOrgName,
    amountMinor: row.amountMinor, currency: row.currency, state: row.state,
    checkoutUrl: side === 'payer' && row.state === 'pending' ? row.checkoutUrl : null,
    paymentIntentId: row.paymentIntentId, refundId: row.refundId, refundedMinor: row.refundedMinor, failureReason: row.failureReason,
    side, moves: paymentActionsFor(row.state, actorOf(user, side) as { role: 'owner', side: PaymentSide }, refundDue(row) !== null),
    succeededAt: iso(row.succeededAt), failedAt: iso(row.failedAt), refundedAt: iso(row.refundedAt),
    createdAt: iso(row.createdAt)!, updatedAt: iso(row.updatedAt)!,
  }
}

// ----- Reads -----

export async function listPayments(user: Member, query: PaymentListQuery): Promise<PaymentList> {
  const { rows, total } = await listPaymentRows(useDb(), user.orgId, query)
  return { items: rows.map(r => toPayment(r, user)), total }
}

export async function getPayment(user: Member, id: number): Promise<PaymentDetail> {
  const db = useDb()
  const row = await findPaymentRow(db, user.orgId, id)
  if (!row) notFound('That payment')
  return { ...toPayment(row, user), history: await listPaymentEvents(db, id) }
}

/** What the organisation owes and is owed that has no live payment yet, owed first. */
export async function listDue(user: Member): Promise<PaymentDueList> {
  const db = useDb()
  const [contracts, deliveries] = await Promise.all([owingTreeContracts(db, user.orgId), settledDeliveries(db, user.orgId)])
  const payments = await paymentsOf(db, contracts.map(c => c.id as number), deliveries.map(d => d.id as number))
  const standing = (purpose: PaymentPurpose, object: { treeContractId?: number, deliveryId?: number }) => {
    const mine = payments.filter(p => p.purpose === purpose && (object.treeContractId ? p.treeContractId === object.treeContractId : p.deliveryId === object.deliveryId))
    return { live: mine.some(p => p.state === 'pending' || p.state === 'succeeded'), lastFailed: mine.filter(p => p.state === 'failed').at(-1)?.id ?? null }
  }
  const items: PaymentDue[] = []
  for (const c of contracts) {
    for (const purpose of ['deposit', 'balance'] as const) {
      const due = treeContractDue(purpose, factsOf(c))
      const { live, lastFailed } = standing(purpose, { treeContractId: c.id })
      // A balance is owed once; a deposit stays owed until it is paid (or refunded after a cancellation).
      if (!due.ok || live || (purpose === 'deposit' && payments.some(p => p.treeContractId === c.id && p.purpose === 'deposit' && p.state === 'refunded'))) continue
      items.push({
        purpose, treeContractId: c.id, deliveryId: null,
        description: describe({ purpose, treeCount: c.treeCount, varietyName: c.varietyName, rootstockDesignation: c.rootstockDesignation, lotCode: null, deliveredOn: null }),
        payerOrgId: c.buyerOrgId, payerOrgName: c.buyerOrgName, payeeOrgId: c.nurseryOrgId, payeeOrgName: c.nurseryOrgName,
        amountMinor: due.amountMinor, currency: c.currency, side: c.buyerOrgId === user.orgId ? 'payer' : 'payee', lastFailedPaymentId: lastFailed,
      })
    }
  }
  for (const d of deliveries) {
    const due = settlementDue(d)
    const { live, lastFailed } = standing('settlement', { deliveryId: d.id })
    if (!due.ok || live) continue
    items.push({
      purpose: 'settlement', treeContractId: null, deliveryId: d.id,
      description: describe({ purpose: 'settlement', treeCount: null, varietyName: null, rootstockDesignation: null, lotCode: d.lotCode, deliveredOn: d.deliveredOn }),
      payerOrgId: d.makerOrgId, payerOrgName: d.makerOrgName, payeeOrgId: d.growerOrgId, payeeOrgName: d.growerOrgName,
      amountMinor: due.amountMinor, currency: d.currency, side: d.makerOrgId === user.orgId ? 'payer' : 'payee', lastFailedPaymentId: lastFailed,
    })
  }
  items.sort((a, b) => (a.side === b.side ? 0 : a.side === 'payer' ? -1 : 1))
  return { items, total: items.length }
}

// ----- Asking for a payment -----

interface PaidObject {
  purpose: PaymentPurpose
  treeContractId: number | null
  deliveryId: number | null
  payerOrgId: number
  payeeOrgId: number
  currency: string
  description: string
  amountMinor: number | null
  /** Why it cannot be paid now, when it cannot. */
  refusal: string | null
}

/** The object, locked, as the caller may see it (404 otherwise), with who pays whom and what. */
async function lockPaidObject(trx: Knex.Transaction, user: Member, input: PaymentCreateInput): Promise<PaidObject> {
  if (input.purpose === 'settlement') {
    const row = await lockDeliveryRow(trx, user.orgId, input.deliveryId!)
    if (!row) notFound('That delivery')
    const lot = await trx('harvestLots').where({ id: row.lotId }).first('code') as { code: string }
    const due = settlementDue(row)
    return {
      purpose: 'settlement', treeContractId: null, deliveryId: row.id, payerOrgId: row.makerOrgId, payeeOrgId: row.growerOrgId, currency: row.currency,
      description: describe({ purpose: 'settlement', treeCount: null, varietyName: null, rootstockDesignation: null, lotCode: lot.code, deliveredOn: row.deliveredOn }),
      amountMinor: due.ok ? due.amountMinor : null, refusal: due.ok ? null : due.message,
    }
  }
  const row = await lockContractRow<TreeContractRow>(trx, TREE_PARTIES, user.orgId, input.treeContractId!)
  if (!row) notFound('That tree contract')
  const [variety, rootstock] = await catalogueSpecies(trx, row.varietyId, row.rootstockId)
  const names = { varietyName: variety?.name ?? null, rootstockDesignation: rootstock?.designation ?? null }
  const due = treeContractDue(input.purpose, factsOf(row))
  return {
    purpose: input.purpose, treeContractId: row.id, deliveryId: null, payerOrgId: row.buyerOrgId, payeeOrgId: row.nurseryOrgId, currency: row.currency,
    description: describe({ purpose: input.purpose, treeCount: row.treeCount, lotCode: null, deliveredOn: null, ...names }),
    amountMinor: due.ok ? due.amountMinor : null, refusal: due.ok ? null : due.message,
  }
}

export type PaymentAsked = { payment: PaymentDetail, created: boolean }

/**
 * The payer's owners ask to pay: the live payment if there is one (created false), or a new one
 * with its Checkout Session on the processor. 403 for the payee's people, 404 for anyone else,
 * 409 when the object owes nothing now or the seller has no connected account (the seller is told).
 */
export async function requestPayment(user: Member, input: PaymentCreateInput): Promise<PaymentAsked> {
  const outcome = await transactionRetried(async (trx) => {
    const object = await lockPaidObject(trx, user, input)
    if (object.payerOrgId !== user.orgId) {
      throw createError({ statusCode: 403, message: 'This is owed to your organisation: only the paying party pays it.' })
    }
    const live = await lockLivePayment(trx, object.purpose, { treeContractId: object.treeContractId ?? undefined, deliveryId: object.deliveryId ?? undefined })
    if (live) return { id: live.id, created: false }
    if (object.refusal || object.amountMinor === null) throw createError({ statusCode: 409, message: object.refusal ?? 'Nothing is owed on this now.' })
    const payee = (await paymentAccountOf(trx, object.payeeOrgId))!
    if (!payee.paymentAccountId) {
      await tellSellerToConnect(trx, payee, user, object)
      return { noAccount: payee.name }
    }
    return { id: await openPayment(trx, user, object, payee.paymentAccountId), created: true }
  })
  if ('noAccount' in outcome) {
    throw createError({
      statusCode: 409,
      message: `${outcome.noAccount} cannot be paid yet: it has not connected a payment account. Its owners have been told to connect one from their settings page; pay once they have.`,
      data: { reason: 'payee-not-connected' },
    })
  }
  return { payment: await getPayment(user, outcome.id), created: outcome.created }
}

async function tellSellerToConnect(trx: Knex.Transaction, payee: { id: number, name: string }, user: Member, object: PaidObject): Promise<void> {
  const payer = await trx('organisations').where({ id: user.orgId }).first('name') as { name: string }
  const owners = await ownerIds(trx, payee.id)
  if (!owners.length) return
  await queueNotice(trx, {
    orgId: payee.id, recipients: owners, kind: 'payment.account-needed', link: '/settings',
    subject: `${payer.name} wants to pay you: connect a payment account`,
    body: `${user.name} of ${payer.name} tried to pay ${object.description.charAt(0).toLowerCase()}${object.description.slice(1)}, but ${payee.name} has no payment account connected yet. An owner connects one from the settings page (Payment account → Connect); then ${payer.name} can pay.`,
  })
}

/** Writes the pending payment, makes its Checkout Session on the processor (same transaction: a refusal leaves nothing) and keeps its ids. */
async function openPayment(trx: Knex.Transaction, user: Member, object: PaidObject, paymentAccountId: string): Promise<number> {
  // The key the processor sees is derived from the payment's id, with a nonce made once with the row:
  // ids start again in a database restored or made afresh, and the processor remembers keys for a day.
  const nonce = randomBytes(6).toString('hex')
  const id = await insertPayment(trx, {
    purpose: object.purpose, treeContractId: object.treeContractId, deliveryId: object.deliveryId, payerOrgId: object.payerOrgId, payeeOrgId: object.payeeOrgId,
    amountMinor: object.amountMinor, currency: object.currency, state: 'pending', paymentAccountId, idempotencyKey: `pw-new-${nonce}`, createdByUserId: user.id,
  })
  const idempotencyKey = `pw-payment-${id}-${nonce}`
  await updatePayment(trx, id, { idempotencyKey })
  const metadata = { paymentId: String(id), purpose: object.purpose }
  const session = await withProcessor(stripe => stripe.checkout.sessions.create({
    mode: 'payment',
    client_reference_id: String(id),
    line_items: [{ quantity: 1, price_data: { currency: object.currency.toLowerCase(), unit_amount: object.amountMinor!, product_data: { name: object.description } } }],
    payment_intent_data: { transfer_data: { destination: paymentAccountId }, metadata },
    metadata,
    success_url: appLink(`/payments/${id}?returned=paid`),
    cancel_url: appLink(`/payments/${id}?returned=cancelled`),
  }, { idempotencyKey: `${idempotencyKey}-checkout` }))
  const paymentIntentId = typeof session.payment_intent === 'string' ? session.payment_intent : session.payment_intent?.id ?? null
  await updatePayment(trx, id, { checkoutSessionId: session.id, checkoutUrl: session.url, paymentIntentId })
  await insertPaymentEvent(trx, { paymentId: id, action: 'created', fromState: null, toState: 'pending', byUserId: user.id, byName: user.name, note: `${money(object.amountMinor!, object.currency)} to pay on the processor's page` })
  await recordAudit(trx, { orgId: user.orgId, actorUserId: user.id, action: 'payment.created', objectType: 'payment', objectId: id, detail: { purpose: object.purpose, amountMinor: object.amountMinor, currency: object.currency } })
  return id
}

// ----- Refunds -----

/** Locks the payment's object row, then the payment's: the order every write here takes them in. */
async function lockPaymentAndObject(trx: Knex.Transaction, found: Pick<PaymentRow, 'id' | 'treeContractId' | 'deliveryId'>) {
  if (found.treeContractId) await trx('treeContracts').where({ id: found.treeContractId }).forUpdate().first('id')
  if (found.deliveryId) await trx('deliveries').where({ id: found.deliveryId }).forUpdate().first('id')
  return (await lockPayment(trx, found.id))!
}

/** Sends the refund to the processor and records it, under the locks; the caller checked the move. */
async function refundLocked(trx: Knex.Transaction, id: number, amountMinor: number, by: { userId: number | null, name: string, orgId: number | null }, reason: string | null): Promise<void> {
  const payment = (await lockPayment(trx, id))!
  const refund = await withProcessor(stripe => stripe.refunds.create({
    payment_intent: payment.paymentIntentId!, amount: amountMinor, metadata: { paymentId: String(id) },
  }, { idempotencyKey: `${payment.idempotencyKey}-refund` }))
  const done = refund.status === 'succeeded'
  await updatePayment(trx, id, { refundId: refund.id, refundedMinor: amountMinor, ...(done ? { state: 'refunded', refundedAt: trx.fn.now(3) } : {}) })
  await insertPaymentEvent(trx, {
    paymentId: id, action: 'refunded', fromState: payment.state, toState: done ? 'refunded' : payment.state, byUserId: by.userId, byName: by.name,
    note: `${money(amountMinor, payment.currency)} refunded${reason ? `: ${reason}` : ''}`,
  })
  await recordAudit(trx, { orgId: by.orgId, actorUserId: by.userId, action: 'payment.refunded', objectType: 'payment', objectId: id, detail: { amountMinor, refundId: refund.id } })
  await tellBothSides(trx, payment, by.userId, 'refunded', `${money(amountMinor, payment.currency)} of the payment was refunded to the payer${reason ? `: ${reason}` : '.'}`)
}

/** The payee's owners refund a deposit the terms return on the contract's cancellation. */
export async function refundPayment(user: Member, id: number, input: PaymentRefundInput): Promise<PaymentDetail> {
  await transactionRetried(async (trx) => {
    const found = await findPaymentRow(trx, user.orgId, id)
    if (!found) notFound('That payment')
    await lockPaymentAndObject(trx, found)
    const row = (await findPaymentRow(trx, user.orgId, id))!
    const check = checkPaymentMove('refund', row.state, actorOf(user, sideOf(row, user.orgId)))
    if (!check.ok) throw createError({ statusCode: check.statusCode, message: check.statusCode === 403 ? 'Only the owners of the organisation paid can refund a payment.' : check.message, data: { state: check.state } })
    const amount = refundDue(row)
    if (amount === null) {
      throw createError({ statusCode: 409, message: 'Only a deposit is refunded here, once its tree contract is cancelled under terms that return it.', data: { state: row.state } })
    }
    await refundLocked(trx, id, amount, { userId: user.id, name: user.name, orgId: user.orgId }, input.reason ?? null)
  })
  return getPayment(user, id)
}

/**
 * After a tree contract is cancelled: when its terms return the deposit and the deposit was paid,
 * the refund goes to the processor at once. The cancellation stands either way; if the processor
 * does not answer, the nursery's owners are told to refund it from the payment's page.
 */
export async function refundDepositAfterCancel(treeContractId: number): Promise<void> {
  const paid = await succeededDeposit(useDb(), treeContractId)
  if (!paid) return
  try {
    await transactionRetried(async (trx) => {
      const row = await lockPaymentAndObject(trx, { id: paid.id, treeContractId, deliveryId: null })
      const shown = (await findPaymentRow(trx, row.payeeOrgId, paid.id))!
      const amount = refundDue(shown)
      if (amount === null || !checkPaymentMove('refund', shown.state, PAYMENT_SYSTEM).ok) return
      await refundLocked(trx, paid.id, amount, { userId: null, name: POMEWRIGHT, orgId: null }, 'the tree contract was cancelled and its terms return the deposit')
    })
  }
  catch (error) {
    await transactionRetried(async (trx) => {
      const payment = (await lockPayment(trx, paid.id))!
      await tellParty(trx, payment.payeeOrgId, null, {
        subject: 'A deposit refund is waiting: refund it from the payment',
        body: `The tree contract was cancelled and its terms return the deposit, but the payment processor did not take the refund (${(error as Error).message}). Refund it from the payment's page.`,
        link: `/payments/${paid.id}`, kind: 'payment.refund-waiting',
      })
    })
  }
}

// ----- The processor's events -----

interface EventEffect {
  action: Extract<PaymentMoveAction, 'succeed' | 'fail' | 'refund'>
  paymentId?: number
  checkoutSessionId?: string
  paymentIntentId?: string
  note: string | null
}

const metadataId = (metadata: Stripe.Metadata | null | undefined) => {
  const id = Number(metadata?.paymentId)
  return Number.isSafeInteger(id) && id > 0 ? id : undefined
}
const idOf = (value: string | { id: string } | null | undefined) => (typeof value === 'string' ? value : value?.id)

/** What an event means for a payment, or null for an event Pomewright does not act on. */
function effectOf(event: Stripe.Event): EventEffect | null {
  if (typeof event.data?.object !== 'object' || event.data.object === null || typeof event.id !== 'string') return null
  switch (event.type) {
    case 'checkout.session.completed':
    case 'checkout.session.async_payment_succeeded': {
      const session = event.data.object
      if (session.payment_status !== 'paid') return null
      return { action: 'succeed', paymentId: metadataId(session.metadata), checkoutSessionId: session.id, paymentIntentId: idOf(session.payment_intent), note: null }
    }
    case 'checkout.session.async_payment_failed':
    case 'checkout.session.expired': {
      const session = event.data.object
      const note = event.type === 'checkout.session.expired' ? 'The payment page expired before it was paid.' : 'The payment did not go through.'
      return { action: 'fail', paymentId: metadataId(session.metadata), checkoutSessionId: session.id, note }
    }
    case 'payment_intent.payment_failed': {
      const intent = event.data.object
      return { action: 'fail', paymentId: metadataId(intent.metadata), paymentIntentId: intent.id, note: intent.last_payment_error?.message ?? 'The payment did not go through.' }
    }
    case 'charge.refunded': {
      const charge = event.data.object
      return { action: 'refund', paymentId: metadataId(charge.metadata), paymentIntentId: idOf(charge.payment_intent), note: `${money(charge.amount_refunded, charge.currency.toUpperCase())} refunded` }
    }
    default:
      return null
  }
}

const STATE_VERB: Record<EventEffect['action'], string> = { succeed: 'succeeded', fail: 'failed', refund: 'refunded' }

/**
 * One verified event from the processor, in one transaction: recorded once by its id (a replay
 * changes nothing), the payment moved if the table allows it from where it stands (an event that
 * comes too late is kept in the history as changing nothing), and a paid settlement's delivery
 * moved to paid. Events about payments Pomewright did not make are ignored.
 */
export async function handleProcessorEvent(event: Stripe.Event): Promise<{ handled: boolean, applied: boolean }> {
  const effect = effectOf(event)
  if (!effect) return { handled: false, applied: false }
  const found = await findPaymentForProcessor(useDb(), effect)
  if (!found) return { handled: false, applied: false }
  return transactionRetried(async (trx) => {
    const payment = await lockPaymentAndObject(trx, found)
    const check = checkPaymentMove(effect.action, payment.state, PAYMENT_SYSTEM)
    const to: PaymentState = check.ok ? check.to : payment.state
    const recorded = await insertPaymentEvent(trx, {
      paymentId: payment.id, action: STATE_VERB[effect.action] as 'succeeded', fromState: payment.state, toState: to, applied: check.ok,
      processorEventId: event.id, processorEventType: event.type, byName: 'the payment processor', note: effect.note,
    })
    if (!recorded || !check.ok) return { handled: true, applied: false }
    const columns: Record<string, unknown> = { state: to }
    if (effect.action === 'succeed') Object.assign(columns, { succeededAt: trx.fn.now(3), failureReason: null, ...(effect.paymentIntentId ? { paymentIntentId: effect.paymentIntentId } : {}) })
    if (effect.action === 'fail') Object.assign(columns, { failedAt: trx.fn.now(3), failureReason: effect.note })
    if (effect.action === 'refund') Object.assign(columns, { refundedAt: trx.fn.now(3) })
    await updatePayment(trx, payment.id, columns)
    await recordAudit(trx, { orgId: null, actorUserId: null, action: `payment.${to}`, objectType: 'payment', objectId: payment.id, detail: { eventId: event.id, eventType: event.type, from: payment.state } })
    if (effect.action === 'succeed' && payment.deliveryId) await markDeliveryPaid(trx, payment.deliveryId, payment.payerOrgId)
    const said = effect.action === 'succeed'
      ? `${money(payment.amountMinor, payment.currency)} was paid.`
      : effect.action === 'fail' ? `The payment of ${money(payment.amountMinor, payment.currency)} did not go through${effect.note ? `: ${effect.note}` : '.'}` : `${effect.note ?? 'It was refunded'} to the payer.`
    await tellBothSides(trx, payment, null, to, said)
    return { handled: true, applied: true }
  })
}

/** The delivery's `pay` move, made by Pomewright in the payment's transaction (the delivery row is locked already). */
async function markDeliveryPaid(trx: Knex.Transaction, deliveryId: number, makerOrgId: number): Promise<void> {
  const row = (await lockDeliveryRow(trx, makerOrgId, deliveryId))!
  const check = checkDeliveryMove('pay', { state: row.state, disputedBy: row.disputedBy }, DELIVERY_SYSTEM)
  // A delivery disputed since the payment was asked for stays as it is; the payment is kept and shown.
  if (!check.ok) return
  await updateDeliveryRow(trx, deliveryId, { state: check.to, paidAt: trx.fn.now(3) })
  await insertDeliveryEvent(trx, { deliveryId, action: 'paid', version: row.version, byUserId: null, byOrgId: null, byName: POMEWRIGHT })
  await recordAudit(trx, { orgId: null, actorUserId: null, action: 'delivery.paid', objectType: 'delivery', objectId: deliveryId, detail: { from: row.state, to: check.to } })
}

async function tellBothSides(trx: Knex.Transaction, payment: Pick<PaymentRow, 'id' | 'payerOrgId' | 'payeeOrgId' | 'purpose'>, exceptUserId: number | null, state: string, body: string): Promise<void> {
  const shown = (await findPaymentRow(trx, payment.payerOrgId, payment.id))!
  const what = describe(shown)
  for (const orgId of [payment.payerOrgId, payment.payeeOrgId]) {
    await tellParty(trx, orgId, exceptUserId, {
      subject: `Payment ${state}: ${what}`,
      body: `${what} (${shown.payerOrgName} to ${shown.payeeOrgName}): ${body}`,
      link: `/payments/${payment.id}`, kind: `payment.${state}`,
    })
  }
}

// ----- Connecting a seller's payment account -----

/** An owner of a grower or nursery connects a payment account on the processor; asking again keeps the one it has. */
export async function connectPaymentAccount(user: Member): Promise<string> {
  return transactionRetried(async (trx) => {
    const org = (await lockSettings(trx, user.orgId))!
    if (org.paymentAccountId) return org.paymentAccountId
    const account = await withProcessor(stripe => stripe.accounts.create({
      type: 'express', country: org.countryCode ?? 'GB', ...(org.contactEmail ? { email: org.contactEmail } : {}),
      business_profile: { name: org.name }, metadata: { organisationId: String(org.id) },
    }, { idempotencyKey: `pw-organisation-${org.id}-account` }))
    await setPaymentAccount(trx, org.id, account.id)
    await recordAudit(trx, { orgId: org.id, actorUserId: user.id, action: 'organisation.payment_account_connected', objectType: 'organisation', objectId: org.id, detail: { paymentAccountId: account.id } })
    return account.id
  })
}
