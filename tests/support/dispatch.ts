import { afterAll } from 'vitest'
import { hashPassword } from '../../server/utils/passwords'
import { orgId, rootstockId, varietyId, type ORGS } from './contracts'
import { testDb, uniqueEmail } from './db'
import { DEMO_PASSWORD } from './env'
import { ApiClient } from './http'

// For the dispatch labels: a second nursery of the file's own (with an owner who signs in), tree
// contracts between any two organisations in the state a test needs, and dug trees by grade on a
// run. Everything made here carries the mark and goes when the file ends; call this after
// nurseryFixtures, so the runs (removed by it) go before the contracts they serve.

type Party = keyof typeof ORGS | number

export interface DugGradeRow { caliperMm: number, heightCm: number | null, feathered: boolean, count: number }

export function dispatchFixtures(mark: string) {
  const db = testDb()
  const orgs: number[] = []
  afterAll(async () => {
    const contracts = (await db('tree_contracts').where('notes', 'like', `${mark}%`).select('id')).map(r => r.id as number)
    if (contracts.length) {
      await db('nursery_runs').whereIn('tree_contract_id', contracts).update({ tree_contract_id: null })
      await db('contract_events').where({ contract_kind: 'tree' }).whereIn('contract_id', contracts).delete()
      await db('tree_contracts').whereIn('id', contracts).delete()
    }
    if (orgs.length) {
      await db('audit_events').whereIn('org_id', orgs).delete()
      await db('organisations').whereIn('id', orgs).delete()
    }
  })

  const idOf = async (party: Party) => (typeof party === 'number' ? party : orgId(party))

  /** Another nursery, with an owner signed in: it is no party to the demo's contracts. */
  async function otherNursery(): Promise<{ id: number, client: ApiClient }> {
    const email = uniqueEmail('dispatch-nursery')
    const [id] = await db('organisations').insert({
      name: `${mark} nursery ${Date.now().toString(36)}`, kind: 'grower', is_nursery: true, status: 'active', hemisphere: 'north', currency: 'GBP',
      listed: false, hydrometer_calibration_c: 20, contact_email: email, plant_health_reg_no: 'GB-10001', country_code: 'GB',
    })
    orgs.push(id!)
    await db('users').insert({ email, name: 'Dispatch Owner', org_id: id, role: 'owner', units: 'metric', password_hash: await hashPassword(DEMO_PASSWORD), email_verified_at: new Date() })
    const client = new ApiClient()
    await client.signIn(email, DEMO_PASSWORD)
    if (!client.hasSession()) throw new Error('the other nursery could not sign in')
    return { id: id!, client }
  }

  /** A tree contract (Quillhurst buys Dabinett on MM.106 from Hollowmere unless told otherwise) in `state`. */
  async function contract(state: string, options: { buyer?: Party, nursery?: Party, columns?: Record<string, unknown> } = {}): Promise<number> {
    const offered = state !== 'draft'
    const [id] = await db('tree_contracts').insert({
      buyer_org_id: await idOf(options.buyer ?? 'quillhurst'), nursery_org_id: await idOf(options.nursery ?? 'hollowmere'),
      drafted_by: 'buyer', last_offer_by: offered ? 'buyer' : null, state, version: offered ? 1 : 0,
      accepted_version: ['accepted', 'propagating', 'ready', 'delivered'].includes(state) ? 1 : null,
      variety_id: await varietyId('Dabinett'), rootstock_id: await rootstockId('MM.106'), tree_count: 100, tree_type: 'maiden', min_caliper_mm: 12,
      delivery_year: 2027, delivery_season: 'spring', currency: 'GBP', unit_price_minor: 1450, royalty_per_tree_minor: 0, deposit_pct: 20,
      deposit_if_buyer_cancels: 'kept', deposit_if_nursery_cancels: 'refunded', buyer_may_cancel_until: 'accepted', certificate_required: true,
      take_rate: 0.85, survival_rate: 0.9, notes: mark, ...options.columns,
    })
    return id!
  }

  /** Records a dig of these grades on a run of Hollowmere's. */
  async function dig(runId: number, grades: DugGradeRow[], happenedOn = '2026-11-16'): Promise<void> {
    await db('propagation_events').insert({ org_id: await orgId('hollowmere'), run_id: runId, kind: 'dug', happened_on: happenedOn, grades: JSON.stringify(grades), by_name: 'Test' })
  }

  /** Records a budding of `variety` on a run of Hollowmere's. */
  async function bud(runId: number, variety: string, count: number, happenedOn = '2025-08-20'): Promise<void> {
    await db('propagation_events').insert({ org_id: await orgId('hollowmere'), run_id: runId, kind: 'budded', happened_on: happenedOn, method: 'chip-bud', variety_id: await varietyId(variety), count, by_name: 'Test' })
  }

  return { otherNursery, contract, dig, bud }
}
