import { describe, expect, it } from 'vitest'
import { testDb } from '../support/db'
import { as } from '../support/http'

// Quillhurst's blend plans as the demo seeds them over Tansy Row's TR-26-001 (5,610 kg delivered to
// its press). The lot's price is its contract price on its °Brix (the demo contract: £210.00 a tonne
// at a 12.0 °Brix baseline, +£10.00 a tonne per °Brix above): 13.4 °Bx is £224.00 a tonne.
// Quillhurst's press yields 750 L a tonne. Worked by hand.
const db = testDb()
const lotId = async (code: string) => (await db('harvest_lots').where({ code }).first('id')).id as number

describe('the demo\'s blend plans', () => {
  it('has the first pressing and its trace back to Tansy Row\'s block, delivery and lab sheet', async () => {
    const maker = await as('makerOwner')
    const [summary] = (await maker.get('/api/blend-plans?q=First Kingston Black pressing')).body.items
    // 2,400 L at 750 L/t is 3,200 kg; 3.2 t × £224.00 = £716.80.
    expect(summary).toMatchObject({ state: 'pressed', status: 'optimal', volumeL: 2400, cost: 71_680, currency: 'GBP' })
    const plan = (await maker.get(`/api/blend-plans/${summary.id}`)).body
    expect(plan.result.lines.map((l: { code: string, kg: number }) => [l.code, l.kg])).toEqual([['TR-26-001', 3200]])
    expect(plan.pressing).toMatchObject({ pressedOn: '2026-11-20', litresPressed: 2430, vessel: 'Tank 4' })
    const trace = (await maker.get(`/api/pressings/${plan.pressing.id}/trace`)).body
    expect(trace.lots.map((l: { code: string, kg: number }) => [l.code, l.kg])).toEqual([['TR-26-001', 3250]])
    expect(trace.lots[0]).toMatchObject({ grower: { name: 'Tansy Row Fruit' }, block: { name: 'River Strip' }, variety: { name: 'Kingston Black' }, deliveries: [{ ticketNo: 'QCW-26-0188', netKg: 5610 }] })
    expect(trace.lots[0].labSheets.length).toBeGreaterThan(0)
  })

  it('holds 800 kg of TR-26-001 for the committed plan, so 1,560 kg of it is free, and its trace shows both plans', async () => {
    const maker = await as('makerOwner')
    const [committed] = (await maker.get('/api/blend-plans?state=committed&q=Medium-dry base, December')).body.items
    expect(committed).toMatchObject({ state: 'committed', volumeL: 600, cost: 17_920 }) // 0.8 t × £224.00
    const id = await lotId('TR-26-001')
    expect((await db('harvest_lots').where({ id }).first('state')).state).toBe('delivered')
    // 5,610 kg weighed in − 3,250 kg pressed − 800 kg held = 1,560 kg.
    const listed = (await maker.get('/api/blends/lots?q=TR-26-001')).body.items
    expect(listed).toMatchObject([{ code: 'TR-26-001', freeKg: 1560 }])
    const trace = (await maker.get(`/api/lots/${id}/trace`)).body
    expect(trace.plans.map((p: { name: string, state: string, kg: number }) => [p.name, p.state, p.kg])).toEqual(expect.arrayContaining([
      ['First Kingston Black pressing', 'pressed', 3200], ['Medium-dry base, December', 'committed', 800],
    ]))
    expect(trace.pressings).toContainEqual(expect.objectContaining({ pressedOn: '2026-11-20', kg: 3250, vessel: 'Tank 4' }))
    // Tansy Row sees only who pressed its lot and when.
    const grower = (await (await as('grower2Owner')).get(`/api/lots/${id}/trace`)).body
    expect(grower.plans).toEqual([])
    expect(grower.pressings).toContainEqual({ id: null, planId: null, makerName: 'Quillhurst Cider Works', pressedOn: '2026-11-20', kg: 3250, vessel: null, litresPressed: null })
  })
})
