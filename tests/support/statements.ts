import { afterAll } from 'vitest'
import type { DeliveryState } from '../../shared/types/delivery'
import { settleLoad } from '../../shared/utils/deliverySettlement'
import type { FruitPriceTerms } from '../../shared/utils/settlement'
import { orgId, varietyId } from './contracts'
import { testDb } from './db'

// Deliveries for the statement tests, written straight into the test database as the delivery
// service keeps them (each settlement worked by settleLoad), on a fruit contract of their own
// between Quillhurst (maker) and Hollowmere (grower), whose settings charge 20 % tax. The contract's
// notes, the lots' codes and the deliveries' notes start with the file's mark, so a file removes
// only its own, deliveries first (they refer to the lots).

/** The fixture contract's terms (invented): £250.00 a tonne at 11.0 °Brix, +£8.00 / −£10.00 a tonne per °Brix, rejected under 9.0. */
export const FIXTURE_TERMS: FruitPriceTerms = { basePricePerTonneMinor: 25_000, baselineBrix: 11.0, bonusPerBrixPerTonneMinor: 800, deductionPerBrixPerTonneMinor: 1_000, rejectFloorBrix: 9.0 }

export interface FixtureDelivery {
  netKg: number
  brix: number
  deliveredOn: string
  state?: DeliveryState
  ticketNo?: string
  grossKg?: number | null
  tareKg?: number | null
  taxRatePct?: number | null
}

export function statementFixtures(mark: string) {
  const db = testDb()
  let n = 0
  afterAll(async () => {
    await db('deliveries').where('notes', 'like', `${mark}%`).delete()
    const lots = (await db('harvest_lots').where('code', 'like', `${mark}%`).select('id') as { id: number }[]).map(r => r.id)
    if (lots.length) {
      await db('juice_readings').whereIn('lot_id', lots).delete()
      await db('harvest_lots').whereIn('id', lots).delete()
    }
    const contracts = (await db('fruit_contracts').where('notes', 'like', `${mark}%`).select('id') as { id: number }[]).map(r => r.id)
    if (contracts.length) {
      await db('contract_events').where({ contract_kind: 'fruit' }).whereIn('contract_id', contracts).delete()
      await db('fruit_contract_years').whereIn('contract_id', contracts).delete()
      await db('fruit_contracts').whereIn('id', contracts).delete()
    }
  })

  /** A bittersweet fruit contract Quillhurst ↔ Hollowmere, accepted unless `state` says otherwise, 30 t a year. */
  async function contract(years: number[], state = 'accepted'): Promise<number> {
    const accepted = ['accepted', 'fulfilled'].includes(state)
    const [id] = await db('fruit_contracts').insert({
      maker_org_id: await orgId('quillhurst'), grower_org_id: await orgId('hollowmere'), drafted_by: 'maker',
      last_offer_by: state === 'draft' ? null : 'maker', state, version: state === 'draft' ? 0 : 1, accepted_version: accepted ? 1 : null,
      species: 'apple', juice_class: 'bittersweet', tolerance_pct: 10, currency: 'GBP',
      base_price_per_tonne_minor: FIXTURE_TERMS.basePricePerTonneMinor, baseline_brix: FIXTURE_TERMS.baselineBrix,
      bonus_per_brix_per_tonne_minor: FIXTURE_TERMS.bonusPerBrixPerTonneMinor, deduction_per_brix_per_tonne_minor: FIXTURE_TERMS.deductionPerBrixPerTonneMinor,
      reject_floor_brix: FIXTURE_TERMS.rejectFloorBrix, crop_failure: 'owed', notes: mark,
    })
    await db('fruit_contract_years').insert(years.map(year => ({ contract_id: id, harvest_year: year, tonnes: 30, window_from: `${year}-10-01`, window_to: `${year}-11-15` })))
    return id!
  }

  /** A Hollowmere lot of Dabinett with one reading, delivered to Quillhurst under `contractId`. */
  async function delivery(contractId: number, load: FixtureDelivery): Promise<number> {
    const grower = await orgId('hollowmere')
    const year = Number(load.deliveredOn.slice(0, 4))
    const code = `${mark}${++n}`
    const [lotId] = await db('harvest_lots').insert({
      org_id: grower, code, variety_id: await varietyId('Dabinett'), picked_on: load.deliveredOn, harvest_year: year, net_kg: load.netKg, state: 'delivered',
    })
    const [readingId] = await db('juice_readings').insert({ org_id: grower, lot_id: lotId, sampled_on: load.deliveredOn, brix: load.brix })
    const taxRatePct = load.taxRatePct === undefined ? 20 : load.taxRatePct
    const worked = settleLoad(FIXTURE_TERMS, { netKg: load.netKg, brix: load.brix }, taxRatePct)
    const state = load.state ?? 'settled'
    const [id] = await db('deliveries').insert({
      fruit_contract_id: contractId, maker_org_id: await orgId('quillhurst'), grower_org_id: grower, lot_id: lotId, harvest_year: year,
      delivered_on: load.deliveredOn, ticket_no: load.ticketNo ?? `T-${code}`, gross_kg: load.grossKg ?? null, tare_kg: load.tareKg ?? null, net_kg: load.netKg,
      reading_id: readingId, reading_brix: load.brix, reading_sampled_on: load.deliveredOn, state, version: 1,
      disputed_by: state === 'disputed' ? 'grower' : null, dispute_reason: state === 'disputed' ? 'Our own reading was higher' : null,
      currency: 'GBP', settlement: JSON.stringify(worked.settlement), amount_minor: worked.amountMinor, tax_rate_pct: worked.taxRatePct,
      tax_minor: worked.taxMinor, total_minor: worked.totalMinor, notes: mark, settled_at: state === 'recorded' ? null : new Date(`${load.deliveredOn}T15:00:00Z`),
      created_at: new Date(`${load.deliveredOn}T12:00:00Z`), updated_at: new Date(`${load.deliveredOn}T15:00:00Z`),
    })
    return id!
  }

  return { contract, delivery }
}
