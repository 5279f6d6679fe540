import { describe, it, expect } from 'vitest'
import {
  DEFAULT_FORECAST_YEARS,
  bearingFraction,
  forecastBlock,
  forecastCoverage,
  sumForecastByClass,
  type BearingCurve,
  type ClassedBlock,
} from '../../shared/utils/forecast'

// Rootstock figures here are invented for hand-worked examples; the linear ramp
// to full bearing is common practice.
const slowCurve: BearingCurve = { yearsToFirstCrop: 3, yearsToFullBearing: 7, yieldPerTreeKgAtFull: 20 }
const quickCurve: BearingCurve = { yearsToFirstCrop: 2, yearsToFullBearing: 4, yieldPerTreeKgAtFull: 30 }

describe('bearingFraction', () => {
  it('is 0 before the first crop, ramps in equal steps, then stays at 1 (worked example)', () => {
    // First crop at age 3, full at 7: (age − 3 + 1) / (7 − 3 + 1) = 1/5, 2/5, … 5/5.
    expect([0, 1, 2, 3, 4, 5, 6, 7, 8, 20].map(age => bearingFraction(age, slowCurve)))
      .toEqual([0, 0, 0, 0.2, 0.4, 0.6, 0.8, 1, 1, 1])
  })

  it('bears something in the first cropping year', () => {
    expect(bearingFraction(3, slowCurve)).toBeGreaterThan(0)
  })

  it('jumps straight to the full crop when first crop and full bearing coincide', () => {
    const curve = { yearsToFirstCrop: 4, yearsToFullBearing: 4, yieldPerTreeKgAtFull: 50 }
    expect(bearingFraction(3, curve)).toBe(0)
    expect(bearingFraction(4, curve)).toBe(1)
  })

  it('refuses a curve that reaches full bearing before its first crop', () => {
    expect(() => bearingFraction(5, { yearsToFirstCrop: 5, yearsToFullBearing: 3, yieldPerTreeKgAtFull: 10 }))
      .toThrow(/Years to full bearing \(3\) cannot be fewer than years to first crop \(5\)/)
    expect(() => bearingFraction(5, { yearsToFirstCrop: 2, yearsToFullBearing: 5, yieldPerTreeKgAtFull: -1 }))
      .toThrow(RangeError)
    expect(() => bearingFraction(2.5, slowCurve)).toThrow(RangeError)
  })
})

describe('forecastBlock', () => {
  it('forecasts 1000 trees planted 2020 at 95 % survival (worked example)', () => {
    // kg = 1000 × 0.95 × 20 kg × fraction; ages 1–10 over 2021–2030.
    const rows = forecastBlock({ trees: 1000, yearPlanted: 2020, survivalRate: 0.95 }, slowCurve, { startYear: 2021, years: 10 })
    expect(rows.map(r => r.year)).toEqual([2021, 2022, 2023, 2024, 2025, 2026, 2027, 2028, 2029, 2030])
    const kg = rows.map(r => r.kg)
    const expected = [0, 0, 3800, 7600, 11400, 15200, 19000, 19000, 19000, 19000]
    expected.forEach((value, i) => expect(kg[i]).toBeCloseTo(value, 9))
  })

  it('takes survival as 1 and 15 years when not given', () => {
    const rows = forecastBlock({ trees: 500, yearPlanted: 2022 }, quickCurve, { startYear: 2022 })
    expect(DEFAULT_FORECAST_YEARS).toBe(15)
    expect(rows).toHaveLength(15)
    expect(rows[0]).toEqual({ year: 2022, kg: 0 })
    // 500 × 30 kg × 1/3, 2/3, 1 in 2024, 2025, 2026 (worked example).
    expect(rows[2]?.kg).toBeCloseTo(5000, 9)
    expect(rows[3]?.kg).toBeCloseTo(10000, 9)
    expect(rows[4]?.kg).toBe(15000)
    expect(rows[14]).toEqual({ year: 2036, kg: 15000 })
  })

  it('gives 0 for years before the block was planted', () => {
    const rows = forecastBlock({ trees: 300, yearPlanted: 2030 }, quickCurve, { startYear: 2025, years: 5 })
    expect(rows.every(r => r.kg === 0)).toBe(true)
  })

  it('refuses impossible blocks and options', () => {
    expect(() => forecastBlock({ trees: -1, yearPlanted: 2020 }, slowCurve, { startYear: 2021 })).toThrow(/Tree count/)
    expect(() => forecastBlock({ trees: 10.5, yearPlanted: 2020 }, slowCurve, { startYear: 2021 })).toThrow(RangeError)
    expect(() => forecastBlock({ trees: 10, yearPlanted: 2020, survivalRate: 1.2 }, slowCurve, { startYear: 2021 }))
      .toThrow(/Survival rate must be from 0 to 1/)
    expect(() => forecastBlock({ trees: 10, yearPlanted: 2020 }, slowCurve, { startYear: 2021, years: 0 }))
      .toThrow(/Number of years/)
  })
})

describe('sumForecastByClass and forecastCoverage', () => {
  const blocks: ClassedBlock[] = [
    { juiceClass: 'bittersweet', trees: 1000, yearPlanted: 2020, survivalRate: 0.95, curve: slowCurve },
    { juiceClass: 'bittersweet', trees: 200, yearPlanted: 2015, survivalRate: 0.9, curve: slowCurve },
    { juiceClass: 'sharp', trees: 500, yearPlanted: 2022, curve: quickCurve },
  ]
  const forecast = sumForecastByClass(blocks, { startYear: 2021, years: 10 })

  it('adds blocks of the same class year by year (worked example)', () => {
    // Second bittersweet block: 200 × 0.9 × 20 = 3600 kg at full bearing (age 7, 2022);
    // age 6 in 2021 bears 0.8 of that, 2880 kg. First block adds 0, 0, 3800 in 2021–2023.
    const bittersweet = forecast.bittersweet.map(r => r.kg)
    expect(bittersweet[0]).toBeCloseTo(2880, 9)
    expect(bittersweet[1]).toBeCloseTo(3600, 9)
    expect(bittersweet[2]).toBeCloseTo(7400, 9)
    expect(bittersweet[9]).toBeCloseTo(22600, 9)
  })

  it('lists every apple and perry class, with zeros for classes nobody grows', () => {
    expect(Object.keys(forecast).sort()).toEqual(['bittersharp', 'bittersweet', 'perry bittersharp', 'perry bittersweet', 'perry medium sharp', 'perry sweet', 'sharp', 'sweet'])
    expect(forecast.sweet).toHaveLength(10)
    expect(forecast.sweet.every(r => r.kg === 0)).toBe(true)
    expect(forecast.sharp.map(r => r.kg)).toEqual([0, 0, 0, 5000, 10000, 15000, 15000, 15000, 15000, 15000])
  })

  it('reports coverage and shortfall per class and year, adding contracts for the same year (worked example)', () => {
    const rows = forecastCoverage(forecast, [
      { juiceClass: 'bittersweet', year: 2023, tonnes: 5 },
      { juiceClass: 'bittersweet', year: 2023, tonnes: 2 },
      { juiceClass: 'bittersweet', year: 2022, tonnes: 10 },
      { juiceClass: 'sharp', year: 2024, tonnes: 8 },
      { juiceClass: 'sweet', year: 2025, tonnes: 0 },
    ])
    expect(rows.map(r => `${r.juiceClass} ${r.year}`)).toEqual([
      'sweet 2025',
      'sharp 2024',
      'bittersweet 2022',
      'bittersweet 2023',
    ])
    const [sweet, sharp, bs2022, bs2023] = rows
    expect(sweet).toEqual({ juiceClass: 'sweet', year: 2025, forecastKg: 0, contractedKg: 0, coverage: null, shortfallKg: 0 })
    // 5000 kg forecast against 8000 kg contracted: 62.5 % covered, 3000 kg short.
    expect(sharp?.coverage).toBeCloseTo(0.625, 12)
    expect(sharp?.shortfallKg).toBeCloseTo(3000, 9)
    // 3600 kg against 10,000 kg: 36 %, 6400 kg short.
    expect(bs2022?.coverage).toBeCloseTo(0.36, 12)
    expect(bs2022?.shortfallKg).toBeCloseTo(6400, 9)
    // 7400 kg against 5 t + 2 t: covered, 400 kg to spare, no shortfall.
    expect(bs2023?.contractedKg).toBe(7000)
    expect(bs2023?.coverage).toBeCloseTo(7400 / 7000, 12)
    expect(bs2023?.shortfallKg).toBe(0)
  })

  it('refuses contracts outside the forecast years or with negative tonnes', () => {
    expect(() => forecastCoverage(forecast, [{ juiceClass: 'sharp', year: 2040, tonnes: 1 }]))
      .toThrow(/no figure for 2040/)
    expect(() => forecastCoverage(forecast, [{ juiceClass: 'sharp', year: 2024, tonnes: -1 }]))
      .toThrow(/Contracted tonnes must be zero or more/)
  })

  it('keeps perry pears apart from apples of the same class name', () => {
    const mixed = sumForecastByClass([
      { species: 'apple', juiceClass: 'sweet', trees: 100, yearPlanted: 2010, curve: quickCurve },
      { species: 'pear', juiceClass: 'sweet', trees: 50, yearPlanted: 2010, curve: quickCurve },
      { species: 'pear', juiceClass: 'medium sharp', trees: 10, yearPlanted: 2010, curve: quickCurve },
    ], { startYear: 2021, years: 1 })
    expect(mixed.sweet[0]!.kg).toBeCloseTo(100 * 30, 9)
    expect(mixed['perry sweet'][0]!.kg).toBeCloseTo(50 * 30, 9)
    expect(mixed['perry medium sharp'][0]!.kg).toBeCloseTo(10 * 30, 9)
  })

  it('refuses an unknown juice class, and a class the species does not have', () => {
    // @ts-expect-error: not one of the classes
    const bad: ClassedBlock = { juiceClass: 'dessert', trees: 10, yearPlanted: 2020, curve: slowCurve }
    expect(() => sumForecastByClass([bad], { startYear: 2021 })).toThrow(/has no juice class/)
    const sharpPear: ClassedBlock = { species: 'pear', juiceClass: 'sharp', trees: 10, yearPlanted: 2020, curve: slowCurve }
    expect(() => sumForecastByClass([sharpPear], { startYear: 2021 })).toThrow(/A pear has no juice class "sharp"/)
  })
})
