import { describe, it, expect } from 'vitest'
import {
  ACID_THRESHOLD_G_PER_L,
  JUICE_CLASSES,
  TANNIN_THRESHOLD_G_PER_L,
  juiceClass,
} from '../../shared/utils/juiceClass'

describe('juiceClass (Long Ashton classification)', () => {
  it('uses acid 4.5 g/L (0.45 % malic) and tannin 2.0 g/L (0.2 %) (Long Ashton, via Lea, "Cider Apple Compositional Data"; Miles, King & Peck, WSU 2015)', () => {
    expect(ACID_THRESHOLD_G_PER_L).toBe(4.5)
    expect(TANNIN_THRESHOLD_G_PER_L).toBe(2.0)
    expect(JUICE_CLASSES).toEqual(['sweet', 'sharp', 'bittersweet', 'bittersharp'])
  })

  // The four quadrants of the Long Ashton table (same sources).
  it.each([
    [3.0, 1.0, 'sweet'], // low acid, low tannin
    [7.0, 1.0, 'sharp'], // high acid, low tannin
    [2.5, 3.0, 'bittersweet'], // low acid, high tannin
    [8.0, 2.6, 'bittersharp'], // high acid, high tannin
  ] as const)('TA %s g/L, tannin %s g/L is %s', (ta, tannin, expected) => {
    expect(juiceClass(ta, tannin)).toBe(expected)
  })

  it('counts a value exactly on a threshold as high (our documented rule; the source leaves it open)', () => {
    expect(juiceClass(4.5, 1.0)).toBe('sharp')
    expect(juiceClass(3.0, 2.0)).toBe('bittersweet')
    expect(juiceClass(4.5, 2.0)).toBe('bittersharp')
  })

  it('counts a value just under a threshold as low', () => {
    expect(juiceClass(4.49, 1.99)).toBe('sweet')
    expect(juiceClass(4.4999, 2.0)).toBe('bittersweet')
  })

  it('handles a juice with no measurable acid or tannin', () => {
    expect(juiceClass(0, 0)).toBe('sweet')
  })

  it('refuses negative or missing readings', () => {
    expect(() => juiceClass(-1, 1)).toThrow(/Titratable acidity must be zero or more/)
    expect(() => juiceClass(5, -0.1)).toThrow(/Tannin must be zero or more/)
    expect(() => juiceClass(Number.NaN, 1)).toThrow(RangeError)
    expect(() => juiceClass(5, Number.POSITIVE_INFINITY)).toThrow(RangeError)
  })
})
