import knexFactory from 'knex'
import { describe, expect, it } from 'vitest'
import { knexConfig } from '../../server/db/config'
import { seed as seedCatalogue } from '../../server/db/seeds/02_catalogue'
import { seed as seedBlocks } from '../../server/db/seeds/03_demo_blocks'
import { seed } from '../../server/db/seeds/06_demo_nursery'
import { TAG_CODE_PATTERN } from '../../server/utils/tagCode'
import { rootstocksToBud } from '../../shared/utils/backplan'
import { runCounts, type RunEventForCount } from '../../shared/utils/runCounts'
import { testDb } from '../support/db'
import { testEnv } from '../support/env'
import { scratchDatabase } from '../support/scratchDb'

// Hollowmere's nursery as the demo seeds it, read straight from the tables (snake_case). The rows
// other tests add are left out by looking only at the seeded beds, field and lots by name.
const db = testDb()
const HOLLOWMERE = 'Hollowmere Orchard & Nursery'
const STOOL_BEDS = ['Barn Stools', 'Pond Stools']
const FIELD = 'Nursery Field'

interface RunRow {
  id: number
  row_name: string
  from_position: number
  to_position: number
  rootstock: string
  variety_id: number
  variety: string
  liner_grade: string | null
  lined_out_on: string
  lined_out_count: number
  tree_contract_id: number | null
  tag_code: string
  tag_printed_at: Date | null
  identity_changed_at: Date
}

interface EventRow { id: number, run_id: number, kind: string, happened_on: string, count: number | null, cause: string | null, variety_id: number | null, budwood_lot_id: number | null, by_user_id: number | null, by_name: string }

async function hollowmereId(): Promise<number> {
  return (await db('organisations').where({ name: HOLLOWMERE }).first('id')).id
}

/** The demo's Dabinett tree contract, Quillhurst's with Hollowmere (the first made: tests may add others). */
async function dabinettContract(knex = db): Promise<{ id: number, state: string, version: number } | undefined> {
  return knex('tree_contracts as c').join('varieties as v', 'v.id', 'c.variety_id').join('organisations as b', 'b.id', 'c.buyer_org_id')
    .join('organisations as n', 'n.id', 'c.nursery_org_id')
    .where({ 'v.name': 'Dabinett', 'b.name': 'Quillhurst Cider Works', 'n.name': HOLLOWMERE, 'c.tree_count': 1200 })
    .orderBy('c.id').first('c.id', 'c.state', 'c.version')
}

async function seededRuns(): Promise<RunRow[]> {
  return db('nursery_runs as n')
    .join('nursery_rows as r', 'r.id', 'n.row_id')
    .join('nursery_beds as f', 'f.id', 'r.field_id')
    .join('rootstocks as s', 's.id', 'n.rootstock_id')
    .join('varieties as v', 'v.id', 'n.variety_id')
    .where({ 'f.org_id': await hollowmereId(), 'f.name': FIELD })
    .orderBy(['r.name', 'n.from_position'])
    .select('n.id', 'r.name as row_name', 'n.from_position', 'n.to_position', 's.designation as rootstock', 'n.variety_id', 'v.name as variety',
      'n.liner_grade', 'n.lined_out_on', 'n.lined_out_count', 'n.tree_contract_id', 'n.tag_code', 'n.tag_printed_at', 'n.identity_changed_at')
}

async function eventsOf(runIds: number[]): Promise<EventRow[]> {
  return db('propagation_events').whereIn('run_id', runIds).orderBy('id')
    .select('id', 'run_id', 'kind', 'happened_on', 'count', 'cause', 'variety_id', 'budwood_lot_id', 'by_user_id', 'by_name')
}

const forCount = (e: EventRow): RunEventForCount => ({ kind: e.kind, happenedOn: e.happened_on, id: e.id, count: e.count, cause: e.cause })
const month = (iso: string) => Number(iso.slice(5, 7))

describe('the demo nursery: stool beds and liners', () => {
  it('has a dwarfing and a semi-vigorous stool bed, each with its mother plants and the year it was set out', async () => {
    const beds = await db('nursery_beds as b').join('rootstocks as s', 's.id', 'b.rootstock_id')
      .where({ 'b.org_id': await hollowmereId(), 'b.kind': 'stool' }).whereIn('b.name', STOOL_BEDS)
      .select('b.name', 's.designation', 's.vigour', 'b.mother_plants', 'b.year_established')
    expect(beds.map(b => b.vigour).sort()).toEqual(['dwarf', 'semi-vigorous'])
    expect(beds.find(b => b.vigour === 'semi-vigorous')?.designation).toBe('MM.106')
    for (const bed of beds) {
      expect(bed.mother_plants).toBeGreaterThan(0)
      expect(bed.year_established).toBeLessThanOrEqual(2025)
    }
  })

  it('records this year\'s work on each: cut back in late winter, earthed up in early and mid-summer, liners lifted by grade in the autumn', async () => {
    // The stool bed cycle: Hoying, Cornell, "Vegetative Rootstock and Finished Apple Tree Production"
    // (2015); liners cut in late autumn and graded 5-10 mm (Crassweller, Penn State, eXtension).
    const beds = await db('nursery_beds').where({ org_id: await hollowmereId(), kind: 'stool' }).whereIn('name', STOOL_BEDS).select('id', 'name')
    expect(beds).toHaveLength(2)
    for (const bed of beds) {
      const records = await db('nursery_bed_records').where({ bed_id: bed.id }).whereBetween('done_on', ['2026-01-01', '2026-12-31'])
        .orderBy(['done_on', 'id']).select('kind', 'done_on', 'count', 'grade', 'by_user_id')
      expect(records.map(r => r.kind), bed.name).toEqual(['cut-back', 'earthed-up', 'earthed-up', 'liners-lifted', 'liners-lifted'])
      const [cutBack, firstEarthing, secondEarthing, ...lifted] = records
      expect([2, 3]).toContain(month(cutBack.done_on))
      expect(month(firstEarthing.done_on)).toBe(6)
      expect(month(secondEarthing.done_on)).toBe(7)
      expect(lifted.map(r => r.grade).sort()).toEqual(['5-7mm', '7-10mm'])
      for (const r of lifted) {
        expect([10, 11]).toContain(month(r.done_on))
        expect(r.count).toBeGreaterThan(0)
      }
      expect(records.every(r => r.by_user_id !== null)).toBe(true)
    }
  })

  it('has one lifted liner lot for each liners-lifted record, of the same count, grade and rootstock, received the day it was lifted', async () => {
    const orgId = await hollowmereId()
    const records = await db('nursery_bed_records as r').join('nursery_beds as b', 'b.id', 'r.bed_id')
      .where({ 'b.org_id': orgId, 'r.kind': 'liners-lifted' }).whereIn('b.name', STOOL_BEDS)
      .select('r.id', 'r.count', 'r.grade', 'r.done_on', 'b.rootstock_id')
    const lots = await db('liner_lots').where({ org_id: orgId, source: 'lifted' }).whereIn('bed_record_id', records.map(r => r.id))
      .select('bed_record_id', 'count', 'grade', 'rootstock_id', 'received_on')
    expect(records.length).toBeGreaterThanOrEqual(4)
    expect(lots).toHaveLength(records.length)
    for (const record of records) {
      expect(lots.find(l => l.bed_record_id === record.id)).toEqual({
        bed_record_id: record.id, count: record.count, grade: record.grade, rootstock_id: record.rootstock_id, received_on: record.done_on,
      })
    }
  })

  it('has a bought-in lot with its supplier and plant passport', async () => {
    const bought = await db('liner_lots').where({ org_id: await hollowmereId(), source: 'bought' }).whereNull('bed_record_id').first('supplier', 'certificate', 'count')
    expect(bought?.supplier).toMatch(/\w/)
    expect(bought?.certificate).toMatch(/plant passport/i)
    expect(bought?.count).toBeGreaterThan(0)
  })

  it('never lines out more liners of a rootstock and grade than had come in by that day', async () => {
    const orgId = await hollowmereId()
    const runs = await seededRuns()
    const lots = await db('liner_lots').where({ org_id: orgId }).select('rootstock_id', 'grade', 'count', 'received_on')
    const rootstockIds = await db('nursery_runs').whereIn('id', runs.map(r => r.id)).select('id', 'rootstock_id')
    const rootstockOf = new Map(rootstockIds.map(r => [r.id, r.rootstock_id]))
    expect(runs.every(r => r.liner_grade !== null)).toBe(true)
    for (const run of runs) {
      const same = (r: { rootstock_id: number, grade: string }) => r.rootstock_id === rootstockOf.get(run.id) && r.grade === run.liner_grade
      const cameIn = lots.filter(l => same(l) && l.received_on <= run.lined_out_on).reduce((s, l) => s + l.count, 0)
      const linedOut = runs.filter(r => same({ rootstock_id: rootstockOf.get(r.id)!, grade: r.liner_grade! }) && r.lined_out_on <= run.lined_out_on)
        .reduce((s, r) => s + r.lined_out_count, 0)
      expect(linedOut, `${run.rootstock} ${run.liner_grade} by ${run.lined_out_on}`).toBeLessThanOrEqual(cameIn)
    }
  })
})

describe('the demo nursery: rows and runs', () => {
  it('lays out rows 10 to 14 of 600 positions at 30 cm in the nursery field', async () => {
    const rows = await db('nursery_rows as r').join('nursery_beds as f', 'f.id', 'r.field_id')
      .where({ 'f.org_id': await hollowmereId(), 'f.name': FIELD, 'f.kind': 'field' }).orderBy('r.name').select('r.name', 'r.positions', 'r.spacing_cm')
    expect(rows).toEqual(['10', '11', '12', '13', '14'].map(name => ({ name, positions: 600, spacing_cm: 30 })))
  })

  it('lines out one liner to a position, and each run fits its row without overlapping another', async () => {
    const runs = await seededRuns()
    for (const run of runs) {
      expect(run.lined_out_count).toBe(run.to_position - run.from_position + 1)
      expect(run.to_position).toBeLessThanOrEqual(600)
      const overlapping = runs.filter(o => o.id !== run.id && o.row_name === run.row_name && o.from_position <= run.to_position && run.from_position <= o.to_position)
      expect(overlapping).toEqual([])
    }
  })

  it('lines out the 1,569 MM.106 liners the Dabinett contract\'s back-plan asks for', async () => {
    const dabinett = (await seededRuns()).filter(r => r.variety === 'Dabinett' && r.rootstock === 'MM.106')
    // ceil(1200 / (0.85 × 0.9)) = ceil(1568.6) = 1569, the contract's take and survival terms.
    expect(rootstocksToBud(1200, 0.85, 0.9)).toBe(1569)
    expect(dabinett.reduce((s, r) => s + r.lined_out_count, 0)).toBe(1569)
    expect(dabinett.length).toBeGreaterThanOrEqual(3)
    expect(dabinett.every(r => r.lined_out_on >= '2026-03-01' && r.lined_out_on <= '2026-04-30')).toBe(true)
  })

  it('serves the Dabinett contract with those runs, and the contract is in propagation with one entry saying so', async () => {
    const contract = await dabinettContract()
    expect(contract?.state).toBe('propagating')
    const dabinett = (await seededRuns()).filter(r => r.variety === 'Dabinett' && r.rootstock === 'MM.106')
    expect(dabinett.map(r => r.tree_contract_id)).toEqual(dabinett.map(() => contract!.id))
    const started = await db('contract_events').where({ contract_kind: 'tree', contract_id: contract!.id, action: 'propagation-started' }).select('version')
    expect(started).toEqual([{ version: contract!.version }])
  })

  it('counts the Dabinett runs from their events without a refusal: budded in August, 86-90 % take, some losses', async () => {
    const dabinett = (await seededRuns()).filter(r => r.variety === 'Dabinett' && r.rootstock === 'MM.106')
    const events = await eventsOf(dabinett.map(r => r.id))
    const people = await db('users').whereIn('email', ['grower@demo.test', 'grower-member@demo.test']).select('id', 'name')
    let standing = 0
    for (const run of dabinett) {
      const own = events.filter(e => e.run_id === run.id)
      expect(own[0]).toMatchObject({ kind: 'lined-out', count: run.lined_out_count, happened_on: run.lined_out_on })
      const counts = runCounts(run.lined_out_count, own.map(forCount))
      expect(counts.takeRate).toBeGreaterThanOrEqual(0.86)
      expect(counts.takeRate).toBeLessThanOrEqual(0.9)
      expect(counts.lost).toBeGreaterThan(counts.losses['failed-take']!)
      const budded = own.filter(e => e.kind === 'budded')
      expect(budded).toHaveLength(1)
      expect(budded[0]!.happened_on.slice(0, 7)).toBe('2026-08')
      for (const e of own) expect(people).toContainEqual({ id: e.by_user_id, name: e.by_name })
      standing += counts.standing
    }
    // Worked by hand from the seeded events: rows 10, 11 and 12 stand at 520 + 514 + 319.
    expect(standing).toBe(1353)
    const causes = new Set(events.filter(e => e.kind === 'loss').map(e => e.cause))
    expect(causes).toContain('rodents')
  })

  it('has one run for the contract that was budded with another variety than it is meant for', async () => {
    const runs = await seededRuns()
    const events = await eventsOf(runs.map(r => r.id))
    const mismatched = runs.filter(r => events.some(e => e.run_id === r.id && e.kind === 'budded' && e.variety_id !== r.variety_id))
    expect(mismatched).toHaveLength(1)
    expect(mismatched[0]!.variety).toBe('Dabinett')
    const budded = events.find(e => e.run_id === mismatched[0]!.id && e.kind === 'budded')!
    expect((await db('varieties').where({ id: budded.variety_id }).first('name')).name).toBe('Yarlington Mill')
  })

  it('has one run whose printed tag is older than its last change of variety; the other tags were printed after theirs', async () => {
    const runs = await seededRuns()
    const stale = runs.filter(r => r.tag_printed_at !== null && r.tag_printed_at < r.identity_changed_at)
    expect(stale.map(r => r.variety)).toEqual(['Kingston Black'])
    expect(stale[0]!.tree_contract_id).toBeNull()
    expect(stale[0]!.lined_out_on.slice(0, 4)).toBe('2026')
    const current = runs.filter(r => r.tag_printed_at !== null && r.tag_printed_at >= r.identity_changed_at)
    expect(current.length).toBeGreaterThan(runs.length / 2)
  })

  it('gives every run its own tag code', async () => {
    const runs = await seededRuns()
    expect(runs.length).toBeGreaterThanOrEqual(4)
    for (const run of runs) expect(run.tag_code).toMatch(TAG_CODE_PATTERN)
    expect(new Set(runs.map(r => r.tag_code)).size).toBe(runs.length)
  })
})

describe('the demo nursery: budwood', () => {
  it('traces the Dabinett budwood, cut in August before the budding, to Hollowmere\'s Long Ground block', async () => {
    const orgId = await hollowmereId()
    const lot = await db('budwood_lots as w').join('varieties as v', 'v.id', 'w.variety_id').join('orchard_blocks as b', 'b.id', 'w.block_id')
      .join('varieties as bv', 'bv.id', 'b.variety_id')
      .where({ 'w.org_id': orgId, 'v.name': 'Dabinett' })
      .first('w.id', 'w.cut_on', 'w.source_kind', 'w.sticks', 'w.label', 'b.name as block', 'b.org_id as block_org_id', 'bv.name as block_variety')
    expect(lot).toMatchObject({ source_kind: 'own-block', block: 'Long Ground', block_org_id: orgId, block_variety: 'Dabinett' })
    expect(lot.cut_on.slice(0, 7)).toBe('2026-08')
    expect(lot.sticks).toBeGreaterThan(0)
    const budded = await db('propagation_events').where({ budwood_lot_id: lot.id, kind: 'budded' }).select('run_id', 'happened_on')
    // The runs it was budded on: the two a fire-blight trace would name.
    expect(new Set(budded.map(e => e.run_id)).size).toBe(2)
    expect(budded.every(e => e.happened_on >= lot.cut_on)).toBe(true)
  })
})

describe('the demo nursery seed', () => {
  it('adds nothing when it runs a second time', async () => {
    const tables = ['nursery_beds', 'nursery_bed_records', 'liner_lots', 'budwood_lots', 'nursery_rows', 'nursery_runs', 'propagation_events', 'contract_events']
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

  it('moves a Dabinett contract that is only accepted into propagation, as Hollowmere\'s owner, and links the runs to it', async () => {
    const scratch = await scratchDatabase('pomewright_demo_nursery')
    const knex = knexFactory(knexConfig(scratch.url))
    try {
      await seedCatalogue(knex)
      await seedBlocks(knex)
      const id = async (table: string, column: string, value: string) => (await scratch.db(table).where(column, value).first('id')).id as number
      const [contractId] = await scratch.db('tree_contracts').insert({
        buyer_org_id: await id('organisations', 'name', 'Quillhurst Cider Works'), nursery_org_id: await id('organisations', 'name', HOLLOWMERE),
        drafted_by: 'buyer', last_offer_by: 'nursery', state: 'accepted', version: 2, accepted_version: 2,
        variety_id: await id('varieties', 'name', 'Dabinett'), rootstock_id: await id('rootstocks', 'designation', 'MM.106'),
        tree_count: 1200, tree_type: 'maiden', delivery_year: 2028, delivery_season: 'spring', currency: 'GBP', unit_price_minor: 1450,
        deposit_if_buyer_cancels: 'kept', deposit_if_nursery_cancels: 'refunded', buyer_may_cancel_until: 'accepted', take_rate: 0.85, survival_rate: 0.9,
      })
      await seed(knex)
      expect(await dabinettContract(scratch.db)).toEqual({ id: contractId, state: 'propagating', version: 2 })
      const events = await scratch.db('contract_events as e').join('users as u', 'u.id', 'e.by_user_id').where({ 'e.contract_kind': 'tree', 'e.contract_id': contractId })
        .select('e.action', 'e.version', 'e.by_name', 'e.changes', 'u.email')
      expect(events.map(e => ({ ...e, changes: typeof e.changes === 'string' ? JSON.parse(e.changes) : e.changes })))
        .toEqual([{ action: 'propagation-started', version: 2, by_name: 'Ines Varga', changes: [], email: 'grower@demo.test' }])
      const linked = await scratch.db('nursery_runs').where({ tree_contract_id: contractId }).sum({ n: 'lined_out_count' })
      expect(Number(linked[0]!.n)).toBe(1569)
    }
    finally {
      await knex.destroy()
      await scratch.drop()
    }
  })
})
