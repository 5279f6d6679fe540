import type { TaskContractInput, TaskRunInput } from '#shared/utils/nurseryTasks'
import { TASK_CONTRACT_STATES } from '#shared/utils/nurseryTasks'
import type { Db } from '../utils/db'

// Scoped queries for the season calendar: the tree contracts the organisation is the nursery of
// (in the states it grows trees for) and its own runs that serve them. A buyer's side of a
// contract never shows here, nor another nursery's runs.

type ContractRow = Omit<TaskContractInput, 'interstem'> & { interstem: boolean | number }

export async function nurseryContracts(db: Db, orgId: number, treeContractId?: number): Promise<TaskContractInput[]> {
  const rows = await db('treeContracts as c')
    .join('organisations as ob', 'ob.id', 'c.buyerOrgId')
    .join('varieties as v', 'v.id', 'c.varietyId')
    .join('rootstocks as r', 'r.id', 'c.rootstockId')
    .where('c.nurseryOrgId', orgId)
    .whereIn('c.state', TASK_CONTRACT_STATES)
    .modify((q) => {
      if (treeContractId) q.andWhere('c.id', treeContractId)
    })
    .orderBy('c.id')
    .select('c.id', 'c.state', 'ob.name as buyerOrgName', 'v.name as varietyName', 'r.designation as rootstockDesignation', 'c.treeCount',
      'c.takeRate', 'c.survivalRate', 'c.deliveryYear', 'c.deliverySeason', 'c.treeType', 'c.interstem', 'c.deliveredOn') as ContractRow[]
  return rows.map(row => ({ ...row, interstem: Boolean(row.interstem) }))
}

export type TaskRunRow = Omit<TaskRunInput, 'events' | 'rootstockNeedsSupport'> & { rootstockNeedsSupport: boolean | number }

/** The organisation's runs that serve any of the contracts, with what their tasks are named by. */
export async function runsServing(db: Db, orgId: number, contractIds: number[]): Promise<TaskRunRow[]> {
  if (!contractIds.length) return []
  return await db('nurseryRuns as n')
    .join('nurseryRows as w', 'w.id', 'n.rowId')
    .join('nurseryBeds as f', 'f.id', 'w.fieldId')
    .join('rootstocks as r', 'r.id', 'n.rootstockId')
    .join('varieties as v', 'v.id', 'n.varietyId')
    .where('n.orgId', orgId)
    .whereIn('n.treeContractId', contractIds)
    .orderBy('n.id')
    .select('n.id', 'n.treeContractId', 'w.name as rowName', 'f.name as fieldName', 'n.fromPosition', 'n.toPosition', 'r.designation as rootstockDesignation',
      'r.needsSupport as rootstockNeedsSupport', 'n.interstem', 'v.name as varietyName', 'n.linedOutOn', 'n.linedOutCount') as TaskRunRow[]
}
