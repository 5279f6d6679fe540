import { afterAll } from 'vitest'
import { testDb } from './db'
import { deliveryFixtures } from './deliveries'
import type { ApiClient } from './http'
import { as } from './http'

// Blend plans over this file's own lots: Tansy Row's lots under a fruit contract of the file's own
// with Quillhurst (the delivery fixtures' default: bittersharp, £210.00 a tonne at a 12.0 °Brix
// baseline), each with one reading. Quillhurst's press yields 750 L a tonne (the demo's setting),
// so 75 L of juice is 100 kg of fruit. Plans are named with the file's mark and removed (with their
// reservations, pressings and history) before the lots and deliveries are.

export function blendPlanFixtures(mark: string) {
  const db = testDb()
  const deliveries = deliveryFixtures(mark)
  afterAll(async () => {
    await db('blend_plans').where('name', 'like', `${mark}%`).delete()
  })

  let contractId: number | undefined
  async function contract(): Promise<number> {
    contractId ??= await deliveries.contract({ years: { 2026: 1000 } })
    return contractId
  }

  /** A Tansy Row lot of `netKg` at 12.0 °Brix, TA 6 g/L, tannin 2 g/L; delivered whole to Quillhurst when asked. */
  async function lot(netKg: number, options: { delivered?: boolean } = {}): Promise<number> {
    const id = await deliveries.lot('tansyRow', 'Kingston Black', netKg)
    await deliveries.reading(id, { brix: 12.0, ta_g_per_l: 6, tannin_g_per_l: 2 })
    if (options.delivered) {
      const res = await deliveries.record(await as('makerOwner'), { fruitContractId: await contract(), lotId: id, netKg })
      if (res.status !== 201) throw new Error(`could not deliver the lot: ${JSON.stringify(res.body)}`)
    }
    else await contract()
    return id
  }

  /** A plan's body: `volumeL` of juice from the lots, no ranges. */
  const planBody = (name: string, volumeL: number, lotIds: number[]) => ({ name: `${mark}${name}`, request: { volumeL, lots: lotIds.map(lotId => ({ lotId })) } })

  /** Saves a draft as Quillhurst's owner; its id. */
  async function draft(volumeL: number, lotIds: number[], client?: ApiClient): Promise<number> {
    const res = await (client ?? await as('makerOwner')).post('/api/blend-plans', planBody('plan', volumeL, lotIds))
    if (res.status !== 201) throw new Error(`could not save a plan: ${JSON.stringify(res.body)}`)
    return res.body.id
  }

  /** A committed plan. */
  async function committed(volumeL: number, lotIds: number[]): Promise<number> {
    const id = await draft(volumeL, lotIds)
    const res = await (await as('makerOwner')).post(`/api/blend-plans/${id}/commit`, {})
    if (res.status !== 200) throw new Error(`could not commit a plan: ${JSON.stringify(res.body)}`)
    return id
  }

  /** The kg committed plans hold of a lot, summed in the database. */
  async function reservedKg(lotId: number): Promise<number> {
    const [row] = await db('blend_plan_lots as r').join('blend_plans as p', 'p.id', 'r.plan_id').where({ 'r.lot_id': lotId, 'p.state': 'committed' }).sum({ kg: 'r.kg' })
    return Number(row?.kg ?? 0)
  }

  /** The lot's free kg as the planner's lot list shows it to Quillhurst (0 when the list leaves it out). */
  async function freeKg(lotId: number): Promise<number> {
    const code = (await db('harvest_lots').where({ id: lotId }).first('code')).code as string
    const res = await (await as('makerOwner')).get(`/api/blends/lots?q=${encodeURIComponent(code)}`)
    const item = (res.body.items as { lotId: number, freeKg: number }[]).find(i => i.lotId === lotId)
    return item?.freeKg ?? 0
  }

  return { lot, planBody, draft, committed, reservedKg, freeKg, contract }
}
