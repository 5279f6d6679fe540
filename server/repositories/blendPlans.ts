import type { Knex } from 'knex'
import type { BlendPlanListQuery } from '#shared/schemas/blendPlan'
import type { BlendSolveRequest, BlendSolveResponse } from '#shared/types/blend'
import type { BlendPlanEvent, BlendPlanLot, BlendPlanState, LotTrace, Pressing, PressingLot, PressingTrace } from '#shared/types/blendPlan'
import { fromJson, pageWithTotal, type Db } from '../utils/db'
import { containsPattern } from './catalogue'

// Scoped queries for a maker's blend plans, their reservations and pressings, and the trace of
// fruit through them. Every plan and pressing query names the maker, so another tenant's is a 404.
// What is free of a lot is read by one rule, in ./blends.ts (blendLotRowsByIds).

export interface BlendPlanRow {
  id: number
  orgId: number
  name: string
  state: BlendPlanState
  request: BlendSolveRequest
  result: BlendSolveResponse
  notes: string | null
  version: number
  committedAt: Date | null
  pressedAt: Date | null
  createdAt: Date
  updatedAt: Date
}

const PLAN_COLUMNS = ['id', 'orgId', 'name', 'state', 'request', 'result', 'notes', 'version', 'committedAt', 'pressedAt', 'createdAt', 'updatedAt']

function plansOf(db: Db, orgId: number) {
  return db('blendPlans').where('blendPlans.orgId', orgId)
}

function toPlanRow(row: BlendPlanRow): BlendPlanRow {
  return { ...row, request: fromJson(row.request), result: fromJson(row.result) }
}

export async function listPlanRows(db: Db, orgId: number, query: BlendPlanListQuery): Promise<{ rows: BlendPlanRow[], total: number }> {
  const filtered = (q: Knex.QueryBuilder) => {
    if (query.state) q.andWhere('state', query.state)
    if (query.q) q.andWhereILike('name', containsPattern(query.q))
    if (query.lotId) q.whereExists(r => r.from('blendPlanLots as r').whereRaw('r.plan_id = blend_plans.id').andWhere('r.lotId', query.lotId!))
    return q
  }
  const rows = filtered(plansOf(db, orgId)).select(PLAN_COLUMNS).orderBy([{ column: 'updatedAt', order: 'desc' }, { column: 'id', order: 'desc' }])
  const page = await pageWithTotal<BlendPlanRow>(db, rows, () => filtered(plansOf(db, orgId)), query)
  return { rows: page.rows.map(toPlanRow), total: page.total }
}

export async function findPlanRow(db: Db, orgId: number, id: number): Promise<BlendPlanRow | undefined> {
  const row = await plansOf(db, orgId).andWhere({ id }).first(PLAN_COLUMNS) as BlendPlanRow | undefined
  return row && toPlanRow(row)
}

/** The maker's plan, locked until the transaction ends. */
export async function lockPlan(trx: Knex.Transaction, orgId: number, id: number): Promise<BlendPlanRow | undefined> {
  const row = await plansOf(trx, orgId).andWhere({ id }).forUpdate().first(PLAN_COLUMNS) as BlendPlanRow | undefined
  return row && toPlanRow(row)
}

export async function insertPlan(trx: Knex.Transaction, row: Record<string, unknown>): Promise<number> {
  const [id] = await trx('blendPlans').insert(row)
  return id!
}

export async function updatePlanRow(trx: Knex.Transaction, orgId: number, id: number, changes: Record<string, unknown>): Promise<void> {
  await plansOf(trx, orgId).andWhere({ id }).update({ ...changes, updatedAt: trx.fn.now(3) })
}

export async function deletePlanRow(trx: Knex.Transaction, orgId: number, id: number): Promise<void> {
  await plansOf(trx, orgId).andWhere({ id }).delete()
}

export async function insertPlanEvent(trx: Knex.Transaction, event: { planId: number, action: string, fromState: BlendPlanState | null, toState: BlendPlanState, version: number, byUserId: number, detail?: Record<string, unknown> }): Promise<void> {
  await trx('blendPlanEvents').insert({ ...event, detail: event.detail ? JSON.stringify(event.detail) : null })
}

export async function listPlanEvents(db: Db, planId: number): Promise<BlendPlanEvent[]> {
  const rows = await db('blendPlanEvents as e').leftJoin('users as u', 'u.id', 'e.byUserId').where('e.planId', planId)
    .select('e.action', 'e.fromState', 'e.toState', 'e.version', 'u.name as byName', 'e.at').orderBy([{ column: 'e.at' }, { column: 'e.id' }]) as (Omit<BlendPlanEvent, 'at'> & { at: Date })[]
  return rows.map(r => ({ ...r, at: new Date(r.at).toISOString() }))
}

// ----- Lots: locks and reservations -----

export interface LockedLot { id: number, code: string, state: 'available' | 'delivered' | 'pressed', netKg: number }

/**
 * Locks the lots until the transaction ends, always in the order of their ids, so two writers that
 * want some of the same lots queue on the first of them instead of each holding one the other wants.
 */
export function lockLots(trx: Knex.Transaction, lotIds: number[]): Promise<LockedLot[]> {
  if (!lotIds.length) return Promise.resolve([])
  return trx('harvestLots').whereIn('id', [...new Set(lotIds)]).orderBy('id').forUpdate().select('id', 'code', 'state', 'netKg')
}

export async function insertReservations(trx: Knex.Transaction, planId: number, lots: { lotId: number, kg: number, litres: number }[]): Promise<void> {
  await trx('blendPlanLots').where({ planId }).delete()
  if (lots.length) await trx('blendPlanLots').insert(lots.map(l => ({ planId, ...l })))
}

/** The kilograms a plan holds or held of each lot, with what the cellar needs to find the fruit. */
export function planLots(db: Db, planId: number): Promise<BlendPlanLot[]> {
  return db('blendPlanLots as r').join('harvestLots as l', 'l.id', 'r.lotId').join('organisations as o', 'o.id', 'l.orgId')
    .where('r.planId', planId).select('r.lotId', 'l.code', 'o.name as growerName', 'r.kg', 'r.litres', 'l.bins', 'l.state as lotState').orderBy('r.id')
}

/**
 * Of `lotIds`, what the maker has weighed in and not yet pressed, with each lot's total delivered
 * (to anyone) and pressed by the maker. Read under the lots' locks.
 */
export async function pressableKg(trx: Knex.Transaction, orgId: number, lotIds: number[]): Promise<Map<number, { weighedKg: number, deliveredKg: number, pressedKg: number }>> {
  const rows = await trx('harvestLots as l').whereIn('l.id', lotIds).select(
    'l.id',
    trx.raw('(SELECT COALESCE(SUM(d.net_kg), 0) FROM deliveries d WHERE d.lot_id = l.id AND d.maker_org_id = ?) AS weighed_kg', [orgId]),
    trx.raw('(SELECT COALESCE(SUM(d.net_kg), 0) FROM deliveries d WHERE d.lot_id = l.id) AS delivered_kg'),
    trx.raw('(SELECT COALESCE(SUM(pl.kg), 0) FROM pressing_lots pl JOIN pressings ps ON ps.id = pl.pressing_id WHERE pl.lot_id = l.id AND ps.org_id = ?) AS pressed_kg', [orgId]),
  ) as { id: number, weighedKg: number, deliveredKg: number, pressedKg: number }[]
  return new Map(rows.map(r => [r.id, { weighedKg: Number(r.weighedKg), deliveredKg: Number(r.deliveredKg), pressedKg: Number(r.pressedKg) }]))
}

export async function setLotsPressed(trx: Knex.Transaction, lotIds: number[]): Promise<void> {
  if (lotIds.length) await trx('harvestLots').whereIn('id', lotIds).update({ state: 'pressed', updatedAt: trx.fn.now(3) })
}

// ----- Pressings -----

export async function insertPressing(trx: Knex.Transaction, row: Record<string, unknown>, lots: { lotId: number, kg: number }[]): Promise<number> {
  const [id] = await trx('pressings').insert(row)
  await trx('pressingLots').insert(lots.map((l, i) => ({ pressingId: id, lotId: l.lotId, kg: l.kg, position: i + 1 })))
  return id!
}

type PressingRow = Omit<Pressing, 'lots' | 'createdAt'> & { createdAt: Date }

function pressingsOf(db: Db, orgId: number) {
  return db('pressings as p').join('blendPlans as bp', 'bp.id', 'p.planId').leftJoin('users as u', 'u.id', 'p.recordedByUserId').where('p.orgId', orgId)
    .select('p.id', 'p.planId', 'bp.name as planName', 'p.pressedOn', 'p.litresPressed', 'p.vessel', 'p.notes', 'u.name as recordedByName', 'p.createdAt')
}

async function withLots(db: Db, row: PressingRow | undefined): Promise<Pressing | null> {
  if (!row) return null
  const lots = await db('pressingLots as pl').join('harvestLots as l', 'l.id', 'pl.lotId').where('pl.pressingId', row.id)
    .select('pl.lotId', 'l.code', 'pl.kg', 'pl.position').orderBy('pl.position') as PressingLot[]
  return { ...row, createdAt: new Date(row.createdAt).toISOString(), lots }
}

export async function findPressing(db: Db, orgId: number, id: number): Promise<Pressing | null> {
  return withLots(db, await pressingsOf(db, orgId).andWhere('p.id', id).first())
}

export async function pressingOfPlan(db: Db, orgId: number, planId: number): Promise<Pressing | null> {
  return withLots(db, await pressingsOf(db, orgId).andWhere('p.planId', planId).first())
}

interface SourceLot {
  id: number
  pickedOn: string
  harvestYear: number
  varietyId: number
  varietyName: string
  growerId: number
  growerName: string
  blockId: number | null
  blockName: string | null
}

/** Where each lot of a pressing came from: grower, block, variety, the loads weighed in and the lab sheets of its readings. */
export async function pressingSources(db: Db, orgId: number, pressing: Pressing): Promise<PressingTrace['lots']> {
  const lotIds = pressing.lots.map(l => l.lotId)
  const lots = await db('harvestLots as l').join('varieties as v', 'v.id', 'l.varietyId').join('organisations as o', 'o.id', 'l.orgId')
    .leftJoin('orchardBlocks as b', 'b.id', 'l.blockId').whereIn('l.id', lotIds)
    .select('l.id', 'l.pickedOn', 'l.harvestYear', 'v.id as varietyId', 'v.name as varietyName', 'o.id as growerId', 'o.name as growerName', 'b.id as blockId', 'b.name as blockName') as SourceLot[]
  const deliveries = await db('deliveries').whereIn('lotId', lotIds).andWhere('makerOrgId', orgId)
    .select('id', 'lotId', 'deliveredOn', 'ticketNo', 'netKg').orderBy([{ column: 'deliveredOn' }, { column: 'id' }]) as { id: number, lotId: number, deliveredOn: string, ticketNo: string | null, netKg: number }[]
  const sheets = await db('juiceReadings as r').join('labSheets as s', 's.id', 'r.labSheetId').whereIn('r.lotId', lotIds)
    .distinct('r.lotId', 's.id', 's.name').orderBy([{ column: 'r.lotId' }, { column: 's.id' }]) as { lotId: number, id: number, name: string }[]
  const byId = new Map(lots.map(l => [l.id, l]))
  return pressing.lots.map(({ lotId, code, kg, position }) => {
    const lot = byId.get(lotId)!
    return {
      lotId, code, kg, position, pickedOn: lot.pickedOn, harvestYear: lot.harvestYear,
      variety: { id: lot.varietyId, name: lot.varietyName },
      grower: { id: lot.growerId, name: lot.growerName },
      block: lot.blockId === null ? null : { id: lot.blockId, name: lot.blockName! },
      deliveries: deliveries.filter(d => d.lotId === lotId).map(({ lotId: _l, ...d }) => d),
      labSheets: sheets.filter(s => s.lotId === lotId).map(({ id, name }) => ({ id, name })),
    }
  })
}

/** A lot's code and grower, for a reader the lot's own rule has let see it. */
export function lotOwner(db: Db, lotId: number): Promise<{ id: number, code: string, orgId: number } | undefined> {
  return db('harvestLots').where({ id: lotId }).first('id', 'code', 'orgId')
}

/** The maker's plans that held or hold kg of the lot, and its pressings of it. */
export async function lotTraceForMaker(db: Db, orgId: number, lotId: number): Promise<Pick<LotTrace, 'plans' | 'pressings'>> {
  // A plan went into the lot when its commit held some of it or its pressing took some of it.
  const plans = await db('blendPlans as p').where('p.orgId', orgId)
    .where(w => w.whereExists(r => r.from('blendPlanLots as r').whereRaw('r.plan_id = p.id').andWhere('r.lotId', lotId))
      .orWhereExists(t => t.from('pressings as ps').join('pressingLots as pl', 'pl.pressingId', 'ps.id').whereRaw('ps.plan_id = p.id').andWhere('pl.lotId', lotId)))
    .select('p.id', 'p.name', 'p.state', db.raw('COALESCE((SELECT r.kg FROM blend_plan_lots r WHERE r.plan_id = p.id AND r.lot_id = ?), 0) AS kg', [lotId]))
    .orderBy('p.id') as LotTrace['plans']
  const pressings = await db('pressingLots as pl').join('pressings as ps', 'ps.id', 'pl.pressingId').join('organisations as o', 'o.id', 'ps.orgId')
    .where({ 'pl.lotId': lotId, 'ps.orgId': orgId })
    .select('ps.id', 'ps.planId', 'o.name as makerName', 'ps.pressedOn', 'pl.kg', 'ps.vessel', 'ps.litresPressed').orderBy([{ column: 'ps.pressedOn' }, { column: 'ps.id' }]) as LotTrace['pressings']
  return { plans, pressings }
}

/** The grower's own lot, forward only as far as who pressed how much of it and when. */
export async function lotTraceForGrower(db: Db, lotId: number): Promise<LotTrace['pressings']> {
  const rows = await db('pressingLots as pl').join('pressings as ps', 'ps.id', 'pl.pressingId').join('organisations as o', 'o.id', 'ps.orgId')
    .where('pl.lotId', lotId).select('o.name as makerName', 'ps.pressedOn', 'pl.kg').orderBy([{ column: 'ps.pressedOn' }, { column: 'ps.id' }]) as { makerName: string, pressedOn: string, kg: number }[]
  return rows.map(r => ({ id: null, planId: null, makerName: r.makerName, pressedOn: r.pressedOn, kg: r.kg, vessel: null, litresPressed: null }))
}
