import type { Knex } from 'knex'
import type { DeliveryListQuery } from '#shared/schemas/delivery'
import type { Delivery, DeliveryEvent, DeliverySettlement } from '#shared/types/delivery'
import { fromJson, type Db } from '../utils/db'
import { coversLot } from './lots'

// Scoped queries for deliveries at the press. A delivery is seen by exactly the two parties of its
// fruit contract: every query that reads one names the organisation as maker or grower, so another
// tenant's delivery is simply not there. The lot, its readings and the contract year are read here
// for the service, which locks them in the delivery's own transaction.

/** A delivery's row as stored, with the names the API shows beside it: the API's shape less the caller's side and moves, with its times as the driver gives them. */
export type DeliveryRow = Omit<Delivery, 'side' | 'moves' | 'settledAt' | 'paidAt' | 'createdAt' | 'updatedAt'> & {
  settledAt: Date | null
  paidAt: Date | null
  createdAt: Date
  updatedAt: Date
}

function toRow(row: DeliveryRow & { settlement: string | DeliverySettlement }): DeliveryRow {
  return { ...row, settlement: fromJson(row.settlement) }
}

/** Narrows a query on `deliveries as d` to the deliveries the organisation is a party to. */
function ofParty(q: Knex.QueryBuilder, orgId: number): Knex.QueryBuilder {
  return q.where(w => w.where('d.makerOrgId', orgId).orWhere('d.growerOrgId', orgId))
}

function joined(db: Db) {
  return db('deliveries as d')
    .join('organisations as om', 'om.id', 'd.makerOrgId')
    .join('organisations as og', 'og.id', 'd.growerOrgId')
    .join('harvestLots as l', 'l.id', 'd.lotId')
    .join('varieties as v', 'v.id', 'l.varietyId')
}

const COLUMNS = ['d.*', 'om.name as makerOrgName', 'og.name as growerOrgName', 'l.code as lotCode', 'v.name as varietyName']

export async function findDeliveryRow(db: Db, orgId: number, id: number): Promise<DeliveryRow | undefined> {
  const row = await ofParty(joined(db), orgId).where('d.id', id).first(COLUMNS)
  return row ? toRow(row) : undefined
}

/** The delivery's own row, locked until the transaction ends, if the organisation is a party to it. */
export function lockDeliveryRow(trx: Knex.Transaction, orgId: number, id: number): Promise<Omit<DeliveryRow, 'makerOrgName' | 'growerOrgName' | 'lotCode' | 'varietyName'> | undefined> {
  return ofParty(trx('deliveries as d'), orgId).where('d.id', id).forUpdate().first('d.*')
    .then((row: (DeliveryRow & { settlement: string }) | undefined) => (row ? toRow(row) : undefined))
}

function filtered(q: Knex.QueryBuilder, orgId: number, query: DeliveryListQuery): Knex.QueryBuilder {
  ofParty(q, orgId)
  if (query.fruitContractId) q.andWhere('d.fruitContractId', query.fruitContractId)
  if (query.growerOrgId) q.andWhere('d.growerOrgId', query.growerOrgId)
  if (query.makerOrgId) q.andWhere('d.makerOrgId', query.makerOrgId)
  if (query.harvestYear) q.andWhere('d.harvestYear', query.harvestYear)
  if (query.state) q.andWhere('d.state', query.state)
  if (query.lotId) q.andWhere('d.lotId', query.lotId)
  return q
}

/** The party's deliveries, newest delivered first. */
export async function listDeliveryRows(db: Db, orgId: number, query: DeliveryListQuery): Promise<{ rows: DeliveryRow[], total: number }> {
  const rows = await filtered(joined(db), orgId, query).select([...COLUMNS, db.raw('COUNT(*) OVER () AS list_total')])
    .orderBy([{ column: 'd.deliveredOn', order: 'desc' }, { column: 'd.id', order: 'desc' }]).limit(query.limit).offset(query.offset) as (DeliveryRow & { settlement: string, listTotal: number })[]
  if (rows[0]) return { rows: rows.map(({ listTotal: _t, ...row }) => toRow(row)), total: Number(rows[0].listTotal) }
  const [{ total }] = await filtered(db('deliveries as d'), orgId, query).count({ total: '*' }) as [{ total: number }]
  return { rows: [], total: Number(total) }
}

export async function insertDelivery(trx: Knex.Transaction, row: Record<string, unknown>): Promise<number> {
  const [id] = await trx('deliveries').insert(row)
  return id!
}

export async function updateDeliveryRow(trx: Knex.Transaction, id: number, columns: Record<string, unknown>): Promise<void> {
  await trx('deliveries').where({ id }).update({ ...columns, updatedAt: trx.fn.now(3) })
}

// ----- The contract year -----

/** The contract year's row, locked until the transaction ends, so its deliveries are counted one writer at a time. */
export function lockContractYear(trx: Knex.Transaction, contractId: number, harvestYear: number): Promise<{ tonnes: number } | undefined> {
  return trx('fruitContractYears').where({ contractId, harvestYear }).forUpdate().first('tonnes')
}

export function contractYear(db: Db, contractId: number, harvestYear: number): Promise<{ tonnes: number } | undefined> {
  return db('fruitContractYears').where({ contractId, harvestYear }).first('tonnes')
}

export type YearDelivery = Pick<DeliveryRow, 'id' | 'deliveredOn' | 'netKg' | 'state' | 'excessKg' | 'excessDecision' | 'readingBrix' | 'rotPct' | 'damagePct' | 'qualityRejectReason' | 'version'>

/** Every delivery of the contract's year, locked (read as committed), in the order they were delivered. */
export function lockYearDeliveries(trx: Knex.Transaction, contractId: number, harvestYear: number): Promise<YearDelivery[]> {
  return trx('deliveries').where({ fruitContractId: contractId, harvestYear })
    .orderBy([{ column: 'deliveredOn' }, { column: 'id' }]).forUpdate()
    .select('id', 'deliveredOn', 'netKg', 'state', 'excessKg', 'excessDecision', 'readingBrix', 'rotPct', 'damagePct', 'qualityRejectReason', 'version')
}

/** Net kilograms delivered against the contract's year, a disputed load included. */
export async function yearDeliveredKg(db: Db, contractId: number, harvestYear: number): Promise<number> {
  const [row] = await db('deliveries').where({ fruitContractId: contractId, harvestYear }).sum({ kg: 'netKg' }) as [{ kg: number | null }]
  return Number(row?.kg ?? 0)
}

// ----- The lot and its readings -----

export interface GrowerLot { id: number, code: string, netKg: number, harvestYear: number, pickedOn: string, state: string, varietyName: string, varietyClass: string | null, species: string }

/** The grower's lot by id; another organisation's lot is not there. */
export function findGrowerLot(db: Db, growerOrgId: number, lotId: number): Promise<GrowerLot | undefined> {
  return db('harvestLots as l').join('varieties as v', 'v.id', 'l.varietyId').where({ 'l.id': lotId, 'l.orgId': growerOrgId })
    .first('l.id', 'l.code', 'l.netKg', 'l.harvestYear', 'l.pickedOn', 'l.state', 'v.name as varietyName', 'v.juiceClass as varietyClass', 'v.species')
}

/** Whether the fruit contract covers the lot, by the same rule that shows a maker the lots it buys. */
export async function contractCoversLot(db: Db, contractId: number, lotId: number): Promise<boolean> {
  const row = await db('harvestLots as l').join('varieties as v', 'v.id', 'l.varietyId').where('l.id', lotId)
    .whereExists(c => coversLot(c.from('fruitContracts as fc').where('fc.id', contractId))).first('l.id')
  return Boolean(row)
}

/** The lot's row, locked until the transaction ends, so two loads of it are weighed against it one at a time. */
export function lockLot(trx: Knex.Transaction, lotId: number): Promise<{ id: number, netKg: number, state: string } | undefined> {
  return trx('harvestLots').where({ id: lotId }).forUpdate().first('id', 'netKg', 'state')
}

/** Net kilograms of the lot delivered so far (read as committed, under the lot's lock), less one delivery's when it is being corrected. */
export async function lotDeliveredKg(trx: Knex.Transaction, lotId: number, exceptId?: number): Promise<number> {
  const q = trx('deliveries').where({ lotId })
  if (exceptId) q.whereNot('id', exceptId)
  const [row] = await q.forUpdate().sum({ kg: 'netKg' }) as [{ kg: number | null }]
  return Number(row?.kg ?? 0)
}

export async function setLotState(trx: Knex.Transaction, lotId: number, state: 'available' | 'delivered'): Promise<void> {
  await trx('harvestLots').where({ id: lotId }).update({ state, updatedAt: trx.fn.now(3) })
}

export interface SugarReading { id: number, sampledOn: string, brix: number | null, sg: number | null }

export function findLotReading(db: Db, lotId: number, readingId: number): Promise<SugarReading | undefined> {
  return db('juiceReadings').where({ id: readingId, lotId }).first('id', 'sampledOn', 'brix', 'sg')
}

/** The lot's latest reading that has a sugar figure (°Brix or SG), by day sampled, then entry. */
export function latestSugarReading(db: Db, lotId: number): Promise<SugarReading | undefined> {
  return db('juiceReadings').where({ lotId }).where(q => q.whereNotNull('brix').orWhereNotNull('sg'))
    .orderBy([{ column: 'sampledOn', order: 'desc' }, { column: 'id', order: 'desc' }]).first('id', 'sampledOn', 'brix', 'sg')
}

/** The seller's tax on sales as its settings say now; null when it has none set. */
export async function taxRateOf(db: Db, orgId: number): Promise<number | null> {
  const row = await db('organisations').where({ id: orgId }).first('taxRatePct') as { taxRatePct: number | null } | undefined
  return row?.taxRatePct ?? null
}

// ----- History -----

export interface NewDeliveryEvent {
  deliveryId: number
  action: DeliveryEvent['action']
  version: number
  byUserId: number | null
  byOrgId: number | null
  byName: string
  changes?: DeliveryEvent['changes']
  reason?: string | null
}

export async function insertDeliveryEvent(trx: Knex.Transaction, event: NewDeliveryEvent): Promise<void> {
  await trx('deliveryEvents').insert({ ...event, changes: JSON.stringify(event.changes ?? []), reason: event.reason ?? null })
}

/** A delivery's history, oldest first; the caller has checked it may see the delivery. */
export async function listDeliveryEvents(db: Db, deliveryId: number): Promise<DeliveryEvent[]> {
  const rows = await db('deliveryEvents as e').leftJoin('organisations as o', 'o.id', 'e.byOrgId').where('e.deliveryId', deliveryId).orderBy('e.id')
    .select('e.id', 'e.action', 'e.version', 'e.byName', 'o.name as byOrgName', 'e.changes', 'e.reason', 'e.createdAt as at') as (Omit<DeliveryEvent, 'changes' | 'at'> & { changes: string | DeliveryEvent['changes'], at: Date })[]
  return rows.map(r => ({ ...r, changes: fromJson<DeliveryEvent['changes']>(r.changes), at: new Date(r.at).toISOString() }))
}
