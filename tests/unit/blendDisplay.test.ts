import { describe, expect, it } from 'vitest'
import { juiceKgPerLitre } from '../../shared/utils/blendMix'
import { looseningSentence, loosenRanges, loosenedBound, missSentence, pearsonCheck, rangeFromTyped, savingPerStep, savingSentence, shareBy } from '../../shared/utils/blendDisplay'
import { brixToSg } from '../../shared/utils/sugar'

const litres = (l: number) => `${l.toLocaleString('en-GB')} L`

describe('a binding range\'s saving in words', () => {
  it('quotes a TA floor per 0.1 g/L: the solver\'s cost per g/L over ten', () => {
    // 12,340 minor units per g/L → 1,234 per 0.1 g/L = £12.34.
    expect(savingPerStep({ property: 'taGPerL', costPerUnit: 12340 })).toBeCloseTo(1234, 9)
    expect(savingSentence({ property: 'taGPerL', bound: 'min', costPerUnit: 12340 }, { min: 5, max: 6.5 }, 'GBP'))
      .toBe('Allowing TA down to 4.9 g/L would save about £12.34 per 0.1 g/L.')
  })

  it('quotes an SG ceiling per 0.001, the unit the solver quotes it in', () => {
    expect(savingSentence({ property: 'sg', bound: 'max', costPerUnit: 815.6 }, { min: 1.05, max: 1.056 }, 'GBP'))
      .toBe('Allowing SG up to 1.057 would save about £8.16 per 0.001 SG.')
  })

  it('quotes tannin and °Brix per 0.1 of their unit, and says so when a step saves under a penny', () => {
    expect(savingSentence({ property: 'tanninGPerL', bound: 'max', costPerUnit: 5000 }, { min: 1.6, max: 2.4 }, 'EUR'))
      .toBe('Allowing tannin up to 2.5 g/L would save about €5.00 per 0.1 g/L.')
    expect(savingSentence({ property: 'brix', bound: 'min', costPerUnit: 3 }, { min: 12, max: 14 }, 'GBP'))
      .toBe('Allowing °Brix down to 11.9 °Bx would save less than £0.01 per 0.1 °Bx.')
  })
})

describe('loosening a bound', () => {
  it('moves the bound one step outward to the step\'s decimals, leaving the rest', () => {
    // 5.0 − 0.1 in binary floating point is 4.8999999999999995; the maker reads 4.9.
    expect(loosenedBound('taGPerL', 'min', 5)).toBe(4.9)
    expect(loosenedBound('sg', 'max', 1.056)).toBe(1.057)
    expect(loosenedBound('brix', 'max', 13.3)).toBe(13.4)
    const ranges = { sg: { min: 1.05, max: 1.056 }, taGPerL: { min: 5, max: 6.5 } }
    expect(loosenRanges(ranges, 'taGPerL', 'min')).toEqual({ sg: { min: 1.05, max: 1.056 }, taGPerL: { min: 4.9, max: 6.5 } })
    expect(ranges.taGPerL.min).toBe(5)
    expect(() => loosenRanges(ranges, 'brix', 'min')).toThrow(/no °Brix range/)
  })
})

describe('a missed range in words', () => {
  it('says by how much a property is under or over its range', () => {
    expect(missSentence({ property: 'taGPerL', min: 5, max: 6.5, achieved: 4.62 }, litres)).toBe('TA is 4.62 g/L, 0.38 g/L under the 5.0–6.5 g/L asked for.')
    expect(missSentence({ property: 'tanninGPerL', min: 1.6, max: 2.4, achieved: 2.71 }, litres)).toBe('Tannin is 2.71 g/L, 0.31 g/L over the 1.6–2.4 g/L asked for.')
  })

  it('says how short of the volume the lots fall', () => {
    expect(missSentence({ property: 'volumeL', min: 8000, max: 8000, achieved: 6500 }, litres)).toBe('The lots give 6,500 L of juice, 1,500 L short of the 8,000 L asked for.')
  })
})

describe('a range typed with a side left empty', () => {
  it('stops the open side at the property\'s widest, and is no range when both are empty', () => {
    // The widest the API takes (shared/schemas/blend.ts, PROPERTY_LIMITS): TA up to 30 g/L, SG from 1.000.
    expect(rangeFromTyped('taGPerL', 5, null)).toEqual({ min: 5, max: 30 })
    expect(rangeFromTyped('sg', null, 1.056)).toEqual({ min: 1, max: 1.056 })
    expect(rangeFromTyped('brix', null, null)).toBeUndefined()
  })
})

describe('the composition of a blend', () => {
  it('sums the shares of the lines by a key, largest first', () => {
    const lines = [{ k: 'sharp', s: 0.2 }, { k: 'bittersweet', s: 0.5 }, { k: 'sharp', s: 0.3 }]
    const parts = shareBy(lines, l => l.k, l => l.s)
    expect(parts.map(p => p.key)).toEqual(['sharp', 'bittersweet'])
    expect(parts[0]!.share).toBeCloseTo(0.5, 12)
    expect(parts[1]!.share).toBeCloseTo(0.5, 12)
  })
})

describe('the Pearson square worked on a two-lot blend', () => {
  it('splits °Brix by mass and TA by volume, beside the solver\'s own split', () => {
    const sgA = brixToSg(10)
    const sgB = brixToSg(14)
    // Litres that make equal masses of juice: the square on 10 and 14 °Bx to 12 gives |12 − 14| : |10 − 12| = 1 : 1 by mass.
    const litresA = 1000
    const litresB = 1000 * juiceKgPerLitre(sgA) / juiceKgPerLitre(sgB)
    const check = pearsonCheck({ brix: 10, sg: sgA, taGPerL: 4, litres: litresA }, { brix: 14, sg: sgB, taGPerL: 8, litres: litresB }, { brix: 12, taGPerL: 5 })
    expect(check.brix!.square).toBeCloseTo(0.5, 12)
    expect(check.brix!.solver).toBeCloseTo(0.5, 12)
    // TA 4 and 8 g/L to 5 g/L: |5 − 8| : |4 − 5| = 3 : 1 by volume, so A is 75 % (the square's own rule).
    expect(check.ta!.square).toBeCloseTo(0.75, 12)
    expect(check.ta!.solver).toBeCloseTo(litresA / (litresA + litresB), 12)
  })

  it('has no square for a property the two lots share or one of them lacks', () => {
    const check = pearsonCheck({ brix: 12, sg: brixToSg(12), taGPerL: null, litres: 500 }, { brix: 12, sg: brixToSg(12), taGPerL: 6, litres: 500 }, { brix: 12, taGPerL: null })
    expect(check).toEqual({ brix: null, ta: null })
  })
})

describe('what loosening a range did', () => {
  const step = { property: 'taGPerL' as const, bound: 'max' as const, to: 6.6, saidMinor: 33.4, costBefore: 85_306 }
  it('says what the step saved beside what was said', () => {
    expect(looseningSentence(step, 85_273, 'GBP')).toBe('Allowing TA up to 6.6 g/L saved £0.33 (about £0.33 was said).')
  })
  it('says so when the step saved less than the rate said, or nothing', () => {
    expect(looseningSentence({ ...step, property: 'sg', bound: 'min', to: 1.049, saidMinor: 866.4 }, 85_249, 'GBP'))
      .toBe('Allowing SG down to 1.049 saved £0.57 (about £8.66 was said: past a point in that step, other lots or ranges took over, so it saved less).')
    expect(looseningSentence(step, 85_306, 'GBP')).toBe('Allowing TA up to 6.6 g/L saved nothing (about £0.33 was said).')
  })
})
