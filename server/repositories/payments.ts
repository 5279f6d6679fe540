import type { Knex } from 'knex'
import type { PaymentListQuery } from '#shared/schemas/payment'
import type { Payment, PaymentEvent, PaymentPurpose, PaymentState } from '#shared/types/payment'
import { isDbError, pageWithTotal, type Db } from '../utils/db'

// Scoped queries for payments. A payment is seen by exactly its payer and its payee: every read a
// person makes names the organisation as one or the other, so another tenant's payment is simply
// not there. The processor's events name no organisation: the few reads they make by the
// processor's ids are marked as such and used by the webhook alone.

/** A payment's row as stored, with the names the API shows beside it. */
export interface PaymentRow extends Omit<Payment, 'description' | 'side' | 'moves' | 'checkoutUrl' | 'succeededAt' | 'failedAt' | 'refundedAt' | 'createdAt' | 'updatedAt'> {
  checkoutSessionId: string | null
  checkoutUrl: string | null
  paymentAccountId: string
  idempotencyKey: string
  createdByUserId: number | null
  succeededAt: Date | null
  failedAt: Date | null
  refundedAt: Date | null
  createdAt: Date
  updatedAt: Date
  /** What the description is made of: the tree contract's trees, or the delivery's lot and day. */
  treeCount: number | null
  varietyName: string | null
  rootstockDesignation: string | null
  lotCode: string | null
  deliveredOn: string | null
  /** The tree contract's standing and terms, for whether its deposit may be refunded now. */
  treeContractState: string | null
  cancelledBy: 'buyer' | 'nursery' | null
  acceptedVersion: number | null
  unitPriceMinor: number | null
  royaltyPerTreeMinor: number | null
  depositPct: number | null
  depositIfBuyerCancels: 'kept' | 'refunded' | null
  depositIfNurseryCancels: 'refunded' | 'doubled' | null
}

const ER_DUP_ENTRY = 1062

function joined(db: Db) {
  return db('payments as p')
    .join('organisations as payer', 'payer.id', 'p.payerOrgId')
    .join('organisations as payee', 'payee.id', 'p.payeeOrgId')
    .leftJoin('treeContracts as tc', 'tc.id', 'p.treeContractId')
    .leftJoin('varieties as v', 'v.id', 'tc.varietyId')
    .leftJoin('rootstocks as r', 'r.id', 'tc.rootstockId')
    .leftJoin('deliveries as d', 'd.id', 'p.deliveryId')
    .leftJoin('harvestLots as l', 'l.id', 'd.lotId')
}

const COLUMNS = [
  'p.*', 'payer.name as payerOrgName', 'payee.name as payeeOrgName', 'tc.treeCount', 'v.name as varietyName',
  'r.designation as rootstockDesignation', 'l.code as lotCode', 'd.deliveredOn', 'tc.state as treeContractState', 'tc.cancelledBy',
  'tc.acceptedVersion', 'tc.unitPriceMinor', 'tc.royaltyPerTreeMinor', 'tc.depositPct', 'tc.depositIfBuyerCancels', 'tc.depositIfNurseryCancels',
]

/** Narrows a query on `payments as p` to the payments the organisation pays or is paid. */
function ofParty(q: Knex.QueryBuilder, orgId: number): Knex.QueryBuilder {
  return q.where(w => w.where('p.payerOrgId', orgId).orWhere('p.payeeOrgId', orgId))
}

export function findPaymentRow(db: Db, orgId: number, id: number): Promise<PaymentRow | undefined> {
  return ofParty(joined(db), orgId).where('p.id', id).first(COLUMNS)
}

function filtered(q: Knex.QueryBuilder, orgId: number, query: PaymentListQuery): Knex.QueryBuilder {
  if (query.side === 'payer') q.where('p.payerOrgId', orgId)
  else if (query.side === 'payee') q.where('p.payeeOrgId', orgId)
  else ofParty(q, orgId)
  if (query.purpose) q.andWhere('p.purpose', query.purpose)
  if (query.state) q.andWhere('p.state', query.state)
  if (query.treeContractId) q.andWhere('p.treeContractId', query.treeContractId)
  if (query.deliveryId) q.andWhere('p.deliveryId', query.deliveryId)
  return q
}

/** The party's payments, newest first. */
export async function listPaymentRows(db: Db, orgId: number, query: PaymentListQuery): Promise<{ rows: PaymentRow[], total: number }> {
  const rows = filtered(joined(db), orgId, query).select(COLUMNS)
    .orderBy([{ column: 'p.createdAt', order: 'desc' }, { column: 'p.id', order: 'desc' }])
  return pageWithTotal<PaymentRow>(db, rows, () => filtered(db('payments as p'), orgId, query), query)
}

/** The payment's own row, locked until the transaction ends. For the webhook and the services that found it by a scoped read first. */
export function lockPayment(trx: Knex.Transaction, id: number): Promise<PaymentRow | undefined> {
  return trx('payments').where({ id }).forUpdate().first()
}

/** The live (pending or succeeded) payment for this purpose and object, locked; the object's own row must be locked first. */
export function lockLivePayment(trx: Knex.Transaction, purpose: PaymentPurpose, object: { treeContractId?: number, deliveryId?: number }): Promise<{ id: number } | undefined> {
  const q = trx('payments').where({ purpose }).whereIn('state', ['pending', 'succeeded'])
  if (object.treeContractId) q.andWhere('treeContractId', object.treeContractId)
  else q.andWhere('deliveryId', object.deliveryId!)
  return q.forUpdate().first('id')
}

export async function insertPayment(trx: Knex.Transaction, row: Record<string, unknown>): Promise<number> {
  const [id] = await trx('payments').insert(row)
  return id!
}

export async function updatePayment(trx: Knex.Transaction, id: number, columns: Record<string, unknown>): Promise<void> {
  await trx('payments').where({ id }).update({ ...columns, updatedAt: trx.fn.now(3) })
}

export interface NewPaymentEvent {
  paymentId: number
  action: PaymentEvent['action']
  fromState: PaymentState | null
  toState: PaymentState
  applied?: boolean
  processorEventId?: string | null
  processorEventType?: string | null
  byUserId?: number | null
  byName: string
  note?: string | null
}

/** Records a step of the payment's history; false when the processor's event was recorded before (a replay). */
export async function insertPaymentEvent(trx: Knex.Transaction, event: NewPaymentEvent): Promise<boolean> {
  try {
    await trx('paymentEvents').insert({ applied: true, processorEventId: null, processorEventType: null, byUserId: null, note: null, ...event })
    return true
  }
  catch (error) {
    if (event.processorEventId && isDbError(error, ER_DUP_ENTRY)) return false
    throw error
  }
}

export async function listPaymentEvents(db: Db, paymentId: number): Promise<PaymentEvent[]> {
  const rows = await db('paymentEvents').where({ paymentId }).orderBy('id')
    .select('id', 'action', 'fromState', 'toState', 'applied', 'byName', 'note', 'createdAt') as (Omit<PaymentEvent, 'createdAt'> & { createdAt: Date })[]
  return rows.map(r => ({ ...r, createdAt: new Date(r.createdAt).toISOString() }))
}

/** For the webhook: the payment a processor's object names, by our id in its metadata or by the processor's own ids. */
export async function findPaymentForProcessor(db: Db, ids: { paymentId?: number, checkoutSessionId?: string, paymentIntentId?: string }): Promise<Pick<PaymentRow, 'id' | 'treeContractId' | 'deliveryId'> | undefined> {
  const q = db('payments')
  if (ids.paymentId) q.orWhere('id', ids.paymentId)
  if (ids.checkoutSessionId) q.orWhere('checkoutSessionId', ids.checkoutSessionId)
  if (ids.paymentIntentId) q.orWhere('paymentIntentId', ids.paymentIntentId)
  if (!ids.paymentId && !ids.checkoutSessionId && !ids.paymentIntentId) return undefined
  return q.first('id', 'treeContractId', 'deliveryId')
}

/** A tree contract's succeeded deposit, for the refund a cancellation makes (no person reads it). */
export function succeededDeposit(db: Db, treeContractId: number): Promise<{ id: number } | undefined> {
  return db('payments').where({ treeContractId, purpose: 'deposit', state: 'succeeded' }).whereNull('refundId').first('id')
}

/** The payment account a seller has connected, and its owners to tell. */
export function paymentAccountOf(db: Db, orgId: number): Promise<{ id: number, name: string, paymentAccountId: string | null } | undefined> {
  return db('organisations').where({ id: orgId }).first('id', 'name', 'paymentAccountId')
}

// ----- What is owed and has no live payment yet -----

/** The tree contracts the organisation is a party to that may owe a deposit or a balance. */
export function owingTreeContracts(db: Db, orgId: number) {
  return db('treeContracts as c')
    .join('organisations as ob', 'ob.id', 'c.buyerOrgId')
    .join('organisations as on', 'on.id', 'c.nurseryOrgId')
    .join('varieties as v', 'v.id', 'c.varietyId')
    .join('rootstocks as r', 'r.id', 'c.rootstockId')
    .where(q => q.where('c.buyerOrgId', orgId).orWhere('c.nurseryOrgId', orgId))
    .whereIn('c.state', ['accepted', 'propagating', 'ready', 'delivered'])
    .orderBy('c.id')
    .select('c.*', 'ob.name as buyerOrgName', 'on.name as nurseryOrgName', 'v.name as varietyName', 'r.designation as rootstockDesignation')
}

/** The settled deliveries the organisation is a party to: each owes its settlement. */
export function settledDeliveries(db: Db, orgId: number) {
  return db('deliveries as d')
    .join('organisations as om', 'om.id', 'd.makerOrgId')
    .join('organisations as og', 'og.id', 'd.growerOrgId')
    .join('harvestLots as l', 'l.id', 'd.lotId')
    .where(q => q.where('d.makerOrgId', orgId).orWhere('d.growerOrgId', orgId))
    .where('d.state', 'settled')
    .orderBy([{ column: 'd.deliveredOn', order: 'desc' }, { column: 'd.id', order: 'desc' }])
    .select('d.id', 'd.makerOrgId', 'd.growerOrgId', 'd.totalMinor', 'd.currency', 'd.deliveredOn', 'd.state', 'om.name as makerOrgName', 'og.name as growerOrgName', 'l.code as lotCode')
}

/** The payments, in any state, of these objects: to tell what is live and what failed last. */
export function paymentsOf(db: Db, treeContractIds: number[], deliveryIds: number[]): Promise<{ id: number, purpose: PaymentPurpose, treeContractId: number | null, deliveryId: number | null, state: PaymentState }[]> {
  if (!treeContractIds.length && !deliveryIds.length) return Promise.resolve([])
  return db('payments').where(q => q.whereIn('treeContractId', treeContractIds).orWhereIn('deliveryId', deliveryIds))
    .orderBy('id').select('id', 'purpose', 'treeContractId', 'deliveryId', 'state')
}
