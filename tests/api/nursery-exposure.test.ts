import { beforeAll, describe, expect, it } from 'vitest'
import { contractFixtures, orgId, userId } from '../support/contracts'
import { testDb } from '../support/db'
import { exposureFixtures } from '../support/exposure'
import { as } from '../support/http'

// A budwood lot suspected of fire blight, through the API. The rule (Smith 2002, Acta
// Horticulturae 590:109): the lot exposes every run worked with it, and every run the same person
// worked after it on the same day (the knife carries it). A hand-worked book of budding, all
// Hollowmere's unless said, each run lined out with 100 on 2023-04-01:
//   r1  Ines,  14 Aug 2023, no. 2, budded with the suspect lot   → on the list (with the lot)
//   r2  Ines,  14 Aug, no. 3, budded with another lot            → on the list (after it)
//   r3  Ines,  14 Aug, no. 1, another lot                        → not: before the suspect lot
//   r4  Tomas, 14 Aug, no. 4, another lot                        → not: other hands
//   r5  Ines,  15 Aug, no. 1, another lot                        → not: another day
//   r6  Ines,  14 Aug, no. 4, interstem budded, another lot      → on the list (after it)
//   r7  Tomas, 16 Aug, no. 1, interstem budded with the lot      → on the list (with the lot)
//   r8  Tansy Row's run, 14 Aug, names the lot's id              → not: another organisation's
// The days are this file's own, so no other test's budding falls on them.
const MARK = 'Exposure test'
const { treeContract } = contractFixtures(MARK)
const { run, lot, work } = exposureFixtures(MARK)
const db = testDb()

interface Item { run: { id: number, rowName: string, counts: { standing: number, worked: number, dug: number } }, reason: string, events: { id: number }[], contract: { id: number, buyerOrgName: string } | null }
const byRun = (items: Item[]) => [...items].sort((a, b) => a.run.id - b.run.id)

const people: Record<'ines' | 'tomas' | 'olu' | 'greta' | 'priya' | 'dara', number> = { ines: 0, tomas: 0, olu: 0, greta: 0, priya: 0, dara: 0 }
const INES = 'grower@demo.test'
const TOMAS = 'grower-member@demo.test'

/** The budwood notices one person has about the lot (its label is this file's own). */
async function noticesOf(user: number, label: string) {
  return db('notices').where({ user_id: user, kind: 'budwood.suspect' }).andWhere('body', 'like', `%${label}%`).orderBy('id').select('subject', 'body', 'link')
}

let suspect: { id: number, label: string }
let r: Record<'r1' | 'r2' | 'r3' | 'r4' | 'r5' | 'r6' | 'r7' | 'r8', number>
let events: Record<'r1' | 'r2' | 'r6' | 'r7', number>
let contracts: Record<'a' | 'b' | 'c', number>

beforeAll(async () => {
  Object.assign(people, {
    ines: await userId(INES), tomas: await userId(TOMAS), olu: await userId('maker@demo.test'), greta: await userId('viewer@demo.test'),
    priya: await userId('grower2@demo.test'), dara: await userId('maker2@demo.test'),
  })
  suspect = await lot()
  const other = await lot()
  contracts = {
    a: await treeContract('propagating'),
    b: await treeContract('accepted'),
    c: await treeContract('accepted', { buyer_org_id: await orgId('tansyRow') }),
  }
  const linedOutOn = '2023-04-01'
  r = {
    r1: await run({ linedOutOn, treeContractId: contracts.a }), r2: await run({ linedOutOn, treeContractId: contracts.b }), r3: await run({ linedOutOn, treeContractId: contracts.a }),
    r4: await run({ linedOutOn }), r5: await run({ linedOutOn }), r6: await run({ linedOutOn }), r7: await run({ linedOutOn, treeContractId: contracts.c }),
    r8: await run({ linedOutOn, org: 'tansyRow' }),
  }
  events = {
    r1: await work(r.r1, { on: '2023-08-14', by: INES, dayOrder: 2, lotId: suspect.id, count: 100 }),
    r2: await work(r.r2, { on: '2023-08-14', by: INES, dayOrder: 3, lotId: other.id, count: 100 }),
    r6: await work(r.r6, { on: '2023-08-14', by: INES, dayOrder: 4, lotId: other.id, kind: 'interstem-budded', count: 100 }),
    r7: await work(r.r7, { on: '2023-08-16', by: TOMAS, dayOrder: 1, lotId: suspect.id, kind: 'interstem-budded', count: 100 }),
  }
  await work(r.r3, { on: '2023-08-14', by: INES, dayOrder: 1, lotId: other.id, count: 100 })
  await work(r.r4, { on: '2023-08-14', by: TOMAS, dayOrder: 4, lotId: other.id, count: 100 })
  await work(r.r5, { on: '2023-08-15', by: INES, dayOrder: 1, lotId: other.id, count: 100 })
  await work(r.r8, { on: '2023-08-14', by: 'grower2@demo.test', dayOrder: 5, lotId: suspect.id, count: 100, org: 'tansyRow' })
  // Ten of r1 lost to rodents: 90 stand.
  await db('propagation_events').insert({ org_id: await orgId('hollowmere'), run_id: r.r1, kind: 'loss', happened_on: '2023-09-20', count: 10, cause: 'rodents', by_name: 'Test' })
})

describe('the exposure list of a budwood lot', () => {
  it('lists exactly the runs worked with the lot or after it that day by the same person, with counts, rows and contracts', async () => {
    const nursery = await as('growerOwner')
    const res = await nursery.get(`/api/nursery/budwood/${suspect.id}/exposure`)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body.lot).toMatchObject({ id: suspect.id, label: suspect.label, varietyName: 'Dabinett', suspect: null })
    const items = byRun(res.body.items)
    expect(items.map(i => i.run.id)).toEqual([r.r1, r.r2, r.r6, r.r7])
    const rowOf = async (id: number) => (await db('nursery_runs as n').join('nursery_rows as w', 'w.id', 'n.row_id').where('n.id', id).first('w.name')).name
    const quillhurst = 'Quillhurst Cider Works'
    expect(items[0]).toEqual({
      run: {
        id: r.r1, rowName: await rowOf(r.r1), fieldName: expect.stringContaining(MARK), fromPosition: 1, toPosition: 100, varietyName: 'Dabinett', rootstockDesignation: 'MM.106',
        // 100 lined out, 100 budded, 10 lost: 90 stand (the run's own counts).
        counts: { standing: 90, worked: 100, dug: 0 },
      },
      reason: 'budded-with-lot',
      events: [{ id: events.r1, kind: 'budded', happenedOn: '2023-08-14', byName: 'Ines Varga', dayOrder: 2, count: 100, budwoodLotId: suspect.id, budwoodLabel: suspect.label }],
      contract: { id: contracts.a, buyerOrgName: quillhurst },
    })
    expect(items[1]).toMatchObject({ reason: 'budded-after-lot', run: { counts: { standing: 100, worked: 100, dug: 0 } }, events: [{ id: events.r2, dayOrder: 3 }], contract: { id: contracts.b, buyerOrgName: quillhurst } })
    // Interstem budding is working a run with a knife too, with the lot or after it.
    expect(items[2]).toMatchObject({ reason: 'budded-after-lot', events: [{ id: events.r6, kind: 'interstem-budded' }], contract: null })
    expect(items[3]).toMatchObject({ reason: 'budded-with-lot', events: [{ id: events.r7, kind: 'interstem-budded', byName: 'Tomas Reyne' }], contract: { id: contracts.c, buyerOrgName: 'Tansy Row Fruit' } })
    // 90 + 100 + 100 + 100 standing; contracts a, b and c.
    expect(res.body.totals).toEqual({ runs: 4, standing: 390, contracts: 3 })
  })

  it('shows the demo lot HM-BW-26-01 reaching the two Dabinett runs of rows 10 and 11', async () => {
    const demoLot = await db('budwood_lots').where({ label: 'HM-BW-26-01', org_id: await orgId('hollowmere') }).first('id')
    const res = await (await as('growerMember')).get(`/api/nursery/budwood/${demoLot.id}/exposure`)
    expect(res.status).toBe(200)
    const items = res.body.items as Item[]
    expect(items.map(i => i.run.rowName).sort()).toEqual(['10', '11'])
    expect(items.map(i => i.reason)).toEqual(['budded-with-lot', 'budded-with-lot'])
    expect(items.every(i => i.contract?.buyerOrgName === 'Quillhurst Cider Works')).toBe(true)
    expect(res.body.totals).toMatchObject({ runs: 2, contracts: 1 })
  })

  it('answers 404 for another nursery\'s lot and an unknown one', async () => {
    const theirs = await lot({ org: 'tansyRow' })
    const nursery = await as('growerOwner')
    for (const path of [`/api/nursery/budwood/${theirs.id}`, `/api/nursery/budwood/${theirs.id}/exposure`, '/api/nursery/budwood/99999999/exposure']) {
      expect((await nursery.get(path)).status, path).toBe(404)
    }
    expect((await nursery.post(`/api/nursery/budwood/${theirs.id}/suspect`, { suspectOn: '2023-09-01', reason: 'x' })).status).toBe(404)
    expect((await nursery.post(`/api/nursery/budwood/${theirs.id}/clear`, { reason: 'x' })).status).toBe(404)
    expect((await db('budwood_lots').where({ id: theirs.id }).first('suspect_on')).suspect_on).toBeNull()
  })
})

describe('marking a lot suspect and clearing it', () => {
  it('refuses bad input with a 400 naming the field', async () => {
    const member = await as('growerMember')
    const path = `/api/nursery/budwood/${suspect.id}/suspect`
    const tomorrowAndMore = new Date(Date.now() + 3 * 86_400_000).toISOString().slice(0, 10)
    const cases: [unknown, string][] = [
      [{ reason: 'Blight' }, 'suspectOn'],
      [{ suspectOn: '2023-02-30', reason: 'Blight' }, 'suspectOn'],
      [{ suspectOn: tomorrowAndMore, reason: 'Blight' }, 'suspectOn'],
      [{ suspectOn: '2023-09-01', reason: '   ' }, 'reason'],
      [{ suspectOn: '2023-09-01', reason: 'x'.repeat(501) }, 'reason'],
      [{ suspectOn: '2023-09-01', reason: 'Blight', colour: 'red' }, 'colour'],
    ]
    for (const [body, field] of cases) {
      const res = await member.post(path, body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(res.body.data.issues.map((i: { path: string }) => i.path), JSON.stringify(body)).toContain(field)
    }
    expect((await member.post(`/api/nursery/budwood/${suspect.id}/clear`, {})).body.data.issues[0].path).toBe('reason')
    // Nothing was marked by any of them.
    expect((await member.get(`/api/nursery/budwood/${suspect.id}`)).body.suspect).toBeNull()
  })

  it('marks the lot, tells each exposed contract\'s buyer once and the nursery\'s owners, refuses a second marking, and clears it', async () => {
    const member = await as('growerMember')
    const clearBefore = await member.post(`/api/nursery/budwood/${suspect.id}/clear`, { reason: 'Tested clean' })
    expect(clearBefore.status).toBe(409)
    expect(clearBefore.body.data.state).toBe('not-suspect')

    const marked = await member.post(`/api/nursery/budwood/${suspect.id}/suspect`, { suspectOn: '2023-09-01', reason: 'Shoot blight on the mother trees of the block' })
    expect(marked.status, JSON.stringify(marked.body)).toBe(200)
    expect(marked.body.suspect).toEqual({ on: '2023-09-01', reason: 'Shoot blight on the mother trees of the block', byName: 'Tomas Reyne', markedAt: expect.any(String), clearedAt: null, clearedReason: null })
    expect(Date.now() - Date.parse(marked.body.suspect.markedAt)).toBeLessThan(60_000)

    // Quillhurst has two contracts on the list (a and b): its owner is told once, naming both and their trees.
    const olu = await noticesOf(people.olu, suspect.label)
    expect(olu).toHaveLength(1)
    expect(olu[0].link).toBe(`/contracts/tree/${contracts.a}`)
    expect(olu[0].body).toContain(`Tree contract ${contracts.a}: 90 Dabinett on MM.106 standing in row`)
    expect(olu[0].body).toContain(`Tree contract ${contracts.b}: 100 Dabinett on MM.106 standing in row`)
    // 90 + 100 of its trees.
    expect(olu[0].body).toContain('190 of the trees it grows for you')
    expect(olu[0].body).toMatch(/will advise you/)
    // A viewer is not told (owners and members are); Tansy Row, the buyer of contract c, is; Marrowby has nothing on the list.
    expect(await noticesOf(people.greta, suspect.label)).toHaveLength(0)
    const priya = await noticesOf(people.priya, suspect.label)
    expect(priya).toHaveLength(1)
    expect(priya[0].link).toBe(`/contracts/tree/${contracts.c}`)
    expect(await noticesOf(people.dara, suspect.label)).toHaveLength(0)
    // The nursery's owner is told; the member who marked it is not.
    const ines = await noticesOf(people.ines, suspect.label)
    expect(ines).toHaveLength(1)
    expect(ines[0]).toMatchObject({ link: `/nursery/budwood/${suspect.id}` })
    expect(ines[0].body).toContain('4 runs with 390 trees standing are on its exposure list; 2 buyers were told.')
    expect(await noticesOf(people.tomas, suspect.label)).toHaveLength(0)
    const audit = await db('audit_events').where({ object_type: 'budwood_lot', object_id: suspect.id, action: 'budwood_lot.suspect_marked' }).count({ n: '*' })
    expect(Number(audit[0]!.n)).toBe(1)

    // A second marking while it is suspect: 409 with the state, and nobody is told again.
    const again = await (await as('growerOwner')).post(`/api/nursery/budwood/${suspect.id}/suspect`, { suspectOn: '2023-09-02', reason: 'Again' })
    expect(again.status).toBe(409)
    expect(again.body.data).toMatchObject({ state: 'suspect', suspect: { on: '2023-09-01' } })
    expect(await noticesOf(people.olu, suspect.label)).toHaveLength(1)

    // The lot, the list and the runs show it.
    expect((await member.get(`/api/nursery/budwood/${suspect.id}`)).body.suspect.on).toBe('2023-09-01')
    const list = await member.get('/api/nursery/budwood?limit=200')
    expect(list.body.items.find((l: { id: number }) => l.id === suspect.id).suspect.reason).toBe('Shoot blight on the mother trees of the block')
    const codes = async (id: number) => ((await member.get(`/api/nursery/runs/${id}`)).body.warnings as { code: string }[]).map(w => w.code)
    const after = (await member.get(`/api/nursery/runs/${r.r2}`)).body.warnings.find((w: { code: string }) => w.code === 'suspect-budwood')
    expect(after.message).toBe(`Worked on 2023-08-14 after budwood lot ${suspect.label} by the same hands; the lot is suspect of disease since 2023-09-01: see the lot's exposure list`)
    expect(await codes(r.r1)).toContain('suspect-budwood')
    expect(await codes(r.r3)).not.toContain('suspect-budwood')
    expect(await codes(r.r5)).not.toContain('suspect-budwood')

    // Cleared: the suspicion stays on record with why it was cleared; a second clearing is refused.
    const cleared = await member.post(`/api/nursery/budwood/${suspect.id}/clear`, { reason: 'Laboratory test of the wood negative' })
    expect(cleared.status, JSON.stringify(cleared.body)).toBe(200)
    expect(cleared.body.suspect).toMatchObject({ on: '2023-09-01', reason: 'Shoot blight on the mother trees of the block', clearedAt: expect.any(String), clearedReason: 'Laboratory test of the wood negative' })
    const twice = await member.post(`/api/nursery/budwood/${suspect.id}/clear`, { reason: 'Again' })
    expect(twice.status).toBe(409)
    expect(twice.body.data.state).toBe('cleared')
    expect(await codes(r.r2)).not.toContain('suspect-budwood')

    // Suspected again later: a new marking, and the buyers are told of it once more.
    const remarked = await member.post(`/api/nursery/budwood/${suspect.id}/suspect`, { suspectOn: '2023-10-01', reason: 'Cankers found on the same trees' })
    expect(remarked.status).toBe(200)
    expect(remarked.body.suspect).toMatchObject({ on: '2023-10-01', clearedAt: null })
    expect(await noticesOf(people.olu, suspect.label)).toHaveLength(2)
    expect(await noticesOf(people.priya, suspect.label)).toHaveLength(2)
  })
})
