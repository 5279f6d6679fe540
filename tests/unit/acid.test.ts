import { describe, it, expect } from 'vitest'
import { ACIDS, ACID_EQUIVALENT_WEIGHT_G, convertAcid, taFromTitration, type Acid } from '../../shared/utils/acid'

describe('equivalent weights', () => {
  it('are malic 67.04, tartaric 75.04, sulfuric 49.04 g/eq (AWRI TN14, "Interconversion of acidity units")', () => {
    expect(ACID_EQUIVALENT_WEIGHT_G).toEqual({ malic: 67.04, tartaric: 75.04, sulfuric: 49.04 })
  })
})

describe('convertAcid', () => {
  it('turns 1 g/L as tartaric into 0.6535 g/L as sulfuric (AWRI TN14: molar masses 150.09 and 98.08, both diprotic)', () => {
    expect(convertAcid(1, 'tartaric').sulfuric).toBeCloseTo(98.08 / 150.09, 4)
  })

  it('turns 6.0 g/L as malic into 6.716 g/L as tartaric and 4.389 g/L as sulfuric (worked example)', () => {
    // 6.0 / 67.04 = 0.089499 eq/L; × 75.04 = 6.7160; × 49.04 = 4.3890.
    const ta = convertAcid(6.0, 'malic')
    expect(ta.malic).toBe(6.0)
    expect(ta.tartaric).toBeCloseTo(6.716, 3)
    expect(ta.sulfuric).toBeCloseTo(4.389, 3)
  })

  it('gives back the value it was given, whichever acid it started from', () => {
    for (const from of ACIDS) {
      expect(convertAcid(5.5, from)[from]).toBeCloseTo(5.5, 12)
    }
  })

  it('round-trips through every acid', () => {
    const pairs: Array<[Acid, Acid]> = [['malic', 'tartaric'], ['tartaric', 'sulfuric'], ['sulfuric', 'malic']]
    for (const [a, b] of pairs) {
      expect(convertAcid(convertAcid(7.25, a)[b], b)[a]).toBeCloseTo(7.25, 12)
    }
  })

  it('refuses a negative or missing acidity and an unknown acid', () => {
    expect(() => convertAcid(-0.1, 'malic')).toThrow(/Titratable acidity must be zero or more/)
    expect(() => convertAcid(Number.NaN, 'malic')).toThrow(RangeError)
    // @ts-expect-error: citric is not one of the three bases we keep
    expect(() => convertAcid(5, 'citric')).toThrow(/Acid must be one of malic, tartaric, sulfuric/)
  })
})

describe('taFromTitration', () => {
  it('with 0.1 N NaOH on a 10 mL sample, g/L = mL × 0.67 as malic and × 0.75 as tartaric (AWRI TN14)', () => {
    expect(taFromTitration({ naohMl: 1, normality: 0.1, sampleMl: 10, as: 'malic' })).toBeCloseTo(0.67, 2)
    expect(taFromTitration({ naohMl: 1, normality: 0.1, sampleMl: 10, as: 'tartaric' })).toBeCloseTo(0.75, 2)
    expect(taFromTitration({ naohMl: 8.5, normality: 0.1, sampleMl: 10, as: 'malic' })).toBeCloseTo(8.5 * 0.6704, 10)
  })

  it('12 mL of 0.1 N NaOH on a 15 mL sample is 6.0 g/L as tartaric (common practice: TA = 75 × V × N / sample)', () => {
    expect(taFromTitration({ naohMl: 12, normality: 0.1, sampleMl: 15, as: 'tartaric' })).toBeCloseTo(6.0, 2)
  })

  it('agrees with convertAcid: the same titration expressed two ways', () => {
    const asMalic = taFromTitration({ naohMl: 9.1, normality: 0.2, sampleMl: 25, as: 'malic' })
    const asSulfuric = taFromTitration({ naohMl: 9.1, normality: 0.2, sampleMl: 25, as: 'sulfuric' })
    expect(convertAcid(asMalic, 'malic').sulfuric).toBeCloseTo(asSulfuric, 12)
  })

  it('refuses a zero or negative sample, a zero normality and a negative volume of NaOH', () => {
    expect(() => taFromTitration({ naohMl: 5, normality: 0.1, sampleMl: 0, as: 'malic' })).toThrow(/Sample volume must be above 0/)
    expect(() => taFromTitration({ naohMl: 5, normality: 0, sampleMl: 10, as: 'malic' })).toThrow(/normality must be above 0/)
    expect(() => taFromTitration({ naohMl: -1, normality: 0.1, sampleMl: 10, as: 'malic' })).toThrow(RangeError)
  })
})
