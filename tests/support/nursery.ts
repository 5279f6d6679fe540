import { randomInt } from 'node:crypto'
import { afterAll } from 'vitest'
import { orgId, rootstockId, varietyId, type ORGS } from './contracts'
import { testDb } from './db'

// A nursery's fields, rows, runs and events for tests to act on, written straight into the test
// database and removed when the file ends. Every field a file makes is named after its mark, and
// the file removes only what lies in its own fields (and liner lots whose notes carry the mark).

const TAG_ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ'
const tagCode = () => Array.from({ length: 10 }, () => TAG_ALPHABET[randomInt(TAG_ALPHABET.length)]).join('')
const unique = () => `${Date.now().toString(36)}${randomInt(1_000_000).toString(36)}`

export function nurseryFixtures(mark: string) {
  const db = testDb()
  afterAll(async () => {
    const fields = (await db('nursery_beds').where('name', 'like', `${mark}%`).select('id')).map(r => r.id as number)
    const rows = fields.length ? (await db('nursery_rows').whereIn('field_id', fields).select('id')).map(r => r.id as number) : []
    const runs = rows.length ? (await db('nursery_runs').whereIn('row_id', rows).select('id')).map(r => r.id as number) : []
    if (runs.length) await db('propagation_events').whereIn('run_id', runs).delete()
    if (runs.length) await db('nursery_runs').whereIn('id', runs).delete()
    if (rows.length) await db('nursery_rows').whereIn('id', rows).delete()
    if (fields.length) await db('nursery_beds').whereIn('id', fields).delete()
    await db('liner_lots').where('notes', 'like', `${mark}%`).delete()
    await db('budwood_lots').where('label', 'like', `${mark}%`).delete()
  })

  /** A nursery-row field (or another kind of bed) of the organisation, named after the mark. */
  async function field(org: keyof typeof ORGS = 'hollowmere', kind = 'field'): Promise<number> {
    const [id] = await db('nursery_beds').insert({ org_id: await orgId(org), name: `${mark} ${kind} ${unique()}`, kind })
    return id!
  }

  /** A row of `positions` in a new field of the organisation (or in `fieldId`). */
  async function row(options: { org?: keyof typeof ORGS, fieldId?: number, positions?: number, name?: string } = {}): Promise<number> {
    const org = options.org ?? 'hollowmere'
    const [id] = await db('nursery_rows').insert({
      org_id: await orgId(org), field_id: options.fieldId ?? await field(org), name: options.name ?? `R${unique()}`, positions: options.positions ?? 500,
    })
    return id!
  }

  /** A run of Dabinett on MM.106 lined out in its own new row, with its lined-out event. */
  async function run(options: { org?: keyof typeof ORGS, linedOut?: number, treeContractId?: number | null, linedOutOn?: string } = {}): Promise<number> {
    const org = options.org ?? 'hollowmere'
    const linedOut = options.linedOut ?? 100
    const linedOutOn = options.linedOutOn ?? '2025-03-20'
    const [id] = await db('nursery_runs').insert({
      org_id: await orgId(org), row_id: await row({ org, positions: linedOut }), from_position: 1, to_position: linedOut,
      rootstock_id: await rootstockId('MM.106'), variety_id: await varietyId('Dabinett'), lined_out_on: linedOutOn, lined_out_count: linedOut,
      tree_contract_id: options.treeContractId ?? null, tag_code: tagCode(),
    })
    await db('propagation_events').insert({ org_id: await orgId(org), run_id: id, kind: 'lined-out', happened_on: linedOutOn, count: linedOut, by_name: 'Test' })
    return id!
  }

  /** A run serving the contract with `count` trees dug from it: what a delivery draws on. */
  async function dugRun(treeContractId: number, count: number): Promise<number> {
    const id = await run({ linedOut: count, treeContractId })
    await db('propagation_events').insert({
      org_id: await orgId('hollowmere'), run_id: id, kind: 'dug', happened_on: '2026-11-15', grades: JSON.stringify([{ caliperMm: 13, heightCm: null, feathered: false, count }]), by_name: 'Test',
    })
    return id
  }

  return { field, row, run, dugRun, tagCode }
}
