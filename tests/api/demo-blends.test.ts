import { describe, expect, it } from 'vitest'
import type { BlendCandidateLot, BlendTarget } from '../../shared/types/blend'
import { DEMO_BLEND_TARGET } from '../../server/db/seeds/10_demo_blend_targets'
import { as } from '../support/http'

// Quillhurst's blend planner as the demo seeds it: its saved medium-dry target and this season's
// Tansy Row lots its bittersharp contract covers. Other tests add lots and targets of their own, so
// only the seeded codes and name are looked at. The prices are worked by hand from the demo
// contract's terms: £210.00 a tonne at a 12.0 °Brix baseline, +£10.00 a tonne per °Brix above,
// −£15.00 below, rejected under 9.5 °Brix.

async function demoTarget(): Promise<BlendTarget> {
  const res = await (await as('makerOwner')).get('/api/blend-targets?limit=200')
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  const target = (res.body.items as BlendTarget[]).find(t => t.name === DEMO_BLEND_TARGET.name)
  expect(target, 'the demo target').toBeDefined()
  return target!
}

async function demoLots(caller: Parameters<typeof as>[0]): Promise<BlendCandidateLot[]> {
  const res = await (await as(caller)).get('/api/blends/lots?q=TR-26-&limit=200')
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  return (res.body.items as BlendCandidateLot[]).filter(l => /^TR-26-00\d$/.test(l.code))
}

describe('the demo\'s blend planner', () => {
  it('keeps Quillhurst\'s medium-dry target, and its viewer reads it', async () => {
    const target = await demoTarget()
    expect(target).toMatchObject({
      ranges: { sg: { min: 1.05, max: 1.056 }, taGPerL: { min: 5, max: 6.5 }, tanninGPerL: { min: 1.6, max: 2.4 } },
      volumeL: 6000,
    })
    const viewer = await (await as('makerViewer')).get(`/api/blend-targets/${target.id}`)
    expect(viewer.body).toEqual(target)
  })

  it('offers Tansy Row\'s five lots, priced on their readings, with TR-26-004 rejected under the floor', async () => {
    const lots = await demoLots('makerOwner')
    expect(lots.map(l => l.code).sort()).toEqual(['TR-26-001', 'TR-26-002', 'TR-26-003', 'TR-26-004', 'TR-26-005'])
    const byCode = new Map(lots.map(l => [l.code, l]))
    // Delivered to Quillhurst: the weighed 5,610 kg, less the demo's first pressing (3,250 kg) and the
    // 800 kg its committed plan holds. 13.4 °Bx, 1.4 above: £210.00 + 1.4 × £10.00 = £224.00.
    expect(byCode.get('TR-26-001')).toMatchObject({ state: 'delivered', freeKg: 1560, pricePerTonne: 22_400, rejected: false, juiceClass: 'bittersharp' })
    // 11.8 °Bx, 0.2 under: £210.00 − 0.2 × £15.00 = £207.00 (as its settled delivery was paid).
    expect(byCode.get('TR-26-003')).toMatchObject({ state: 'delivered', freeKg: 3320, pricePerTonne: 20_700, rejected: false })
    // Still at the grower: its net kg.
    expect(byCode.get('TR-26-002')).toMatchObject({ state: 'available', freeKg: 6050, rejected: false })
    expect(byCode.get('TR-26-004')).toMatchObject({
      rejected: true, rejectReason: '9.3 °Brix is under the contract\'s reject floor of 9.5 °Brix',
      reading: { brix: 9.3, testedOn: '2026-10-09' },
    })
  })

  const solveDemo = async (ranges: BlendTarget['ranges']) => {
    const target = await demoTarget()
    const lots = await demoLots('makerOwner')
    return (await as('makerOwner')).post('/api/blends/solve', { target: ranges, volumeL: target.volumeL, lots: lots.map(l => ({ lotId: l.lotId })) })
  }

  it('meets the target from those lots, leaving the rejected one out', async () => {
    const target = await demoTarget()
    const lots = await demoLots('makerOwner')
    const res = await solveDemo(target.ranges)
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(res.body).toMatchObject({ status: 'optimal', misses: [], currency: 'GBP' })
    const rejected = lots.find(l => l.code === 'TR-26-004')!
    expect(res.body.rejected).toEqual([{ lotId: rejected.lotId, code: 'TR-26-004', reason: rejected.rejectReason }])
    expect(res.body.lines.map((l: { code: string }) => l.code)).not.toContain('TR-26-004')
    const litres = res.body.lines.reduce((sum: number, l: { litres: number }) => sum + l.litres, 0)
    expect(litres).toBeCloseTo(6000, 0)
    const { predicted } = res.body
    expect(predicted.sg).toBeGreaterThanOrEqual(1.05 - 1e-6)
    expect(predicted.sg).toBeLessThanOrEqual(1.056 + 1e-6)
    expect(predicted.taGPerL).toBeGreaterThanOrEqual(5 - 1e-6)
    expect(predicted.taGPerL).toBeLessThanOrEqual(6.5 + 1e-6)
    expect(predicted.tanninGPerL).toBeGreaterThanOrEqual(1.6 - 1e-6)
    expect(predicted.tanninGPerL).toBeLessThanOrEqual(2.4 + 1e-6)
    expect(res.body.cost).toBeGreaterThan(0)
  })

  it('says the TA maximum binds, and loosening it saves what it says', async () => {
    const target = await demoTarget()
    const before = await solveDemo(target.ranges)
    // The cheapest lot, TR-26-003 (£207.00 a tonne), is also the sharpest (7.6 g/L): the blend takes
    // as much of it as the 6.5 g/L maximum allows.
    expect(before.body.binding).toEqual([{ property: 'taGPerL', bound: 'max', costPerUnit: expect.any(Number) }])
    const saving = before.body.binding[0].costPerUnit as number
    expect(saving).toBeGreaterThan(0)
    // 0.05 g/L more saves 0.05 × the saving per g/L (costs are rounded to a whole penny each side).
    const nudged = await solveDemo({ ...target.ranges, taGPerL: { min: 5, max: 6.55 } })
    expect(nudged.body.status).toBe('optimal')
    expect(Math.abs((before.body.cost - nudged.body.cost) - saving * 0.05)).toBeLessThanOrEqual(1)
    // Further out another range starts to bind, so the saving per g/L is an upper bound of what 0.1 saves.
    const loosened = await solveDemo({ ...target.ranges, taGPerL: { min: 5, max: 6.6 } })
    expect(before.body.cost - loosened.body.cost).toBeGreaterThan(0)
    expect(before.body.cost - loosened.body.cost).toBeLessThanOrEqual(saving * 0.1 + 1)
  })

  it('shows Marrowby none of Tansy Row\'s lots', async () => {
    expect(await demoLots('maker2Owner')).toEqual([])
  })
})
