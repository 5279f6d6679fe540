import type { Knex } from 'knex'
import type { BudwoodCreateInput, BudwoodSuspectInput } from '#shared/schemas/nursery'
import type { BudwoodLot, ExposureEvent } from '#shared/types/nursery'
import type { WorkingEvent } from '#shared/utils/exposure'
import { useDb, type Db } from '../utils/db'

// Scoped queries for budwood lots: every one names the organisation, and the block a lot was cut
// from is joined only when it is the same organisation's.

const LOT_COLUMNS = [
  'w.id', 'w.label', 'w.varietyId', 'v.name as varietyName', 'w.cutOn', 'w.sourceKind', 'w.blockId', 'b.name as blockName',
  'w.sourceNote', 'w.supplier', 'w.certificate', 'w.sticks', 'w.notes',
  'w.suspectOn', 'w.suspectReason', 'u.name as suspectByName', 'w.suspectMarkedAt', 'w.suspectClearedAt', 'w.suspectClearedReason',
]

interface LotRow extends Omit<BudwoodLot, 'suspect'> {
  suspectOn: string | null
  suspectReason: string | null
  suspectByName: string | null
  suspectMarkedAt: Date | null
  suspectClearedAt: Date | null
  suspectClearedReason: string | null
}

const iso = (d: Date | string | null) => (d === null ? null : new Date(d).toISOString())

function toLot({ suspectOn, suspectReason, suspectByName, suspectMarkedAt, suspectClearedAt, suspectClearedReason, ...lot }: LotRow): BudwoodLot {
  const suspect = suspectOn === null
    ? null
    : { on: suspectOn, reason: suspectReason ?? '', byName: suspectByName, markedAt: iso(suspectMarkedAt)!, clearedAt: iso(suspectClearedAt), clearedReason: suspectClearedReason }
  return { ...lot, suspect }
}

function lotsOf(db: Db, orgId: number) {
  return db('budwoodLots as w')
    .join('varieties as v', 'v.id', 'w.varietyId')
    .leftJoin('orchardBlocks as b', q => q.on('b.id', 'w.blockId').andOn('b.orgId', 'w.orgId'))
    .leftJoin('users as u', 'u.id', 'w.suspectByUserId')
    .where('w.orgId', orgId)
}

/** The organisation's budwood, the latest cut first, with the count of all of it. */
export async function listBudwood(orgId: number, page: { limit: number, offset: number }): Promise<{ items: BudwoodLot[], total: number }> {
  const db = useDb()
  const rows = await lotsOf(db, orgId).select([...LOT_COLUMNS, db.raw('COUNT(*) OVER () AS list_total')])
    .orderBy([{ column: 'w.cutOn', order: 'desc' }, { column: 'w.id', order: 'desc' }]).limit(page.limit).offset(page.offset) as (LotRow & { listTotal: number })[]
  let total = rows[0]?.listTotal ?? 0
  if (!rows.length && page.offset > 0) {
    const [row] = await db('budwoodLots').where({ orgId }).count({ total: '*' }) as [{ total: number }]
    total = Number(row.total)
  }
  return { items: rows.map(({ listTotal: _t, ...lot }) => toLot(lot)), total }
}

export async function findBudwood(db: Db, orgId: number, id: number): Promise<BudwoodLot | undefined> {
  const row = await lotsOf(db, orgId).andWhere('w.id', id).first(LOT_COLUMNS) as LotRow | undefined
  return row && toLot(row)
}

/** The organisation's own orchard block and the variety it grows, or undefined (another tenant's block too). */
export function findOwnBlock(trx: Knex.Transaction, orgId: number, blockId: number): Promise<{ name: string, varietyId: number, varietyName: string } | undefined> {
  return trx('orchardBlocks as b').join('varieties as v', 'v.id', 'b.varietyId')
    .where({ 'b.id': blockId, 'b.orgId': orgId }).first('b.name', 'b.varietyId', 'v.name as varietyName')
}

export async function insertBudwood(trx: Knex.Transaction, orgId: number, input: BudwoodCreateInput): Promise<number> {
  const [id] = await trx('budwoodLots').insert({ orgId, ...input })
  return id!
}

// ----- Suspect lots and what they touched -----

/** The lot's suspect state, locked until the transaction ends: one marking or clearing at a time. */
export function lockBudwood(trx: Knex.Transaction, orgId: number, id: number) {
  return trx('budwoodLots').where({ id, orgId }).forUpdate().first('id', 'label', 'suspectOn', 'suspectClearedAt') as Promise<
    { id: number, label: string, suspectOn: string | null, suspectClearedAt: Date | null } | undefined
  >
}

/** Marks the lot suspect now; a lot cleared before is suspect again, its earlier marking kept in the audit trail. */
export async function markBudwoodSuspect(trx: Knex.Transaction, orgId: number, id: number, input: BudwoodSuspectInput, byUserId: number): Promise<void> {
  await trx('budwoodLots').where({ id, orgId }).update({
    suspectOn: input.suspectOn, suspectReason: input.reason, suspectByUserId: byUserId, suspectMarkedAt: trx.fn.now(3),
    suspectClearedAt: null, suspectClearedReason: null,
  })
}

export async function clearBudwoodSuspect(trx: Knex.Transaction, orgId: number, id: number, reason: string): Promise<void> {
  await trx('budwoodLots').where({ id, orgId }).update({ suspectClearedAt: trx.fn.now(3), suspectClearedReason: reason })
}

/** The organisation's lots that are suspect now (marked and not cleared). */
export function suspectLots(db: Db, orgId: number): Promise<{ id: number, label: string, suspectOn: string }[]> {
  return db('budwoodLots').where({ orgId }).whereNotNull('suspectOn').whereNull('suspectClearedAt').select('id', 'label', 'suspectOn')
}

/** Budding, grafting and interstem budding: the work that carries disease from one run to the next on the knife. */
export const WORKING_KINDS = ['budded', 'grafted', 'interstem-budded'] as const

export type WorkingEventRow = WorkingEvent & Omit<ExposureEvent, 'kind'> & { kind: ExposureEvent['kind'] }

/**
 * The organisation's working events on every day one of `lotIds` was worked: the events with the
 * lots and every other one those days, from which the exposure is worked out.
 */
export function workingEventsOnDaysOf(db: Db, orgId: number, lotIds: number[]): Promise<WorkingEventRow[]> {
  const days = db('propagationEvents').where({ orgId }).whereIn('budwoodLotId', lotIds).whereIn('kind', WORKING_KINDS).distinct('happenedOn')
  return db('propagationEvents as e')
    .leftJoin('budwoodLots as b', q => q.on('b.id', 'e.budwoodLotId').andOn('b.orgId', 'e.orgId'))
    .where('e.orgId', orgId).whereIn('e.kind', WORKING_KINDS).whereIn('e.happenedOn', days)
    .orderBy([{ column: 'e.happenedOn' }, { column: 'e.id' }])
    .select('e.id', 'e.runId', 'e.kind', 'e.happenedOn', 'e.byUserId', 'e.byName', 'e.dayOrder', 'e.count', 'e.budwoodLotId', 'b.label as budwoodLabel')
}

/** The buyers of the tree contracts the organisation is the nursery of, by contract. */
export function contractBuyers(db: Db, orgId: number, contractIds: number[]): Promise<{ id: number, buyerOrgId: number, buyerOrgName: string }[]> {
  if (!contractIds.length) return Promise.resolve([])
  return db('treeContracts as c').join('organisations as o', 'o.id', 'c.buyerOrgId')
    .where('c.nurseryOrgId', orgId).whereIn('c.id', contractIds).orderBy('c.id').select('c.id', 'c.buyerOrgId', 'o.name as buyerOrgName')
}
