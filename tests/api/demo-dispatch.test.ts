import knexFactory from 'knex'
import { describe, expect, it } from 'vitest'
import { knexConfig } from '../../server/db/config'
import { DISPATCH_GRADES, seed } from '../../server/db/seeds/07_demo_dispatch'
import { rootstocksToBud } from '../../shared/utils/backplan'
import { runCounts } from '../../shared/utils/runCounts'
import { testDb } from '../support/db'
import { testEnv } from '../support/env'
import { as } from '../support/http'

// The demo's trees ready to go, as the seed leaves them: Tansy Row's 400 Stoke Red on M.26 from
// Hollowmere, lined out in 2025, budded that August, headed back in spring 2026 and dug in
// November 2026, so the dispatch labels have bundles on first start. Read from the tables
// (snake_case) and through the API.
const db = testDb()

async function theContract() {
  const row = await db('tree_contracts as c').join('organisations as b', 'b.id', 'c.buyer_org_id').join('organisations as n', 'n.id', 'c.nursery_org_id')
    .join('varieties as v', 'v.id', 'c.variety_id').join('rootstocks as r', 'r.id', 'c.rootstock_id')
    .where({ 'b.name': 'Tansy Row Fruit', 'n.name': 'Hollowmere Orchard & Nursery', 'v.name': 'Stoke Red', 'r.designation': 'M.26' })
    .orderBy('c.id').first('c.*', 'b.id as buyer_id', 'n.id as nursery_id')
  if (!row) throw new Error('No demo contract for Stoke Red from Hollowmere to Tansy Row')
  return row
}

async function theRun(contractId: number) {
  const runs = await db('nursery_runs as n').join('nursery_rows as w', 'w.id', 'n.row_id').join('nursery_beds as f', 'f.id', 'w.field_id')
    .where({ 'n.tree_contract_id': contractId }).select('n.*', 'w.name as row_name', 'f.name as field_name')
  expect(runs).toHaveLength(1)
  return runs[0]!
}

const eventsOf = (runId: number) => db('propagation_events').where({ run_id: runId }).orderBy(['happened_on', 'id'])
const json = (value: unknown) => (typeof value === 'string' ? JSON.parse(value) : value)

describe('the demo contract with trees ready', () => {
  it('has Tansy Row\'s 400 Stoke Red on M.26 from Hollowmere for spring 2027, ready', async () => {
    const row = await theContract()
    expect(row).toMatchObject({ tree_count: 400, tree_type: 'maiden', delivery_year: 2027, delivery_season: 'spring', state: 'ready', version: 1, accepted_version: 1, drafted_by: 'buyer', currency: 'GBP' })
  })

  it('has a history in the order the move table allows: created, offered, accepted, propagation started, marked ready', async () => {
    const row = await theContract()
    const events = await db('contract_events').where({ contract_kind: 'tree', contract_id: row.id }).orderBy('id')
    expect(events.map(e => [e.action, e.version, e.by_org_id])).toEqual([
      ['created', 0, row.buyer_id], ['offered', 1, row.buyer_id], ['accepted', 1, row.nursery_id],
      ['propagation-started', 1, row.nursery_id], ['marked-ready', 1, row.nursery_id],
    ])
    events.slice(1).forEach((e, i) => expect(e.at.getTime()).toBeGreaterThan(events[i]!.at.getTime()))
    expect(json(events[1]!.terms)).toMatchObject({ treeCount: 400, deliveryYear: 2027 })
  })
})

describe('its run', () => {
  it('lines out in row 14 of the nursery field in spring 2025 the liners the back-plan asks for', async () => {
    const run = await theRun((await theContract()).id)
    // ⌈400 / (0.85 × 0.9)⌉ = ⌈522.9⌉ = 523, the contract's take and survival terms.
    expect(rootstocksToBud(400, 0.85, 0.9)).toBe(523)
    expect(run).toMatchObject({ field_name: 'Nursery Field', row_name: '14', lined_out_count: 523, from_position: 1, to_position: 523 })
    expect(run.lined_out_on >= '2025-03-01' && run.lined_out_on <= '2025-05-31').toBe(true)
    expect(run.tag_printed_at.getTime()).toBeGreaterThanOrEqual(run.identity_changed_at.getTime())
  })

  it('is budded in August 2025, headed back in spring 2026 and dug in November 2026 in three grades', async () => {
    // The cycle: Crassweller, Penn State, eXtension "Nursery Production of Finished Apple Trees".
    const run = await theRun((await theContract()).id)
    const events = await eventsOf(run.id)
    const one = (kind: string) => {
      const found = events.filter(e => e.kind === kind)
      expect(found, kind).toHaveLength(1)
      return found[0]!
    }
    expect(one('budded').happened_on.slice(0, 7)).toBe('2025-08')
    expect(['03', '04']).toContain(one('headed-back').happened_on.slice(5, 7))
    expect(one('headed-back').happened_on.slice(0, 4)).toBe('2026')
    const dug = one('dug')
    expect(dug.happened_on.slice(0, 7)).toBe('2026-11')
    expect(json(dug.grades)).toEqual(DISPATCH_GRADES)
    expect(DISPATCH_GRADES).toHaveLength(3)
  })

  it('counts from its events without a refusal: the row dug out, more trees than the contract orders', async () => {
    const run = await theRun((await theContract()).id)
    const events = await eventsOf(run.id)
    const counts = runCounts(run.lined_out_count, events.map(e => ({ kind: e.kind, happenedOn: e.happened_on, id: e.id, count: e.count, cause: e.cause, grades: json(e.grades) })))
    // Worked by hand: 212 + 198 + 37 = 447 dug of 461 that took, 14 lost since.
    expect(counts).toMatchObject({ dug: 447, standing: 0, taken: 461 })
    expect(counts.dug).toBeGreaterThanOrEqual(400)
  })

  it('was lined out from liners that had come in, and budded from a lot of its own variety cut before the budding', async () => {
    const run = await theRun((await theContract()).id)
    const lots = await db('liner_lots').where({ org_id: run.org_id, rootstock_id: run.rootstock_id, grade: run.liner_grade }).where('received_on', '<=', run.lined_out_on).sum({ n: 'count' })
    expect(Number(lots[0]!.n)).toBeGreaterThanOrEqual(run.lined_out_count)
    const budded = (await eventsOf(run.id)).find(e => e.kind === 'budded')!
    const lot = await db('budwood_lots').where({ id: budded.budwood_lot_id, org_id: run.org_id }).first('variety_id', 'cut_on')
    expect(lot.variety_id).toBe(run.variety_id)
    expect(budded.variety_id).toBe(run.variety_id)
    expect(lot.cut_on <= budded.happened_on).toBe(true)
  })
})

describe('its dispatch labels', () => {
  it('show on first start: 46 bundles of ten or fewer, 447 trees, each with Hollowmere\'s plant passport', async () => {
    const id = (await theContract()).id
    const res = await (await as('growerOwner')).get(`/api/tree-contracts/${id}/dispatch-labels`)
    expect(res.status).toBe(200)
    // Worked by hand: ⌈212/10⌉ + ⌈198/10⌉ + ⌈37/10⌉ = 22 + 20 + 4.
    expect(res.body.totals).toMatchObject({ trees: 447, bundles: 46 })
    expect(res.body.passportNote).toBeNull()
    for (const label of res.body.labels) {
      expect(label).toMatchObject({ varietyName: 'Stoke Red', rootstockDesignation: 'M.26', buyerName: 'Tansy Row Fruit', delivery: 'spring 2027' })
      expect(label.passport).toMatchObject({ botanicalName: 'Malus domestica', operator: 'GB-40917', origin: 'GB', traceabilityCode: label.code })
    }
  })
})

describe('the demo dispatch seed', () => {
  it('adds nothing when it runs a second time', async () => {
    const tables = ['tree_contracts', 'contract_events', 'liner_lots', 'budwood_lots', 'nursery_runs', 'propagation_events']
    const countAll = async () => Promise.all(tables.map(async t => Number((await db(t).count({ n: '*' }))[0]!.n)))
    const before = await countAll()
    const knex = knexFactory(knexConfig(testEnv.databaseUrl))
    try {
      await seed(knex)
    }
    finally {
      await knex.destroy()
    }
    expect(await countAll()).toEqual(before)
  })
})
