import type { Knex } from 'knex'
import type { ContractHistoryEntry } from '#shared/types/contract'
import type { ContractKind } from '#shared/utils/contractStatus'
import { fromJson, type Db } from '../utils/db'

// Scoped queries for both kinds of contract. A contract is visible to exactly its two parties,
// and a draft only to the side drafting it: every query here goes through `visibleTo`, so another
// organisation's contract, or the other side's draft, is simply not there.

export interface ContractParties<Side extends string = string> {
  kind: ContractKind
  table: 'treeContracts' | 'fruitContracts'
  /** The two sides, each with the column naming its organisation. */
  sides: readonly [{ side: Side, column: string }, { side: Side, column: string }]
}

export const TREE_PARTIES: ContractParties<'buyer' | 'nursery'> = {
  kind: 'tree',
  table: 'treeContracts',
  sides: [{ side: 'buyer', column: 'buyerOrgId' }, { side: 'nursery', column: 'nurseryOrgId' }],
}

export const FRUIT_PARTIES: ContractParties<'maker' | 'grower'> = {
  kind: 'fruit',
  table: 'fruitContracts',
  sides: [{ side: 'maker', column: 'makerOrgId' }, { side: 'grower', column: 'growerOrgId' }],
}

/** Narrows a query on `alias` to the contracts the organisation may see. */
export function visibleTo(query: Knex.QueryBuilder, parties: ContractParties, orgId: number, alias = 'c'): Knex.QueryBuilder {
  return query.where(q => parties.sides.forEach(({ side, column }) => {
    q.orWhere(own => own.where(`${alias}.${column}`, orgId)
      .andWhere(shown => shown.whereNot(`${alias}.state`, 'draft').orWhere(`${alias}.draftedBy`, side)))
  }))
}

/** The contract's row, locked until the transaction ends, if the organisation may see it. */
export function lockContractRow<Row>(trx: Knex.Transaction, parties: ContractParties, orgId: number, id: number): Promise<Row | undefined> {
  return visibleTo(trx(`${parties.table} as c`).where('c.id', id), parties, orgId).forUpdate().first('c.*') as unknown as Promise<Row | undefined>
}

export interface NewContractEvent {
  contractKind: ContractKind
  contractId: number
  action: string
  version: number
  byUserId: number | null
  byOrgId: number | null
  byName: string
  changes: { field: string, from: unknown, to: unknown }[]
  terms?: Record<string, unknown> | null
  reason?: string | null
}

export async function insertContractEvent(trx: Knex.Transaction, event: NewContractEvent): Promise<void> {
  const { terms, changes, reason, ...rest } = event
  await trx('contractEvents').insert({ ...rest, changes: JSON.stringify(changes), terms: terms ? JSON.stringify(terms) : null, reason: reason ?? null })
}

interface EventRow {
  id: number
  action: string
  version: number
  byUserId: number | null
  byOrgId: number | null
  byName: string
  at: Date
  changes: string | ContractHistoryEntry['changes']
  reason: string | null
}

function toEntry(row: EventRow): ContractHistoryEntry {
  return {
    id: row.id,
    action: row.action,
    version: row.version,
    byUserId: row.byUserId,
    byOrgId: row.byOrgId,
    byName: row.byName,
    at: new Date(row.at).toISOString(),
    changes: fromJson(row.changes),
    reason: row.reason,
  }
}

/**
 * The contract's history, oldest first. The caller has checked the contract is visible; `fromVersion`
 * 1 leaves out the draft's own entries (the other side never saw the draft).
 */
export async function listContractEvents(db: Db, kind: ContractKind, contractId: number, page: { limit: number, offset: number }, fromVersion = 0) {
  const scope = () => db('contractEvents').where({ contractKind: kind, contractId }).andWhere('version', '>=', fromVersion)
  const rows = await scope()
    .select('id', 'action', 'version', 'byUserId', 'byOrgId', 'byName', 'at', 'changes', 'reason', db.raw('COUNT(*) OVER () AS list_total'))
    .orderBy('id').limit(page.limit).offset(page.offset) as (EventRow & { listTotal: number })[]
  const total = rows[0]?.listTotal ?? ((await scope().count({ total: '*' })) as { total: number }[])[0]!.total
  return { items: rows.map(toEntry), total: Number(total) }
}

/** The whole terms of a version, as the offer or counter that made it recorded them. */
export async function versionTerms(db: Db, kind: ContractKind, contractId: number, version: number): Promise<Record<string, unknown> | null> {
  const row = await db('contractEvents').where({ contractKind: kind, contractId, version }).whereIn('action', ['offered', 'countered'])
    .orderBy('id', 'desc').first('terms') as { terms: string | Record<string, unknown> | null } | undefined
  return row?.terms ? fromJson(row.terms) : null
}

/** An organisation by id, with what a contract party needs to know of it. */
export function findParty(db: Db, id: number): Promise<{ id: number, name: string, kind: 'grower' | 'maker', isNursery: boolean, status: string, currency: string, hemisphere: 'north' | 'south' } | undefined> {
  return db('organisations').where({ id }).first('id', 'name', 'kind', 'isNursery', 'status', 'currency', 'hemisphere')
}

/** Owners and members of an organisation (viewers only read): told of every move the other side makes. */
export async function writerIds(trx: Knex.Transaction, orgId: number): Promise<number[]> {
  const rows = await trx('users').where({ orgId, active: true }).whereIn('role', ['owner', 'member']).select('id') as { id: number }[]
  return rows.map(r => r.id)
}

/** Offers whose last day has passed and whose expiry nobody has been told of yet. */
export function expiredUntold(db: Db, table: ContractParties['table'], today: string, limit: number): Promise<{ id: number, version: number }[]> {
  return db(table).whereIn('state', ['offered', 'countered']).where('expiresOn', '<', today)
    .where(q => q.whereNull('expiryNoticedVersion').orWhereRaw('expiry_noticed_version <> version'))
    .orderBy('id').limit(limit).select('id', 'version')
}
