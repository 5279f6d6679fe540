import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { orgId } from '../support/contracts'
import { testDb } from '../support/db'
import { dispatchFixtures } from '../support/dispatch'
import { as } from '../support/http'
import { nurseryFixtures } from '../support/nursery'

// A tree contract's dispatch labels: one per bundle of the trees dug from its runs, with the plant
// passport when the nursery is registered for one. Contracts, runs and digs are this file's own.
const MARK = 'Dispatch labels test'
const { run } = nurseryFixtures(MARK)
const { otherNursery, contract, dig, bud } = dispatchFixtures(MARK)
const db = testDb()

const labelsOf = async (id: number, query = '', caller: Parameters<typeof as>[0] = 'growerOwner') =>
  (await as(caller)).get(`/api/tree-contracts/${id}/dispatch-labels${query}`)

interface Label { code: string, bundleNo: number, runId: number, count: number, gradeWords: string, varietyName: string, species: string, rootstockDesignation: string, contractId: number, buyerName: string, delivery: string, rowName: string, underCaliper: boolean, passport: Record<string, string> | null }

let hollowmere: { plant_health_reg_no: string | null, country_code: string | null }

beforeAll(async () => {
  hollowmere = await db('organisations').where({ id: await orgId('hollowmere') }).first('plant_health_reg_no', 'country_code')
})

afterAll(async () => {
  await db('organisations').where({ id: await orgId('hollowmere') }).update(hollowmere)
})

describe('the labels of a contract\'s dug trees', () => {
  let contractId: number
  let runId: number
  let tagCode: string

  beforeAll(async () => {
    contractId = await contract('ready')
    runId = await run({ linedOut: 40, treeContractId: contractId })
    tagCode = (await db('nursery_runs').where({ id: runId }).first('tag_code')).tag_code
    await dig(runId, [{ caliperMm: 16, heightCm: 160, feathered: true, count: 23 }, { caliperMm: 13, heightCm: null, feathered: false, count: 10 }])
  })

  it('ties the dug trees of each grade in bundles of ten, the remainder in the last, and counts every tree once', async () => {
    const res = await labelsOf(contractId)
    expect(res.status).toBe(200)
    const labels = res.body.labels as Label[]
    // Worked by hand: 23 = 10 + 10 + 3 and 10 = 10.
    expect(labels.map(l => [l.gradeWords, l.count])).toEqual([
      ['16 mm caliper, 160 cm, feathered', 10], ['16 mm caliper, 160 cm, feathered', 10], ['16 mm caliper, 160 cm, feathered', 3], ['13 mm caliper, whip', 10],
    ])
    expect(res.body.totals).toEqual({
      trees: 33, bundles: 4,
      grades: [
        { gradeWords: '16 mm caliper, 160 cm, feathered', underCaliper: false, trees: 23, bundles: 3 },
        { gradeWords: '13 mm caliper, whip', underCaliper: false, trees: 10, bundles: 1 },
      ],
    })
    expect(res.body).toMatchObject({ bundleSize: 10, runId: null, contract: { id: contractId, state: 'ready', treeCount: 100, buyerName: 'Quillhurst Cider Works', delivery: 'spring 2027' } })
  })

  it('says on every label what the trees are, who they go to and where they grew, each with a code of its own', async () => {
    const labels = (await labelsOf(contractId)).body.labels as Label[]
    for (const label of labels) {
      expect(label).toMatchObject({ runId, varietyName: 'Dabinett', species: 'apple', rootstockDesignation: 'MM.106', contractId, buyerName: 'Quillhurst Cider Works', delivery: 'spring 2027' })
      expect(label.rowName).toMatch(/\w/)
    }
    expect(labels.map(l => l.code)).toEqual([1, 2, 3, 4].map(n => `${tagCode}-0${n}`))
  })

  it('bundles by the size asked for', async () => {
    const res = await labelsOf(contractId, '?bundleSize=5')
    expect(res.status).toBe(200)
    // 23 = 5 + 5 + 5 + 5 + 3; 10 = 5 + 5.
    expect((res.body.labels as Label[]).map(l => l.count)).toEqual([5, 5, 5, 5, 3, 5, 5])
    expect(res.body.totals).toMatchObject({ trees: 33, bundles: 7 })
    expect((await labelsOf(contractId, '?bundleSize=')).body.bundleSize).toBe(10)
  })

  it('carries the plant passport of a registered nursery: the botanical name, GB-40917 once, the bundle\'s code, GB', async () => {
    await db('organisations').where({ id: await orgId('hollowmere') }).update({ plant_health_reg_no: 'GB-40917', country_code: 'GB' })
    const res = await labelsOf(contractId)
    expect(res.body.passportNote).toBeNull()
    for (const label of res.body.labels as Label[]) {
      // Regulation (EU) 2016/2031 Annex VII: A botanical name, B country-registration, C traceability code, D origin.
      expect(label.passport).toEqual({ heading: 'UK plant passport', botanicalName: 'Malus domestica', operator: 'GB-40917', traceabilityCode: label.code, origin: 'GB' })
    }
  })

  it('prints no passport without a registration number, and says why', async () => {
    await db('organisations').where({ id: await orgId('hollowmere') }).update({ plant_health_reg_no: null })
    try {
      const res = await labelsOf(contractId)
      expect(res.status).toBe(200)
      expect((res.body.labels as Label[]).every(l => l.passport === null)).toBe(true)
      expect(res.body.labels).toHaveLength(4)
      expect(res.body.passportNote).toMatch(/no plant-health registration number/)
    }
    finally {
      await db('organisations').where({ id: await orgId('hollowmere') }).update(hollowmere)
    }
  })

  it('gives one run\'s labels alone when asked, and refuses a run that does not serve the contract, naming runId', async () => {
    const second = await run({ linedOut: 12, treeContractId: contractId })
    await dig(second, [{ caliperMm: 14, heightCm: 150, feathered: true, count: 12 }])
    const all = await labelsOf(contractId)
    expect(all.body.totals).toMatchObject({ trees: 45, bundles: 6 })
    expect(all.body.runs.map((r: { id: number }) => r.id).sort()).toEqual([runId, second].sort())
    const one = await labelsOf(contractId, `?runId=${second}`)
    expect(one.status).toBe(200)
    expect((one.body.labels as Label[]).map(l => [l.runId, l.count])).toEqual([[second, 10], [second, 2]])
    expect(one.body.runId).toBe(second)
    const elsewhere = await run({ linedOut: 5 })
    const refused = await labelsOf(contractId, `?runId=${elsewhere}`)
    expect(refused.status).toBe(400)
    expect(refused.body.data.issues.map((i: { path: string }) => i.path)).toEqual(['runId'])
  })
})

describe('what a label names', () => {
  it('names the variety the run was budded with, and warns when it is not the contract\'s', async () => {
    const id = await contract('ready')
    const runId = await run({ linedOut: 8, treeContractId: id })
    await bud(runId, 'Yarlington Mill', 8)
    await dig(runId, [{ caliperMm: 13, heightCm: 140, feathered: false, count: 8 }])
    const res = await labelsOf(id)
    expect((res.body.labels as Label[]).map(l => l.varietyName)).toEqual(['Yarlington Mill'])
    expect(res.body.warnings.join(' ')).toMatch(/Yarlington Mill, not the Dabinett/)
  })

  it('names a pear Pyrus communis', async () => {
    await db('organisations').where({ id: await orgId('hollowmere') }).update({ plant_health_reg_no: 'GB-40917', country_code: 'GB' })
    const id = await contract('ready')
    const runId = await run({ linedOut: 4, treeContractId: id })
    await bud(runId, 'Thorn', 4)
    await dig(runId, [{ caliperMm: 12, heightCm: 120, feathered: false, count: 4 }])
    const [label] = (await labelsOf(id)).body.labels as Label[]
    // USDA ARS GRIN Taxonomy: Pyrus communis L.
    expect(label).toMatchObject({ varietyName: 'Thorn', species: 'pear', passport: { botanicalName: 'Pyrus communis' } })
  })

  it('marks a grade thinner than the contract\'s least caliper', async () => {
    const id = await contract('delivered')
    const runId = await run({ linedOut: 15, treeContractId: id })
    await dig(runId, [{ caliperMm: 12, heightCm: 130, feathered: false, count: 10 }, { caliperMm: 10.5, heightCm: 110, feathered: false, count: 5 }])
    const res = await labelsOf(id)
    expect(res.status).toBe(200)
    // The contract asks 12 mm: 12 is enough, 10.5 is under.
    expect((res.body.labels as Label[]).map(l => l.underCaliper)).toEqual([false, true])
    expect(res.body.totals.grades.map((g: { underCaliper: boolean }) => g.underCaliper)).toEqual([false, true])
  })
})

describe('the contract\'s state', () => {
  it.each(['draft', 'offered', 'countered', 'accepted', 'declined', 'cancelled'])('refuses a contract that is %s with 409 saying why', async (state) => {
    // The nursery drafted these, so it sees its own draft too.
    const id = await contract(state, { columns: { drafted_by: 'nursery', last_offer_by: state === 'draft' ? null : 'nursery' } })
    const res = await labelsOf(id)
    expect(res.status).toBe(409)
    expect(res.body.data.state).toBe(state)
    expect(res.body.message).toMatch(new RegExp(`is ${state}.*propagation, ready or delivered`))
  })

  it('answers a contract in propagation with no trees dug yet with no labels and a note saying so', async () => {
    const id = await contract('propagating')
    await run({ linedOut: 20, treeContractId: id })
    const res = await labelsOf(id)
    expect(res.status).toBe(200)
    expect(res.body.labels).toEqual([])
    expect(res.body.totals).toEqual({ trees: 0, bundles: 0, grades: [] })
    expect(res.body.warnings.join(' ')).toMatch(/No trees have been dug/)
  })
})

describe('who gets the labels', () => {
  it('refuses the buyer with 403 and a message, whether or not it runs a nursery itself', async () => {
    const id = await contract('ready')
    const maker = await labelsOf(id, '', 'makerOwner')
    expect(maker.status).toBe(403)
    expect(maker.body.message).toMatch(/\w/)
    // Hollowmere buying from another nursery: it sees the contract, but the labels are the nursery's.
    const other = await otherNursery()
    const bought = await contract('ready', { buyer: 'hollowmere', nursery: other.id })
    const asBuyer = await labelsOf(bought)
    expect(asBuyer.status).toBe(403)
    expect(asBuyer.body.message).toMatch(/printed by the nursery/)
    expect((await other.client.get(`/api/tree-contracts/${bought}/dispatch-labels`)).status).toBe(200)
  })

  it('answers 404 to a nursery that is no party to the contract, and for an id that is not there', async () => {
    const id = await contract('ready')
    const other = await otherNursery()
    expect((await other.client.get(`/api/tree-contracts/${id}/dispatch-labels`)).status).toBe(404)
    expect((await labelsOf(99_999_999)).status).toBe(404)
  })
})

describe('a bad query', () => {
  it.each([
    ['bundleSize', '0'], ['bundleSize', '101'], ['bundleSize', '2.5'], ['bundleSize', 'ten'],
    ['runId', 'abc'], ['runId', '0'], ['runId', '-3'],
  ])('refuses %s=%s with 400 naming the field', async (field, value) => {
    const id = await contract('ready')
    const res = await labelsOf(id, `?${field}=${value}`)
    expect(res.status).toBe(400)
    expect(res.body.data.issues.map((i: { path: string }) => i.path)).toEqual([field])
  })

  it('refuses an id that is not one with 400', async () => {
    expect((await (await as('growerOwner')).get('/api/tree-contracts/abc/dispatch-labels')).status).toBe(400)
  })
})
