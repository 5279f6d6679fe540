import type { Knex } from 'knex'
import { treeTermsFields, type TreeContractListQuery, type TreeTerms } from '#shared/schemas/contract'
import type { TreeContractSide, TreeContractState } from '#shared/utils/contractStatus'
import type { Hemisphere } from '#shared/utils/hemisphere'
import type { Db } from '../utils/db'
import { TREE_PARTIES, visibleTo } from './contracts'

// Scoped queries for tree contracts (buyer ↔ nursery): every read goes through `visibleTo`.

/** The terms' columns: the schema's fields, so a new term needs naming once. */
export const TREE_TERM_KEYS = Object.keys(treeTermsFields) as (keyof TreeTerms)[]

export interface TreeContractRow extends TreeTerms {
  id: number
  buyerOrgId: number
  nurseryOrgId: number
  draftedBy: TreeContractSide
  lastOfferBy: TreeContractSide | null
  cancelledBy: TreeContractSide | null
  state: TreeContractState
  version: number
  acceptedVersion: number | null
  expiryNoticedVersion: number | null
  shortfallNoticedTrees: number | null
  deliveredCount: number | null
  deliveredOn: string | null
  createdByUserId: number | null
  createdAt: Date
  updatedAt: Date
  buyerOrgName: string
  nurseryOrgName: string
  varietyName: string
  varietySpecies: 'apple' | 'pear'
  rootstockDesignation: string
  rootstockNeedsSupport: boolean
  /** Where the nursery grows: its back-plan's dates fall in that hemisphere's season. */
  nurseryHemisphere: Hemisphere
}

function selectJoined(db: Db) {
  return db('treeContracts as c')
    .join('organisations as ob', 'ob.id', 'c.buyerOrgId')
    .join('organisations as on', 'on.id', 'c.nurseryOrgId')
    .join('varieties as v', 'v.id', 'c.varietyId')
    .join('rootstocks as r', 'r.id', 'c.rootstockId')
    .select('c.*', 'ob.name as buyerOrgName', 'on.name as nurseryOrgName', 'v.name as varietyName', 'v.species as varietySpecies', 'r.designation as rootstockDesignation', 'r.needsSupport as rootstockNeedsSupport', 'on.hemisphere as nurseryHemisphere')
}

export function findTreeContract(db: Db, orgId: number, id: number): Promise<TreeContractRow | undefined> {
  return visibleTo(selectJoined(db).where('c.id', id), TREE_PARTIES, orgId).first()
}

function filtered(q: Knex.QueryBuilder, orgId: number, query: TreeContractListQuery): Knex.QueryBuilder {
  visibleTo(q, TREE_PARTIES, orgId)
  if (query.state) q.andWhere('c.state', query.state)
  if (query.year) q.andWhere('c.deliveryYear', query.year)
  if (query.counterpartyId) q.andWhere(w => w.where('c.buyerOrgId', query.counterpartyId!).orWhere('c.nurseryOrgId', query.counterpartyId!))
  return q
}

export async function listTreeContracts(db: Db, orgId: number, query: TreeContractListQuery): Promise<{ rows: TreeContractRow[], total: number }> {
  const rows = await filtered(selectJoined(db), orgId, query).select(db.raw('COUNT(*) OVER () AS list_total'))
    .orderBy([{ column: 'c.updatedAt', order: 'desc' }, { column: 'c.id', order: 'desc' }]).limit(query.limit).offset(query.offset) as (TreeContractRow & { listTotal: number })[]
  if (rows.length || query.offset === 0) return { rows, total: rows[0]?.listTotal ?? 0 }
  // A page past the end counts apart.
  const [{ total }] = await filtered(db('treeContracts as c'), orgId, query).count({ total: '*' }) as [{ total: number }]
  return { rows: [], total: Number(total) }
}

export async function insertTreeContract(trx: Knex.Transaction, row: Record<string, unknown>): Promise<number> {
  const [id] = await trx('treeContracts').insert(row)
  return id!
}
