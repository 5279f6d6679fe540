import { describe, it, expect } from 'vitest'
import {
  ACID_THRESHOLD_G_PER_L,
  APPLE_CLASSES,
  JUICE_CLASSES,
  PEAR_CLASSES,
  PEAR_THRESHOLDS_G_PER_L,
  TANNIN_THRESHOLD_G_PER_L,
  isClassOf,
  juiceClass,
} from '../../shared/utils/juiceClass'

describe('juiceClass (Long Ashton classification)', () => {
  it('uses acid 4.5 g/L (0.45 % malic) and tannin 2.0 g/L (0.2 %) (Long Ashton, via Lea, "Cider Apple Compositional Data"; Miles, King & Peck, WSU 2015)', () => {
    expect(ACID_THRESHOLD_G_PER_L).toBe(4.5)
    expect(TANNIN_THRESHOLD_G_PER_L).toBe(2.0)
    expect(APPLE_CLASSES).toEqual(['sweet', 'sharp', 'bittersweet', 'bittersharp'])
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

describe('juiceClass for perry pears (Pollard & Beech classes)', () => {
  // Pollard & Beech, as set out in "Perry Pear Varieties" (homepage.ntlworld.com/scrumpy) and
  // cider-making.co.uk's perry pear lists: sweet acid about 0.2 % or below, tannin below 0.15 %;
  // medium sharp 0.2–0.6 % acid, tannin below 0.15 %; bittersweet acid below 0.45 %, tannin above
  // 0.2 %; bittersharp acid above 0.45 %, tannin above 0.2 % (% w/v as malic; × 10 = g/L).
  it('has its own four classes, with medium sharp and no sharp', () => {
    expect(PEAR_CLASSES).toEqual(['sweet', 'medium sharp', 'bittersweet', 'bittersharp'])
    expect(JUICE_CLASSES).toEqual(['sweet', 'sharp', 'medium sharp', 'bittersweet', 'bittersharp'])
    expect(isClassOf('pear', 'sharp')).toBe(false)
    expect(isClassOf('apple', 'medium sharp')).toBe(false)
    expect(PEAR_THRESHOLDS_G_PER_L).toMatchObject({ sweetAcidMax: 2.0, mediumSharpAcidMax: 6.0, lowTanninMax: 1.5, bitterTanninMin: 2.0, bittersharpAcidMin: 4.5 })
  })

  // Brooks & Olmo juice figures (USDA pear germplasm descriptions) with the published class of
  // each pear (same lists): Blakeney Red, Brandy and Gin medium sharp; Butt bittersharp.
  it.each([
    ['Blakeney Red', 4.2, 1.3, 'medium sharp'],
    ['Brandy', 4.4, 1.2, 'medium sharp'],
    ['Gin', 4.2, 1.5, 'medium sharp'],
    ['Butt', 5.4, 3.2, 'bittersharp'],
  ] as const)('%s (TA %s g/L, tannin %s g/L) is %s, as published', (_name, ta, tannin, expected) => {
    expect(juiceClass(ta, tannin, 'pear')).toBe(expected)
  })

  it('puts a pear juice in each published class', () => {
    expect(juiceClass(1.8, 1.0, 'pear')).toBe('sweet')
    expect(juiceClass(3.5, 1.0, 'pear')).toBe('medium sharp')
    expect(juiceClass(3.0, 2.6, 'pear')).toBe('bittersweet')
    expect(juiceClass(5.5, 2.6, 'pear')).toBe('bittersharp')
  })

  it('settles what the source leaves open by documented rules', () => {
    expect(juiceClass(2.0, 1.0, 'pear')).toBe('sweet') // "on or below 0.2 %"
    expect(juiceClass(7.5, 1.0, 'pear')).toBe('medium sharp') // above 0.6 %: no sharper pear class
    expect(juiceClass(3.0, 1.8, 'pear')).toBe('medium sharp') // tannin 1.5–2.0 g/L: not bitter
    expect(juiceClass(4.5, 2.0, 'pear')).toBe('bittersharp') // on both lines: counted as above
  })

  it('classes the same reading differently from an apple where the thresholds differ', () => {
    expect(juiceClass(4.2, 1.3)).toBe('sweet')
    expect(juiceClass(4.2, 1.3, 'pear')).toBe('medium sharp')
  })
})
