import type { Knex } from 'knex'
import type { BlendLotListQuery } from '#shared/schemas/blend'
import type { BlendCandidateLot, BlendTarget } from '#shared/types/blend'
import type { FruitPriceTerms } from '#shared/utils/settlement'
import { pageWithTotal, type Db } from '../utils/db'
import { containsPattern } from './catalogue'
import { coversLot, visibleTo as lotVisibleTo } from './lots'

// Scoped queries for the blend planner: the lots a maker may blend, with their free kilograms and
// the fruit contract each is bought under, and the maker's saved targets. Every query names the
// maker, so another tenant's lot or target is simply not there.

/** The contract states under which a maker buys a lot's fruit (as lots.ts shows them). */
const BUYING_STATES = ['accepted', 'fulfilled']

/** A lot as the planner reads it: the list's fields less the reading and price, with its contract's terms. */
export type BlendLotRow = Omit<BlendCandidateLot, 'state' | 'reading' | 'pricePerTonne' | 'rejected' | 'rejectReason' | 'juiceYieldLPerTonne'> & {
  state: 'available' | 'delivered' | 'pressed'
  terms: FruitPriceTerms
}

/**
 * Free kilograms of a lot to the maker, the one rule the lot list, the solver and the plans' commit
 * all read: what was weighed in at its press (its deliveries of the lot), and, while the lot is still
 * available at the grower, what the grower has not yet delivered to anyone; less what committed blend
 * plans hold of it (anyone's: the fruit is one), less what this maker has pressed of it.
 */
const FREE_KG = `(c.delivered_here_kg + CASE WHEN c.state = 'available' THEN GREATEST(0, c.net_kg - c.delivered_kg) ELSE 0 END - c.reserved_kg - c.pressed_kg)`

/**
 * The lots the maker may see (lots.ts's rule), each with the contract it is bought under: the one it
 * was delivered under when it was delivered to this maker, else the lowest-numbered accepted or
 * fulfilled contract of the maker's that covers it. `narrow` filters the lots (`l`, joined to their
 * variety `v`) inside, so the per-lot sums are worked for the lots asked for only.
 */
function blendLotsOf(db: Db, makerOrgId: number, narrow: (lots: Knex.QueryBuilder) => void) {
  const lots = db('harvestLots as l')
    .join('varieties as v', 'v.id', 'l.varietyId')
    .join('organisations as o', 'o.id', 'l.orgId')
    .select(
      'l.id as lotId', 'l.code', 'l.orgId as growerId', 'o.name as growerName', 'l.varietyId', 'v.name as varietyName', 'v.species',
      'v.juiceClass', 'l.state', 'l.harvestYear', 'l.netKg',
      db.raw('(SELECT COALESCE(SUM(d.net_kg), 0) FROM deliveries d WHERE d.lot_id = l.id AND d.maker_org_id = ?) AS delivered_here_kg', [makerOrgId]),
      db.raw('(SELECT COALESCE(SUM(d.net_kg), 0) FROM deliveries d WHERE d.lot_id = l.id) AS delivered_kg'),
      db.raw(`(SELECT COALESCE(SUM(r.kg), 0) FROM blend_plan_lots r JOIN blend_plans p ON p.id = r.plan_id WHERE r.lot_id = l.id AND p.state = 'committed') AS reserved_kg`),
      db.raw('(SELECT COALESCE(SUM(pl.kg), 0) FROM pressing_lots pl JOIN pressings ps ON ps.id = pl.pressing_id WHERE pl.lot_id = l.id AND ps.org_id = ?) AS pressed_kg', [makerOrgId]),
      db.raw('COALESCE((SELECT MIN(d.fruit_contract_id) FROM deliveries d WHERE d.lot_id = l.id AND d.maker_org_id = ?), (?)) AS contract_id', [
        makerOrgId,
        coversLot(db('fruitContracts as fc').where('fc.makerOrgId', makerOrgId).whereIn('fc.state', BUYING_STATES)).min('fc.id'),
      ]),
    )
  lotVisibleTo(lots, makerOrgId)
  narrow(lots)
  return db.from(lots.as('c')).join('fruitContracts as k', 'k.id', 'c.contractId')
}

const COLUMNS = [
  'c.lotId', 'c.code', 'c.growerId', 'c.growerName', 'c.varietyId', 'c.varietyName', 'c.species', 'c.juiceClass', 'c.state', 'c.harvestYear',
  'c.contractId', 'k.currency', 'k.basePricePerTonneMinor', 'k.baselineBrix', 'k.bonusPerBrixPerTonneMinor', 'k.deductionPerBrixPerTonneMinor',
  'k.rejectFloorBrix',
]

type Selected = Omit<BlendLotRow, 'terms'> & Omit<FruitPriceTerms, 'maxRotPct' | 'maxDamagePct'>

function toRow({ basePricePerTonneMinor, baselineBrix, bonusPerBrixPerTonneMinor, deductionPerBrixPerTonneMinor, rejectFloorBrix, ...row }: Selected): BlendLotRow {
  return { ...row, freeKg: Number(row.freeKg), terms: { basePricePerTonneMinor, baselineBrix, bonusPerBrixPerTonneMinor, deductionPerBrixPerTonneMinor, rejectFloorBrix } }
}

/** The list's lots: not pressed, something free, and the filters asked. */
function filtered(db: Db, makerOrgId: number, query: BlendLotListQuery): Knex.QueryBuilder {
  const q = blendLotsOf(db, makerOrgId, (lots) => {
    lots.whereNot('l.state', 'pressed')
    if (query.juiceClass) lots.andWhere('v.juiceClass', query.juiceClass)
    if (query.varietyId) lots.andWhere('l.varietyId', query.varietyId)
    if (query.growerId) lots.andWhere('l.orgId', query.growerId)
    if (query.state) lots.andWhere('l.state', query.state)
    if (query.q) lots.andWhereILike('l.code', containsPattern(query.q))
  })
  q.whereRaw(`${FREE_KG} > 0`)
  if (query.minFreeKg !== undefined) q.andWhereRaw(`${FREE_KG} >= ?`, [query.minFreeKg])
  return q
}

/** The lots the maker may blend now (not pressed, something free), by grower and code. */
export async function listBlendLotRows(db: Db, makerOrgId: number, query: BlendLotListQuery): Promise<{ rows: BlendLotRow[], total: number }> {
  const rows = filtered(db, makerOrgId, query).select([...COLUMNS, db.raw(`${FREE_KG} AS free_kg`)])
    .orderBy([{ column: 'c.growerName' }, { column: 'c.code' }, { column: 'c.lotId' }])
  const page = await pageWithTotal<Selected>(db, rows, () => filtered(db, makerOrgId, query), query)
  return { rows: page.rows.map(toRow), total: page.total }
}

/** Of `lotIds`, the lots the maker may see, pressed or not, whatever is free of them (as committed: lock the lots first to hold it). */
export async function blendLotRowsByIds(db: Db, makerOrgId: number, lotIds: number[]): Promise<BlendLotRow[]> {
  if (!lotIds.length) return []
  const rows = await blendLotsOf(db, makerOrgId, lots => lots.whereIn('l.id', lotIds)).select([...COLUMNS, db.raw(`${FREE_KG} AS free_kg`)]) as Selected[]
  return rows.map(toRow)
}

/** The maker's currency and press yield, as its settings stand. */
export function makerSettings(db: Db, orgId: number): Promise<{ currency: string, defaultJuiceYieldLPerT: number | null } | undefined> {
  return db('organisations').where({ id: orgId }).first('currency', 'defaultJuiceYieldLPerT')
}

// ----- Saved targets -----

const TARGET_COLUMNS = [
  'id', 'name', 'brixMin', 'brixMax', 'sgMin', 'sgMax', 'taMinGPerL', 'taMaxGPerL', 'tanninMinGPerL', 'tanninMaxGPerL', 'volumeL',
  'phNote', 'notes', 'createdAt', 'updatedAt',
]

/** The table's columns of each property's range. */
export const RANGE_COLUMNS = {
  brix: ['brixMin', 'brixMax'],
  sg: ['sgMin', 'sgMax'],
  taGPerL: ['taMinGPerL', 'taMaxGPerL'],
  tanninGPerL: ['tanninMinGPerL', 'tanninMaxGPerL'],
} as const

export type BlendTargetRow = Omit<BlendTarget, 'ranges' | 'createdAt' | 'updatedAt'> & Record<typeof RANGE_COLUMNS[keyof typeof RANGE_COLUMNS][number], number | null> & {
  createdAt: Date
  updatedAt: Date
}

function targetsOf(db: Db, orgId: number) {
  return db('blendTargets').where({ orgId })
}

export async function listTargetRows(db: Db, orgId: number, query: { limit: number, offset: number, q?: string }): Promise<{ rows: BlendTargetRow[], total: number }> {
  const search = (q: Knex.QueryBuilder) => (query.q ? q.andWhereILike('name', containsPattern(query.q)) : q)
  const rows = search(targetsOf(db, orgId)).select(TARGET_COLUMNS).orderBy([{ column: 'name' }, { column: 'id' }])
  return pageWithTotal<BlendTargetRow>(db, rows, () => search(targetsOf(db, orgId)), query)
}

export function findTargetRow(db: Db, orgId: number, id: number): Promise<BlendTargetRow | undefined> {
  return targetsOf(db, orgId).andWhere({ id }).first(TARGET_COLUMNS)
}

/** The organisation's target, locked until the transaction ends. */
export function lockTarget(trx: Knex.Transaction, orgId: number, id: number): Promise<{ id: number, name: string } | undefined> {
  return targetsOf(trx, orgId).andWhere({ id }).forUpdate().first('id', 'name')
}

export function targetNameTaken(db: Db, orgId: number, name: string, exceptId?: number): Promise<{ id: number } | undefined> {
  const q = targetsOf(db, orgId).andWhere({ name })
  if (exceptId) q.whereNot('id', exceptId)
  return q.first('id')
}

export async function insertTarget(trx: Knex.Transaction, row: Record<string, unknown>): Promise<number> {
  const [id] = await trx('blendTargets').insert(row)
  return id!
}

export async function updateTargetRow(trx: Knex.Transaction, orgId: number, id: number, changes: Record<string, unknown>): Promise<void> {
  await targetsOf(trx, orgId).andWhere({ id }).update({ ...changes, updatedAt: trx.fn.now(3) })
}

export async function deleteTargetRow(trx: Knex.Transaction, orgId: number, id: number): Promise<void> {
  await targetsOf(trx, orgId).andWhere({ id }).delete()
}
