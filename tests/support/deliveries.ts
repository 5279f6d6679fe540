import { afterAll } from 'vitest'
import { contractFixtures, orgId, varietyId } from './contracts'
import { testDb } from './db'
import type { ApiClient } from './http'
import { lotFixtures } from './lots'

// Fruit contracts, lots and readings for delivery tests, written straight into the test database,
// and removed with their deliveries when the file ends. Lot codes and contract notes start with the
// file's mark (keep it short: lot codes hold 40 characters), so a file removes only its own, and
// the demo's deliveries are never touched.

export interface DeliveryContractOptions {
  grower?: 'tansyRow' | 'hollowmere'
  maker?: 'quillhurst' | 'marrowby'
  state?: string
  /** Tonnes per harvest year. */
  years?: Record<number, number>
  /** Any other column of fruit_contracts (snake_case). */
  columns?: Record<string, unknown>
}

export function deliveryFixtures(mark: string) {
  const db = testDb()
  const lots = lotFixtures(mark)
  const contracts = contractFixtures(mark)

  // Registered after the lot and contract fixtures, so it runs before them (vitest runs afterAll
  // hooks last-in first-out): the deliveries hold the lots, which cannot go while they are there.
  afterAll(async () => {
    const contractIds = (await db('fruit_contracts').where('notes', 'like', `${mark}%`).select('id') as { id: number }[]).map(r => r.id)
    const lotIds = (await db('harvest_lots').where('code', 'like', `${mark}%`).select('id') as { id: number }[]).map(r => r.id)
    const ids = (await db('deliveries').where(q => q.whereIn('fruit_contract_id', contractIds).orWhereIn('lot_id', lotIds)).select('id') as { id: number }[]).map(r => r.id)
    if (!ids.length) return
    await db('delivery_events').whereIn('delivery_id', ids).delete()
    await db('deliveries').whereIn('id', ids).delete()
  })

  /**
   * A fruit contract Quillhurst (or Marrowby) buys under from Tansy Row (or Hollowmere): by default
   * accepted, bittersharp apples, 100 t of 2026 within 10 %, at £210.00 a tonne on a 12.0 °Brix
   * baseline (+£8.00 / −£12.00 a tonne per °Brix), rejected under 9.5 °Brix, at most 5 % rot and 10 %
   * damage. Each year's window runs into January of the next, so the contract clock leaves it accepted.
   */
  async function contract(options: DeliveryContractOptions = {}): Promise<number> {
    const years = options.years ?? { 2026: 100 }
    const id = await contracts.fruitContract(options.state ?? 'accepted', {
      maker_org_id: await orgId(options.maker ?? 'quillhurst'),
      grower_org_id: await orgId(options.grower ?? 'tansyRow'),
      max_rot_pct: 5,
      max_damage_pct: 10,
      ...options.columns,
    }, Object.keys(years).map(Number))
    for (const [year, tonnes] of Object.entries(years)) {
      await db('fruit_contract_years').where({ contract_id: id, harvest_year: Number(year) }).update({ tonnes, window_to: `${Number(year) + 1}-01-31` })
    }
    return id
  }

  /** A lot of `grower`'s of the named variety, picked on `pickedOn` (its harvest year) with `netKg`. */
  async function lot(grower: 'tansyRow' | 'hollowmere', variety: string, netKg = 10_000, pickedOn = '2026-10-01'): Promise<number> {
    return lots.lot(await orgId(grower), { variety_id: await varietyId(variety), net_kg: netKg, picked_on: pickedOn })
  }

  /** A lot with one reading of `brix`, ready to deliver. */
  async function testedLot(grower: 'tansyRow' | 'hollowmere', variety: string, brix: number, netKg = 10_000): Promise<number> {
    const id = await lot(grower, variety, netKg)
    await lots.reading(id, { brix })
    return id
  }

  /** Records a delivery through the API; the answer as it came. */
  function record(client: ApiClient, body: Record<string, unknown>) {
    return client.post('/api/deliveries', { deliveredOn: '2026-10-20', ...body })
  }

  return { contract, lot, testedLot, reading: lots.reading, record }
}
