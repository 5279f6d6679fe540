import { describe, expect, it } from 'vitest'
import type { ProgressContractInput, ProgressEvent, ProgressRunInput } from '../../shared/types/contractProgress'
import { backPlanSteps } from '../../shared/utils/backplan'
import { contractProgress, mergeGrades, milestoneOf, shortfallNotice, shortfallStep } from '../../shared/utils/contractProgress'

// A contract's progress summed over its runs. The cycle is a maiden's (R. Crassweller, Penn State /
// eXtension, "Nursery Production of Finished Apple Trees"): lined out in spring, budded in late
// summer, the take counted, headed back the next spring while dormant, dug in November. The
// figures are made up; every result is worked by hand in the comment beside it, with the counting
// rules of shared/utils/runCounts.ts (common practice: a nursery's row book).

let nextId = 1
const e = (kind: string, happenedOn: string, extra: Partial<ProgressEvent> = {}): ProgressEvent => ({ kind, happenedOn, id: nextId++, count: null, ...extra })

// 1,000 maidens for spring 2028: the back-plan's days (shared/utils/backplan.ts, common practice).
const STEPS = backPlanSteps(2028, 'spring')
const contract = (extra: Partial<ProgressContractInput> = {}): ProgressContractInput => ({
  treeCount: 1000, takeRate: 0.85, survivalRate: 0.9, state: 'propagating', deliveredCount: null, deliveredOn: null, steps: STEPS, ...extra,
})

// Row 10: 600 lined out, 3 lost, 597 budded, 527 took, headed back, 7 lost to voles, dug in two passes.
const runA: ProgressRunInput = {
  id: 1, rowName: '10', fieldName: 'Nursery Field', fromPosition: 1, toPosition: 600, linedOutOn: '2026-04-14', linedOutCount: 600,
  events: [
    e('lined-out', '2026-04-14', { count: 600 }),
    e('loss', '2026-06-10', { count: 3, cause: 'other' }),
    e('budded', '2026-08-18', { count: 597 }),
    e('take-counted', '2026-09-15', { count: 527 }),
    e('headed-back', '2027-03-10'),
    e('loss', '2027-05-01', { count: 7, cause: 'rodents' }),
    e('dug', '2027-11-10', { grades: [{ caliperMm: 14, heightCm: 160, feathered: true, count: 300 }, { caliperMm: 11, heightCm: null, feathered: false, count: 150 }] }),
    e('dug', '2027-11-20', { grades: [{ caliperMm: 14, heightCm: 160, feathered: true, count: 60 }, { caliperMm: 10, heightCm: null, feathered: false, count: 10 }] }),
  ],
}
// Row 11: 500 lined out, budded in two passes (480, then 15 missed the first time), take not yet counted.
const runB: ProgressRunInput = {
  id: 2, rowName: '11', fieldName: 'Nursery Field', fromPosition: 1, toPosition: 500, linedOutOn: '2026-04-15', linedOutCount: 500,
  events: [
    e('lined-out', '2026-04-15', { count: 500 }),
    e('budded', '2026-08-19', { count: 480 }),
    e('budded', '2026-09-02', { count: 15 }),
  ],
}

describe('contractProgress: two runs, one dug, one waiting for its take count', () => {
  const progress = contractProgress(contract(), [runA, runB], '2027-12-01')

  it('sums each stage over the runs, with its first and last day', () => {
    const { stages } = progress
    // 600 + 500 = 1,100 lined out on 14 and 15 April.
    expect(stages.linedOut).toEqual({ count: 1100, firstOn: '2026-04-14', lastOn: '2026-04-15' })
    // 597 + 480 + 15 = 1,092 budded, 18 August to 2 September.
    expect(stages.worked).toEqual({ count: 1092, firstOn: '2026-08-18', lastOn: '2026-09-02' })
    // Only row 10's take is counted: 527.
    expect(stages.taken).toEqual({ count: 527, firstOn: '2026-09-15', lastOn: '2026-09-15', runs: 1 })
    // Row 10 was headed back with the 527 that took standing.
    expect(stages.headedBack).toEqual({ count: 527, firstOn: '2027-03-10', lastOn: '2027-03-10', runs: 1 })
    // Row 10: 527 − 7 − 450 − 70 = 0 stand; row 11: 500 (the take not counted, nothing taken off).
    expect(stages.standing).toEqual({ count: 500, asOf: '2027-11-20' })
    // 450 + 70 = 520 dug; grades of 14 mm, 160 cm, feathered merged: 300 + 60 = 360.
    expect(stages.dug).toEqual({
      count: 520, firstOn: '2027-11-10', lastOn: '2027-11-20',
      grades: [
        { caliperMm: 14, heightCm: 160, feathered: true, count: 360 },
        { caliperMm: 11, heightCm: null, feathered: false, count: 150 },
        { caliperMm: 10, heightCm: null, feathered: false, count: 10 },
      ],
    })
    expect(stages.delivered).toEqual({ count: 0, firstOn: null, lastOn: null })
  })

  it('takes the take rate over the runs whose take is counted only', () => {
    // 527 ÷ 597 = 0.88275…; row 11's 495 buds wait for their count and do not pull it down.
    expect(progress.takeRate).toBeCloseTo(527 / 597, 12)
  })

  it('sums each run\'s expected finished trees against the number contracted', () => {
    // Row 10: 520 dug + ⌊0 × 0.9⌋ = 520. Row 11: ⌊500 × 0.85 × 0.9⌋ = ⌊382.5⌋ = 382. 902 of 1,000: 98 short.
    expect(progress.runs.map(r => r.expected)).toEqual([520, 382])
    expect(progress.expected).toEqual({ trees: 902, contracted: 1000, shortfall: 98 })
    expect(progress.runs[1]).toMatchObject({ id: 2, rowName: '11', fromPosition: 1, toPosition: 500, counts: { linedOut: 500, worked: 495, taken: null, standing: 500 } })
  })

  it('says how far each back-plan step has gone, and the first not done is next', () => {
    const step = (name: string) => progress.steps.find(s => s.step === name)
    expect(progress.steps.map(s => s.step)).toEqual(['linersPlanted', 'budded', 'headedBack', 'dug', 'delivered'])
    expect(step('linersPlanted')).toMatchObject({ by: '2026-04-30', runsDone: 2, runs: 2, done: true, count: 1100 })
    expect(step('budded')).toMatchObject({ by: '2026-09-30', runsDone: 2, done: true, count: 1092, firstOn: '2026-08-18', lastOn: '2026-09-02' })
    expect(step('headedBack')).toMatchObject({ by: '2027-03-31', runsDone: 1, done: false, count: 527 })
    // Row 10 is dug out only by its second pass; row 11 not at all.
    expect(step('dug')).toMatchObject({ by: '2027-11-15', runsDone: 1, done: false, count: 520, firstOn: '2027-11-10', lastOn: '2027-11-20' })
    expect(step('delivered')).toMatchObject({ by: '2028-04-15', runsDone: 0, done: false, count: 0 })
    // Row 11 was never headed back: the step of 31 March 2027 is the next, and late on 1 December 2027.
    expect(progress.nextStep).toEqual({ step: 'headedBack', by: '2027-03-31', runsDone: 1, runs: 2, late: true })
  })
})

describe('contractProgress: before and after the runs', () => {
  it('with no run lined out yet: nothing counted, the whole contract short, lining out next', () => {
    const progress = contractProgress(contract({ state: 'accepted' }), [], '2026-01-10')
    expect(progress.stages.linedOut).toEqual({ count: 0, firstOn: null, lastOn: null })
    expect(progress.stages.standing).toEqual({ count: 0, asOf: null })
    expect(progress.takeRate).toBeNull()
    expect(progress.expected).toEqual({ trees: 0, contracted: 1000, shortfall: 1000 })
    // Liners by 30 April 2026 (backplan.ts): not late on 10 January.
    expect(progress.nextStep).toEqual({ step: 'linersPlanted', by: '2026-04-30', runsDone: 0, runs: 0, late: false })
  })

  it('once delivered: the delivery counted on its day and no step left', () => {
    const progress = contractProgress(contract({ state: 'delivered', deliveredCount: 515, deliveredOn: '2028-03-20' }), [runA], '2028-04-01')
    expect(progress.stages.delivered).toEqual({ count: 515, firstOn: '2028-03-20', lastOn: '2028-03-20' })
    expect(progress.steps.at(-1)).toMatchObject({ step: 'delivered', done: true, count: 515 })
    expect(progress.nextStep).toBeNull()
  })

  it('a run lined out and untouched: what stands × expected take × survival', () => {
    const run: ProgressRunInput = { ...runB, events: [runB.events[0]!] }
    // ⌊500 × 0.85 × 0.9⌋ = 382; nothing budded, so the budding of 30 September 2026 is next.
    const progress = contractProgress(contract(), [run], '2026-05-01')
    expect(progress.expected.trees).toBe(382)
    expect(progress.nextStep).toMatchObject({ step: 'budded', by: '2026-09-30', late: false })
  })
})

describe('mergeGrades', () => {
  it('merges only grades of the same caliper, height and feathering', () => {
    const grades = mergeGrades([
      e('dug', '2027-11-10', { grades: [{ caliperMm: 12, heightCm: 150, feathered: false, count: 5 }, { caliperMm: 12, heightCm: 150, feathered: true, count: 3 }] }),
      e('dug', '2027-11-11', { grades: [{ caliperMm: 12, heightCm: 150, feathered: false, count: 4 }, { caliperMm: 12, heightCm: 140, feathered: false, count: 2 }] }),
    ])
    // 5 + 4 = 9 of 12 mm, 150 cm, unfeathered; the feathered and the 140 cm grades stay apart.
    expect(grades).toEqual([
      { caliperMm: 12, heightCm: 150, feathered: true, count: 3 },
      { caliperMm: 12, heightCm: 150, feathered: false, count: 9 },
      { caliperMm: 12, heightCm: 140, feathered: false, count: 2 },
    ])
  })
})

describe('milestoneOf', () => {
  const maiden = STEPS.map(s => s.step)

  it('budding, grafting, the take count and a dig are milestones', () => {
    expect(milestoneOf(maiden, 600, runA.events, runA.events[2]!)).toBe('budded')
    expect(milestoneOf(maiden, 600, runA.events, { id: 999, kind: 'grafted' })).toBe('budded')
    expect(milestoneOf(maiden, 600, runA.events, runA.events[3]!)).toBe('take-counted')
    expect(milestoneOf(maiden, 600, runA.events, runA.events[6]!)).toBe('dug')
    expect(milestoneOf(maiden, 600, runA.events, runA.events[4]!)).toBe('headed-back')
    expect(milestoneOf(maiden, 600, runA.events, runA.events[5]!)).toBeNull()
  })

  it('on a double-worked run only the heading back above the variety\'s bud is the milestone', () => {
    // An interstem is budded and headed back a season before the variety (backplan.ts: double chip-budding in successive years).
    const steps = backPlanSteps(2029, 'spring', { interstem: true }).map(s => s.step)
    const events = [
      e('lined-out', '2026-04-14', { count: 100 }),
      e('interstem-budded', '2026-08-18', { count: 100 }),
      e('headed-back', '2027-03-10'),
      e('budded', '2027-08-18', { count: 95 }),
      e('headed-back', '2028-03-10'),
    ]
    expect(milestoneOf(steps, 100, events, events[2]!)).toBeNull()
    expect(milestoneOf(steps, 100, events, events[4]!)).toBe('headed-back')
  })
})

describe('shortfallNotice', () => {
  it('warns when the expected trees first fall below the contract, again only 1 % lower', () => {
    // 1 % of 1,200 is 12 trees (worked by hand from the rule: 1 % of the contract, at least one tree).
    expect(shortfallStep(1200)).toBe(12)
    expect(shortfallNotice(1217, 1200, null)).toEqual({ tell: false, told: null })
    expect(shortfallNotice(1150, 1200, null)).toEqual({ tell: true, told: 1150 })
    // 1,150 − 1,140 = 10 < 12: not told again; the figure told stays.
    expect(shortfallNotice(1140, 1200, 1150)).toEqual({ tell: false, told: 1150 })
    // 1,150 − 1,138 = 12: told again.
    expect(shortfallNotice(1138, 1200, 1150)).toEqual({ tell: true, told: 1138 })
    // Back at the contracted number: forgotten, so a later fall is told as new.
    expect(shortfallNotice(1200, 1200, 1138)).toEqual({ tell: false, told: null })
  })

  it('takes at least one tree as the step', () => {
    // 1 % of 150 is 1.5: two whole trees; of 50, half a tree: one tree.
    expect(shortfallStep(150)).toBe(2)
    expect(shortfallStep(50)).toBe(1)
    expect(shortfallNotice(48, 50, 49)).toEqual({ tell: true, told: 48 })
  })
})
