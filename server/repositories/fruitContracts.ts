import type { Knex } from 'knex'
import { fruitTermsFields, type FruitContractListQuery, type FruitTerms, type ScheduleYearInput } from '#shared/schemas/contract'
import type { FruitContractSide, FruitContractState } from '#shared/utils/contractStatus'
import type { Db } from '../utils/db'
import { FRUIT_PARTIES, visibleTo } from './contracts'

// Scoped queries for fruit contracts (maker ↔ grower) and their yearly schedules.

/** The terms' columns: the schema's fields less the schedule, which has its own table. */
export const FRUIT_TERM_KEYS = (Object.keys(fruitTermsFields) as (keyof FruitTerms)[]).filter((k): k is Exclude<keyof FruitTerms, 'schedule'> => k !== 'schedule')

export interface FruitContractRow extends Omit<FruitTerms, 'schedule'> {
  id: number
  makerOrgId: number
  growerOrgId: number
  draftedBy: FruitContractSide
  lastOfferBy: FruitContractSide | null
  cancelledBy: FruitContractSide | null
  state: FruitContractState
  version: number
  acceptedVersion: number | null
  expiryNoticedVersion: number | null
  createdByUserId: number | null
  createdAt: Date
  updatedAt: Date
  makerOrgName: string
  growerOrgName: string
  varietyName: string | null
  varietySpecies: 'apple' | 'pear' | null
  varietyJuiceClass: string | null
}

function selectJoined(db: Db) {
  return db('fruitContracts as c')
    .join('organisations as om', 'om.id', 'c.makerOrgId')
    .join('organisations as og', 'og.id', 'c.growerOrgId')
    .leftJoin('varieties as v', 'v.id', 'c.varietyId')
    .select('c.*', 'om.name as makerOrgName', 'og.name as growerOrgName', 'v.name as varietyName', 'v.species as varietySpecies', 'v.juiceClass as varietyJuiceClass')
}

export function findFruitContract(db: Db, orgId: number, id: number): Promise<FruitContractRow | undefined> {
  return visibleTo(selectJoined(db).where('c.id', id), FRUIT_PARTIES, orgId).first()
}

function filtered(q: Knex.QueryBuilder, orgId: number, query: FruitContractListQuery): Knex.QueryBuilder {
  visibleTo(q, FRUIT_PARTIES, orgId)
  if (query.state) q.andWhere('c.state', query.state)
  if (query.year) q.whereExists(y => y.from('fruitContractYears as y').whereRaw('y.contract_id = c.id').andWhere('y.harvestYear', query.year!))
  if (query.counterpartyId) q.andWhere(w => w.where('c.makerOrgId', query.counterpartyId!).orWhere('c.growerOrgId', query.counterpartyId!))
  return q
}

export async function listFruitContracts(db: Db, orgId: number, query: FruitContractListQuery): Promise<{ rows: FruitContractRow[], total: number }> {
  const rows = await filtered(selectJoined(db), orgId, query).select(db.raw('COUNT(*) OVER () AS list_total'))
    .orderBy([{ column: 'c.updatedAt', order: 'desc' }, { column: 'c.id', order: 'desc' }]).limit(query.limit).offset(query.offset) as (FruitContractRow & { listTotal: number })[]
  if (rows.length || query.offset === 0) return { rows, total: rows[0]?.listTotal ?? 0 }
  const [{ total }] = await filtered(db('fruitContracts as c'), orgId, query).count({ total: '*' }) as [{ total: number }]
  return { rows: [], total: Number(total) }
}

/** The schedules of the given contracts, each by year. */
export async function schedulesOf(db: Db, ids: number[]): Promise<Map<number, ScheduleYearInput[]>> {
  const map = new Map<number, ScheduleYearInput[]>(ids.map(id => [id, []]))
  if (!ids.length) return map
  const rows = await db('fruitContractYears').whereIn('contractId', ids).orderBy(['contractId', 'harvestYear'])
    .select('contractId', 'harvestYear', 'tonnes', 'windowFrom', 'windowTo') as { contractId: number, harvestYear: number, tonnes: number, windowFrom: string, windowTo: string }[]
  for (const r of rows) map.get(r.contractId)!.push({ year: r.harvestYear, tonnes: r.tonnes, windowFrom: r.windowFrom, windowTo: r.windowTo })
  return map
}

export async function insertFruitContract(trx: Knex.Transaction, row: Record<string, unknown>): Promise<number> {
  const [id] = await trx('fruitContracts').insert(row)
  return id!
}

/** Replaces a contract's schedule with `schedule`. */
export async function writeSchedule(trx: Knex.Transaction, contractId: number, schedule: ScheduleYearInput[]): Promise<void> {
  await trx('fruitContractYears').where({ contractId }).delete()
  await trx('fruitContractYears').insert(schedule.map(y => ({ contractId, harvestYear: y.year, tonnes: y.tonnes, windowFrom: y.windowFrom, windowTo: y.windowTo })))
}

/** Accepted fruit contracts whose last delivery window closed before `today`. */
export function windowsClosed(db: Db, today: string, limit: number): Promise<{ id: number }[]> {
  return db('fruitContracts as c').where('c.state', 'accepted')
    .whereNotExists(y => y.from('fruitContractYears as y').whereRaw('y.contract_id = c.id').andWhere('y.windowTo', '>=', today))
    .orderBy('c.id').limit(limit).select('c.id')
}
