import { describe, it, expect } from 'vitest'
import {
  ALCOHOL_METHODS,
  ALCOHOL_METHOD_INFO,
  DEFAULT_ALCOHOL_METHOD,
  SUGAR_G_PER_L_PER_ABV,
  abvFromGravity,
  abvFromSugarGPerL,
  ballingAbw,
  potentialAbvFromBrix,
} from '../../shared/utils/alcohol'
import { sgToBrix, solubleSolidsGPerL, sugarGPerL } from '../../shared/utils/sugar'

describe('method list', () => {
  it('names three methods, defaults to gravity drop, and describes and sources each', () => {
    expect(ALCOHOL_METHODS).toEqual(['gravity-drop', 'hall', 'balling'])
    expect(DEFAULT_ALCOHOL_METHOD).toBe('gravity-drop')
    for (const method of ALCOHOL_METHODS) {
      expect(ALCOHOL_METHOD_INFO[method].label.length).toBeGreaterThan(0)
      expect(ALCOHOL_METHOD_INFO[method].description.length).toBeGreaterThan(20)
      expect(ALCOHOL_METHOD_INFO[method].source.length).toBeGreaterThan(5)
    }
  })
})

describe('abvFromGravity', () => {
  it('gravity drop: 1.050 → 1.000 is 6.5625 % ((OG − FG) × 131.25, after Papazian)', () => {
    expect(abvFromGravity(1.05, 1.0, 'gravity-drop')).toBeCloseTo(6.5625, 10)
  })

  it('uses gravity drop when no method is given', () => {
    expect(abvFromGravity(1.05, 1.0)).toBe(abvFromGravity(1.05, 1.0, 'gravity-drop'))
  })

  it('Hall: 1.050 → 1.000 is about 6.61 % (Hall, Zymurgy 18(2), 1995)', () => {
    // Worked example: ABW = 76.08 × 0.050 / 0.725 = 5.24690; ABV = 5.24690 × 1.000 / 0.794 = 6.6082.
    expect(abvFromGravity(1.05, 1.0, 'hall')).toBeCloseTo(6.6082, 4)
  })

  it('Hall: a 1.060 juice fermented dry to 0.998 (worked example)', () => {
    // ABW = 76.08 × 0.062 / 0.715 = 6.59716; ABV = 6.59716 × 0.998 / 0.794 = 8.2921.
    expect(abvFromGravity(1.06, 0.998, 'hall')).toBeCloseTo(8.2921, 4)
  })

  it('Balling agrees with Hall, which is its linear form, for 1.050 → 1.000 (Hall, Zymurgy 1995)', () => {
    const balling = abvFromGravity(1.05, 1.0, 'balling')
    expect(balling).toBeCloseTo(6.61, 2)
    expect(Math.abs(balling - abvFromGravity(1.05, 1.0, 'hall'))).toBeLessThan(0.01)
  })

  it('gives 0 % when nothing fermented, by every method', () => {
    for (const method of ALCOHOL_METHODS) {
      expect(abvFromGravity(1.05, 1.05, method)).toBeCloseTo(0, 10)
    }
  })

  it('refuses a final gravity above the original gravity', () => {
    expect(() => abvFromGravity(1.0, 1.05, 'hall')).toThrow(RangeError)
    expect(() => abvFromGravity(1.0, 1.05)).toThrow(/Final gravity 1.05 is above original gravity 1/)
  })

  it('refuses gravities no juice or cider has, and an unknown method', () => {
    expect(() => abvFromGravity(0.99, 0.99)).toThrow(/Original gravity must be from 1.000/)
    expect(() => abvFromGravity(1.3, 1.0)).toThrow(RangeError)
    expect(() => abvFromGravity(1.05, 0.95)).toThrow(/Final gravity must be from 0.980/)
    expect(() => abvFromGravity(Number.NaN, 1.0)).toThrow(RangeError)
    // @ts-expect-error: an id the method list does not hold
    expect(() => abvFromGravity(1.05, 1.0, 'guess')).toThrow(/Unknown alcohol method/)
  })
})

describe('ballingAbw (Balling\'s formula on extracts in °Plato)', () => {
  it('12 °P fermented to an apparent 2.5 °P holds 4.01 % alcohol by weight (worked example)', () => {
    // Balling (Nielsen et al., "Balling's formula – scrutiny of a brewing dogma"; Hall, Zymurgy 1995):
    // RE = 0.1808 × 12 + 0.8192 × 2.5 = 4.2176 °P;
    // ABW = (12 − 4.2176) / (2.0665 − 0.010665 × 12) = 7.7824 / 1.93852 = 4.01461.
    expect(ballingAbw(12, 2.5)).toBeCloseTo(4.01461, 5)
  })

  it('inverts Balling\'s original-extract equation OE = 100 (2.0665 A + RE) / (100 + 1.0665 A) (Nielsen et al.)', () => {
    const oe = 14.3
    const ae = 2.6
    const abw = ballingAbw(oe, ae)
    const re = 0.1808 * oe + 0.8192 * ae
    expect((100 * (2.0665 * abw + re)) / (100 + 1.0665 * abw)).toBeCloseTo(oe, 10)
  })

  it('accepts a negative apparent extract (a dry cider reads below 1.000) but not one above the original', () => {
    expect(ballingAbw(12.4, -0.5)).toBeGreaterThan(ballingAbw(12.4, 0))
    expect(() => ballingAbw(10, 11)).toThrow(RangeError)
    expect(() => ballingAbw(-1, -2)).toThrow(RangeError)
  })
})

describe('potential alcohol from sugar', () => {
  it('uses 16.83 g/L per % vol (OIV; EU wine rules)', () => {
    expect(SUGAR_G_PER_L_PER_ABV).toBe(16.83)
  })

  // OIV refractometry table II as reproduced in the French arrêté of 14 September 2011,
  // Annex IV: must sugar g/L and the estimated % vol at 16.83 g/L per % vol.
  it.each([
    [82.2, 4.88],
    [103.5, 6.15],
    [114.3, 6.79],
  ])('%s g/L sugar gives %s %% vol (OIV table, arrêté of 14 Sept 2011, Annex IV)', (gPerL, abv) => {
    expect(abvFromSugarGPerL(gPerL)).toBeCloseTo(abv, 2)
  })

  it('gives 4.7 % vol for 82.2 g/L under the old 17.5 g/L convention, so 16.83 is the rule in use (same table)', () => {
    expect(82.2 / 17.5).toBeCloseTo(4.7, 1)
    expect(abvFromSugarGPerL(82.2)).toBeGreaterThan(82.2 / 17.5)
  })

  it('potential alcohol of a 12 °Bx juice is its table sugar ÷ 16.83: 6.15 % vol (OIV Table II, arrêté of 14 Sept 2011, Annex IV, column 6)', () => {
    expect(potentialAbvFromBrix(12)).toBeCloseTo(sugarGPerL(12) / 16.83, 12)
    expect(potentialAbvFromBrix(12)).toBeCloseTo(6.15, 2)
  })

  // SG 1.040–1.065 covers cider juices (typical targets SG 1.045–1.060, extension and cider texts).
  // The four estimates must agree: gravity drop (after Papazian), Hall (Zymurgy 1995), Balling, and
  // sugar ÷ 16.83 with the sugar from the OIV table.
  it.each([1.040, 1.045, 1.050, 1.055, 1.060, 1.065])('agrees with the gravity methods within 0.4 %% vol at SG %s', (sg) => {
    const estimates = [
      abvFromGravity(sg, 1, 'gravity-drop'),
      abvFromGravity(sg, 1, 'hall'),
      abvFromGravity(sg, 1, 'balling'),
      potentialAbvFromBrix(sgToBrix(sg)),
    ]
    expect(Math.max(...estimates) - Math.min(...estimates)).toBeLessThan(0.4)
  })

  it('reads SG 1.050 (12.39 °Bx) as about 6.4 % vol, not the 7.7 % that counting all soluble solids as sugar gives', () => {
    expect(potentialAbvFromBrix(sgToBrix(1.050))).toBeCloseTo(6.4, 1)
    expect(solubleSolidsGPerL(sgToBrix(1.050)) / 16.83).toBeCloseTo(7.7, 1)
  })

  it('is 0 for no sugar and refuses a negative amount', () => {
    expect(abvFromSugarGPerL(0)).toBe(0)
    expect(() => abvFromSugarGPerL(-1)).toThrow(/Sugar must be zero or more g\/L/)
    expect(() => abvFromSugarGPerL(Number.NaN)).toThrow(RangeError)
  })
})
