import { afterAll } from 'vitest'
import { testDb } from './db'

// Harvest lots for tests to act on, written straight into the test database, and removed (with
// their readings) when the file ends. Every lot's code starts with the file's mark, so a file
// removes only its own. Codes are at most 40 characters: keep marks short.

export interface LotColumns {
  code?: string
  variety_id: number
  block_id?: number | null
  picked_on?: string
  net_kg?: number
  bins?: number | null
  notes?: string | null
  state?: 'available' | 'delivered' | 'pressed'
}

export function lotFixtures(mark: string) {
  const db = testDb()
  let n = 0
  afterAll(async () => {
    const rows = await db('harvest_lots').where('code', 'like', `${mark}%`).select('id') as { id: number }[]
    const ids = rows.map(r => r.id)
    if (!ids.length) return
    await db('juice_readings').whereIn('lot_id', ids).delete()
    await db('harvest_lots').whereIn('id', ids).delete()
  })

  /** A lot of organisation `orgId`; the harvest year is the year of `picked_on` (default 2026-10-01). */
  async function lot(orgId: number, columns: LotColumns): Promise<number> {
    const pickedOn = columns.picked_on ?? '2026-10-01'
    const [id] = await db('harvest_lots').insert({
      org_id: orgId, net_kg: 1000, ...columns, code: columns.code ?? `${mark}${++n}-${Math.random().toString(36).slice(2, 6)}`,
      picked_on: pickedOn, harvest_year: Number(pickedOn.slice(0, 4)),
    })
    return id!
  }

  /** A juice reading of a lot, in stored units (g/L as malic), sampled on `sampled_on` (default 2026-10-02). */
  async function reading(lotId: number, columns: Record<string, unknown> = {}): Promise<number> {
    const row = await db('harvest_lots').where({ id: lotId }).first('org_id')
    const [id] = await db('juice_readings').insert({ org_id: row.org_id, lot_id: lotId, sampled_on: '2026-10-02', ...columns })
    return id!
  }

  return { lot, reading }
}
