// A tree contract's progress, summed over the runs that serve it, for the buyer who cannot walk the
// nursery rows: what was lined out, budded, took, headed back, stands, was dug (by grade) and
// delivered, each with the days it happened; the take; the finished trees expected against the
// trees contracted; and the next step the back-plan dates. Each run's counts are runCounts' and
// its expected trees expectedFinished's; which event did a step is runStepsDone's.

import type {
  ContractProgress, ProgressContractInput, ProgressDugGrade, ProgressEvent, ProgressRunInput, ProgressStep, ProgressTally,
} from '../types/contractProgress'
import type { PropagationStep } from './backplan'
import { expectedFinished, runCounts } from './runCounts'
import { runStepsDone, type StepDone } from './stepEvents'

/** What the buyer is told of, once per run: the variety budded (or grafted), the take counted, headed back, dug. */
export const MILESTONES = ['budded', 'take-counted', 'headed-back', 'dug'] as const
export type Milestone = typeof MILESTONES[number]

/** Contract states after which nothing more is to be done. */
const ENDED = ['delivered', 'declined', 'cancelled']

const WORKED = ['budded', 'grafted']

function tally(entries: { count: number, on: string }[]): ProgressTally {
  const days = entries.map(e => e.on).sort()
  return { count: entries.reduce((s, e) => s + e.count, 0), firstOn: days[0] ?? null, lastOn: days.at(-1) ?? null }
}

const dugCount = (e: ProgressEvent) => (e.grades ?? []).reduce((s, g) => s + g.count, 0)

/** Grades of the same caliper, height and feathering are one grade; thickest first. */
export function mergeGrades(events: readonly ProgressEvent[]): ProgressDugGrade[] {
  const merged = new Map<string, ProgressDugGrade>()
  for (const grade of events.flatMap(e => e.grades ?? [])) {
    const heightCm = grade.heightCm ?? null
    const feathered = Boolean(grade.feathered)
    const key = `${grade.caliperMm}|${heightCm}|${feathered}`
    const found = merged.get(key)
    if (found) found.count += grade.count
    else merged.set(key, { caliperMm: grade.caliperMm, heightCm, feathered, count: grade.count })
  }
  return [...merged.values()].sort((a, b) => b.caliperMm - a.caliperMm || (b.heightCm ?? -1) - (a.heightCm ?? -1) || Number(b.feathered) - Number(a.feathered))
}

/** Ordered as runCounts orders them: by day, then as recorded. */
const byOrder = (a: ProgressEvent, b: ProgressEvent) => (a.happenedOn < b.happenedOn ? -1 : a.happenedOn > b.happenedOn ? 1 : a.id - b.id)

/** What stands on the run just after `eventId`. */
function standingAfter(run: ProgressRunInput, eventId: number): number {
  const sorted = [...run.events].sort(byOrder)
  const at = sorted.findIndex(e => e.id === eventId)
  return runCounts(run.linedOutCount, sorted.slice(0, at + 1)).standing
}

interface RunState {
  run: ProgressRunInput
  done: StepDone[]
}

/** The events doing a step on each run, with what each counted. */
function stepEntries(step: PropagationStep, states: RunState[]): { count: number, on: string }[] {
  const doneBy = (s: RunState) => s.done.find(d => d.step === step)
  switch (step) {
    case 'linersPlanted':
      return states.map(s => ({ count: s.run.linedOutCount, on: s.run.linedOutOn }))
    case 'benchGrafted':
    case 'budded':
      return states.flatMap(s => s.run.events.filter(e => WORKED.includes(e.kind)).map(e => ({ count: e.count ?? 0, on: e.happenedOn })))
    case 'interstemBudded':
      return states.flatMap(s => s.run.events.filter(e => e.kind === 'interstem-budded').map(e => ({ count: e.count ?? 0, on: e.happenedOn })))
    case 'dug':
      return states.flatMap(s => s.run.events.filter(e => e.kind === 'dug').map(e => ({ count: dugCount(e), on: e.happenedOn })))
    case 'delivered':
      return []
    default:
      // Heading back and the knip's cut: the trees standing on each run when the step was done.
      return states.flatMap((s) => {
        const done = doneBy(s)
        return done?.eventId != null && done.doneOn ? [{ count: standingAfter(s.run, done.eventId), on: done.doneOn }] : []
      })
  }
}

/**
 * The contract's progress over its runs. `today` (YYYY-MM-DD) says whether the next step is late.
 * The take rate is taken ÷ worked over the runs whose take is counted, so a run still waiting for
 * its count does not pull it down.
 */
export function contractProgress(contract: ProgressContractInput, runs: readonly ProgressRunInput[], today: string): ContractProgress {
  const planSteps = contract.steps.map(s => s.step)
  const states: RunState[] = runs.map(run => ({ run, done: runStepsDone(planSteps, run.linedOutCount, run.events) }))
  const rates = { takeRate: contract.takeRate, survivalRate: contract.survivalRate }
  const progressRuns = runs.map((run) => {
    const counts = runCounts(run.linedOutCount, run.events)
    return {
      id: run.id, rowName: run.rowName, fieldName: run.fieldName, fromPosition: run.fromPosition, toPosition: run.toPosition, linedOutOn: run.linedOutOn,
      counts, expected: expectedFinished(counts, rates).trees,
    }
  })
  const allEvents = runs.flatMap(r => r.events)
  const delivered = contract.deliveredOn !== null && contract.deliveredCount !== null
    ? { count: contract.deliveredCount, firstOn: contract.deliveredOn.slice(0, 10), lastOn: contract.deliveredOn.slice(0, 10) }
    : { count: 0, firstOn: null, lastOn: null }

  const steps: ProgressStep[] = contract.steps.map(({ step, by }) => {
    if (step === 'delivered') {
      return { step, by, runsDone: delivered.firstOn ? runs.length : 0, runs: runs.length, done: delivered.firstOn !== null, firstOn: delivered.firstOn, lastOn: delivered.lastOn, count: delivered.count }
    }
    const runsDone = states.filter(s => s.done.find(d => d.step === step)?.doneOn).length
    return { step, by, runsDone, runs: runs.length, done: runs.length > 0 && runsDone === runs.length, ...tally(stepEntries(step, states)) }
  })

  const counted = progressRuns.filter(r => r.counts.taken !== null)
  const workedCounted = counted.reduce((s, r) => s + r.counts.worked, 0)
  const takenCount = counted.reduce((s, r) => s + r.counts.taken!, 0)
  const takeDays = allEvents.filter(e => e.kind === 'take-counted').map(e => e.happenedOn).sort()
  const headedBack = planSteps.includes('headedBack') ? tally(stepEntries('headedBack', states)) : { count: 0, firstOn: null, lastOn: null }
  const lastDay = [...runs.map(r => r.linedOutOn), ...allEvents.map(e => e.happenedOn)].sort().at(-1) ?? null
  const trees = progressRuns.reduce((s, r) => s + r.expected, 0)

  const next = ENDED.includes(contract.state) ? undefined : steps.find(s => !s.done)
  return {
    stages: {
      linedOut: tally(runs.map(r => ({ count: r.linedOutCount, on: r.linedOutOn }))),
      worked: tally(allEvents.filter(e => WORKED.includes(e.kind)).map(e => ({ count: e.count ?? 0, on: e.happenedOn }))),
      taken: { count: takenCount, firstOn: takeDays[0] ?? null, lastOn: takeDays.at(-1) ?? null, runs: counted.length },
      headedBack: { ...headedBack, runs: planSteps.includes('headedBack') ? states.filter(s => s.done.find(d => d.step === 'headedBack')?.doneOn).length : 0 },
      standing: { count: progressRuns.reduce((s, r) => s + r.counts.standing, 0), asOf: lastDay },
      dug: { ...tally(allEvents.filter(e => e.kind === 'dug').map(e => ({ count: dugCount(e), on: e.happenedOn }))), grades: mergeGrades(allEvents.filter(e => e.kind === 'dug')) },
      delivered,
    },
    steps,
    takeRate: workedCounted > 0 ? takenCount / workedCounted : null,
    expected: { trees, contracted: contract.treeCount, shortfall: Math.max(0, contract.treeCount - trees) },
    nextStep: next ? { step: next.step, by: next.by, runsDone: next.runsDone, runs: next.runs, late: next.by < today } : null,
    runs: progressRuns,
  }
}

/**
 * The milestone a newly recorded event reaches on its run, or null. Budding and grafting tell of
 * the variety worked; heading back only when it is the heading back above the variety's bud
 * (runStepsDone: on a double-worked run the first is the interstem's); the first dig tells that
 * digging has begun. Whether the buyer was told already is the caller's to check.
 */
export function milestoneOf(steps: readonly PropagationStep[], linedOutCount: number, events: readonly ProgressEvent[], event: { id: number, kind: string }): Milestone | null {
  switch (event.kind) {
    case 'budded':
    case 'grafted':
      return 'budded'
    case 'take-counted':
      return 'take-counted'
    case 'dug':
      return 'dug'
    case 'headed-back': {
      const done = runStepsDone(steps, linedOutCount, events)
      return done.find(d => d.step === 'headedBack')?.eventId === event.id ? 'headed-back' : null
    }
    default:
      return null
  }
}

/** How much lower than last told the expected trees must fall to be told again: 1 % of the contract, at least one tree. */
export function shortfallStep(contracted: number): number {
  return Math.max(1, Math.ceil(contracted / 100))
}

/**
 * Whether to warn the buyer that fewer trees are expected than contracted, and the figure to
 * remember as told: warned when it first falls below, again only when it falls at least
 * shortfallStep lower than the figure last told; forgotten (null) once enough are expected again.
 */
export function shortfallNotice(expected: number, contracted: number, lastTold: number | null): { tell: boolean, told: number | null } {
  if (expected >= contracted) return { tell: false, told: null }
  if (lastTold === null || lastTold - expected >= shortfallStep(contracted)) return { tell: true, told: expected }
  return { tell: false, told: lastTold }
}
