import type { Knex } from 'knex'
import type { ContractProgress, ProgressEvent, ProgressRunInput } from '#shared/types/contractProgress'
import type { PropagationEvent } from '#shared/types/nursery'
import { backPlanSteps } from '#shared/utils/backplan'
import { contractDate } from '#shared/utils/contractDisplay'
import { contractProgress, milestoneOf, shortfallNotice, type Milestone } from '#shared/utils/contractProgress'
import { runCounts } from '#shared/utils/runCounts'
import { eventsOfRuns } from '../repositories/nurseryRuns'
import { contractRuns, insertMilestone, lockRunContract, setShortfallNoticed, type ContractRunRow, type ProgressContractRow } from '../repositories/treeContractProgress'
import { findTreeContract } from '../repositories/treeContracts'
import { useDb, type Db } from '../utils/db'
import { notFound } from '../utils/validation'
import { tellParty, today, type Member } from './contracts'

// How a tree contract's trees are coming on, for both parties: the counts of the runs that serve
// it, summed (shared/utils/contractProgress.ts). And the buyer's notices as the nursery records
// its work: each milestone once per run, and a warning when fewer trees are expected than
// contracted, written in the transaction of the event that caused them.

/** States in which a contract's runs are being grown. */
const GROWING = ['accepted', 'propagating', 'ready']

type ContractTerms = Pick<ProgressContractRow, 'treeCount' | 'takeRate' | 'survivalRate' | 'state' | 'deliveredCount' | 'deliveredOn' | 'treeType' | 'interstem' | 'deliveryYear' | 'deliverySeason'>

const stepsOf = (c: ContractTerms) => backPlanSteps(c.deliveryYear, c.deliverySeason, { treeType: c.treeType, interstem: Boolean(c.interstem) })

function withEvents(runs: ContractRunRow[], events: PropagationEvent[]): ProgressRunInput[] {
  return runs.map(run => ({ ...run, events: events.filter(e => e.runId === run.id) }))
}

async function progressOf(db: Db, nurseryOrgId: number, contract: ContractTerms & { id: number }): Promise<{ progress: ContractProgress, runs: ProgressRunInput[] }> {
  const rows = await contractRuns(db, nurseryOrgId, contract.id)
  const runs = withEvents(rows, await eventsOfRuns(db, nurseryOrgId, rows.map(r => r.id)))
  const progress = contractProgress({ ...contract, deliveredOn: contract.deliveredOn?.slice(0, 10) ?? null, steps: stepsOf(contract) }, runs, today())
  return { progress, runs }
}

/** The progress of a contract the caller is a party to (404 otherwise): only this contract's runs are read. */
export async function getTreeContractProgress(user: Member, id: number): Promise<ContractProgress> {
  const db = useDb()
  const contract = await findTreeContract(db, user.orgId, id)
  if (!contract) notFound('That tree contract')
  return (await progressOf(db, contract.nurseryOrgId, contract)).progress
}

// ----- Notices to the buyer -----

const n = (value: number) => value.toLocaleString('en-GB')

function expectedLine(progress: ContractProgress): string {
  const { trees, contracted, shortfall } = progress.expected
  const short = shortfall > 0 ? `, ${n(shortfall)} fewer than the ${n(contracted)} contracted` : ` for the ${n(contracted)} contracted`
  return `The nursery now expects ${n(trees)} finished trees${short}.`
}

function placeOf(run: ProgressRunInput): string {
  const positions = run.fromPosition === run.toPosition ? `position ${run.fromPosition}` : `positions ${run.fromPosition}–${run.toPosition}`
  return `row ${run.rowName} of ${run.fieldName}, ${positions}`
}

/** What happened, in one sentence after the nursery's name, and what it means for the contract. */
function milestoneWords(milestone: Milestone, event: ProgressEvent, run: ProgressRunInput, progress: ContractProgress, trees: string): { what: string, more: string } {
  const on = contractDate(event.happenedOn)
  const counts = progress.runs.find(r => r.id === run.id)!.counts
  switch (milestone) {
    case 'budded': {
      const verb = event.kind === 'grafted' ? 'grafted' : 'budded'
      return { what: `${verb} ${n(event.count ?? 0)} of your ${trees}`, more: `on ${on}, in ${placeOf(run)}. ${n(progress.stages.worked.count)} are ${verb} so far for your contract.` }
    }
    case 'take-counted': {
      const rate = counts.takeRate === null ? '' : ` (${(counts.takeRate * 100).toFixed(1)} %)`
      return { what: `counted the take of your ${trees}`, more: `on ${on}, in ${placeOf(run)}: ${n(event.count ?? 0)} of ${n(counts.worked)} took${rate}.` }
    }
    case 'headed-back': {
      // What stood that day, even when the entry is made later.
      const upTo = run.events.filter(e => e.happenedOn < event.happenedOn || (e.happenedOn === event.happenedOn && e.id <= event.id))
      return { what: `headed back ${n(runCounts(run.linedOutCount, upTo).standing)} of your ${trees}`, more: `on ${on}, above the bud, in ${placeOf(run)}.` }
    }
    case 'dug': {
      const dug = (event.grades ?? []).reduce((s, g) => s + g.count, 0)
      const grades = (event.grades ?? []).map(g => `${n(g.count)} at ${g.caliperMm} mm${g.heightCm ? `, ${g.heightCm} cm` : ''}${g.feathered ? ', feathered' : ''}`).join('; ')
      return { what: `dug ${n(dug)} of your ${trees}`, more: `on ${on}, in ${placeOf(run)} (${grades}). ${n(counts.standing)} still stand in that run.` }
    }
  }
}

const EVENT_WORDS: Record<string, string> = {
  'budded': 'the budding', 'grafted': 'the grafting', 'take-counted': 'the take count', 'loss': 'a loss', 'dug': 'a dig', 'headed-back': 'the heading back',
}

/**
 * After the nursery records `eventId` on its run, inside that transaction: tells the buyer of a
 * milestone reached on the run (once per contract, milestone and run) and warns it when the trees
 * expected over all the contract's runs fall below the contracted number (shortfallNotice). Runs
 * serving no contract, or one no longer being grown, tell nobody.
 */
export async function tellBuyerOfProgress(trx: Knex.Transaction, nurseryOrgId: number, runId: number, eventId: number): Promise<void> {
  const contract = await lockRunContract(trx, nurseryOrgId, runId)
  if (!contract || !GROWING.includes(contract.state)) return
  const { progress, runs } = await progressOf(trx, nurseryOrgId, contract)
  const run = runs.find(r => r.id === runId)
  const event = run?.events.find(e => e.id === eventId)
  if (!run || !event) return
  const trees = `${contract.varietyName} on ${contract.rootstockDesignation}`
  const link = `/contracts/tree/${contract.id}`

  const milestone = milestoneOf(stepsOf(contract).map(s => s.step), run.linedOutCount, run.events, event)
  if (milestone && await insertMilestone(trx, { treeContractId: contract.id, milestone, runId, reachedOn: event.happenedOn })) {
    const { what, more } = milestoneWords(milestone, event, run, progress, trees)
    await tellParty(trx, contract.buyerOrgId, null, {
      subject: `${contract.nurseryOrgName} ${what}`,
      body: `${contract.nurseryOrgName} ${what} ${more} ${expectedLine(progress)}`,
      link,
      kind: `tree_contract.${milestone}`,
    })
  }

  const shortfall = shortfallNotice(progress.expected.trees, contract.treeCount, contract.shortfallNoticedTrees)
  if (shortfall.told !== contract.shortfallNoticedTrees) await setShortfallNoticed(trx, contract.id, shortfall.told)
  if (shortfall.tell) {
    const { trees: expected, contracted, shortfall: short } = progress.expected
    await tellParty(trx, contract.buyerOrgId, null, {
      subject: `Fewer trees expected: ${n(expected)} of your ${n(contracted)} ${trees}`,
      body: `After ${EVENT_WORDS[event.kind] ?? 'an entry'} recorded by ${contract.nurseryOrgName} on ${contractDate(event.happenedOn)}, `
        + `the runs for your contract are expected to finish ${n(expected)} trees, ${n(short)} fewer than the ${n(contracted)} contracted. `
        + 'Ask the nursery how it will make up the difference.',
      link,
      kind: 'tree_contract.shortfall',
    })
  }
}
