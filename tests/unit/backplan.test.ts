import { describe, it, expect } from 'vitest'
import { PROPAGATION_STEPS, backPlanSteps, nurseryBackPlan, rootstocksToBud } from '../../shared/utils/backplan'

// Cycle: R. Crassweller, Penn State, "Nursery Production of Finished Apple Trees"
// (eXtension apples): liners planted spring year 2, budded late summer year 2,
// headed back spring year 3, dug late autumn year 3, sold early spring.
// The exact calendar days are common practice.

describe('backPlanSteps', () => {
  it('works back from a spring 2027 delivery (Penn State / eXtension cycle; days are common practice)', () => {
    expect(backPlanSteps(2027, 'spring')).toEqual([
      { step: 'linersPlanted', by: '2025-04-30' },
      { step: 'budded', by: '2025-09-30' },
      { step: 'headedBack', by: '2026-03-31' },
      { step: 'dug', by: '2026-11-15' },
      { step: 'delivered', by: '2027-04-15' },
    ])
  })

  it('works back from an autumn 2026 delivery, dug and delivered the same autumn', () => {
    expect(backPlanSteps(2026, 'autumn')).toEqual([
      { step: 'linersPlanted', by: '2025-04-30' },
      { step: 'budded', by: '2025-09-30' },
      { step: 'headedBack', by: '2026-03-31' },
      { step: 'dug', by: '2026-11-15' },
      { step: 'delivered', by: '2026-11-30' },
    ])
  })

  // Budding runs through August and September in the north (common practice; Crassweller, eXtension:
  // late August to early September above 36° N; Ohio State, eXtension: T-budding June to September).
  it('lets budding run to the end of September', () => {
    const budded = backPlanSteps(2028, 'spring').find(s => s.step === 'budded')!.by
    expect(budded >= '2026-09-15').toBe(true)
    expect(budded.slice(5, 7)).toBe('09')
  })

  it('lists the steps in order with strictly later dates', () => {
    for (const season of ['spring', 'autumn'] as const) {
      const steps = backPlanSteps(2030, season)
      expect(steps.map(s => s.step)).toEqual([...PROPAGATION_STEPS])
      for (let i = 1; i < steps.length; i++) {
        expect(steps[i]!.by > steps[i - 1]!.by).toBe(true)
      }
    }
  })

  it('starts liners about two years before a spring delivery (growers order about two years ahead: Penn State / eXtension)', () => {
    const steps = backPlanSteps(2028, 'spring')
    expect(steps[0]?.by.startsWith('2026-')).toBe(true)
  })

  it('refuses an impossible year or an unknown season', () => {
    expect(() => backPlanSteps(2026.5, 'spring')).toThrow(/Delivery year must be a whole year/)
    expect(() => backPlanSteps(99, 'spring')).toThrow(RangeError)
    // @ts-expect-error: only autumn and spring deliveries
    expect(() => backPlanSteps(2027, 'summer')).toThrow(/Delivery season must be 'autumn' or 'spring'/)
  })
})

describe('rootstocksToBud', () => {
  it('is ceil(N / (take × survival)): 1000 trees at 80 % take and 90 % survival need 1389 (worked example)', () => {
    // 1000 / 0.72 = 1388.9 → 1389.
    expect(rootstocksToBud(1000, 0.8, 0.9)).toBe(1389)
  })

  it('does not add a rootstock for binary rounding when the answer is whole', () => {
    expect(rootstocksToBud(900, 0.9, 1)).toBe(1000)
    expect(rootstocksToBud(700, 0.7, 1)).toBe(1000)
    expect(rootstocksToBud(250, 1, 1)).toBe(250)
  })

  it('always buds at least as many rootstocks as trees wanted', () => {
    for (const take of [0.55, 0.7, 0.85, 0.95, 1]) {
      expect(rootstocksToBud(333, take, 0.93)).toBeGreaterThanOrEqual(333)
    }
  })

  it('refuses rates outside (0, 1] and a tree count that is not a whole number above 0', () => {
    expect(() => rootstocksToBud(100, 0, 0.9)).toThrow(/Take rate must be above 0 and at most 1/)
    expect(() => rootstocksToBud(100, 1.1, 0.9)).toThrow(RangeError)
    expect(() => rootstocksToBud(100, 0.8, -0.2)).toThrow(/Survival rate must be above 0 and at most 1/)
    expect(() => rootstocksToBud(100, 0.8, Number.NaN)).toThrow(RangeError)
    expect(() => rootstocksToBud(0, 0.8, 0.9)).toThrow(/Trees wanted must be a whole number of at least 1/)
    expect(() => rootstocksToBud(10.5, 0.8, 0.9)).toThrow(RangeError)
  })
})

describe('nurseryBackPlan', () => {
  it('returns the dated steps and the rootstocks to bud together', () => {
    const plan = nurseryBackPlan({ deliveryYear: 2027, season: 'spring', trees: 2000, takeRate: 0.85, survivalRate: 0.9 })
    expect(plan.steps).toEqual(backPlanSteps(2027, 'spring'))
    // 2000 / 0.765 = 2614.4 → 2615 (worked example).
    expect(plan.rootstocksToBud).toBe(2615)
  })
})
