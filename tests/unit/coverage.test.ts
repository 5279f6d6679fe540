import { describe, expect, it } from 'vitest'
import { growerCoverage, makerSupply, plantingYear, treeContractBlocks, type CoverageContract, type SupplyTreeContract } from '#shared/utils/coverage'
import { sumForecastByClass, type BearingCurve } from '#shared/utils/forecast'

// Rootstock curves and orchards here are invented for hand-worked examples; the straight-line
// ramp to full bearing is common practice (see shared/utils/forecast.ts).
const matureCurve: BearingCurve = { yearsToFirstCrop: 3, yearsToFullBearing: 7, yieldPerTreeKgAtFull: 20 }
const youngCurve: BearingCurve = { yearsToFirstCrop: 2, yearsToFullBearing: 5, yieldPerTreeKgAtFull: 30 }
const perryCurve: BearingCurve = { yearsToFirstCrop: 4, yearsToFullBearing: 10, yieldPerTreeKgAtFull: 50 }

describe('grower coverage (hand-worked example)', () => {
  // Forecast, 2026–2028, by hand (fraction = (age − first + 1) / (full − first + 1)):
  //   apple bittersharp, 600 trees planted 2015, full bearing:   600 × 20 kg = 12,000 kg each year
  //   apple bittersharp, 400 trees planted 2023 (ages 3, 4, 5):  400 × 30 kg × 2/4, 3/4, 4/4
  //                                                              = 6,000, 9,000, 12,000 kg
  //     → apple bittersharp 18,000, 21,000, 24,000 kg
  //   perry bittersharp, 200 pear trees planted 2010, full:      200 × 50 kg = 10,000 kg each year
  const forecast = sumForecastByClass([
    { juiceClass: 'bittersharp', trees: 600, yearPlanted: 2015, curve: matureCurve },
    { juiceClass: 'bittersharp', trees: 400, yearPlanted: 2023, curve: youngCurve },
    { species: 'pear', juiceClass: 'bittersharp', trees: 200, yearPlanted: 2010, curve: perryCurve },
  ], { startYear: 2026, years: 3 })

  const accepted: CoverageContract = {
    state: 'accepted',
    fruit: { juiceClass: 'bittersharp' },
    schedule: [{ year: 2026, tonnes: 20 }, { year: 2027, tonnes: 20 }, { year: 2028, tonnes: 20 }],
    tolerancePct: 10,
  }
  const offered: CoverageContract = {
    state: 'offered',
    fruit: { variety: { species: 'apple', juiceClass: 'bittersharp' } },
    schedule: [{ year: 2027, tonnes: 5 }, { year: 2028, tonnes: 2 }],
    tolerancePct: 5,
  }
  const pear: CoverageContract = {
    state: 'accepted',
    fruit: { variety: { species: 'pear', juiceClass: 'bittersharp' } },
    schedule: [{ year: 2026, tonnes: 12 }],
    tolerancePct: 0,
  }
  const countered: CoverageContract = { state: 'countered', fruit: { juiceClass: 'bittersharp' }, schedule: [{ year: 2028, tonnes: 1 }], tolerancePct: 0 }
  const ignored: CoverageContract[] = [
    { state: 'declined', fruit: { juiceClass: 'bittersharp' }, schedule: [{ year: 2026, tonnes: 50 }], tolerancePct: 0 },
    { state: 'draft', fruit: { juiceClass: 'bittersharp' }, schedule: [{ year: 2027, tonnes: 100 }], tolerancePct: 0 },
    { state: 'cancelled', fruit: { species: 'pear', juiceClass: 'bittersharp' }, schedule: [{ year: 2026, tonnes: 9 }], tolerancePct: 0 },
  ]
  const coverage = growerCoverage(forecast, [accepted, offered, pear, countered, ...ignored])

  it('reports forecast, accepted, offered and both shortfalls per class and year', () => {
    expect(coverage.rows).toEqual([
      // 2026: 20 t accepted against 18,000 kg: 2,000 kg short. No offers.
      { juiceClass: 'bittersharp', year: 2026, forecastKg: 18000, contractedKg: 20000, offeredKg: 0, shortfallKg: 2000, shortfallIfAcceptedKg: 2000 },
      // 2027: 20 t accepted against 21,000 kg: covered; with the 5 t offer, 25,000 kg: 4,000 kg short.
      { juiceClass: 'bittersharp', year: 2027, forecastKg: 21000, contractedKg: 20000, offeredKg: 5000, shortfallKg: 0, shortfallIfAcceptedKg: 4000 },
      // 2028: 20 t accepted, 2 t offered + 1 t countered = 23,000 kg against 24,000 kg: covered either way.
      { juiceClass: 'bittersharp', year: 2028, forecastKg: 24000, contractedKg: 20000, offeredKg: 3000, shortfallKg: 0, shortfallIfAcceptedKg: 0 },
      // The pear contract stands apart: 12 t against the perry pears' 10,000 kg, 2,000 kg short.
      { juiceClass: 'perry bittersharp', year: 2026, forecastKg: 10000, contractedKg: 12000, offeredKg: 0, shortfallKg: 2000, shortfallIfAcceptedKg: 2000 },
    ])
  })

  it('warns only where the contracts exceed the forecast by more than their tolerance', () => {
    expect(coverage.overCommitted).toEqual([
      // 2027: the least the contracts accept is 20 t × 0.90 + 5 t × 0.95 = 18,000 + 4,750 = 22,750 kg,
      // 1,750 kg above the 21,000 kg forecast; only accepting the offer would cause it.
      { juiceClass: 'bittersharp', year: 2027, forecastKg: 21000, contractedKg: 25000, leastKg: 22750, shortKg: 1750, ifAccepted: true },
      // Pears 2026: no tolerance, so the least is the full 12,000 kg, 2,000 kg above the forecast.
      { juiceClass: 'perry bittersharp', year: 2026, forecastKg: 10000, contractedKg: 12000, leastKg: 12000, shortKg: 2000, ifAccepted: false },
    ])
    // Apples 2026 are 2,000 kg short of 20 t, but 20 t − 10 % = 18,000 kg is exactly the forecast:
    // the contract is met at its tolerance, so there is no warning.
    expect(coverage.overCommitted.some(w => w.juiceClass === 'bittersharp' && w.year === 2026)).toBe(false)
  })

  it('warns on 2026 apples once the tolerance is narrower than the shortfall', () => {
    // 20 t − 5 % = 19,000 kg against 18,000 kg: 1,000 kg short of the least.
    const tight = growerCoverage(forecast, [{ ...accepted, tolerancePct: 5 }])
    expect(tight.overCommitted).toEqual([
      { juiceClass: 'bittersharp', year: 2026, forecastKg: 18000, contractedKg: 20000, leastKg: 19000, shortKg: 1000, ifAccepted: false },
    ])
    // With no tolerance the least is the whole 20 t, the same 2,000 kg as the shortfall.
    expect(growerCoverage(forecast, [{ ...accepted, tolerancePct: 0 }]).overCommitted[0]).toMatchObject({ leastKg: 20000, shortKg: 2000 })
    // Tolerance does not change the shortfall itself.
    expect(tight.rows[0]?.shortfallKg).toBe(2000)
  })

  it('shows on one offer what accepting it would do', () => {
    const onOffer = growerCoverage(forecast, [accepted, offered])
    expect(onOffer.overCommitted).toEqual([
      { juiceClass: 'bittersharp', year: 2027, forecastKg: 21000, contractedKg: 25000, leastKg: 22750, shortKg: 1750, ifAccepted: true },
    ])
    // Once accepted, the same contract counts as contracted and the warning is no longer conditional.
    const afterAcceptance = growerCoverage(forecast, [accepted, { ...offered, state: 'accepted' }])
    expect(afterAcceptance.rows[1]).toMatchObject({ year: 2027, contractedKg: 25000, offeredKg: 0, shortfallKg: 4000 })
    expect(afterAcceptance.overCommitted).toMatchObject([{ year: 2027, ifAccepted: false, shortKg: 1750 }])
  })

  it('has no rows and no warnings for a grower without contracts, and refuses a bad tolerance or a year outside the forecast', () => {
    expect(growerCoverage(forecast, ignored)).toEqual({ rows: [], overCommitted: [] })
    expect(() => growerCoverage(forecast, [{ ...accepted, tolerancePct: 120 }])).toThrow(/Tolerance must be from 0 to 100/)
    expect(() => growerCoverage(forecast, [{ ...offered, schedule: [{ year: 2031, tonnes: 1 }] }])).toThrow(/no figure for 2031/)
    expect(() => growerCoverage(forecast, [{ ...accepted, fruit: { species: 'pear', juiceClass: 'sharp' } }])).toThrow(/A pear has no juice class "sharp"/)
  })
})

describe('planting year of delivered trees', () => {
  it('counts a spring delivery from that year and an autumn delivery from the next (north, common practice)', () => {
    expect(plantingYear(2027, 'spring')).toBe(2027)
    expect(plantingYear(2027, 'autumn')).toBe(2028)
  })

  it('counts both from the next harvest year in the south, where a growing season runs into the next year', () => {
    expect(plantingYear(2027, 'spring', 'south')).toBe(2028)
    expect(plantingYear(2027, 'autumn', 'south')).toBe(2028)
  })
})

describe('maker supply (hand-worked example)', () => {
  const needs = [
    { juiceClass: 'bittersharp', year: 2026, kg: 30000 },
    { juiceClass: 'bittersharp', year: 2027, kg: 30000 },
    { juiceClass: 'bittersharp', year: 2028, kg: 40000 },
    { juiceClass: 'bittersharp', year: 2029, kg: 50000 },
    { juiceClass: 'bittersharp', year: 2030, kg: 50000 },
    { juiceClass: 'bittersharp', year: 2031, kg: 99000 },
    { juiceClass: 'perry bittersharp', year: 2026, kg: 5000 },
  ] as const
  const contracts: CoverageContract[] = [
    {
      state: 'accepted',
      fruit: { juiceClass: 'bittersharp' },
      schedule: [2026, 2027, 2028, 2029, 2030].map(year => ({ year, tonnes: 20 })),
      tolerancePct: 10,
    },
    { state: 'offered', fruit: { juiceClass: 'bittersharp' }, schedule: [{ year: 2026, tonnes: 10 }], tolerancePct: 0 },
    { state: 'accepted', fruit: { variety: { species: 'pear', juiceClass: 'bittersharp' } }, schedule: [{ year: 2026, tonnes: 3 }], tolerancePct: 0 },
  ]
  const bittersharp = { species: 'apple', juiceClass: 'bittersharp' } as const
  const trees: SupplyTreeContract[] = [
    // Spring 2025: planted 2025, ages 1–5 in 2026–2030; first crop 3, full 6 → 0, 0, 1/4, 2/4, 3/4
    // of 1,000 × 0.9 × 25 kg = 22,500 kg → 0, 0, 5,625, 11,250, 16,875 kg.
    { state: 'accepted', trees: 1000, variety: bittersharp, curve: { yearsToFirstCrop: 3, yearsToFullBearing: 6, yieldPerTreeKgAtFull: 25 }, survivalRate: 0.9, deliveryYear: 2025, deliverySeason: 'spring' },
    // Autumn 2025: counts as planted 2026, ages 0–4; first crop 2, full 5 → 0, 0, 1/4, 2/4, 3/4
    // of 800 × 30 kg = 24,000 kg → 0, 0, 6,000, 12,000, 18,000 kg.
    { state: 'ready', trees: 800, variety: bittersharp, curve: youngCurve, deliveryYear: 2025, deliverySeason: 'autumn' },
    // Delivered spring 2020: ages 6–10; first crop 4, full 7 → 3/4 then full of 100 × 40 kg
    // → 3,000, 4,000, 4,000, 4,000, 4,000 kg of perry pears.
    { state: 'delivered', trees: 100, variety: { species: 'pear', juiceClass: 'bittersharp' }, curve: { yearsToFirstCrop: 4, yearsToFullBearing: 7, yieldPerTreeKgAtFull: 40 }, deliveryYear: 2020, deliverySeason: 'spring' },
    // Not agreed, or called off: no fruit.
    { state: 'offered', trees: 5000, variety: bittersharp, curve: youngCurve, deliveryYear: 2024, deliverySeason: 'spring' },
    { state: 'cancelled', trees: 2000, variety: bittersharp, curve: youngCurve, deliveryYear: 2024, deliverySeason: 'spring' },
  ]
  const rows = makerSupply(needs, contracts, trees, { startYear: 2026, years: 5 })

  it('sets need against contracted fruit and fruit from trees, with the gap per class and year', () => {
    expect(rows).toEqual([
      // gap = max(0, need − 20,000 contracted − from trees)
      { juiceClass: 'bittersharp', year: 2026, needKg: 30000, contractedKg: 20000, fromTreesKg: 0, gapKg: 10000 },
      { juiceClass: 'bittersharp', year: 2027, needKg: 30000, contractedKg: 20000, fromTreesKg: 0, gapKg: 10000 },
      // 5,625 + 6,000 = 11,625 kg from trees; 40,000 − 20,000 − 11,625 = 8,375 kg.
      { juiceClass: 'bittersharp', year: 2028, needKg: 40000, contractedKg: 20000, fromTreesKg: 11625, gapKg: 8375 },
      // 11,250 + 12,000 = 23,250 kg; 50,000 − 20,000 − 23,250 = 6,750 kg.
      { juiceClass: 'bittersharp', year: 2029, needKg: 50000, contractedKg: 20000, fromTreesKg: 23250, gapKg: 6750 },
      // 16,875 + 18,000 = 34,875 kg; 50,000 − 20,000 − 34,875 is below 0: no gap.
      { juiceClass: 'bittersharp', year: 2030, needKg: 50000, contractedKg: 20000, fromTreesKg: 34875, gapKg: 0 },
      // Perry pears apart: 5,000 kg needed in 2026 against 3 t contracted and 3,000 kg from trees.
      { juiceClass: 'perry bittersharp', year: 2026, needKg: 5000, contractedKg: 3000, fromTreesKg: 3000, gapKg: 0 },
      { juiceClass: 'perry bittersharp', year: 2027, needKg: 0, contractedKg: 0, fromTreesKg: 4000, gapKg: 0 },
      { juiceClass: 'perry bittersharp', year: 2028, needKg: 0, contractedKg: 0, fromTreesKg: 4000, gapKg: 0 },
      { juiceClass: 'perry bittersharp', year: 2029, needKg: 0, contractedKg: 0, fromTreesKg: 4000, gapKg: 0 },
      { juiceClass: 'perry bittersharp', year: 2030, needKg: 0, contractedKg: 0, fromTreesKg: 4000, gapKg: 0 },
    ])
  })

  it('takes an autumn delivery as planted the next year', () => {
    const [autumn] = treeContractBlocks([trees[1]!])
    expect(autumn?.yearPlanted).toBe(2026)
    // Had it counted from 2025, it would be age 3 in 2028 (2/4 → 12,000 kg) instead of 6,000 kg.
    const alone = makerSupply([], [], [trees[1]!], { startYear: 2028, years: 1 })
    expect(alone).toEqual([{ juiceClass: 'bittersharp', year: 2028, needKg: 0, contractedKg: 0, fromTreesKg: 6000, gapKg: 0 }])
  })

  it('leaves out classes with nothing in the window, and refuses a negative need', () => {
    expect(rows.some(r => r.juiceClass === 'sweet' || r.juiceClass === 'bittersweet')).toBe(false)
    expect(makerSupply([], [], [], { startYear: 2026, years: 5 })).toEqual([])
    expect(() => makerSupply([{ juiceClass: 'sharp', year: 2026, kg: -1 }], [], [], { startYear: 2026 })).toThrow(/A need must be zero or more kg/)
  })
})
