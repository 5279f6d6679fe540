import type { Knex } from 'knex'
import type { BlockCreateInput, BlockPatchInput } from '#shared/schemas/block'
import type { OrchardBlock } from '#shared/types/block'
import { treesPerHectare } from '#shared/utils/planting'
import type { RootstockBearing } from '../utils/bearingCurve'
import { useDb, type Db } from '../utils/db'

// Scoped queries for orchard blocks: every one names the organisation, so another tenant's block
// is simply not there. Transactions, checks and audit are the block service's.

const COLUMNS = [
  'b.id', 'b.name', 'b.varietyId', 'v.name as varietyName', 'v.species', 'v.juiceClass',
  'b.rootstockId', 'r.designation as rootstockDesignation', 'b.treeCount', 'b.yearPlanted', 'b.areaHa',
  'b.inRowM', 'b.betweenRowM', 'b.organicStatus', 'b.survivalRate', 'b.bearingPace', 'b.notes', 'b.createdAt', 'b.updatedAt',
  'r.yearsToFirstCrop', 'r.yearsToFirstCropLate', 'r.yearsToFullBearing', 'r.yieldPerTreeKg',
]

/** A block as selected: the API's fields less the computed density, and the rootstock's bearing figures. */
export type BlockRow = Omit<OrchardBlock, 'densityPerHa'> & Omit<RootstockBearing, 'designation'>

function blocksOf(db: Db, orgId: number) {
  return db('orchardBlocks as b')
    .join('varieties as v', 'v.id', 'b.varietyId')
    .join('rootstocks as r', 'r.id', 'b.rootstockId')
    .where('b.orgId', orgId)
}

/** The API's block: the row less the bearing figures, with the density its spacing gives. */
export function toBlock({ yearsToFirstCrop: _f, yearsToFirstCropLate: _l, yearsToFullBearing: _b, yieldPerTreeKg: _y, ...block }: BlockRow): OrchardBlock {
  return { ...block, densityPerHa: treesPerHectare(block.inRowM, block.betweenRowM) }
}

export async function listBlocks(orgId: number, page: { limit: number, offset: number }) {
  const db = useDb()
  // The count and totals over all the organisation's blocks ride on each row of the page (window
  // functions, taken before LIMIT), so the list is one query; a page past the end sums apart.
  const rows = await blocksOf(db, orgId)
    .select([...COLUMNS, db.raw('COUNT(*) OVER () AS list_total'), db.raw('SUM(b.tree_count) OVER () AS list_trees'), db.raw('SUM(b.area_ha) OVER () AS list_area_ha')])
    .orderBy([{ column: 'b.name' }, { column: 'b.id' }]).limit(page.limit).offset(page.offset) as (BlockRow & { listTotal: number, listTrees: number, listAreaHa: number })[]
  const first = rows[0]
  const sums = first
    ? { total: first.listTotal, trees: first.listTrees, areaHa: first.listAreaHa }
    : (await db('orchardBlocks').where({ orgId })
        .select(db.raw('COUNT(*) AS total'), db.raw('COALESCE(SUM(tree_count), 0) AS trees'), db.raw('COALESCE(SUM(area_ha), 0) AS area_ha')) as { total: number, trees: number, areaHa: number }[])[0]!
  const items = rows.map(({ listTotal: _t, listTrees: _n, listAreaHa: _a, ...row }) => toBlock(row))
  return { items, total: sums.total, totals: { trees: sums.trees, areaHa: sums.areaHa } }
}

export function findBlock(db: Db, orgId: number, id: number): Promise<BlockRow | undefined> {
  return blocksOf(db, orgId).andWhere('b.id', id).first(COLUMNS)
}

/** Every block of the organisation, by name. */
export function allBlocks(orgId: number): Promise<BlockRow[]> {
  return blocksOf(useDb(), orgId).select(COLUMNS).orderBy('b.name')
}

/** The block's own row, locked until the transaction ends, or undefined. */
export function lockBlock(trx: Knex.Transaction, orgId: number, id: number): Promise<{ name: string, varietyId: number, rootstockId: number } | undefined> {
  return trx('orchardBlocks').where({ id, orgId }).forUpdate().first('name', 'varietyId', 'rootstockId')
}

export async function insertBlock(trx: Knex.Transaction, orgId: number, input: BlockCreateInput): Promise<number> {
  const [id] = await trx('orchardBlocks').insert({ orgId, ...input })
  return id!
}

export async function updateBlockRow(trx: Knex.Transaction, orgId: number, id: number, patch: BlockPatchInput): Promise<void> {
  await trx('orchardBlocks').where({ id, orgId }).update({ ...patch, updatedAt: trx.fn.now(3) })
}

export async function deleteBlockRow(trx: Knex.Transaction, orgId: number, id: number): Promise<void> {
  await trx('orchardBlocks').where({ id, orgId }).delete()
}
