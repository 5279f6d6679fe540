// The nursery's season calendar: from each tree contract's back-plan and what has been recorded on
// the runs that serve it, what must be done by when. A task is done only when the matching event is
// on the run (shared/utils/stepEvents.ts says which event does which step), never ticked by hand.
//
// Besides the back-plan's steps a run has three jobs of the growing season (common practice):
// - the take is counted a few weeks after budding, by the heading back at the latest (a sleeping
//   eye, which is not headed back in the nursery, by its dig);
// - shoots from the rootstock below the bud are rubbed off in the season after heading back, by
//   30 June in the north;
// - a rootstock too weak to hold a tree up is staked by 31 May of that season.
// A bench graft grows its one season the year it is lined out, so its jobs fall in that year.
// These dates move six months with the hemisphere like the back-plan's own.

import type { NurseryTask, NurseryTaskContract, NurseryTaskRun, TaskStep } from '../types/nurseryTasks'
import { backPlanSteps, rootstocksToBud, seasonalDate, type DeliverySeason, type PropagationStep, type TreeType } from './backplan'
import type { Hemisphere } from './hemisphere'
import { runStepsDone, type StepEvent } from './stepEvents'

/** Contract states whose trees the nursery is growing; a delivered contract shows what was done. */
export const TASK_CONTRACT_STATES = ['accepted', 'propagating', 'ready', 'delivered'] as const

export interface TaskContractInput {
  id: number
  state: string
  buyerOrgName: string
  varietyName: string
  rootstockDesignation: string
  treeCount: number
  takeRate: number
  survivalRate: number
  deliveryYear: number
  deliverySeason: DeliverySeason
  treeType: TreeType
  interstem: boolean
  deliveredOn: string | null
}

export interface TaskRunInput extends NurseryTaskRun {
  treeContractId: number | null
  rootstockDesignation: string
  rootstockNeedsSupport: boolean
  /** The interstem's name, where the run has one. */
  interstem: string | null
  varietyName: string
  linedOutOn: string
  linedOutCount: number
  events: readonly StepEvent[]
}

export interface NurseryTasksInput {
  contracts: readonly TaskContractInput[]
  runs: readonly TaskRunInput[]
  hemisphere: Hemisphere
  /** YYYY-MM-DD */
  today: string
}

const count = (n: number) => n.toLocaleString('en-GB')

/** "Quillhurst Cider Works' Dabinett", "Tansy Row's Dabinett". */
const possessive = (name: string) => (name.endsWith('s') ? `${name}'` : `${name}'s`)

function where(run: NurseryTaskRun): string {
  const span = run.fromPosition === run.toPosition ? `position ${count(run.fromPosition)}` : `positions ${count(run.fromPosition)}–${count(run.toPosition)}`
  return `row ${run.rowName}, ${span}`
}

function runTitle(step: TaskStep, run: TaskRunInput, contract: TaskContractInput): string {
  const at = where(run)
  const liners = `${count(run.linedOutCount)} ${run.rootstockDesignation} liners`
  switch (step) {
    case 'benchGrafted': return `Bench-graft ${run.varietyName} onto ${count(run.linedOutCount)} ${run.rootstockDesignation} rootstocks for ${at}`
    case 'interstemBudded': return `Bud ${at} with the interstem${run.interstem ? ` ${run.interstem}` : ''}: ${liners}`
    case 'interstemHeadedBack': return `Head back ${at} above the interstem bud`
    case 'budded': return `Bud ${at}: ${liners} with ${run.varietyName}`
    case 'headedBack': return `Head back ${at} above the ${run.varietyName} bud`
    case 'knipCutBack': return `Cut back ${at} to knips`
    case 'dug': return `Dig ${at}: ${run.varietyName} on ${run.rootstockDesignation} for ${contract.buyerOrgName}`
    case 'takeCounted': return `Count the take of ${at}`
    case 'shootsRemoved': return `Remove rootstock shoots from ${at}`
    case 'staked': return `Stake ${at}`
    default: return `${step} ${at}`
  }
}

const summary = (c: TaskContractInput): NurseryTaskContract => ({ id: c.id, buyerOrgName: c.buyerOrgName, varietyName: c.varietyName, treeType: c.treeType })
const runSummary = (r: TaskRunInput): NurseryTaskRun => ({ id: r.id, rowName: r.rowName, fieldName: r.fieldName, fromPosition: r.fromPosition, toPosition: r.toPosition })

type Draft = Omit<NurseryTask, 'overdue'>

/** The day the runs together first lined out at least `wanted`; null while they have not. */
function linedOutEnough(runs: readonly TaskRunInput[], wanted: number): string | null {
  let total = 0
  for (const run of [...runs].sort((a, b) => (a.linedOutOn < b.linedOutOn ? -1 : a.linedOutOn > b.linedOutOn ? 1 : a.id - b.id))) {
    total += run.linedOutCount
    if (total >= wanted) return run.linedOutOn
  }
  return null
}

function contractTasks(contract: TaskContractInput, runs: readonly TaskRunInput[], steps: ReturnType<typeof backPlanSteps>): Draft[] {
  const wanted = rootstocksToBud(contract.treeCount, contract.takeRate, contract.survivalRate)
  const linedOut = runs.reduce((s, r) => s + r.linedOutCount, 0)
  const left = Math.max(0, wanted - linedOut)
  const what = contract.treeType === 'bench-graft' ? 'bench grafts' : 'liners'
  const lineOutOn = linedOutEnough(runs, wanted)
  const dueOf = (step: PropagationStep) => steps.find(s => s.step === step)!.by
  const delivered = contract.state === 'delivered' && contract.deliveredOn ? contract.deliveredOn : null
  return [
    {
      key: `contract-${contract.id}-linersPlanted`, step: 'linersPlanted',
      title: `Line out ${count(left || wanted)}${left && left < wanted ? ' more' : ''} ${what} of ${contract.rootstockDesignation} for ${possessive(contract.buyerOrgName)} ${contract.varietyName}`,
      due: dueOf('linersPlanted'), done: lineOutOn !== null, doneOn: lineOutOn, run: null, contract: summary(contract),
    },
    {
      key: `contract-${contract.id}-delivered`, step: 'delivered',
      title: `Deliver ${count(contract.treeCount)} ${contract.varietyName} on ${contract.rootstockDesignation} to ${contract.buyerOrgName}`,
      due: dueOf('delivered'), done: delivered !== null, doneOn: delivered, run: null, contract: summary(contract),
    },
  ]
}

/** First event of `kind` on or after `since`. */
function firstSince(events: readonly StepEvent[], kind: string, since: string | null): StepEvent | undefined {
  return [...events].sort((a, b) => (a.happenedOn < b.happenedOn ? -1 : a.happenedOn > b.happenedOn ? 1 : a.id - b.id))
    .find(e => e.kind === kind && (since === null || e.happenedOn >= since))
}

/** A date of the northern plan's year `year` on `monthDay` ('06-30'), moved to the hemisphere. */
const seasonDay = (year: string, monthDay: string, season: DeliverySeason, hemisphere: Hemisphere) => seasonalDate(`${year}-${monthDay}`, season, hemisphere)

function runTasks(contract: TaskContractInput, run: TaskRunInput, hemisphere: Hemisphere): Draft[] {
  const options = { treeType: contract.treeType, interstem: contract.interstem }
  const north = backPlanSteps(contract.deliveryYear, contract.deliverySeason, options)
  const local = backPlanSteps(contract.deliveryYear, contract.deliverySeason, { ...options, hemisphere })
  // Lining out is the contract's task (its runs together), delivery the contract's own.
  const steps = local.filter(s => s.step !== 'linersPlanted' && s.step !== 'delivered')
  const done = runStepsDone(steps.map(s => s.step), run.linedOutCount, run.events)
  const doneOf = (step: PropagationStep) => done.find(d => d.step === step)?.doneOn ?? null
  const make = (step: TaskStep, due: string, doneOn: string | null): Draft => ({
    key: `run-${run.id}-${step}`, step, title: runTitle(step, run, contract), due, done: doneOn !== null, doneOn, run: runSummary(run), contract: summary(contract),
  })
  const tasks = steps.map((s, i) => make(s.step, s.by, done[i]!.doneOn))

  const northOf = (step: PropagationStep) => north.find(s => s.step === step)?.by
  const { treeType, deliverySeason: season } = contract
  // The worked step the take is counted after, and the season the tree grows in the row.
  const worked: PropagationStep = treeType === 'bench-graft' ? 'benchGrafted' : 'budded'
  const growing = treeType === 'bench-graft' ? northOf('linersPlanted') : northOf('headedBack')
  let takeDue = local.find(s => s.step === 'headedBack')?.by
  if (treeType === 'sleeping-eye') takeDue = local.find(s => s.step === 'dug')!.by
  if (treeType === 'bench-graft') takeDue = seasonDay(growing!.slice(0, 4), '06-30', season, hemisphere)
  const take = firstSince(run.events, 'take-counted', doneOf(worked))
  tasks.push(make('takeCounted', takeDue!, take?.happenedOn ?? null))
  if (growing) {
    const since = doneOf(treeType === 'bench-graft' ? 'benchGrafted' : 'headedBack')
    // Before heading back is recorded, a shoot cleared before the variety was worked belongs to an
    // earlier season (a clean stem to bud on), not this one.
    const shoots = since || doneOf(worked) ? firstSince(run.events, 'shoots-removed', since ?? doneOf(worked)) : undefined
    tasks.push(make('shootsRemoved', seasonDay(growing.slice(0, 4), '06-30', season, hemisphere), shoots?.happenedOn ?? null))
    if (run.rootstockNeedsSupport) {
      const stake = firstSince(run.events, 'staked', null)
      tasks.push(make('staked', seasonDay(growing.slice(0, 4), '05-31', season, hemisphere), stake?.happenedOn ?? null))
    }
  }
  return tasks
}

const STEP_ORDER: TaskStep[] = ['benchGrafted', 'linersPlanted', 'interstemBudded', 'interstemHeadedBack', 'budded', 'takeCounted', 'headedBack', 'staked', 'shootsRemoved', 'knipCutBack', 'dug', 'delivered']

/** Due date first; on one day the contract's tasks, then run by run in the order of the work. */
export function byDue(a: NurseryTask, b: NurseryTask): number {
  if (a.due !== b.due) return a.due < b.due ? -1 : 1
  if (a.contract.id !== b.contract.id) return a.contract.id - b.contract.id
  if ((a.run?.id ?? 0) !== (b.run?.id ?? 0)) return (a.run?.id ?? 0) - (b.run?.id ?? 0)
  return STEP_ORDER.indexOf(a.step) - STEP_ORDER.indexOf(b.step)
}

/**
 * Every task of the nursery's contracts and of the runs that serve them, sorted by due date. A
 * delivered contract keeps only what was done; a contract in another state (offered, cancelled)
 * has none. A run serving no contract listed has none either: its dates come from a contract.
 */
export function nurseryTasks(input: NurseryTasksInput): NurseryTask[] {
  const tasks: NurseryTask[] = []
  for (const contract of input.contracts) {
    if (!(TASK_CONTRACT_STATES as readonly string[]).includes(contract.state)) continue
    const runs = input.runs.filter(r => r.treeContractId === contract.id)
    const steps = backPlanSteps(contract.deliveryYear, contract.deliverySeason, { treeType: contract.treeType, interstem: contract.interstem, hemisphere: input.hemisphere })
    const drafts = [...contractTasks(contract, runs, steps), ...runs.flatMap(run => runTasks(contract, run, input.hemisphere))]
    for (const draft of drafts) {
      if (contract.state === 'delivered' && !draft.done) continue
      tasks.push({ ...draft, overdue: !draft.done && draft.due < input.today })
    }
  }
  return tasks.sort(byDue)
}

export interface TaskFilter {
  state?: 'open' | 'overdue' | 'done' | 'all'
  /** YYYY-MM-DD, on the due date */
  from?: string
  to?: string
  treeContractId?: number
  runId?: number
}

/** The tasks a filter keeps, in their order. */
export function filterTasks(tasks: readonly NurseryTask[], filter: TaskFilter): NurseryTask[] {
  return tasks.filter((t) => {
    if (filter.state === 'open' && t.done) return false
    if (filter.state === 'overdue' && !t.overdue) return false
    if (filter.state === 'done' && !t.done) return false
    if (filter.from && t.due < filter.from) return false
    if (filter.to && t.due > filter.to) return false
    if (filter.treeContractId && t.contract.id !== filter.treeContractId) return false
    if (filter.runId && t.run?.id !== filter.runId) return false
    return true
  })
}
