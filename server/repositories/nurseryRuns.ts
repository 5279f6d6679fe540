import type { Knex } from 'knex'
import type { DugGrade, EventKind, LinerGrade, RunListQuery } from '#shared/schemas/nursery'
import type { NurseryRun, PropagationEvent } from '#shared/types/nursery'
import type { Db } from '../utils/db'

// Scoped queries for the runs of the row map and the events on them: every one names the
// organisation, so another tenant's run or event is simply not there. The counts, warnings and
// expected trees are worked out by the run service from these rows; nothing derived is stored.

/** A run as selected, with the names the page shows and the terms of the contract it serves. */
export type RunRow = Pick<NurseryRun, 'id' | 'rowId' | 'rowName' | 'fieldName' | 'fromPosition' | 'toPosition' | 'rootstockId'
  | 'rootstockDesignation' | 'rootstockNeedsSupport' | 'interstem' | 'linerGrade' | 'linedOutOn' | 'linedOutCount' | 'varietyId'
  | 'varietyName' | 'treeContractId' | 'tagCode' | 'notes'> & {
    tagPrintedAt: Date | null
    identityChangedAt: Date
    createdAt: Date
    updatedAt: Date
    // The contract, when the run serves one the nursery still sees (null columns otherwise).
    contractId: number | null
    contractBuyerOrgName: string | null
    contractVarietyId: number | null
    contractVarietyName: string | null
    contractRootstockId: number | null
    contractRootstockDesignation: string | null
    contractTreeCount: number | null
    contractTakeRate: number | null
    contractSurvivalRate: number | null
    contractState: string | null
  }

const COLUMNS = [
  'n.id', 'n.rowId', 'w.name as rowName', 'f.name as fieldName', 'n.fromPosition', 'n.toPosition',
  'n.rootstockId', 'r.designation as rootstockDesignation', 'r.needsSupport as rootstockNeedsSupport', 'n.interstem', 'n.linerGrade',
  'n.linedOutOn', 'n.linedOutCount', 'n.varietyId', 'v.name as varietyName', 'n.treeContractId', 'n.tagCode', 'n.tagPrintedAt',
  'n.identityChangedAt', 'n.notes', 'n.createdAt', 'n.updatedAt',
  'c.id as contractId', 'ob.name as contractBuyerOrgName', 'c.varietyId as contractVarietyId', 'cv.name as contractVarietyName',
  'c.rootstockId as contractRootstockId', 'cr.designation as contractRootstockDesignation', 'c.treeCount as contractTreeCount',
  'c.takeRate as contractTakeRate', 'c.survivalRate as contractSurvivalRate', 'c.state as contractState',
]

function runsOf(db: Db, orgId: number) {
  return db('nurseryRuns as n')
    .join('nurseryRows as w', 'w.id', 'n.rowId')
    .join('nurseryBeds as f', 'f.id', 'w.fieldId')
    .join('rootstocks as r', 'r.id', 'n.rootstockId')
    .join('varieties as v', 'v.id', 'n.varietyId')
    // Only a contract the organisation is the nursery of: its runs are its own side's record.
    .leftJoin('treeContracts as c', q => q.on('c.id', 'n.treeContractId').andOn('c.nurseryOrgId', 'n.orgId'))
    .leftJoin('organisations as ob', 'ob.id', 'c.buyerOrgId')
    .leftJoin('varieties as cv', 'cv.id', 'c.varietyId')
    .leftJoin('rootstocks as cr', 'cr.id', 'c.rootstockId')
    .where('n.orgId', orgId)
}

function filtered(db: Db, orgId: number, query: Omit<RunListQuery, 'limit' | 'offset' | 'hasWarnings'>) {
  return runsOf(db, orgId).modify((q) => {
    if (query.varietyId) q.andWhere('n.varietyId', query.varietyId)
    if (query.rootstockId) q.andWhere('n.rootstockId', query.rootstockId)
    if (query.treeContractId) q.andWhere('n.treeContractId', query.treeContractId)
    if (query.rowId) q.andWhere('n.rowId', query.rowId)
  })
}

// The map's order: field, row (numbers as numbers), then along the row.
function mapOrder(q: Knex.QueryBuilder): Knex.QueryBuilder {
  return q.orderBy('f.name').orderByRaw('natural_sort_key(w.name)').orderBy([{ column: 'n.fromPosition' }, { column: 'n.id' }])
}

/** One page of runs, or every match when `page` is left out (the service then filters and pages). */
export async function listRunRows(db: Db, orgId: number, query: RunListQuery, page?: { limit: number, offset: number }): Promise<{ rows: RunRow[], total: number }> {
  const q = mapOrder(filtered(db, orgId, query).select([...COLUMNS, db.raw('COUNT(*) OVER () AS list_total')]))
  if (page) q.limit(page.limit).offset(page.offset)
  const rows = await q as (RunRow & { listTotal: number })[]
  if (!rows.length && page && page.offset > 0) {
    const [{ total }] = await filtered(db, orgId, query).count({ total: '*' }) as [{ total: number }]
    return { rows: [], total: Number(total) }
  }
  return { rows: rows.map(({ listTotal: _t, ...row }) => row), total: rows[0]?.listTotal ?? 0 }
}

export function findRunRow(db: Db, orgId: number, id: number): Promise<RunRow | undefined> {
  return runsOf(db, orgId).andWhere('n.id', id).first(COLUMNS)
}

export function findRunRowsByIds(db: Db, orgId: number, ids: number[]): Promise<RunRow[]> {
  return mapOrder(runsOf(db, orgId).whereIn('n.id', ids).select(COLUMNS))
}

export async function findRunIdByTag(db: Db, orgId: number, tagCode: string): Promise<number | undefined> {
  const row = await db('nurseryRuns').where({ orgId, tagCode }).first('id') as { id: number } | undefined
  return row?.id
}

/** The run's own row, locked until the transaction ends: events on one run are counted one at a time. */
export interface LockedRun {
  id: number
  rowId: number
  interstem: string | null
  fromPosition: number
  toPosition: number
  rootstockId: number
  varietyId: number
  treeContractId: number | null
  linerGrade: LinerGrade | null
  linedOutOn: string
  linedOutCount: number
}

export function lockRun(trx: Knex.Transaction, orgId: number, id: number): Promise<LockedRun | undefined> {
  return trx('nurseryRuns').where({ id, orgId }).forUpdate()
    .first('id', 'rowId', 'fromPosition', 'toPosition', 'rootstockId', 'interstem', 'varietyId', 'treeContractId', 'linerGrade', 'linedOutOn', 'linedOutCount')
}

/** The first other run of the row that holds any of the positions, with what it is. */
export function runInTheWay(trx: Knex.Transaction, orgId: number, rowId: number, span: { fromPosition: number, toPosition: number }, exceptId?: number) {
  const q = trx('nurseryRuns as n').join('varieties as v', 'v.id', 'n.varietyId').join('rootstocks as r', 'r.id', 'n.rootstockId')
    .where({ 'n.orgId': orgId, 'n.rowId': rowId })
    .andWhere('n.fromPosition', '<=', span.toPosition).andWhere('n.toPosition', '>=', span.fromPosition)
  if (exceptId) q.andWhereNot('n.id', exceptId)
  return q.orderBy('n.fromPosition').first('n.id', 'n.fromPosition', 'n.toPosition', 'v.name as varietyName', 'r.designation as rootstockDesignation') as Promise<
    { id: number, fromPosition: number, toPosition: number, varietyName: string, rootstockDesignation: string } | undefined
  >
}

/** The highest position any run of the row holds (0 for an empty row). */
export async function lastHeldPosition(trx: Knex.Transaction, orgId: number, rowId: number): Promise<number> {
  const [row] = await trx('nurseryRuns').where({ orgId, rowId }).max({ last: 'toPosition' }) as [{ last: number | null }]
  return row.last ?? 0
}

/** A tree contract the organisation is the nursery of, as a run needs to check it. */
export function findNurseryContract(trx: Knex.Transaction, orgId: number, id: number) {
  return trx('treeContracts').where({ id, nurseryOrgId: orgId }).first('id', 'state') as Promise<{ id: number, state: string } | undefined>
}

export async function insertRun(trx: Knex.Transaction, row: Record<string, unknown>): Promise<number> {
  const [id] = await trx('nurseryRuns').insert(row)
  return id!
}

export async function updateRunRow(trx: Knex.Transaction, orgId: number, id: number, changes: Record<string, unknown>): Promise<void> {
  await trx('nurseryRuns').where({ id, orgId }).update({ ...changes, updatedAt: trx.fn.now(3) })
}

/** Marks the runs' tags printed now; the caller has checked every id is the organisation's. */
export async function markTagsPrinted(trx: Knex.Transaction, orgId: number, ids: number[]): Promise<void> {
  await trx('nurseryRuns').where({ orgId }).whereIn('id', ids).update({ tagPrintedAt: trx.fn.now(3) })
}

export async function lockOwnRuns(trx: Knex.Transaction, orgId: number, ids: number[]): Promise<number[]> {
  const rows = await trx('nurseryRuns').where({ orgId }).whereIn('id', ids).forUpdate().select('id') as { id: number }[]
  return rows.map(r => r.id)
}

// ----- Events -----

interface EventRow extends Omit<PropagationEvent, 'grades' | 'createdAt'> {
  grades: string | DugGrade[] | null
  createdAt: Date
}

function eventsOf(db: Db, orgId: number) {
  return db('propagationEvents as e')
    .leftJoin('varieties as v', 'v.id', 'e.varietyId')
    .leftJoin('budwoodLots as b', q => q.on('b.id', 'e.budwoodLotId').andOn('b.orgId', 'e.orgId'))
    .where('e.orgId', orgId)
    .select('e.id', 'e.runId', 'e.kind', 'e.happenedOn', 'e.count', 'e.cause', 'e.method', 'e.varietyId', 'v.name as varietyName',
      'e.budwoodLotId', 'b.label as budwoodLabel', 'e.budHeightCm', 'e.dayOrder', 'e.passNo', 'e.grades', 'e.notes',
      'e.byUserId', 'e.byName', 'e.clientKey', 'e.createdAt')
}

function toEvent(row: EventRow): PropagationEvent {
  const grades = typeof row.grades === 'string' ? JSON.parse(row.grades) as DugGrade[] : row.grades
  return { ...row, kind: row.kind as EventKind, grades, createdAt: new Date(row.createdAt).toISOString() }
}

// Date order; events of one day in the order they were recorded.
const EVENT_ORDER = [{ column: 'e.happenedOn' }, { column: 'e.id' }]

/** Every event of the given runs, in date order. */
export async function eventsOfRuns(db: Db, orgId: number, runIds: number[]): Promise<PropagationEvent[]> {
  if (!runIds.length) return []
  const rows = await eventsOf(db, orgId).whereIn('e.runId', runIds).orderBy(EVENT_ORDER) as EventRow[]
  return rows.map(toEvent)
}

export async function listEvents(db: Db, orgId: number, runId: number, page: { limit: number, offset: number }): Promise<{ items: PropagationEvent[], total: number }> {
  const rows = await eventsOf(db, orgId).andWhere('e.runId', runId).select(db.raw('COUNT(*) OVER () AS list_total'))
    .orderBy(EVENT_ORDER).limit(page.limit).offset(page.offset) as (EventRow & { listTotal: number })[]
  if (!rows.length && page.offset > 0) {
    const [{ total }] = await db('propagationEvents').where({ orgId, runId }).count({ total: '*' }) as [{ total: number }]
    return { items: [], total: Number(total) }
  }
  return { items: rows.map(({ listTotal: _t, ...row }) => toEvent(row)), total: rows[0]?.listTotal ?? 0 }
}

export async function findEvent(db: Db, orgId: number, id: number): Promise<PropagationEvent | undefined> {
  const row = await eventsOf(db, orgId).andWhere('e.id', id).first() as EventRow | undefined
  return row && toEvent(row)
}

export function findEventByClientKey(trx: Knex.Transaction, orgId: number, clientKey: string): Promise<{ id: number, runId: number } | undefined> {
  return trx('propagationEvents').where({ orgId, clientKey }).first('id', 'runId')
}

export async function insertEvent(trx: Knex.Transaction, row: Record<string, unknown>): Promise<number> {
  const [id] = await trx('propagationEvents').insert({ ...row, grades: row.grades ? JSON.stringify(row.grades) : null })
  return id!
}

/** The organisation's own budwood lot, with the variety it was cut from. */
export function findBudwoodLot(trx: Knex.Transaction, orgId: number, id: number) {
  return trx('budwoodLots as b').join('varieties as v', 'v.id', 'b.varietyId').where({ 'b.id': id, 'b.orgId': orgId })
    .first('b.id', 'b.label', 'b.varietyId', 'v.name as varietyName') as Promise<{ id: number, label: string, varietyId: number, varietyName: string } | undefined>
}

/** The trees dug from the runs that serve a contract, all grades: what the nursery has to deliver. */
export async function dugForContract(db: Db, nurseryOrgId: number, contractId: number): Promise<number> {
  const rows = await db('propagationEvents as e').join('nurseryRuns as n', 'n.id', 'e.runId')
    .where({ 'n.orgId': nurseryOrgId, 'n.treeContractId': contractId, 'e.kind': 'dug' })
    .select('e.grades') as { grades: string | DugGrade[] | null }[]
  return rows.reduce((sum, { grades }) => {
    const list = typeof grades === 'string' ? JSON.parse(grades) as DugGrade[] : grades ?? []
    return sum + list.reduce((s, g) => s + g.count, 0)
  }, 0)
}
