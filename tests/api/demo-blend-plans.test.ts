import { describe, expect, it } from 'vitest'
import { testDb } from '../support/db'
import { as } from '../support/http'

// Quillhurst's blend plans as the demo seeds them over Tansy Row's fruit delivered to its press.
// Prices are each lot's contract price on its °Brix (the demo contract: £210.00 a tonne at a 12.0
// °Brix baseline, +£10.00 a tonne per °Brix above, −£15.00 below): TR-26-003 at 11.8 °Bx is £207.00
// a tonne, TR-26-001 at 13.4 °Bx £224.00. Quillhurst's press yields 750 L a tonne. Worked by hand.
const db = testDb()
const lotId = async (code: string) => (await db('harvest_lots').where({ code }).first('id')).id as number

describe('the demo\'s blend plans', () => {
  it('has the first pressing, cheapest juice first, and its trace back to Tansy Row\'s blocks and deliveries', async () => {
    const maker = await as('makerOwner')
    const list = await maker.get('/api/blend-plans?q=First bittersharp pressing')
    const [summary] = list.body.items
    expect(summary).toMatchObject({ state: 'pressed', status: 'optimal', volumeL: 3600, currency: 'GBP' })
    // TR-26-003 whole: 3,320 kg = 2,490 L at £207.00 (68,724 p); the other 1,110 L from TR-26-001 is
    // 1,480 kg at £224.00 (33,152 p); 101,876 p in all.
    expect(summary.cost).toBe(101_876)
    const plan = (await maker.get(`/api/blend-plans/${summary.id}`)).body
    expect(plan.result.lines.map((l: { code: string, kg: number }) => [l.code, l.kg])).toEqual([['TR-26-003', 3320], ['TR-26-001', 1480]])
    expect(plan.pressing).toMatchObject({ pressedOn: '2026-11-20', litresPressed: 3540, vessel: 'Tank 4' })
    const trace = (await maker.get(`/api/pressings/${plan.pressing.id}/trace`)).body
    expect(trace.lots.map((l: { code: string, kg: number }) => [l.code, l.kg])).toEqual([['TR-26-003', 3200], ['TR-26-001', 1500]])
    expect(trace.lots[0]).toMatchObject({ grower: { name: 'Tansy Row Fruit' }, block: { name: 'Osier Bed' }, deliveries: [{ ticketNo: 'QCW-26-0112', netKg: 3320 }] })
    expect(trace.lots[0].labSheets.length).toBeGreaterThan(0)
    // 120 kg of TR-26-003 were left out, so the lot is not wholly pressed and that much is still free.
    expect((await db('harvest_lots').where({ code: 'TR-26-003' }).first('state')).state).toBe('delivered')
    const listed = (await maker.get('/api/blends/lots?q=TR-26-003')).body.items
    expect(listed).toMatchObject([{ code: 'TR-26-003', freeKg: 120 }])
  })

  it('holds 800 kg of TR-26-001 for the committed medium-dry plan, and its trace shows both plans', async () => {
    const maker = await as('makerOwner')
    const [committed] = (await maker.get('/api/blend-plans?state=committed&q=Medium-dry base, December')).body.items
    expect(committed).toMatchObject({ state: 'committed', volumeL: 600, cost: 17_920 }) // 0.8 t × £224.00
    const id = await lotId('TR-26-001')
    const trace = (await maker.get(`/api/lots/${id}/trace`)).body
    expect(trace.plans.map((p: { name: string, state: string, kg: number }) => [p.name, p.state, p.kg])).toEqual(expect.arrayContaining([
      ['First bittersharp pressing', 'pressed', 1480], ['Medium-dry base, December', 'committed', 800],
    ]))
    expect(trace.pressings).toContainEqual(expect.objectContaining({ pressedOn: '2026-11-20', kg: 1500, vessel: 'Tank 4' }))
    // Tansy Row sees only who pressed its lot and when.
    const grower = (await (await as('grower2Owner')).get(`/api/lots/${id}/trace`)).body
    expect(grower.plans).toEqual([])
    expect(grower.pressings).toContainEqual({ id: null, planId: null, makerName: 'Quillhurst Cider Works', pressedOn: '2026-11-20', kg: 1500, vessel: null, litresPressed: null })
  })
})
