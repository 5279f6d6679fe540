// The counts of a nursery run, derived from its events and never typed (common practice: a
// nursery's book of a row keeps dated entries, and the standing count is what they leave).
//
// In date order (same day: in the order recorded), starting from the liners lined out:
// - a loss takes its count off what stands;
// - a take count says how many budded rootstocks took: what stood and did not take counts as a
//   failed take, and what stands is the take count;
// - a dig takes the trees dug (all grades) off what stands.
// Budding and grafting record how many were worked; the take rate is taken ÷ worked.
// The expected finished trees: what stands after the take count × the survival-to-sale rate
// (the contract's back-plan term), plus what has been dug already; before the take is counted,
// what stands × the expected take rate × survival.

import type { LossCause } from '../schemas/nursery'

export interface RunEventForCount {
  kind: string
  happenedOn: string
  /** Order of recording, for events on the same day. */
  id: number
  count?: number | null
  cause?: LossCause | string | null
  grades?: { count: number }[] | null
}

export interface RunCounts {
  linedOut: number
  /** Buds or grafts put on. */
  worked: number
  /** The last take count; null before one. */
  taken: number | null
  /** taken ÷ worked, 0–1; null until both are known. */
  takeRate: number | null
  /** By cause, failed takes included. */
  losses: Record<string, number>
  lost: number
  dug: number
  standing: number
}

export class CountRefusal extends Error {
  constructor(public field: 'count' | 'grades', message: string) {
    super(message)
  }
}

const byOrder = (a: RunEventForCount, b: RunEventForCount) => (a.happenedOn < b.happenedOn ? -1 : a.happenedOn > b.happenedOn ? 1 : a.id - b.id)

function dugTotal(e: RunEventForCount): number {
  return (e.grades ?? []).reduce((s, g) => s + g.count, 0)
}

/**
 * The run's counts after its events. An event that would take more than stands throws a
 * CountRefusal naming the field: the service checks a new event by counting with it included.
 */
export function runCounts(linedOut: number, events: readonly RunEventForCount[]): RunCounts {
  if (!Number.isInteger(linedOut) || linedOut < 0) throw new RangeError(`Lined out must be a whole number; got ${linedOut}`)
  let standing = linedOut
  let worked = 0
  let taken: number | null = null
  let dug = 0
  const losses: Record<string, number> = {}
  for (const e of [...events].sort(byOrder)) {
    const n = e.count ?? 0
    switch (e.kind) {
      case 'budded':
      case 'grafted':
        if (worked + n > linedOut) throw new CountRefusal('count', `Only ${linedOut - worked} of the ${linedOut} rootstocks lined out are still to work`)
        worked += n
        break
      case 'loss':
        if (n > standing) throw new CountRefusal('count', `Only ${standing} stand in this run on ${e.happenedOn}: a loss cannot be larger`)
        standing -= n
        losses[e.cause ?? 'other'] = (losses[e.cause ?? 'other'] ?? 0) + n
        break
      case 'take-counted':
        if (n > standing) throw new CountRefusal('count', `Only ${standing} stand in this run on ${e.happenedOn}: more cannot have taken`)
        losses['failed-take'] = (losses['failed-take'] ?? 0) + (standing - n)
        standing = n
        taken = n
        break
      case 'dug': {
        const total = dugTotal(e)
        if (total > standing) throw new CountRefusal('grades', `Only ${standing} stand in this run on ${e.happenedOn}: more cannot be dug`)
        standing -= total
        dug += total
        break
      }
      default:
        break
    }
  }
  const lost = Object.values(losses).reduce((s, n) => s + n, 0)
  return { linedOut, worked, taken, takeRate: taken !== null && worked > 0 ? taken / worked : null, losses, lost, dug, standing }
}

export interface ExpectedFinished {
  trees: number
  /** How it was worked, in words, for the page. */
  formula: string
}

/**
 * The trees a run is expected to finish: dug + ⌊standing × survival⌋ once the take is counted;
 * ⌊standing × take × survival⌋ before it (rounded down: a part of a tree is no tree).
 */
export function expectedFinished(counts: RunCounts, rates: { takeRate: number, survivalRate: number }): ExpectedFinished {
  for (const [name, rate] of Object.entries(rates)) {
    if (!Number.isFinite(rate) || rate <= 0 || rate > 1) throw new RangeError(`${name} must be above 0 and at most 1; got ${rate}`)
  }
  if (counts.taken !== null || counts.dug > 0) {
    const trees = counts.dug + Math.floor(counts.standing * rates.survivalRate + 1e-9)
    return { trees, formula: `${counts.dug} dug + ${counts.standing} standing × ${rates.survivalRate} survival to sale` }
  }
  const trees = Math.floor(counts.standing * rates.takeRate * rates.survivalRate + 1e-9)
  return { trees, formula: `${counts.standing} standing × ${rates.takeRate} expected take × ${rates.survivalRate} survival to sale` }
}
