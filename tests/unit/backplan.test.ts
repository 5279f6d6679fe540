import { describe, it, expect } from 'vitest'
import { PROPAGATION_STEPS, TREE_TYPES, backPlanSteps, backPlanWarning, extraSeasons, nurseryBackPlan, propagationSeasons, rootstocksToBud } from '../../shared/utils/backplan'
import type { BackPlanStep, DeliverySeason, PropagationStep, TreeType } from '../../shared/utils/backplan'

// Cycle: R. Crassweller, Penn State, "Nursery Production of Finished Apple Trees"
// (eXtension apples): liners planted spring year 2, budded late summer year 2,
// headed back spring year 3, dug late autumn year 3, sold early spring.
// The exact calendar days are common practice.

const MAIDEN_STEPS: readonly PropagationStep[] = ['linersPlanted', 'budded', 'headedBack', 'dug', 'delivered']

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
      expect(steps.map(s => s.step)).toEqual(PROPAGATION_STEPS.filter(step => MAIDEN_STEPS.includes(step)))
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

// Tree types and interstems, hand-worked for a 2030 delivery. Sources for the seasons:
// - sleeping eye: Good Fruit Grower, "Types of trees": a rootstock planted a year ahead of delivery,
//   budded about August and dug for delivery the next spring; here the buyer heads it back;
// - maiden: Penn State / eXtension cycle above; feathered the same length (common practice);
// - knip and double-worked trees one season more (Good Fruit Grower, "Types of trees", for the knip;
//   double chip-budding in successive years, interstock onto quince then the variety onto the
//   interstock, as set out in the pear guidance quoted in the Home Orchard Society forum thread
//   "Quince compatibility/incompatibility"); both together two more (common practice);
// - bench graft: grafted January to April (Good Fruit Grower, "Types of trees"), planted out in spring
//   and sold after one season (Pro Tree Nursery, "Grafting"; Sunridge Nurseries, "Dormant
//   benchgrafts"); no budding step (common practice).
// The days of the month are common practice throughout.
type Plan = [treeType: TreeType, interstem: boolean, season: DeliverySeason, steps: BackPlanStep[]]
const step = (name: PropagationStep, by: string): BackPlanStep => ({ step: name, by })
const HAND_WORKED: Plan[] = [
  ['maiden', false, 'autumn', [step('linersPlanted', '2029-04-30'), step('budded', '2029-09-30'), step('headedBack', '2030-03-31'), step('dug', '2030-11-15'), step('delivered', '2030-11-30')]],
  ['maiden', false, 'spring', [step('linersPlanted', '2028-04-30'), step('budded', '2028-09-30'), step('headedBack', '2029-03-31'), step('dug', '2029-11-15'), step('delivered', '2030-04-15')]],
  ['feathered', false, 'autumn', [step('linersPlanted', '2029-04-30'), step('budded', '2029-09-30'), step('headedBack', '2030-03-31'), step('dug', '2030-11-15'), step('delivered', '2030-11-30')]],
  ['feathered', false, 'spring', [step('linersPlanted', '2028-04-30'), step('budded', '2028-09-30'), step('headedBack', '2029-03-31'), step('dug', '2029-11-15'), step('delivered', '2030-04-15')]],
  // Double-worked: the interstem budded in the first summer, grown the next season, the variety budded onto it.
  ['maiden', true, 'autumn', [step('linersPlanted', '2028-04-30'), step('interstemBudded', '2028-09-30'), step('interstemHeadedBack', '2029-03-31'), step('budded', '2029-09-30'), step('headedBack', '2030-03-31'), step('dug', '2030-11-15'), step('delivered', '2030-11-30')]],
  ['maiden', true, 'spring', [step('linersPlanted', '2027-04-30'), step('interstemBudded', '2027-09-30'), step('interstemHeadedBack', '2028-03-31'), step('budded', '2028-09-30'), step('headedBack', '2029-03-31'), step('dug', '2029-11-15'), step('delivered', '2030-04-15')]],
  ['feathered', true, 'autumn', [step('linersPlanted', '2028-04-30'), step('interstemBudded', '2028-09-30'), step('interstemHeadedBack', '2029-03-31'), step('budded', '2029-09-30'), step('headedBack', '2030-03-31'), step('dug', '2030-11-15'), step('delivered', '2030-11-30')]],
  ['feathered', true, 'spring', [step('linersPlanted', '2027-04-30'), step('interstemBudded', '2027-09-30'), step('interstemHeadedBack', '2028-03-31'), step('budded', '2028-09-30'), step('headedBack', '2029-03-31'), step('dug', '2029-11-15'), step('delivered', '2030-04-15')]],
  // Knip: a one-year tree cut back in its second winter, then grown a season more.
  ['knip', false, 'autumn', [step('linersPlanted', '2028-04-30'), step('budded', '2028-09-30'), step('headedBack', '2029-03-31'), step('knipCutBack', '2030-03-31'), step('dug', '2030-11-15'), step('delivered', '2030-11-30')]],
  ['knip', false, 'spring', [step('linersPlanted', '2027-04-30'), step('budded', '2027-09-30'), step('headedBack', '2028-03-31'), step('knipCutBack', '2029-03-31'), step('dug', '2029-11-15'), step('delivered', '2030-04-15')]],
  ['knip', true, 'autumn', [step('linersPlanted', '2027-04-30'), step('interstemBudded', '2027-09-30'), step('interstemHeadedBack', '2028-03-31'), step('budded', '2028-09-30'), step('headedBack', '2029-03-31'), step('knipCutBack', '2030-03-31'), step('dug', '2030-11-15'), step('delivered', '2030-11-30')]],
  ['knip', true, 'spring', [step('linersPlanted', '2026-04-30'), step('interstemBudded', '2026-09-30'), step('interstemHeadedBack', '2027-03-31'), step('budded', '2027-09-30'), step('headedBack', '2028-03-31'), step('knipCutBack', '2029-03-31'), step('dug', '2029-11-15'), step('delivered', '2030-04-15')]],
  // Sleeping eye: no heading back; for spring, dug by mid-March of the delivery year (common practice).
  ['sleeping-eye', false, 'autumn', [step('linersPlanted', '2030-04-30'), step('budded', '2030-09-30'), step('dug', '2030-11-15'), step('delivered', '2030-11-30')]],
  ['sleeping-eye', false, 'spring', [step('linersPlanted', '2029-04-30'), step('budded', '2029-09-30'), step('dug', '2030-03-15'), step('delivered', '2030-04-15')]],
  // Bench graft: grafted by mid-March, lined out in spring, dug after that one season.
  ['bench-graft', false, 'autumn', [step('benchGrafted', '2030-03-15'), step('linersPlanted', '2030-04-30'), step('dug', '2030-11-15'), step('delivered', '2030-11-30')]],
  ['bench-graft', false, 'spring', [step('benchGrafted', '2029-03-15'), step('linersPlanted', '2029-04-30'), step('dug', '2029-11-15'), step('delivered', '2030-04-15')]],
]

// The months each step may fall in (northern hemisphere; common practice): grafting indoors in late
// winter, lining out in spring, budding in late summer (Penn State and Ohio State, eXtension), cutting
// back while dormant, digging after leaf fall (or, for a spring sleeping eye, before bud break).
const MONTHS_OF: Record<PropagationStep, number[]> = {
  benchGrafted: [1, 2, 3],
  linersPlanted: [3, 4, 5],
  interstemBudded: [8, 9],
  interstemHeadedBack: [2, 3],
  budded: [8, 9],
  headedBack: [2, 3],
  knipCutBack: [1, 2, 3],
  dug: [10, 11, 12],
  delivered: [10, 11, 12],
}
const month = (iso: string) => Number(iso.slice(5, 7))
const year = (iso: string) => Number(iso.slice(0, 4))

describe('backPlanSteps by tree type and interstem', () => {
  for (const [treeType, interstem, season, expected] of HAND_WORKED) {
    it(`dates a ${treeType}${interstem ? ' on an interstem' : ''} for ${season} 2030 delivery (hand-worked; sources above)`, () => {
      expect(backPlanSteps(2030, season, { treeType, interstem })).toEqual(expected)
    })
  }

  it('gives a maiden without an interstem when no option is given (today\'s plan)', () => {
    for (const season of ['autumn', 'spring'] as const) {
      expect(backPlanSteps(2031, season, {})).toEqual(backPlanSteps(2031, season))
      expect(backPlanSteps(2031, season, { treeType: 'maiden', interstem: false })).toEqual(backPlanSteps(2031, season))
    }
  })

  it('lists only the steps a tree type has, in the order of PROPAGATION_STEPS, each date later than the last', () => {
    for (const [treeType, interstem, season] of HAND_WORKED) {
      const steps = backPlanSteps(2035, season, { treeType, interstem })
      const names = steps.map(s => s.step)
      expect(names, treeType).toEqual(PROPAGATION_STEPS.filter(name => names.includes(name)))
      for (let i = 1; i < steps.length; i++) expect(steps[i]!.by > steps[i - 1]!.by, `${treeType} ${season}`).toBe(true)
    }
  })

  it('keeps every step in its season (common practice)', () => {
    for (const [treeType, interstem, season] of HAND_WORKED) {
      for (const { step: name, by } of backPlanSteps(2035, season, { treeType, interstem })) {
        let months = MONTHS_OF[name]
        if (name === 'delivered' && season === 'spring') months = [3, 4, 5]
        if (name === 'dug' && treeType === 'sleeping-eye' && season === 'spring') months = [2, 3]
        expect(months, `${treeType} ${season} ${name} ${by}`).toContain(month(by))
      }
    }
  })

  it('has a sleeping eye budded and dug without heading back, and a bench graft never budded', () => {
    for (const season of ['autumn', 'spring'] as const) {
      const eye = backPlanSteps(2032, season, { treeType: 'sleeping-eye' }).map(s => s.step)
      expect(eye).toContain('budded')
      expect(eye).not.toContain('headedBack')
      const bench = backPlanSteps(2032, season, { treeType: 'bench-graft' }).map(s => s.step)
      expect(bench).toContain('benchGrafted')
      expect(bench).not.toContain('budded')
    }
  })

  it('a sleeping eye for autumn is budded that summer and dug after leaf fall the same year (Good Fruit Grower, "Types of trees"; common practice)', () => {
    const steps = backPlanSteps(2032, 'autumn', { treeType: 'sleeping-eye' })
    expect(steps.find(s => s.step === 'budded')?.by).toBe('2032-09-30')
    expect(steps.find(s => s.step === 'dug')?.by).toBe('2032-11-15')
  })

  it('counts the growing seasons the plan spans, from lining out to the last season before digging', () => {
    for (const [treeType, interstem, season] of HAND_WORKED) {
      const steps = backPlanSteps(2030, season, { treeType, interstem })
      const lastSeason = season === 'autumn' ? 2030 : 2029
      expect(lastSeason - year(steps[0]!.by) + 1, `${treeType} ${interstem} ${season}`).toBe(propagationSeasons(treeType, interstem))
    }
  })

  it('refuses an interstem on a sleeping eye or a bench graft, and an unknown tree type', () => {
    expect(() => backPlanSteps(2030, 'spring', { treeType: 'sleeping-eye', interstem: true })).toThrow(/A sleeping eye cannot be on an interstem: it is dug with its bud still dormant/)
    expect(() => backPlanSteps(2030, 'autumn', { treeType: 'bench-graft', interstem: true })).toThrow(/A bench graft cannot be on an interstem: it is one graft made indoors/)
    expect(() => backPlanSteps(2030, 'autumn', { treeType: 'bench-graft', interstem: true })).toThrow(RangeError)
    // @ts-expect-error: only the tree types listed
    expect(() => backPlanSteps(2030, 'autumn', { treeType: 'whip' })).toThrow(/Tree type must be one of sleeping-eye, maiden, feathered, knip, bench-graft/)
  })
})

describe('extraSeasons and propagationSeasons', () => {
  it('gives the seasons more than a maiden, and the seasons in the nursery row (sources above; knip on an interstem common practice)', () => {
    const cases: [TreeType, boolean, number, number][] = [
      ['maiden', false, 0, 2],
      ['feathered', false, 0, 2],
      ['maiden', true, 1, 3],
      ['feathered', true, 1, 3],
      ['knip', false, 1, 3],
      ['knip', true, 2, 4],
      ['sleeping-eye', false, -1, 1],
      ['bench-graft', false, -1, 1],
    ]
    for (const [treeType, interstem, extra, seasons] of cases) {
      expect(extraSeasons(treeType, interstem), `${treeType} ${interstem}`).toBe(extra)
      expect(propagationSeasons(treeType, interstem), `${treeType} ${interstem}`).toBe(seasons)
    }
    expect(propagationSeasons()).toBe(2)
    expect(TREE_TYPES.every(t => propagationSeasons(t) >= 1)).toBe(true)
  })

  it('refuses the same combinations as the plan', () => {
    expect(() => extraSeasons('sleeping-eye', true)).toThrow(RangeError)
    expect(() => propagationSeasons('bench-graft', true)).toThrow(RangeError)
  })
})

describe('nurseryBackPlan by tree type', () => {
  it('passes the tree type and interstem to the dated steps and leaves the rootstock count alone', () => {
    const plan = nurseryBackPlan({ deliveryYear: 2030, season: 'autumn', trees: 1000, takeRate: 0.8, survivalRate: 0.9, treeType: 'knip', interstem: true })
    expect(plan.steps).toEqual(HAND_WORKED.find(([t, i, s]) => t === 'knip' && i && s === 'autumn')![3])
    // 1000 / 0.72 = 1388.9 → 1389 (worked example).
    expect(plan.rootstocksToBud).toBe(1389)
  })
})

describe('backPlanWarning', () => {
  // A maiden for autumn 2027: liners by 30 April 2026 (Penn State / eXtension cycle; day common practice).
  const maiden = backPlanSteps(2027, 'autumn')

  it('says the season is too close, naming the first step in plain words, once its date is past', () => {
    expect(backPlanWarning(maiden, '2026-05-01')).toBe('The delivery season is too close: rootstock liners should have been lined out by 30 April 2026.')
    expect(backPlanWarning(maiden, '2027-01-02')).toBe('The delivery season is too close: rootstock liners should have been lined out by 30 April 2026.')
  })

  it('is null while there is still time, including on the day itself', () => {
    expect(backPlanWarning(maiden, '2026-04-30')).toBeNull()
    expect(backPlanWarning(maiden, '2025-12-31')).toBeNull()
  })

  it('names grafting for a bench graft, whose first step it is', () => {
    // Bench graft for autumn 2027: grafted by 15 March 2027 (common practice).
    const bench = backPlanSteps(2027, 'autumn', { treeType: 'bench-graft' })
    expect(backPlanWarning(bench, '2027-03-16')).toBe('The delivery season is too close: the bench grafts should have been made by 15 March 2027.')
    expect(backPlanWarning(bench, '2027-03-15')).toBeNull()
  })

  it('warns a year earlier for a knip tree than for a maiden delivered the same season', () => {
    const knip = backPlanSteps(2027, 'autumn', { treeType: 'knip' })
    expect(backPlanWarning(knip, '2025-06-01')).toBe('The delivery season is too close: rootstock liners should have been lined out by 30 April 2025.')
    expect(backPlanWarning(maiden, '2025-06-01')).toBeNull()
  })

  it('has nothing to say about an empty plan and refuses a today that is not a date', () => {
    expect(backPlanWarning([], '2026-05-01')).toBeNull()
    expect(() => backPlanWarning(maiden, '1 May 2026')).toThrow(/Today must be a date as YYYY-MM-DD/)
    expect(() => backPlanWarning(maiden, '2026-02-30')).toThrow(RangeError)
  })
})

// The southern hemisphere: the same season falls six months off (August budding in England is
// February budding in New Zealand: common practice). An autumn delivery moves six months back, a
// spring delivery six months on, so each stays in its delivery year; a day past the new month's end
// falls on its last day (31 March → 30 September). Hand-worked from HAND_WORKED above.
type SouthPlan = [treeType: TreeType, interstem: boolean, season: DeliverySeason, dates: string[]]
const SOUTH_MAIDEN = ['2028-10-30', '2029-03-30', '2029-09-30', '2030-05-15']
const SOUTH_INTERSTEM = ['2027-10-30', '2028-03-30', '2028-09-30', '2029-03-30', '2029-09-30', '2030-05-15']
const SOUTH_KNIP = ['2027-10-30', '2028-03-30', '2028-09-30', '2029-09-30', '2030-05-15']
const SOUTH_KNIP_INTERSTEM = ['2026-10-30', '2027-03-30', '2027-09-30', '2028-03-30', '2028-09-30', '2029-09-30', '2030-05-15']
const SOUTH_HAND_WORKED: SouthPlan[] = [
  // Autumn 2030 in the south is May 2030: dug by mid-May, delivered by 30 May.
  ['maiden', false, 'autumn', [...SOUTH_MAIDEN, '2030-05-30']],
  // Spring 2030 in the south is October 2030: the same trees, held over the winter, delivered by 15 October.
  ['maiden', false, 'spring', [...SOUTH_MAIDEN, '2030-10-15']],
  ['feathered', false, 'autumn', [...SOUTH_MAIDEN, '2030-05-30']],
  ['feathered', false, 'spring', [...SOUTH_MAIDEN, '2030-10-15']],
  ['maiden', true, 'autumn', [...SOUTH_INTERSTEM, '2030-05-30']],
  ['maiden', true, 'spring', [...SOUTH_INTERSTEM, '2030-10-15']],
  ['feathered', true, 'autumn', [...SOUTH_INTERSTEM, '2030-05-30']],
  ['feathered', true, 'spring', [...SOUTH_INTERSTEM, '2030-10-15']],
  ['knip', false, 'autumn', [...SOUTH_KNIP, '2030-05-30']],
  ['knip', false, 'spring', [...SOUTH_KNIP, '2030-10-15']],
  ['knip', true, 'autumn', [...SOUTH_KNIP_INTERSTEM, '2030-05-30']],
  ['knip', true, 'spring', [...SOUTH_KNIP_INTERSTEM, '2030-10-15']],
  // A sleeping eye for autumn is dug in May; for spring, dug by mid-September before its bud breaks.
  ['sleeping-eye', false, 'autumn', ['2029-10-30', '2030-03-30', '2030-05-15', '2030-05-30']],
  ['sleeping-eye', false, 'spring', ['2029-10-30', '2030-03-30', '2030-09-15', '2030-10-15']],
  ['bench-graft', false, 'autumn', ['2029-09-15', '2029-10-30', '2030-05-15', '2030-05-30']],
  ['bench-graft', false, 'spring', ['2029-09-15', '2029-10-30', '2030-05-15', '2030-10-15']],
]

describe('backPlanSteps in the southern hemisphere', () => {
  for (const [treeType, interstem, season, dates] of SOUTH_HAND_WORKED) {
    it(`dates a ${treeType}${interstem ? ' on an interstem' : ''} for ${season} 2030 delivery in the south (hand-worked, six months off; common practice)`, () => {
      const north = backPlanSteps(2030, season, { treeType, interstem })
      const south = backPlanSteps(2030, season, { treeType, interstem, hemisphere: 'south' })
      expect(south.map(s => s.step)).toEqual(north.map(s => s.step))
      expect(south.map(s => s.by)).toEqual(dates)
    })
  }

  it('leaves the north as it was when the hemisphere is named (hand-worked plans above)', () => {
    for (const [treeType, interstem, season, expected] of HAND_WORKED) {
      expect(backPlanSteps(2030, season, { treeType, interstem, hemisphere: 'north' })).toEqual(expected)
    }
  })

  it('moves an autumn delivery six months back and a spring delivery six months on, in the same delivery year (common practice)', () => {
    const autumn = backPlanSteps(2027, 'autumn', { hemisphere: 'south' })
    expect(autumn.at(-1)).toEqual({ step: 'delivered', by: '2027-05-30' }) // 30 November → 30 May
    const spring = backPlanSteps(2027, 'spring', { hemisphere: 'south' })
    expect(spring.at(-1)).toEqual({ step: 'delivered', by: '2027-10-15' }) // 15 April → 15 October
  })

  it('keeps every step in its season six months on, in order (common practice)', () => {
    for (const [treeType, interstem, season] of HAND_WORKED) {
      const steps = backPlanSteps(2035, season, { treeType, interstem, hemisphere: 'south' })
      for (let i = 1; i < steps.length; i++) expect(steps[i]!.by > steps[i - 1]!.by, `${treeType} ${season}`).toBe(true)
      for (const { step: name, by } of steps) {
        let months = MONTHS_OF[name]
        if (name === 'delivered' && season === 'spring') months = [3, 4, 5]
        if (name === 'dug' && treeType === 'sleeping-eye' && season === 'spring') months = [2, 3]
        expect(months.map(m => ((m + 5) % 12) + 1), `${treeType} ${season} ${name} ${by}`).toContain(month(by))
      }
      expect(year(steps.at(-1)!.by)).toBe(2035)
    }
  })

  it('passes the hemisphere through the whole back-plan and refuses an unknown one', () => {
    const plan = nurseryBackPlan({ deliveryYear: 2030, season: 'autumn', trees: 1000, takeRate: 0.8, survivalRate: 0.9, hemisphere: 'south' })
    expect(plan.steps.map(s => s.by)).toEqual(SOUTH_HAND_WORKED[0]![3])
    // @ts-expect-error: only north and south
    expect(() => backPlanSteps(2030, 'autumn', { hemisphere: 'east' })).toThrow(/Hemisphere must be 'north' or 'south'/)
  })
})
