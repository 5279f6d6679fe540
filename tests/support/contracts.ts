import { afterAll } from 'vitest'
import { testDb } from './db'

// Contracts for tests to act on, written straight into the test database in the state a test
// needs, and removed when the file ends. Every one is marked in its notes, so a file removes only
// its own.

export const ORGS = {
  hollowmere: 'Hollowmere Orchard & Nursery',
  tansyRow: 'Tansy Row Fruit',
  quillhurst: 'Quillhurst Cider Works',
  marrowby: 'Marrowby Perry House',
} as const

const ids = new Map<string, number>()

async function idOf(table: string, column: string, value: string): Promise<number> {
  const key = `${table}:${value}`
  if (!ids.has(key)) {
    const row = await testDb()(table).where(column, value).first('id')
    if (!row) throw new Error(`no ${table} row with ${column} = ${value}`)
    ids.set(key, row.id as number)
  }
  return ids.get(key)!
}

export const orgId = (name: keyof typeof ORGS) => idOf('organisations', 'name', ORGS[name])
export const varietyId = (name: string) => idOf('varieties', 'name', name)
export const rootstockId = (designation: string) => idOf('rootstocks', 'designation', designation)
export const userId = (email: string) => idOf('users', 'email', email)

/** Marks this file's contracts and removes them (and their history) when it ends. */
export function contractFixtures(mark: string) {
  const db = testDb()
  afterAll(async () => {
    for (const [table, kind] of [['tree_contracts', 'tree'], ['fruit_contracts', 'fruit']] as const) {
      const rows = await db(table).where('notes', 'like', `${mark}%`).select('id') as { id: number }[]
      const list = rows.map(r => r.id)
      if (!list.length) continue
      await db('contract_events').where({ contract_kind: kind }).whereIn('contract_id', list).delete()
      await db(table).whereIn('id', list).delete()
    }
  })

  const nextYear = new Date().getUTCFullYear() + 2

  /** A tree contract Quillhurst (buyer) ↔ Hollowmere (nursery) in `state`, drafted by the buyer. */
  async function treeContract(state: string, columns: Record<string, unknown> = {}): Promise<number> {
    const offered = state !== 'draft'
    const [id] = await db('tree_contracts').insert({
      buyer_org_id: await orgId('quillhurst'),
      nursery_org_id: await orgId('hollowmere'),
      drafted_by: 'buyer',
      last_offer_by: offered ? 'buyer' : null,
      state,
      version: offered ? 1 : 0,
      accepted_version: ['accepted', 'propagating', 'ready', 'delivered'].includes(state) ? 1 : null,
      variety_id: await varietyId('Dabinett'),
      rootstock_id: await rootstockId('MM.106'),
      tree_count: 100,
      tree_type: 'maiden',
      delivery_year: nextYear,
      delivery_season: 'spring',
      currency: 'GBP',
      unit_price_minor: 1450,
      royalty_per_tree_minor: 0,
      deposit_pct: 20,
      deposit_if_buyer_cancels: 'kept',
      deposit_if_nursery_cancels: 'refunded',
      buyer_may_cancel_until: 'accepted',
      certificate_required: true,
      take_rate: 0.85,
      survival_rate: 0.9,
      notes: mark,
      ...columns,
    })
    return id!
  }

  /** A fruit contract Quillhurst (maker) ↔ Tansy Row (grower) in `state`, drafted by the maker, for two harvests. */
  async function fruitContract(state: string, columns: Record<string, unknown> = {}, years = [nextYear, nextYear + 1]): Promise<number> {
    const offered = state !== 'draft'
    const [id] = await db('fruit_contracts').insert({
      maker_org_id: await orgId('quillhurst'),
      grower_org_id: await orgId('tansyRow'),
      drafted_by: 'maker',
      last_offer_by: offered ? 'maker' : null,
      state,
      version: offered ? 1 : 0,
      accepted_version: ['accepted', 'fulfilled'].includes(state) ? 1 : null,
      species: 'apple',
      juice_class: 'bittersharp',
      tolerance_pct: 10,
      currency: 'GBP',
      base_price_per_tonne_minor: 21000,
      baseline_brix: 12,
      bonus_per_brix_per_tonne_minor: 800,
      deduction_per_brix_per_tonne_minor: 1200,
      reject_floor_brix: 9.5,
      crop_failure: 'forgiven',
      notes: mark,
      ...columns,
    })
    await db('fruit_contract_years').insert(years.map(year => ({ contract_id: id, harvest_year: year, tonnes: 1, window_from: `${year}-10-01`, window_to: `${year}-11-15` })))
    return id!
  }

  return { treeContract, fruitContract }
}
