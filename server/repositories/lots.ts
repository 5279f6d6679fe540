import type { Knex } from 'knex'
import type { LotListQuery } from '#shared/schemas/lot'
import type { HarvestLot, JuiceReading } from '#shared/types/lot'
import type { NormalisedReading } from '#shared/utils/juiceReading'
import type { Db } from '../utils/db'

// Scoped queries for harvest lots and their juice readings. A lot is seen by its own organisation,
// and by a maker whose accepted fruit contract with the grower covers it (or covered it: a contract
// stays so once fulfilled, when its last delivery window has closed): one of the contract's
// schedule years is the lot's harvest year, and the contract is for the lot's variety or (a
// contract by class) for the variety's published class and species, and by a maker it was delivered
// to. Everything else is not there.

/** An accepted contract covers its lots; once its last window closes it is fulfilled and still does. */
const COVERING_STATES = ['accepted', 'fulfilled']

/**
 * Whether the fruit contract `fc` covers the lot `l` (joined to its variety `v`): the contract's
 * grower's lot, harvested in one of the contract's schedule years, of its variety or (a contract
 * by class) of the variety's published class and species. A condition on a subquery that starts
 * `from('fruitContracts as fc')`; deliveries ask it too, to take only the lots a contract covers.
 */
export function coversLot(q: Knex.QueryBuilder): Knex.QueryBuilder {
  return q.join('fruitContractYears as fy', 'fy.contractId', 'fc.id')
    .whereRaw('fc.grower_org_id = l.org_id')
    .whereRaw('fy.harvest_year = l.harvest_year')
    .where(m => m.whereRaw('fc.variety_id = l.variety_id')
      .orWhere(k => k.whereNull('fc.varietyId').whereRaw('fc.juice_class = v.juice_class').whereRaw('fc.species = v.species')))
}

/**
 * The visibility rule as a condition on `harvestLots as l` joined to `varieties as v`: correlated
 * subqueries over the maker's contracts joined to their schedule years, and over the deliveries
 * made to it (a lot delivered to a maker stays its to see, whatever becomes of the contract).
 */
export function visibleTo(q: Knex.QueryBuilder, orgId: number): Knex.QueryBuilder {
  return q.where(w => w.where('l.orgId', orgId)
    .orWhereExists(c => coversLot(c.from('fruitContracts as fc').where('fc.makerOrgId', orgId).whereIn('fc.state', COVERING_STATES)))
    .orWhereExists(d => d.from('deliveries as d').whereRaw('d.lot_id = l.id').where('d.makerOrgId', orgId)))
}

const LOT_COLUMNS = [
  'l.id', 'l.orgId', 'o.name as orgName', 'l.code', 'l.blockId', 'b.name as blockName', 'l.varietyId', 'v.name as varietyName',
  'v.species', 'v.juiceClass as varietyClass', 'l.pickedOn', 'l.harvestYear', 'l.netKg', 'l.bins', 'l.notes', 'l.state',
  'l.createdAt', 'l.updatedAt',
]

export type LotRow = Omit<HarvestLot, 'latestReading' | 'juiceClass'>
export type ReadingRow = Omit<JuiceReading, 'juiceClass'>

function lotsOf(db: Db, orgId: number) {
  return visibleTo(db('harvestLots as l')
    .join('varieties as v', 'v.id', 'l.varietyId')
    .join('organisations as o', 'o.id', 'l.orgId')
    .leftJoin('orchardBlocks as b', 'b.id', 'l.blockId'), orgId)
}

/** Of `lotIds`, those the organisation may see (its own, or covered by its accepted fruit contracts). */
export async function lotIdsVisibleTo(db: Db, orgId: number, lotIds: number[]): Promise<number[]> {
  if (!lotIds.length) return []
  const rows = await visibleTo(db('harvestLots as l').join('varieties as v', 'v.id', 'l.varietyId'), orgId)
    .whereIn('l.id', lotIds).select('l.id') as { id: number }[]
  return rows.map(r => r.id)
}

function filtered(q: Knex.QueryBuilder, query: LotListQuery): Knex.QueryBuilder {
  if (query.varietyId) q.andWhere('l.varietyId', query.varietyId)
  if (query.blockId) q.andWhere('l.blockId', query.blockId)
  // The variety's published class: the class a lot is traded by.
  if (query.juiceClass) q.andWhere('v.juiceClass', query.juiceClass)
  if (query.state) q.andWhere('l.state', query.state)
  if (query.harvestYear) q.andWhere('l.harvestYear', query.harvestYear)
  if (query.q) {
    const like = `%${query.q.replace(/[\\%_]/g, c => `\\${c}`)}%`
    q.andWhere(w => w.whereILike('l.code', like).orWhereILike('v.name', like).orWhereILike('b.name', like).orWhereILike('l.notes', like))
  }
  return q
}

export async function listLotRows(db: Db, orgId: number, query: LotListQuery): Promise<{ rows: LotRow[], total: number, netKg: number }> {
  const rows = await filtered(lotsOf(db, orgId), query)
    .select([...LOT_COLUMNS, db.raw('COUNT(*) OVER () AS list_total'), db.raw('SUM(l.net_kg) OVER () AS list_net_kg')])
    .orderBy([{ column: 'l.pickedOn', order: 'desc' }, { column: 'l.id', order: 'desc' }]).limit(query.limit).offset(query.offset) as (LotRow & { listTotal: number, listNetKg: number })[]
  const first = rows[0]
  if (first) return { rows: rows.map(({ listTotal: _t, listNetKg: _n, ...row }) => row), total: Number(first.listTotal), netKg: Number(first.listNetKg) }
  const [sums] = await filtered(lotsOf(db, orgId), query)
    .select(db.raw('COUNT(*) AS total'), db.raw('COALESCE(SUM(l.net_kg), 0) AS net_kg')) as { total: number, netKg: number }[]
  return { rows: [], total: Number(sums?.total ?? 0), netKg: Number(sums?.netKg ?? 0) }
}

export function findLotRow(db: Db, orgId: number, id: number): Promise<LotRow | undefined> {
  return lotsOf(db, orgId).andWhere('l.id', id).first(LOT_COLUMNS)
}

/** The organisation's own lot, locked until the transaction ends. */
export function lockOwnLot(trx: Knex.Transaction, orgId: number, id: number): Promise<{ id: number, code: string, blockId: number | null, varietyId: number } | undefined> {
  return trx('harvestLots').where({ id, orgId }).forUpdate().first('id', 'code', 'blockId', 'varietyId')
}

export function findOwnBlock(db: Db, orgId: number, blockId: number): Promise<{ id: number, name: string, varietyId: number, varietyName: string } | undefined> {
  return db('orchardBlocks as b').join('varieties as v', 'v.id', 'b.varietyId')
    .where({ 'b.id': blockId, 'b.orgId': orgId }).first('b.id', 'b.name', 'b.varietyId', 'v.name as varietyName')
}

export function findVariety(db: Db, id: number): Promise<{ id: number, name: string, species: 'apple' | 'pear' } | undefined> {
  return db('varieties').where({ id }).first('id', 'name', 'species')
}

export function codeTaken(db: Db, orgId: number, code: string, exceptId?: number): Promise<{ id: number } | undefined> {
  const q = db('harvestLots').where({ orgId, code })
  if (exceptId) q.whereNot('id', exceptId)
  return q.first('id')
}

export async function insertLot(trx: Knex.Transaction, row: Record<string, unknown>): Promise<number> {
  const [id] = await trx('harvestLots').insert(row)
  return id!
}

export async function updateLotRow(trx: Knex.Transaction, orgId: number, id: number, changes: Record<string, unknown>): Promise<void> {
  await trx('harvestLots').where({ id, orgId }).update({ ...changes, updatedAt: trx.fn.now(3) })
}

export async function deleteLotRow(trx: Knex.Transaction, orgId: number, id: number): Promise<void> {
  await trx('harvestLots').where({ id, orgId }).delete()
}

export async function countReadings(db: Db, lotId: number): Promise<number> {
  const [{ n }] = await db('juiceReadings').where({ lotId }).count({ n: '*' }) as [{ n: number }]
  return Number(n)
}

const READING_COLUMNS = [
  'id', 'lotId', 'labSheetId', 'sheetRow', 'sampledOn', 'brix', 'sg', 'sgAsRead', 'tempC', 'taGPerL', 'taReportedAs',
  'taReportedValue', 'taReportedUnit', 'ph', 'tanninGPerL', 'yanMgPerL', 'notes', 'createdAt',
]

/** A lot's readings, newest sample first. */
export async function listReadingRows(db: Db, lotId: number, page: { limit: number, offset: number }): Promise<{ rows: ReadingRow[], total: number }> {
  const rows = await db('juiceReadings').where({ lotId }).select([...READING_COLUMNS, db.raw('COUNT(*) OVER () AS list_total')])
    .orderBy([{ column: 'sampledOn', order: 'desc' }, { column: 'id', order: 'desc' }]).limit(page.limit).offset(page.offset) as (ReadingRow & { listTotal: number })[]
  const total = rows[0] ? Number(rows[0].listTotal) : await countReadings(db, lotId)
  return { rows: rows.map(({ listTotal: _t, ...r }) => r), total }
}

/** The newest reading of each lot (by day sampled, then entry). */
export async function latestReadingRows(db: Db, lotIds: number[]): Promise<Map<number, ReadingRow>> {
  const latest = new Map<number, ReadingRow>()
  if (!lotIds.length) return latest
  const ranked = db('juiceReadings').whereIn('lotId', lotIds)
    .select([...READING_COLUMNS, db.raw('ROW_NUMBER() OVER (PARTITION BY lot_id ORDER BY sampled_on DESC, id DESC) AS rn')])
  const rows = await db.from(ranked.as('r')).where('rn', 1).select(READING_COLUMNS) as ReadingRow[]
  for (const row of rows) latest.set(row.lotId, row)
  return latest
}

export function findReadingRow(db: Db, id: number): Promise<ReadingRow | undefined> {
  return db('juiceReadings').where({ id }).first(READING_COLUMNS)
}

export async function insertReading(trx: Knex.Transaction, row: NormalisedReading & { orgId: number, lotId: number, sampledOn: string, notes: string | null, enteredByUserId: number, labSheetId?: number | null, sheetRow?: number | null }): Promise<number> {
  const [id] = await trx('juiceReadings').insert(row)
  return id!
}

export async function calibrationOf(db: Db, orgId: number): Promise<number> {
  const row = await db('organisations').where({ id: orgId }).first('hydrometerCalibrationC') as { hydrometerCalibrationC: number } | undefined
  return row?.hydrometerCalibrationC ?? 20
}
