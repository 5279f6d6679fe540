import { describe, expect, it } from 'vitest'
import { exposedRuns, type WorkingEvent } from '../../shared/utils/exposure'

// The rule (Smith 2002, Acta Horticulturae 590:109): a suspect lot exposes every run worked with it,
// and every run worked after it that day by the same person. A hand-worked day:
//   Ines, 20 Aug: run 1 (lot 7), run 2 (lot 8), run 3 (lot 8)   → 1 with the lot, 2 and 3 after it
//   Tomas, 20 Aug: run 4 (lot 8) before Ines started            → not exposed (other hands)
//   Ines, 21 Aug: run 5 (lot 8)                                  → not exposed (another day)
//   Ines, 20 Aug, order 0: run 6 (lot 8), before run 1           → not exposed (before the lot)
const day: WorkingEvent[] = [
  { id: 10, runId: 1, happenedOn: '2026-08-20', byUserId: 1, budwoodLotId: 7, dayOrder: 1 },
  { id: 11, runId: 2, happenedOn: '2026-08-20', byUserId: 1, budwoodLotId: 8, dayOrder: 2 },
  { id: 12, runId: 3, happenedOn: '2026-08-20', byUserId: 1, budwoodLotId: 8, dayOrder: 3 },
  { id: 9, runId: 4, happenedOn: '2026-08-20', byUserId: 2, budwoodLotId: 8, dayOrder: 1 },
  { id: 13, runId: 5, happenedOn: '2026-08-21', byUserId: 1, budwoodLotId: 8, dayOrder: 1 },
  { id: 14, runId: 6, happenedOn: '2026-08-20', byUserId: 1, budwoodLotId: 8, dayOrder: 0 },
]

describe('exposedRuns', () => {
  it('lists the runs worked with the lot and after it that day by the same person', () => {
    expect(exposedRuns(7, day)).toEqual([
      { runId: 1, reason: 'budded-with-lot', eventIds: [10] },
      { runId: 2, reason: 'budded-after-lot', eventIds: [11] },
      { runId: 3, reason: 'budded-after-lot', eventIds: [12] },
    ])
  })

  it('falls back to the order of recording when the day order is not given', () => {
    const unordered = day.map(e => ({ ...e, dayOrder: null }))
    // Run 6 was recorded last (id 14), so without a day order it counts as after the lot.
    expect(exposedRuns(7, unordered).map(e => e.runId)).toEqual([1, 2, 3, 6])
  })

  it('names a run once, with the lot itself as its reason when both apply', () => {
    const twice: WorkingEvent[] = [...day, { id: 15, runId: 2, happenedOn: '2026-08-22', byUserId: 3, budwoodLotId: 7, dayOrder: 1 }]
    expect(exposedRuns(7, twice).find(e => e.runId === 2)).toEqual({ runId: 2, reason: 'budded-with-lot', eventIds: [11, 15] })
  })

  it('is empty for a lot nobody used', () => {
    expect(exposedRuns(99, day)).toEqual([])
  })
})
