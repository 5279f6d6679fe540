import type { Knex } from 'knex'
import type { DeliverySeason, TreeType } from '#shared/utils/backplan'
import type { ProgressRunInput } from '#shared/types/contractProgress'
import type { Milestone } from '#shared/utils/contractProgress'
import type { Db } from '../utils/db'

// Reads and writes of a tree contract's progress. The runs are always the nursery's own runs that
// serve this one contract, named by the nursery's organisation and the contract's id together, so
// the buyer's view can never reach another run of the nursery's. Who may see the contract at all
// is the contract repository's `findTreeContract`.

/** A run serving the contract, as far as the buyer is shown it. */
export type ContractRunRow = Omit<ProgressRunInput, 'events'>

export function contractRuns(db: Db, nurseryOrgId: number, contractId: number): Promise<ContractRunRow[]> {
  return db('nurseryRuns as n')
    .join('nurseryRows as w', 'w.id', 'n.rowId')
    .join('nurseryBeds as f', 'f.id', 'w.fieldId')
    .where({ 'n.orgId': nurseryOrgId, 'n.treeContractId': contractId })
    .orderBy('f.name').orderByRaw('natural_sort_key(w.name)').orderBy([{ column: 'n.fromPosition' }, { column: 'n.id' }])
    .select('n.id', 'w.name as rowName', 'f.name as fieldName', 'n.fromPosition', 'n.toPosition', 'n.linedOutOn', 'n.linedOutCount')
}

/** The contract a run of the nursery serves, as its notices need it. */
export interface ProgressContractRow {
  id: number
  buyerOrgId: number
  state: string
  treeCount: number
  takeRate: number
  survivalRate: number
  treeType: TreeType
  interstem: string | null
  deliveryYear: number
  deliverySeason: DeliverySeason
  deliveredCount: number | null
  deliveredOn: string | null
  shortfallNoticedTrees: number | null
  varietyName: string
  rootstockDesignation: string
  nurseryOrgName: string
}

/**
 * The contract the nursery's run serves, locked until the transaction ends, so two events on its
 * runs at once weigh the shortfall one after the other and never warn twice.
 */
export async function lockRunContract(trx: Knex.Transaction, nurseryOrgId: number, runId: number): Promise<ProgressContractRow | undefined> {
  const run = await trx('nurseryRuns').where({ id: runId, orgId: nurseryOrgId }).first('treeContractId') as { treeContractId: number | null } | undefined
  if (!run?.treeContractId) return undefined
  // The contract's own row alone is locked; the names beside it are read plainly.
  const locked = await trx('treeContracts').where({ id: run.treeContractId, nurseryOrgId }).forUpdate().first('id')
  if (!locked) return undefined
  return trx('treeContracts as c')
    .join('varieties as v', 'v.id', 'c.varietyId')
    .join('rootstocks as r', 'r.id', 'c.rootstockId')
    .join('organisations as o', 'o.id', 'c.nurseryOrgId')
    .where('c.id', run.treeContractId)
    .first('c.id', 'c.buyerOrgId', 'c.state', 'c.treeCount', 'c.takeRate', 'c.survivalRate', 'c.treeType', 'c.interstem', 'c.deliveryYear', 'c.deliverySeason',
      'c.deliveredCount', 'c.deliveredOn', 'c.shortfallNoticedTrees', 'v.name as varietyName', 'r.designation as rootstockDesignation', 'o.name as nurseryOrgName')
}

/** Records that the buyer is told of a milestone on a run; false when it was told before (the row is there). */
export async function insertMilestone(trx: Knex.Transaction, row: { treeContractId: number, milestone: Milestone, runId: number, reachedOn: string }): Promise<boolean> {
  const [id] = await trx('treeContractMilestones').insert(row).onConflict(['treeContractId', 'milestone', 'runId']).ignore()
  return Boolean(id)
}

export async function setShortfallNoticed(trx: Knex.Transaction, contractId: number, trees: number | null): Promise<void> {
  await trx('treeContracts').where({ id: contractId }).update({ shortfallNoticedTrees: trees })
}
