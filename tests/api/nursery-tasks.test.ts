import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { contractFixtures, orgId, varietyId } from '../support/contracts'
import { testDb } from '../support/db'
import { as } from '../support/http'
import { nurseryFixtures } from '../support/nursery'

// The season calendar through the API: tasks from each contract's back-plan, done only when the
// matching event is recorded on the run, overdue once their day has passed, in the nursery's
// hemisphere, and never another nursery's. The dates are the back-plan's (shared/utils/backplan.ts:
// cycle after Penn State / eXtension, days of the month common practice); the jobs between them
// (take counted, shoots removed) common practice. Dates are worked from this year, so every check
// holds whatever day the tests run.
const MARK = 'Tasks test'
const { treeContract } = contractFixtures(MARK)
const { run } = nurseryFixtures(MARK)
const db = testDb()

const year = new Date().getUTCFullYear()
let hollowmere: number
let dabinett: number

beforeAll(async () => {
  hollowmere = await orgId('hollowmere')
  dabinett = await varietyId('Dabinett')
})

afterAll(async () => {
  await db('organisations').where({ id: hollowmere }).update({ hemisphere: 'north' })
})

interface Task { key: string, step: string, title: string, due: string, done: boolean, doneOn: string | null, overdue: boolean, run: { id: number } | null, contract: { id: number, varietyName: string } }

async function tasksOf(query: string): Promise<Task[]> {
  const res = await (await as('growerOwner')).get(`/api/nursery/tasks?${query}`)
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  expect(res.body.total).toBe(res.body.items.length)
  return res.body.items
}

const byKey = (tasks: Task[], key: string) => {
  const task = tasks.find(t => t.key === key)
  expect(task, `${key} in ${tasks.map(t => t.key).join(', ')}`).toBeDefined()
  return task!
}

async function record(runId: number, body: Record<string, unknown>) {
  const res = await (await as('growerMember')).post(`/api/nursery/runs/${runId}/events`, body)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
}

describe('the demo nursery\'s calendar', () => {
  it('has tasks done (lined out, budded, take counted) and tasks still to do (heading back, digging), in due order', async () => {
    const tasks = await tasksOf('')
    expect(tasks.some(t => t.done)).toBe(true)
    expect(tasks.some(t => !t.done)).toBe(true)
    const dues = tasks.map(t => t.due)
    expect(dues).toEqual([...dues].sort())
    // Quillhurst's 1,200 Dabinett for spring 2028: ⌈1200 ÷ (0.85 × 0.9)⌉ = 1,569 liners, lined out by
    // 30 April 2026 (worked example; back-plan), and the rows lined out 14 and 15 April do it.
    const lineOut = tasks.find(t => t.title === 'Line out 1,569 liners of MM.106 for Quillhurst Cider Works\' Dabinett')
    expect(lineOut).toMatchObject({ done: true, doneOn: '2026-04-15', due: '2026-04-30', overdue: false })
    const dabinett = tasks.filter(t => t.contract.varietyName === 'Dabinett')
    const budded = dabinett.filter(t => t.step === 'budded' && t.done)
    expect(budded.map(t => t.doneOn).sort()).toEqual(['2026-08-18', '2026-08-18', '2026-08-19'])
    // Heading back by 31 March 2027 (back-plan).
    expect(dabinett.filter(t => t.step === 'headedBack').map(t => [t.due, t.done])).toEqual([['2027-03-31', false], ['2027-03-31', false], ['2027-03-31', false]])
    // Tansy Row's Stoke Red for spring 2027, dug on 16 November 2026 (by 15 November, so done late), still to deliver.
    const stokeRed = tasks.filter(t => t.contract.varietyName === 'Stoke Red')
    expect(stokeRed.find(t => t.step === 'dug')).toMatchObject({ done: true, doneOn: '2026-11-16' })
    expect(stokeRed.find(t => t.step === 'delivered')).toMatchObject({ done: false, due: '2027-04-15' })
  })
})

describe('tasks done by the events recorded on the run', () => {
  it('marks budding overdue, then done the day it was recorded; the rest follow their own events', async () => {
    // A maiden for autumn this year: liners by 30 April last year, budded by 30 September last year.
    // ⌈100 ÷ 0.765⌉ = 131 rootstocks (worked example).
    const contractId = await treeContract('propagating', { tree_count: 100, delivery_year: year, delivery_season: 'autumn' })
    const runId = await run({ linedOut: 131, treeContractId: contractId, linedOutOn: `${year - 1}-04-20` })
    const before = await tasksOf(`treeContractId=${contractId}`)
    expect(before.map(t => t.step)).toEqual(['linersPlanted', 'budded', 'takeCounted', 'headedBack', 'shootsRemoved', 'dug', 'delivered'])
    expect(byKey(before, `contract-${contractId}-linersPlanted`)).toMatchObject({ due: `${year - 1}-04-30`, done: true, doneOn: `${year - 1}-04-20`, run: null })
    expect(byKey(before, `run-${runId}-budded`)).toMatchObject({ due: `${year - 1}-09-30`, done: false, doneOn: null, overdue: true, run: { id: runId } })
    expect((await tasksOf(`treeContractId=${contractId}&state=overdue`)).map(t => t.key)).toContain(`run-${runId}-budded`)

    await record(runId, { kind: 'budded', happenedOn: `${year - 1}-08-20`, method: 'chip-bud', varietyId: dabinett, count: 131 })
    await record(runId, { kind: 'take-counted', happenedOn: `${year - 1}-09-18`, count: 120 })
    const after = await tasksOf(`runId=${runId}`)
    expect(after.every(t => t.run?.id === runId)).toBe(true)
    expect(byKey(after, `run-${runId}-budded`)).toMatchObject({ done: true, doneOn: `${year - 1}-08-20`, overdue: false })
    expect(byKey(after, `run-${runId}-takeCounted`)).toMatchObject({ done: true, doneOn: `${year - 1}-09-18`, due: `${year}-03-31` })
    expect(byKey(after, `run-${runId}-headedBack`)).toMatchObject({ done: false, due: `${year}-03-31` })
    const done = await tasksOf(`treeContractId=${contractId}&state=done`)
    expect(done.map(t => t.key).sort()).toEqual([`contract-${contractId}-linersPlanted`, `run-${runId}-budded`, `run-${runId}-takeCounted`].sort())
    expect((await tasksOf(`treeContractId=${contractId}&state=overdue`)).map(t => t.key)).not.toContain(`run-${runId}-budded`)
    expect(await tasksOf(`treeContractId=${contractId}&state=open`)).toHaveLength(4)
    // The due-date span: only what falls in March this year (the take and heading back).
    expect((await tasksOf(`treeContractId=${contractId}&from=${year}-03-01&to=${year}-03-31`)).map(t => t.step)).toEqual(['takeCounted', 'headedBack'])
  })

  it('does the interstem\'s steps and the knip cut-back by their own events; the interstem\'s lot must be the nursery\'s', async () => {
    // A knip tree on an interstem for autumn next year: lined out two springs ago (back-plan).
    const contractId = await treeContract('propagating', { tree_count: 100, tree_type: 'knip', interstem: true, delivery_year: year + 1, delivery_season: 'autumn' })
    const runId = await run({ linedOut: 131, treeContractId: contractId, linedOutOn: `${year - 2}-04-20` })
    // Until the run names its interstem, there is no interstem to bud.
    const noInterstem = await (await as('growerMember')).post(`/api/nursery/runs/${runId}/events`, { kind: 'interstem-budded', happenedOn: `${year - 2}-08-20`, method: 'chip-bud', count: 131 })
    expect(noInterstem.status).toBe(400)
    expect(noInterstem.body.data.issues[0].path).toBe('kind')
    await db('nursery_runs').where({ id: runId }).update({ interstem: 'MM.106' })
    const [theirLot] = await db('budwood_lots').insert({ org_id: await orgId('tansyRow'), label: `${MARK} theirs`, variety_id: dabinett, cut_on: `${year - 2}-08-10`, source_kind: 'own-block', sticks: 10 })
    const [ownLot] = await db('budwood_lots').insert({ org_id: hollowmere, label: `${MARK} interstem`, variety_id: await varietyId('Kingston Black'), cut_on: `${year - 2}-08-10`, source_kind: 'own-block', sticks: 10 })

    const member = await as('growerMember')
    const refused = await member.post(`/api/nursery/runs/${runId}/events`, { kind: 'interstem-budded', happenedOn: `${year - 2}-08-20`, method: 'chip-bud', count: 131, budwoodLotId: theirLot })
    expect(refused.status).toBe(400)
    expect(refused.body.data.issues).toEqual([{ path: 'budwoodLotId', message: 'No budwood lot of your nursery has that id' }])

    await record(runId, { kind: 'interstem-budded', happenedOn: `${year - 2}-08-20`, method: 'chip-bud', count: 131, budwoodLotId: ownLot, dayOrder: 1 })
    await record(runId, { kind: 'headed-back', happenedOn: `${year - 1}-03-10` })
    await record(runId, { kind: 'budded', happenedOn: `${year - 1}-08-21`, method: 'chip-bud', varietyId: dabinett, count: 131 })
    await record(runId, { kind: 'headed-back', happenedOn: `${year - 1}-11-20` })
    await record(runId, { kind: 'knip-cut-back', happenedOn: `${year - 1}-12-01` })
    const tasks = await tasksOf(`runId=${runId}`)
    expect(tasks.filter(t => t.done).map(t => [t.step, t.doneOn])).toEqual([
      ['interstemBudded', `${year - 2}-08-20`],
      ['interstemHeadedBack', `${year - 1}-03-10`],
      ['budded', `${year - 1}-08-21`],
      ['headedBack', `${year - 1}-11-20`],
      ['knipCutBack', `${year - 1}-12-01`],
    ])
    expect(byKey(tasks, `run-${runId}-knipCutBack`).due).toBe(`${year + 1}-03-31`)
    expect(byKey(tasks, `run-${runId}-dug`)).toMatchObject({ done: false, due: `${year + 1}-11-15` })
  })
})

describe('the nursery\'s hemisphere', () => {
  it('moves every date six months in the south: the calendar and the contract\'s back-plan', async () => {
    const contractId = await treeContract('accepted', { tree_count: 100, delivery_year: year + 2, delivery_season: 'autumn' })
    const north = await tasksOf(`treeContractId=${contractId}`)
    expect(north.map(t => t.due)).toEqual([`${year + 1}-04-30`, `${year + 2}-11-30`])
    await db('organisations').where({ id: hollowmere }).update({ hemisphere: 'south' })
    try {
      // Autumn in the south is May: six months back, in the same delivery year (common practice).
      const south = await tasksOf(`treeContractId=${contractId}`)
      expect(south.map(t => [t.step, t.due])).toEqual([['linersPlanted', `${year}-10-30`], ['delivered', `${year + 2}-05-30`]])
      // The buyer (in the north) sees the plan in the nursery's season.
      const contract = await (await as('makerOwner')).get(`/api/tree-contracts/${contractId}`)
      expect(contract.body.backPlan.steps.map((s: { by: string }) => s.by)).toEqual([`${year}-10-30`, `${year + 1}-03-30`, `${year + 1}-09-30`, `${year + 2}-05-15`, `${year + 2}-05-30`])
    }
    finally {
      await db('organisations').where({ id: hollowmere }).update({ hemisphere: 'north' })
    }
  })

  it('the public back-plan calculator takes a hemisphere', async () => {
    const calc = await (await as('anonymous')).get('/api/calc/backplan?deliveryYear=2030&season=spring&trees=500&takePct=85&survivalPct=90&hemisphere=south')
    expect(calc.status).toBe(200)
    // Spring 2030 in the south is October: six months on (common practice; hand-worked in tests/unit/backplan.test.ts).
    expect(calc.body.hemisphere).toBe('south')
    expect(calc.body.steps.map((s: { by: string }) => s.by)).toEqual(['2028-10-30', '2029-03-30', '2029-09-30', '2030-05-15', '2030-10-15'])
    const bad = await (await as('anonymous')).get('/api/calc/backplan?deliveryYear=2030&season=spring&trees=500&takePct=85&survivalPct=90&hemisphere=east')
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues[0]).toEqual({ path: 'hemisphere', message: 'Choose north or south' })
  })
})

describe('only the nursery\'s own', () => {
  it('never shows another nursery\'s contract, nor another organisation\'s run serving its contract', async () => {
    const theirs = await treeContract('propagating', { nursery_org_id: await orgId('tansyRow') })
    const ours = await treeContract('propagating')
    const theirRun = await run({ org: 'tansyRow', treeContractId: ours })
    const all = await tasksOf('limit=200')
    expect(all.some(t => t.contract.id === theirs)).toBe(false)
    expect(await tasksOf(`treeContractId=${theirs}`)).toEqual([])
    expect(await tasksOf(`runId=${theirRun}`)).toEqual([])
    expect((await tasksOf(`treeContractId=${ours}`)).map(t => t.key)).toEqual([`contract-${ours}-linersPlanted`, `contract-${ours}-delivered`])
  })

  it('leaves out contracts not yet agreed or ended without delivery', async () => {
    const offered = await treeContract('offered')
    const cancelled = await treeContract('cancelled')
    expect(await tasksOf(`treeContractId=${offered}`)).toEqual([])
    expect(await tasksOf(`treeContractId=${cancelled}`)).toEqual([])
  })
})

describe('a bad query', () => {
  it('answers 400 naming the field', async () => {
    const nursery = await as('growerOwner')
    const cases: [string, string][] = [
      ['state=later', 'state'],
      ['from=2026-13-01', 'from'],
      ['to=tomorrow', 'to'],
      ['from=2027-05-01&to=2027-04-01', 'to'],
      ['treeContractId=abc', 'treeContractId'],
      ['runId=-3', 'runId'],
      ['limit=0', 'limit'],
      ['offset=-1', 'offset'],
    ]
    for (const [query, path] of cases) {
      const res = await nursery.get(`/api/nursery/tasks?${query}`)
      expect(res.status, query).toBe(400)
      expect(res.body.data.issues.map((i: { path: string }) => i.path), query).toContain(path)
    }
  })
})
