import type { TaskListQuery } from '#shared/schemas/nurseryTasks'
import type { NurseryTaskList } from '#shared/types/nurseryTasks'
import { filterTasks, nurseryTasks } from '#shared/utils/nurseryTasks'
import { organisationHemisphere } from '../repositories/coverage'
import { eventsOfRuns } from '../repositories/nurseryRuns'
import { nurseryContracts, runsServing } from '../repositories/nurseryTasks'
import { useDb } from '../utils/db'
import { today } from './contracts'

// The season calendar: worked out on every read from the contracts, their runs' events and the
// nursery's hemisphere (shared/utils/nurseryTasks.ts); nothing is stored, so a task is done the
// moment its event is recorded. A nursery has tens of contracts and hundreds of runs, so the
// whole calendar is worked out and then filtered and paged.
export async function listNurseryTasks(orgId: number, query: TaskListQuery): Promise<NurseryTaskList> {
  const db = useDb()
  const [contracts, hemisphere] = await Promise.all([nurseryContracts(db, orgId, query.treeContractId), organisationHemisphere(db, orgId)])
  const runs = await runsServing(db, orgId, contracts.map(c => c.id))
  const events = await eventsOfRuns(db, orgId, runs.map(r => r.id))
  const byRun = new Map<number, typeof events>()
  for (const e of events) byRun.set(e.runId, [...byRun.get(e.runId) ?? [], e])
  const tasks = nurseryTasks({
    contracts,
    runs: runs.map(run => ({ ...run, rootstockNeedsSupport: Boolean(run.rootstockNeedsSupport), events: byRun.get(run.id) ?? [] })),
    hemisphere,
    today: today(),
  })
  const matching = filterTasks(tasks, query)
  return { items: matching.slice(query.offset, query.offset + query.limit), total: matching.length }
}
