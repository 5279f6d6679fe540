import { beforeAll, describe, expect, it } from 'vitest'
import { contractFixtures, varietyId } from '../support/contracts'
import { testDb } from '../support/db'
import { as } from '../support/http'
import { nurseryFixtures } from '../support/nursery'
import { demoDabinettContract, mailsAbout, noticesAbout, recorded, scratchNursery } from '../support/progress'

// A tree contract's progress as its buyer reads it, against what the nursery records on the runs
// that serve it through its own API; the notices the buyer gets at each milestone and when fewer
// trees are expected than contracted; and who may read it. Counts are worked by hand beside each
// check with the counting rules of shared/utils/runCounts.ts (common practice: a nursery's row book).
const MARK = 'Progress test'
const { treeContract } = contractFixtures(MARK)
const { run } = nurseryFixtures(MARK)
const otherNurseryOwner = scratchNursery(MARK)
const db = testDb()

let dabinett: number
beforeAll(async () => {
  dabinett = await varietyId('Dabinett')
})

const bud = (happenedOn: string, count: number) => ({ kind: 'budded', happenedOn, method: 'chip-bud', varietyId: dabinett, count })
const shortfallTold = async (id: number) => (await db('tree_contracts').where({ id }).first('shortfall_noticed_trees')).shortfall_noticed_trees as number | null
const kinds = async (email: string, id: number) => (await noticesAbout(email, id)).map(n => n.kind)

interface RunAnswer { counts: { linedOut: number, worked: number, taken: number | null, standing: number, dug: number }, expected: { trees: number } }

describe('a contract\'s progress from the events its runs record', () => {
  it('sums the runs\' events, tells the buyer of each milestone once and warns of a shortfall', async () => {
    const nursery = await as('growerMember')
    const buyer = await as('makerOwner')
    // 300 trees at 85 % take and 90 % survival to sale, grown on two runs of 200 liners each.
    const id = await treeContract('propagating', { tree_count: 300, take_rate: 0.85, survival_rate: 0.9 })
    const a = await run({ linedOut: 200, treeContractId: id })
    const b = await run({ linedOut: 200, treeContractId: id })
    // Another run of the nursery's, and a run of another contract: never in this contract's answer.
    const loose = await run({ linedOut: 50 })
    const elsewhere = await run({ linedOut: 30, treeContractId: await treeContract('propagating') })
    for (const r of [loose, elsewhere]) await recorded(nursery, r, bud('2025-08-18', 20))

    // Before budding each run is expected to finish ⌊200 × 0.85 × 0.9⌋ = 153: 306 ≥ 300.
    await recorded(nursery, a, bud('2025-08-18', 190))
    await recorded(nursery, a, bud('2025-08-25', 10)) // a second pass: no second notice
    await recorded(nursery, b, bud('2025-08-19', 198))
    expect(await kinds('maker@demo.test', id)).toEqual(['tree_contract.budded', 'tree_contract.budded'])
    const [first] = await noticesAbout('maker@demo.test', id)
    expect(first!.subject).toBe('Hollowmere Orchard & Nursery budded 190 of your Dabinett on MM.106')
    expect(first!.body).toContain('Hollowmere Orchard & Nursery budded 190 of your Dabinett on MM.106 on 18 August 2025, in row')
    expect(first!.body).toContain('The nursery now expects 306 finished trees for the 300 contracted.')

    // A: 170 took, ⌊170 × 0.9⌋ = 153. B: 160 took, ⌊160 × 0.9⌋ = 144. 297 < 300: the buyer is warned.
    await recorded(nursery, a, { kind: 'take-counted', happenedOn: '2025-09-15', count: 170 })
    expect(await shortfallTold(id)).toBeNull()
    await recorded(nursery, b, { kind: 'take-counted', happenedOn: '2025-09-16', count: 160 })
    expect(await shortfallTold(id)).toBe(297)
    const warning = (await noticesAbout('maker@demo.test', id)).at(-1)!
    expect(warning).toMatchObject({ kind: 'tree_contract.shortfall', subject: 'Fewer trees expected: 297 of your 300 Dabinett on MM.106' })
    expect(warning.body).toContain('expected to finish 297 trees, 3 fewer than the 300 contracted')

    // B loses 2: ⌊158 × 0.9⌋ = 142, 295 in all: 2 lower than told, under 1 % of 300 (3): not told again.
    await recorded(nursery, b, { kind: 'loss', happenedOn: '2025-11-01', count: 2, cause: 'rodents' })
    expect(await shortfallTold(id)).toBe(297)
    // A loses 1: ⌊169 × 0.9⌋ = 152, 294 in all: 3 lower than told: told again.
    await recorded(nursery, a, { kind: 'loss', happenedOn: '2025-11-02', count: 1, cause: 'rodents' })
    expect(await shortfallTold(id)).toBe(294)

    await recorded(nursery, a, { kind: 'headed-back', happenedOn: '2026-03-10' })
    await recorded(nursery, b, { kind: 'headed-back', happenedOn: '2026-03-11' })
    // B dug out: 158 dug count in full, 152 + 158 = 310 ≥ 300: the figure told is forgotten.
    await recorded(nursery, b, { kind: 'dug', happenedOn: '2026-11-10', grades: [{ caliperMm: 14, heightCm: 160, feathered: true, count: 100 }, { caliperMm: 11, count: 58 }] })
    expect(await shortfallTold(id)).toBeNull()
    // A loses 13: ⌊156 × 0.9⌋ = 140, 298 in all: below again, told as a new fall.
    await recorded(nursery, a, { kind: 'loss', happenedOn: '2026-06-01', count: 13, cause: 'breakage' })
    expect(await shortfallTold(id)).toBe(298)
    // A dug in part: 100 + ⌊56 × 0.9⌋ = 150, 308 in all.
    await recorded(nursery, a, { kind: 'dug', happenedOn: '2026-11-12', grades: [{ caliperMm: 14, heightCm: 160, feathered: true, count: 60 }, { caliperMm: 12, count: 40 }] })
    expect(await shortfallTold(id)).toBeNull()

    const told = [
      'tree_contract.budded', 'tree_contract.budded', 'tree_contract.take-counted', 'tree_contract.take-counted', 'tree_contract.shortfall',
      'tree_contract.shortfall', 'tree_contract.headed-back', 'tree_contract.headed-back', 'tree_contract.dug', 'tree_contract.shortfall', 'tree_contract.dug',
    ]
    expect(await kinds('maker@demo.test', id)).toEqual(told)
    // Each notice is an e-mail in the outbox too; the buyer's viewer and the nursery's people are told nothing.
    expect((await mailsAbout('maker@demo.test', id)).map(m => m.kind)).toEqual(told)
    expect(await kinds('viewer@demo.test', id)).toEqual([])
    expect(await kinds('grower@demo.test', id)).toEqual([])
    expect(await db('tree_contract_milestones').where({ tree_contract_id: id }).count({ n: '*' }).first()).toEqual({ n: 8 })
    const notices = await noticesAbout('maker@demo.test', id)
    expect(notices[2]!.body).toContain('170 of 200 took (85.0 %)')
    expect(notices[6]!.subject).toBe('Hollowmere Orchard & Nursery headed back 169 of your Dabinett on MM.106')
    expect(notices[8]!.body).toContain('(100 at 14 mm, 160 cm, feathered; 58 at 11 mm). 0 still stand in that run.')

    // The buyer's answer is the sum of what the nursery's own pages show of its two runs.
    const res = await buyer.get(`/api/tree-contracts/${id}/progress`)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    const p = res.body
    const runs: RunAnswer[] = await Promise.all([a, b].map(async r => (await nursery.get(`/api/nursery/runs/${r}`)).body))
    const sum = (f: (r: RunAnswer) => number) => runs.reduce((s, r) => s + f(r), 0)
    expect(p.stages.linedOut).toEqual({ count: sum(r => r.counts.linedOut), firstOn: '2025-03-20', lastOn: '2025-03-20' })
    // 190 + 10 + 198 = 398 budded; 170 + 160 = 330 took; 56 + 0 stand; 100 + 158 = 258 dug.
    expect(p.stages.worked).toEqual({ count: sum(r => r.counts.worked), firstOn: '2025-08-18', lastOn: '2025-08-25' })
    expect(p.stages.worked.count).toBe(398)
    expect(p.stages.taken).toEqual({ count: sum(r => r.counts.taken ?? 0), firstOn: '2025-09-15', lastOn: '2025-09-16', runs: 2 })
    expect(p.stages.taken.count).toBe(330)
    // Headed back with 169 and 158 standing.
    expect(p.stages.headedBack).toEqual({ count: 327, firstOn: '2026-03-10', lastOn: '2026-03-11', runs: 2 })
    expect(p.stages.standing).toEqual({ count: sum(r => r.counts.standing), asOf: '2026-11-12' })
    expect(p.stages.standing.count).toBe(56)
    expect(p.stages.dug).toEqual({
      count: sum(r => r.counts.dug), firstOn: '2026-11-10', lastOn: '2026-11-12',
      grades: [
        { caliperMm: 14, heightCm: 160, feathered: true, count: 160 },
        { caliperMm: 12, heightCm: null, feathered: false, count: 40 },
        { caliperMm: 11, heightCm: null, feathered: false, count: 58 },
      ],
    })
    expect(p.stages.dug.count).toBe(258)
    expect(p.takeRate).toBeCloseTo(330 / 398, 12)
    expect(p.expected).toEqual({ trees: sum(r => r.expected.trees), contracted: 300, shortfall: 0 })
    expect(p.expected.trees).toBe(308)
    // A still stands in part, so digging is not done on every run: the next step is the dig (2027-11-15 for spring 2028, backplan.ts).
    expect(p.nextStep).toMatchObject({ step: 'dug', runsDone: 1, runs: 2 })

    // Only this contract's runs, and only what the buyer needs of them.
    expect(p.runs.map((r: { id: number }) => r.id).sort()).toEqual([a, b].sort())
    expect(p.runs[0]).toEqual({
      id: expect.any(Number), rowName: expect.any(String), fieldName: expect.stringContaining(MARK), fromPosition: 1, toPosition: 200, linedOutOn: '2025-03-20',
      counts: expect.objectContaining({ linedOut: 200 }), expected: expect.any(Number),
    })
    expect(JSON.stringify(p)).not.toMatch(/tagCode|notes|budwood/)
    // The nursery reads the same.
    expect((await nursery.get(`/api/tree-contracts/${id}/progress`)).body).toEqual(p)

    // Marking the trees ready tells the buyer through the contract's own move.
    expect((await (await as('growerOwner')).post(`/api/tree-contracts/${id}/mark-ready`, {})).status).toBe(200)
    const ready = (await noticesAbout('maker@demo.test', id)).at(-1)!
    expect(ready).toMatchObject({ kind: 'tree_contract.marked-ready', subject: 'Hollowmere Orchard & Nursery has the trees ready for the tree contract for 300 Dabinett on MM.106' })
    expect((await mailsAbout('maker@demo.test', id)).at(-1)!.kind).toBe('tree_contract.marked-ready')
  })

  it('tells nobody of the runs of a contract no longer being grown, or of a run serving none', async () => {
    const nursery = await as('growerMember')
    const id = await treeContract('accepted', { tree_count: 100 })
    const r = await run({ linedOut: 100, treeContractId: id })
    await db('tree_contracts').where({ id }).update({ state: 'cancelled', cancelled_by: 'buyer' })
    await recorded(nursery, r, bud('2025-08-18', 100))
    await recorded(nursery, r, { kind: 'take-counted', happenedOn: '2025-09-15', count: 10 })
    expect(await kinds('maker@demo.test', id)).toEqual([])
    expect(await db('tree_contract_milestones').where({ tree_contract_id: id }).first()).toBeUndefined()
    const progress = (await (await as('makerOwner')).get(`/api/tree-contracts/${id}/progress`)).body
    expect(progress.stages.taken.count).toBe(10)
    expect(progress.nextStep).toBeNull()
  })
})

describe('who reads a contract\'s progress', () => {
  it('answers both parties and nobody else', async () => {
    const id = await treeContract('accepted')
    expect((await (await as('makerOwner')).get(`/api/tree-contracts/${id}/progress`)).status).toBe(200)
    expect((await (await as('makerViewer')).get(`/api/tree-contracts/${id}/progress`)).status).toBe(200)
    expect((await (await as('growerOwner')).get(`/api/tree-contracts/${id}/progress`)).status).toBe(200)
    // Another maker, a grower that is no party and a nursery that is no party: 404, as for an unknown contract.
    expect((await (await as('maker2Owner')).get(`/api/tree-contracts/${id}/progress`)).status).toBe(404)
    expect((await (await as('grower2Owner')).get(`/api/tree-contracts/${id}/progress`)).status).toBe(404)
    expect((await (await otherNurseryOwner()).get(`/api/tree-contracts/${id}/progress`)).status).toBe(404)
    expect((await (await as('makerOwner')).get('/api/tree-contracts/999999999/progress')).status).toBe(404)
    // The buyer's draft is its own.
    expect((await (await as('growerOwner')).get(`/api/tree-contracts/${await treeContract('draft')}/progress`)).status).toBe(404)
    const bad = await (await as('makerOwner')).get('/api/tree-contracts/abc/progress')
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues[0].path).toBe('id')
  })

  it('with no run yet: nothing counted, the whole contract short, lining out next', async () => {
    const id = await treeContract('accepted', { tree_count: 250 })
    const p = (await (await as('makerOwner')).get(`/api/tree-contracts/${id}/progress`)).body
    expect(p.runs).toEqual([])
    expect(p.stages.linedOut).toEqual({ count: 0, firstOn: null, lastOn: null })
    expect(p.expected).toEqual({ trees: 0, contracted: 250, shortfall: 250 })
    expect(p.nextStep).toMatchObject({ step: 'linersPlanted', runsDone: 0, runs: 0 })
  })
})

describe('the demo\'s Dabinett contract', () => {
  it('shows Quillhurst the counts of each step to date on its three runs', async () => {
    const id = await demoDabinettContract()
    const res = await (await as('makerOwner')).get(`/api/tree-contracts/${id}/progress`)
    expect(res.status).toBe(200)
    const p = res.body
    // Rows 10–12 of server/db/seeds/06_demo_nursery.ts: 600 + 600 + 369 = 1,569 lined out in April 2026.
    expect(p.runs.map((r: { rowName: string }) => r.rowName)).toEqual(['10', '11', '12'])
    expect(p.stages.linedOut).toEqual({ count: 1569, firstOn: '2026-04-14', lastOn: '2026-04-15' })
    // 597 + 596 + 367 = 1,560 budded on 18 and 19 August; 527 + 519 + 322 = 1,368 took.
    expect(p.stages.worked).toEqual({ count: 1560, firstOn: '2026-08-18', lastOn: '2026-08-19' })
    expect(p.stages.taken).toEqual({ count: 1368, firstOn: '2026-09-15', lastOn: '2026-09-16', runs: 3 })
    // Less the losses after the take (7, 5, 3): 520 + 514 + 319 = 1,353 stand; not yet headed back or dug.
    expect(p.stages.standing.count).toBe(1353)
    expect(p.stages.headedBack.count).toBe(0)
    expect(p.stages.dug.count).toBe(0)
    // ⌊520 × 0.9⌋ + ⌊514 × 0.9⌋ + ⌊319 × 0.9⌋ = 468 + 462 + 287 = 1,217 expected of the 1,200.
    expect(p.expected).toEqual({ trees: 1217, contracted: 1200, shortfall: 0 })
    expect(p.takeRate).toBeCloseTo(1368 / 1560, 12)
    // Heading back while dormant, by 31 March 2027 for spring 2028 (backplan.ts, common practice).
    expect(p.nextStep).toMatchObject({ step: 'headedBack', by: '2027-03-31', runsDone: 0, runs: 3 })
    // The Kingston Black run for sale is not the contract's.
    expect(p.runs).toHaveLength(3)
  })
})
