import { describe, expect, it } from 'vitest'
import { blendMix } from '../../shared/utils/blendMix'
import { pearsonBrix, pearsonSquare } from '../../shared/utils/pearsonSquare'

describe('pearsonSquare: published worked examples', () => {
  it('orange juice at 10 % sugar and a 60 % syrup to 15 %: 45 parts juice, 5 parts syrup', () => {
    // Practical Action, "Fruit juice processing" (technical brief), Appendix: The Pearson Square.
    const square = pearsonSquare(10, 60, 15)
    expect(square.partsA).toBe(45)
    expect(square.partsB).toBe(5)
    expect(square.shareA).toBeCloseTo(0.9, 12)
  })

  it('a 12 °Brix juice and a 65 °Brix syrup to 24 °Brix: 41 parts juice, 12 parts syrup, 77 % and 23 %', () => {
    // M. Mathews, "Using Pearson's Square" (winemaking article), example "Increasing the Sugar Content of
    // a Must", as reproduced in "How to Use Pearson's Square", foodrecap.com.
    const square = pearsonSquare(12, 65, 24)
    expect(square.partsA).toBe(41)
    expect(square.partsB).toBe(12)
    expect(Math.round(square.shareA * 100)).toBe(77)
    expect(Math.round(square.shareB * 100)).toBe(23)
  })

  it('a 15 % wine fortified with a 40 % spirit to 20 %: 5 parts spirit to 20 parts wine', () => {
    // winemakeri.com, "Pearson Square (Wine fortification chart)".
    const square = pearsonSquare(40, 15, 20)
    expect(square.partsA).toBe(5)
    expect(square.partsB).toBe(20)
  })

  it('a 10 % wine and a 90 % spirit to 25 %: 13 parts wine to 3 of spirit, so 39 L of wine takes 9 L', () => {
    // fermentarium.com, "Quick Lesson: How to use a Pearson's Square" (corrected 2010).
    const square = pearsonSquare(10, 90, 25)
    expect(square.partsA / square.partsB).toBeCloseTo(13 / 3, 12)
    expect((39 * square.partsB) / square.partsA).toBeCloseTo(9, 12)
  })

  it('a 15 % Merlot and an 11 % wine to 12 %: 1 part Merlot to 3 parts of the other', () => {
    // The Grapestompers example, as given in "Let's Mix It Up!", winedreamer.blogspot.com (2007).
    const square = pearsonSquare(15, 11, 12)
    expect(square.partsA).toBe(1)
    expect(square.partsB).toBe(3)
  })

  it('6 gallons of TA 6.5 Merlot brought to 5.9 with a TA 5.0 Syrah take 4 gallons of Syrah', () => {
    // Question: J. I. C. Hidalgo, "Pearson's Square" (FT117 lecture notes), example 3; answer worked by
    // hand: parts Merlot |5.9 − 5.0| = 0.9, Syrah |6.5 − 5.9| = 0.6, so Syrah = 6 × 0.6 / 0.9 = 4 gallons.
    // TA is in g/L, so the parts are parts by volume.
    const square = pearsonSquare(6.5, 5.0, 5.9)
    expect((6 * square.partsB) / square.partsA).toBeCloseTo(4, 12)
  })
})

describe('pearsonBrix: °Brix splits by mass, not by volume', () => {
  // Worked by hand with NBS Circular 440, Table 114 (apparent SG 20/20 °C): 10 °Bx → 1.04003,
  // 20 °Bx → 1.08297. To 14 °Bx the square gives parts |14 − 20| = 6 and |10 − 14| = 4: 60 % and 40 %
  // BY MASS. In litres that is 0.6 / 1.04003 = 0.576906 and 0.4 / 1.08297 = 0.369355 (the 0.998203 kg/L
  // of water cancels), so 60.97 % and 39.03 % of the volume. Mixing 60 : 40 by volume instead gives
  // (10 × 0.6 × 1.04003 + 20 × 0.4 × 1.08297) / (0.6 × 1.04003 + 0.4 × 1.08297) = 14.097 °Bx, not 14.
  const low = { brix: 10, sg: 1.04003 }
  const high = { brix: 20, sg: 1.08297 }

  it('gives 60 : 40 by mass and 60.97 : 39.03 by volume', () => {
    const split = pearsonBrix(low, high, 14)
    expect(split.massShareA).toBeCloseTo(0.6, 12)
    expect(split.massShareB).toBeCloseTo(0.4, 12)
    expect(split.volumeShareA).toBeCloseTo(0.60967, 5)
    expect(split.volumeShareB).toBeCloseTo(0.39033, 5)
  })

  it('hits the target when mixed by its volume shares, and misses it by 0.1 °Bx when mixed 60 : 40 by volume', () => {
    const split = pearsonBrix(low, high, 14)
    const juice = (litresLow: number, litresHigh: number) => blendMix([
      { lot: { ...low, juiceYieldLPerTonne: 1000, taGPerL: null, tanninGPerL: null, ph: null }, kg: litresLow },
      { lot: { ...high, juiceYieldLPerTonne: 1000, taGPerL: null, tanninGPerL: null, ph: null }, kg: litresHigh },
    ])!
    expect(juice(1000 * split.volumeShareA, 1000 * split.volumeShareB).brix).toBeCloseTo(14, 10)
    expect(juice(600, 400).brix).toBeCloseTo(14.0975, 4)
  })
})

describe('pearsonSquare: what it cannot do', () => {
  it('refuses a target outside the two values, two equal components and non-numbers', () => {
    expect(() => pearsonSquare(10, 12, 13)).toThrow(/not between 10 and 12/)
    expect(() => pearsonSquare(11, 11, 11)).toThrow(RangeError)
    expect(() => pearsonSquare(10, Number.NaN, 11)).toThrow(/b must be a number/)
    expect(() => pearsonBrix({ brix: 10, sg: 0 }, { brix: 12, sg: 1.05 }, 11)).toThrow(/a\.sg/)
  })

  it('gives all of one component when the target is that component', () => {
    expect(pearsonSquare(10, 12, 12)).toMatchObject({ shareA: 0, shareB: 1 })
  })
})
