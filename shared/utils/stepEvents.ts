// Which recorded event does each step of a back-plan, so a step is done only when the nursery has
// recorded it on the run (never ticked by hand). The steps of a run fall in order, so each is done
// by the first event of its kind on or after the day the step before it was done: a double-worked
// run's first heading back (above the interstem) does the interstem's step, and only a later one
// heads back above the variety's bud.

import type { PropagationStep } from './backplan'
import { runCounts, type RunEventForCount } from './runCounts'

/** The event kind that does each step on a run; `delivered` is done by the contract's delivery. */
export const STEP_EVENT: Record<Exclude<PropagationStep, 'delivered'>, string> = {
  benchGrafted: 'grafted',
  linersPlanted: 'lined-out',
  interstemBudded: 'interstem-budded',
  interstemHeadedBack: 'headed-back',
  budded: 'budded',
  headedBack: 'headed-back',
  knipCutBack: 'knip-cut-back',
  dug: 'dug',
}

export interface StepEvent extends RunEventForCount {
  kind: string
}

export interface StepDone {
  step: PropagationStep
  /** YYYY-MM-DD, the day the event that did it happened; null while not done. */
  doneOn: string | null
  /** The event that did it. */
  eventId: number | null
}

const byOrder = (a: StepEvent, b: StepEvent) => (a.happenedOn < b.happenedOn ? -1 : a.happenedOn > b.happenedOn ? 1 : a.id - b.id)

/**
 * For each of a run's steps (its contract's back-plan, `delivered` left out), the event that did it.
 * Budding is done by the first budding (a second pass only adds to the count); digging only when
 * nothing stands after a dig, since a part-dug run still has trees to dig. A step with no event
 * stays undone while the later ones may be done: a nursery that forgot to record heading back
 * still sees its dug trees as dug.
 */
export function runStepsDone(steps: readonly PropagationStep[], linedOutCount: number, events: readonly StepEvent[]): StepDone[] {
  const sorted = [...events].sort(byOrder)
  const runSteps = steps.filter((s): s is Exclude<PropagationStep, 'delivered'> => s !== 'delivered')
  const done: StepDone[] = []
  let from = 0
  runSteps.forEach((step, index) => {
    const kind = STEP_EVENT[step]
    // A step missed is looked for only up to the first event of a later step: what comes after
    // that belongs to the later steps (the variety's heading back is not the interstem's).
    const later = new Set(runSteps.slice(index + 1).map(s => STEP_EVENT[s]).filter(k => k !== kind))
    let found: StepEvent | undefined
    for (let i = from; i < sorted.length; i++) {
      const e = sorted[i]!
      if (later.has(e.kind)) break
      if (e.kind !== kind) continue
      if (kind === 'dug' && runCounts(linedOutCount, sorted.slice(0, i + 1)).standing > 0) continue
      found = e
      from = i + 1
      break
    }
    done.push({ step, doneOn: found?.happenedOn ?? null, eventId: found?.id ?? null })
  })
  return done
}
