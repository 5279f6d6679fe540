import { describe, expect, it } from 'vitest'
import type { NurseryTask } from '../../shared/types/nurseryTasks'
import { filterTasks, nurseryTasks, type TaskContractInput, type TaskRunInput } from '../../shared/utils/nurseryTasks'
import type { StepEvent } from '../../shared/utils/stepEvents'

// The season calendar worked by hand. The back-plan's dates are those of shared/utils/backplan.ts
// (cycle after R. Crassweller, Penn State, "Nursery Production of Finished Apple Trees"; the days of
// the month common practice). The jobs between its steps are common practice: the take counted by
// the heading back, rootstock shoots removed by 30 June and stakes in by 31 May of the season after
// heading back; in the south every date six months off.

// 1,200 maidens for spring 2028 at 85 % take and 90 % survival: ⌈1200 ÷ 0.765⌉ = 1,569 rootstocks
// (worked example), lined out by 30 April 2026.
const contract = (extra: Partial<TaskContractInput> = {}): TaskContractInput => ({
  id: 7, state: 'propagating', buyerOrgName: 'Quillhurst Cider Works', varietyName: 'Dabinett', rootstockDesignation: 'MM.106',
  treeCount: 1200, takeRate: 0.85, survivalRate: 0.9, deliveryYear: 2028, deliverySeason: 'spring', treeType: 'maiden', interstem: false, deliveredOn: null,
  ...extra,
})

let nextEvent = 1
const ev = (kind: string, happenedOn: string, extra: Partial<StepEvent> = {}): StepEvent => ({ kind, happenedOn, id: nextEvent++, count: null, ...extra })

const run = (extra: Partial<TaskRunInput> = {}): TaskRunInput => ({
  id: 31, treeContractId: 7, rowName: '12', fieldName: 'Nursery Field', fromPosition: 1, toPosition: 1450,
  rootstockDesignation: 'MM.106', rootstockNeedsSupport: false, interstem: null, varietyName: 'Dabinett',
  linedOutOn: '2026-04-14', linedOutCount: 1450, events: [ev('lined-out', '2026-04-14', { count: 1450 })],
  ...extra,
})

const task = (tasks: NurseryTask[], key: string) => {
  const found = tasks.find(t => t.key === key)
  if (!found) throw new Error(`no task ${key} in ${tasks.map(t => t.key).join(', ')}`)
  return found
}
const dues = (tasks: NurseryTask[]) => Object.fromEntries(tasks.map(t => [t.step, t.due]))

describe('a contract not yet started', () => {
  const tasks = nurseryTasks({ contracts: [contract({ state: 'accepted' })], runs: [], hemisphere: 'north', today: '2026-03-01' })

  it('asks for the back-plan\'s rootstocks to be lined out by its date, and the trees delivered (worked example above)', () => {
    expect(tasks.map(t => t.key)).toEqual(['contract-7-linersPlanted', 'contract-7-delivered'])
    expect(task(tasks, 'contract-7-linersPlanted')).toEqual({
      key: 'contract-7-linersPlanted', step: 'linersPlanted', title: 'Line out 1,569 liners of MM.106 for Quillhurst Cider Works\' Dabinett',
      due: '2026-04-30', done: false, doneOn: null, overdue: false, run: null,
      contract: { id: 7, buyerOrgName: 'Quillhurst Cider Works', varietyName: 'Dabinett', treeType: 'maiden' },
    })
    expect(task(tasks, 'contract-7-delivered')).toMatchObject({ title: 'Deliver 1,200 Dabinett on MM.106 to Quillhurst Cider Works', due: '2028-04-15', done: false })
  })

  it('is overdue from the day after its date, not on the day itself', () => {
    const on = (today: string) => task(nurseryTasks({ contracts: [contract({ state: 'accepted' })], runs: [], hemisphere: 'north', today }), 'contract-7-linersPlanted').overdue
    expect(on('2026-04-30')).toBe(false)
    expect(on('2026-05-01')).toBe(true)
  })

  it('has no tasks for a contract the nursery is not growing, nor for a run serving no listed contract', () => {
    for (const state of ['draft', 'offered', 'countered', 'declined', 'cancelled']) {
      expect(nurseryTasks({ contracts: [contract({ state })], runs: [run()], hemisphere: 'north', today: '2026-03-01' }), state).toEqual([])
    }
    expect(nurseryTasks({ contracts: [], runs: [run()], hemisphere: 'north', today: '2026-03-01' })).toEqual([])
  })
})

describe('lining out', () => {
  it('asks for what is still to line out, and is done the day the runs together reach the back-plan\'s 1,569', () => {
    const first = run({ id: 31, linedOutCount: 600, toPosition: 600, linedOutOn: '2026-04-14' })
    const part = nurseryTasks({ contracts: [contract()], runs: [first], hemisphere: 'north', today: '2026-04-20' })
    // 1,569 − 600 = 969 (worked example).
    expect(task(part, 'contract-7-linersPlanted')).toMatchObject({ title: 'Line out 969 more liners of MM.106 for Quillhurst Cider Works\' Dabinett', done: false, doneOn: null })
    const second = run({ id: 32, rowName: '13', linedOutCount: 969, toPosition: 969, linedOutOn: '2026-04-16' })
    const all = nurseryTasks({ contracts: [contract()], runs: [second, first], hemisphere: 'north', today: '2026-05-20' })
    expect(task(all, 'contract-7-linersPlanted')).toMatchObject({ title: 'Line out 1,569 liners of MM.106 for Quillhurst Cider Works\' Dabinett', done: true, doneOn: '2026-04-16', overdue: false })
  })
})

describe('a maiden run through its seasons (north)', () => {
  it('dates each step and job of the run (back-plan; jobs common practice)', () => {
    const tasks = nurseryTasks({ contracts: [contract()], runs: [run()], hemisphere: 'north', today: '2026-06-01' }).filter(t => t.run)
    expect(tasks.map(t => t.step)).toEqual(['budded', 'takeCounted', 'headedBack', 'shootsRemoved', 'dug'])
    expect(dues(tasks)).toEqual({ budded: '2026-09-30', takeCounted: '2027-03-31', headedBack: '2027-03-31', shootsRemoved: '2027-06-30', dug: '2027-11-15' })
    expect(tasks.map(t => t.title)).toEqual([
      'Bud row 12, positions 1–1,450: 1,450 MM.106 liners with Dabinett',
      'Count the take of row 12, positions 1–1,450',
      'Head back row 12, positions 1–1,450 above the Dabinett bud',
      'Remove rootstock shoots from row 12, positions 1–1,450',
      'Dig row 12, positions 1–1,450: Dabinett on MM.106 for Quillhurst Cider Works',
    ])
    expect(tasks[0]!.run).toEqual({ id: 31, rowName: '12', fieldName: 'Nursery Field', fromPosition: 1, toPosition: 1450 })
    expect(tasks.every(t => !t.done && !t.overdue)).toBe(true)
  })

  it('does each task only by its event, on the event\'s day', () => {
    const events = [
      ev('lined-out', '2026-04-14', { count: 1450 }),
      // A clean stem stripped before budding is not the season after heading back.
      ev('shoots-removed', '2026-07-22'),
      ev('budded', '2026-08-18', { count: 1450 }),
      ev('take-counted', '2026-09-15', { count: 1300 }),
    ]
    const tasks = nurseryTasks({ contracts: [contract()], runs: [run({ events })], hemisphere: 'north', today: '2027-04-02' })
    expect(task(tasks, 'run-31-budded')).toMatchObject({ done: true, doneOn: '2026-08-18', overdue: false })
    expect(task(tasks, 'run-31-takeCounted')).toMatchObject({ done: true, doneOn: '2026-09-15' })
    expect(task(tasks, 'run-31-shootsRemoved')).toMatchObject({ done: false, doneOn: null, overdue: false })
    // Heading back was due by 31 March 2027.
    expect(task(tasks, 'run-31-headedBack')).toMatchObject({ done: false, overdue: true })

    const later = [...events, ev('headed-back', '2027-03-20'), ev('shoots-removed', '2027-06-02'), ev('dug', '2027-11-10', { grades: [{ count: 1000 }] })]
    const after = nurseryTasks({ contracts: [contract()], runs: [run({ events: later })], hemisphere: 'north', today: '2027-11-20' })
    expect(task(after, 'run-31-headedBack')).toMatchObject({ done: true, doneOn: '2027-03-20' })
    expect(task(after, 'run-31-shootsRemoved')).toMatchObject({ done: true, doneOn: '2027-06-02' })
    // 1,300 stand after the take count; 1,000 dug leaves 300 in the row: not yet dug.
    expect(task(after, 'run-31-dug')).toMatchObject({ done: false, overdue: true })
    const dugAll = nurseryTasks({ contracts: [contract()], runs: [run({ events: [...later, ev('dug', '2027-11-12', { grades: [{ count: 300 }] })] })], hemisphere: 'north', today: '2027-11-20' })
    expect(task(dugAll, 'run-31-dug')).toMatchObject({ done: true, doneOn: '2027-11-12', overdue: false })
  })

  it('asks for stakes only where the rootstock needs support, by 31 May of the growing season (common practice)', () => {
    expect(nurseryTasks({ contracts: [contract()], runs: [run()], hemisphere: 'north', today: '2026-06-01' }).some(t => t.step === 'staked')).toBe(false)
    const m9 = run({ rootstockDesignation: 'M.9', rootstockNeedsSupport: true })
    const staked = task(nurseryTasks({ contracts: [contract()], runs: [m9], hemisphere: 'north', today: '2026-06-01' }), 'run-31-staked')
    expect(staked).toMatchObject({ title: 'Stake row 12, positions 1–1,450', due: '2027-05-31', done: false })
    const done = nurseryTasks({ contracts: [contract()], runs: [run({ ...m9, events: [...m9.events, ev('staked', '2027-04-10')] })], hemisphere: 'north', today: '2027-06-01' })
    expect(task(done, 'run-31-staked')).toMatchObject({ done: true, doneOn: '2027-04-10' })
  })

  it('names a run of one position as one position', () => {
    const tasks = nurseryTasks({ contracts: [contract()], runs: [run({ fromPosition: 5, toPosition: 5, linedOutCount: 1 })], hemisphere: 'north', today: '2026-06-01' })
    expect(task(tasks, 'run-31-headedBack').title).toBe('Head back row 12, position 5 above the Dabinett bud')
  })
})

describe('the southern hemisphere', () => {
  // Spring 2028 in the south is October 2028: every date six months on, a day past the month's end
  // on its last day (31 March → 30 September, 31 May → 30 November; common practice).
  it('moves every step and job six months on for a spring delivery', () => {
    const m9 = run({ rootstockDesignation: 'M.9', rootstockNeedsSupport: true })
    const tasks = nurseryTasks({ contracts: [contract()], runs: [m9], hemisphere: 'south', today: '2026-06-01' })
    expect(dues(tasks)).toEqual({
      linersPlanted: '2026-10-30', budded: '2027-03-30', takeCounted: '2027-09-30', headedBack: '2027-09-30',
      staked: '2027-11-30', shootsRemoved: '2027-12-30', dug: '2028-05-15', delivered: '2028-10-15',
    })
    // Overdue only against the southern dates: 30 April has passed, 30 October has not.
    expect(task(tasks, 'contract-7-linersPlanted').overdue).toBe(false)
  })

  it('moves an autumn delivery six months back, so it stays in its year', () => {
    const tasks = nurseryTasks({ contracts: [contract({ deliverySeason: 'autumn' })], runs: [run()], hemisphere: 'south', today: '2026-06-01' })
    // North, autumn 2028: liners 2027-04-30, budded 2027-09-30, headed back 2028-03-31, shoots 2028-06-30, dug 2028-11-15, delivered 2028-11-30.
    expect(dues(tasks)).toEqual({
      linersPlanted: '2026-10-30', budded: '2027-03-30', takeCounted: '2027-09-30', headedBack: '2027-09-30',
      shootsRemoved: '2027-12-30', dug: '2028-05-15', delivered: '2028-05-30',
    })
  })
})

describe('other tree types', () => {
  it('a knip tree on an interstem: interstem budded and headed back, the variety budded and headed back, cut back to a knip (back-plan)', () => {
    const knip = contract({ treeType: 'knip', interstem: true, deliverySeason: 'autumn', deliveryYear: 2030 })
    const events = [
      ev('lined-out', '2027-04-14', { count: 500 }),
      ev('interstem-budded', '2027-08-20', { count: 500 }),
      ev('headed-back', '2028-03-10'),
      ev('budded', '2028-08-21', { count: 480 }),
      ev('take-counted', '2028-09-20', { count: 450 }),
      ev('headed-back', '2029-03-12'),
      ev('knip-cut-back', '2030-02-20'),
    ]
    const r = run({ interstem: 'MM.106 interstem', linedOutOn: '2027-04-14', linedOutCount: 500, toPosition: 500, events })
    const tasks = nurseryTasks({ contracts: [knip], runs: [r], hemisphere: 'north', today: '2030-03-01' }).filter(t => t.run)
    expect(tasks.map(t => [t.step, t.due, t.doneOn])).toEqual([
      ['interstemBudded', '2027-09-30', '2027-08-20'],
      ['interstemHeadedBack', '2028-03-31', '2028-03-10'],
      ['budded', '2028-09-30', '2028-08-21'],
      ['takeCounted', '2029-03-31', '2028-09-20'],
      ['headedBack', '2029-03-31', '2029-03-12'],
      ['shootsRemoved', '2029-06-30', null],
      ['knipCutBack', '2030-03-31', '2030-02-20'],
      ['dug', '2030-11-15', null],
    ])
    expect(task(tasks, 'run-31-interstemBudded').title).toBe('Bud row 12, positions 1–500 with the interstem MM.106 interstem: 500 MM.106 liners')
    expect(task(tasks, 'run-31-knipCutBack').title).toBe('Cut back row 12, positions 1–500 to knips')
    expect(task(tasks, 'run-31-shootsRemoved').overdue).toBe(true)
  })

  it('a sleeping eye: take counted by the dig, no heading back, shoots or stakes in the nursery (back-plan)', () => {
    const eye = contract({ treeType: 'sleeping-eye', deliveryYear: 2027, deliverySeason: 'spring' })
    const tasks = nurseryTasks({ contracts: [eye], runs: [run({ rootstockNeedsSupport: true })], hemisphere: 'north', today: '2026-06-01' }).filter(t => t.run)
    // North, spring 2027: budded by 30 September 2026, dug by 15 March 2027 before the bud breaks.
    expect(tasks.map(t => [t.step, t.due])).toEqual([['budded', '2026-09-30'], ['takeCounted', '2027-03-15'], ['dug', '2027-03-15']])
  })

  it('a bench graft: grafted, then its jobs in the season it is lined out (back-plan; common practice)', () => {
    const bench = contract({ treeType: 'bench-graft', deliveryYear: 2027, deliverySeason: 'autumn' })
    const events = [ev('lined-out', '2027-04-10', { count: 300 }), ev('grafted', '2027-04-10', { count: 300 })]
    const r = run({ linedOutOn: '2027-04-10', linedOutCount: 300, toPosition: 300, events })
    const tasks = nurseryTasks({ contracts: [bench], runs: [r], hemisphere: 'north', today: '2027-05-01' })
    expect(tasks.filter(t => t.run).map(t => [t.step, t.due, t.doneOn])).toEqual([
      ['benchGrafted', '2027-03-15', '2027-04-10'],
      ['takeCounted', '2027-06-30', null],
      ['shootsRemoved', '2027-06-30', null],
      ['dug', '2027-11-15', null],
    ])
    // ⌈1200 ÷ 0.765⌉ = 1,569 bench grafts; 300 lined out leaves 1,269 (worked example).
    expect(task(tasks, 'contract-7-linersPlanted').title).toBe('Line out 1,269 more bench grafts of MM.106 for Quillhurst Cider Works\' Dabinett')
  })
})

describe('a delivered contract', () => {
  it('keeps only what was done, delivery on the day delivered', () => {
    const events = [ev('lined-out', '2026-04-14', { count: 1569 }), ev('budded', '2026-08-18', { count: 1569 }), ev('dug', '2027-11-10', { grades: [{ count: 1569 }] })]
    const tasks = nurseryTasks({
      contracts: [contract({ state: 'delivered', deliveredOn: '2028-03-20' })], runs: [run({ linedOutCount: 1569, toPosition: 1569, events })], hemisphere: 'north', today: '2028-06-01',
    })
    expect(tasks.every(t => t.done && !t.overdue)).toBe(true)
    expect(tasks.map(t => t.key)).toEqual(['contract-7-linersPlanted', 'run-31-budded', 'run-31-dug', 'contract-7-delivered'])
    expect(task(tasks, 'contract-7-delivered').doneOn).toBe('2028-03-20')
  })
})

describe('the order and the filters', () => {
  const other = contract({ id: 8, state: 'accepted', varietyName: 'Kingston Black', treeCount: 600, deliveryYear: 2029 })
  const tasks = nurseryTasks({
    contracts: [other, contract()], runs: [run({ events: [ev('lined-out', '2026-04-14', { count: 1450 }), ev('budded', '2026-08-18', { count: 1450 })] })],
    hemisphere: 'north', today: '2026-12-02',
  })

  it('sorts by due date and gives every task its own key', () => {
    const sorted = [...tasks].map(t => t.due)
    expect(sorted).toEqual([...sorted].sort())
    expect(new Set(tasks.map(t => t.key)).size).toBe(tasks.length)
  })

  it('keeps open, overdue or done tasks, a date span, one contract or one run', () => {
    // Lining out for contract 7 is short of 1,569 (1,450 lined out) and was due 30 April 2026.
    expect(filterTasks(tasks, { state: 'overdue' }).map(t => t.key)).toEqual(['contract-7-linersPlanted'])
    expect(filterTasks(tasks, { state: 'done' }).map(t => t.key)).toEqual(['run-31-budded'])
    expect(filterTasks(tasks, { state: 'open' })).toHaveLength(tasks.length - 1)
    expect(filterTasks(tasks, { state: 'all' })).toHaveLength(tasks.length)
    expect(filterTasks(tasks, { from: '2027-01-01', to: '2027-04-30' }).map(t => t.key)).toEqual(['run-31-takeCounted', 'run-31-headedBack', 'contract-8-linersPlanted'])
    expect(filterTasks(tasks, { treeContractId: 8 }).map(t => t.key)).toEqual(['contract-8-linersPlanted', 'contract-8-delivered'])
    expect(filterTasks(tasks, { runId: 31 }).every(t => t.run?.id === 31)).toBe(true)
    expect(filterTasks(tasks, { runId: 31 })).toHaveLength(5)
  })
})
