import { describe, expect, it } from 'vitest'
import { blendMix, juiceKgPerLitre, litresOf, type MixLot } from '../../shared/utils/blendMix'

const lot = (over: Partial<MixLot>): MixLot => ({ juiceYieldLPerTonne: 700, brix: 12, sg: 1.048, taGPerL: 5, tanninGPerL: 1.5, ph: 3.5, ...over })

// Two juices, worked by hand:
//   A: 800 kg at 750 L/t → 600 L of 10 °Bx, SG 1.040, TA 4 g/L, pH 3.8
//   B: 625 kg at 640 L/t → 400 L of 15 °Bx, SG 1.061, TA 8 g/L, pH 3.2
// Juice mass (SG × 0.998203 kg/L): A 600 × 1.040 × 0.998203 = 622.8787 kg, B 400 × 1.061 × 0.998203 = 423.6374 kg.
// °Brix by mass = (10 × 622.8787 + 15 × 423.6374) / 1046.5160 = 12.0240 (by volume it would read 12.0).
// SG by volume = (600 × 1.040 + 400 × 1.061) / 1000 = 1.0484; TA = (600 × 4 + 400 × 8) / 1000 = 5.6 g/L.
// pH estimate: [H+] = (600 × 10^−3.8 + 400 × 10^−3.2) / 1000 = 3.4748e−4 mol/L → pH 3.459 (common practice;
// the volume average of the pH figures themselves would say 3.56).
const A = lot({ juiceYieldLPerTonne: 750, brix: 10, sg: 1.040, taGPerL: 4, tanninGPerL: 1.2, ph: 3.8 })
const B = lot({ juiceYieldLPerTonne: 640, brix: 15, sg: 1.061, taGPerL: 8, tanninGPerL: 0.6, ph: 3.2 })

describe('litresOf and juiceKgPerLitre', () => {
  it('presses kg / 1000 × litres per tonne', () => {
    expect(litresOf(800, 750)).toBeCloseTo(600, 10)
    expect(litresOf(625, 640)).toBeCloseTo(400, 10)
  })

  it('weighs a litre at SG × 0.998203 kg, the density of water at 20 °C (NBS Circular 440)', () => {
    expect(juiceKgPerLitre(1)).toBe(0.998203)
    expect(juiceKgPerLitre(1.040)).toBeCloseTo(1.0381311, 7)
  })
})

describe('blendMix', () => {
  it('mixes °Brix by juice mass, and SG, TA and tannin by volume (worked by hand above)', () => {
    const juice = blendMix([{ lot: A, kg: 800 }, { lot: B, kg: 625 }])!
    expect(juice.brix).toBeCloseTo(12.0240, 4)
    expect(juice.brix).not.toBeCloseTo(12.0, 2)
    expect(juice.sg).toBeCloseTo(1.0484, 10)
    expect(juice.taGPerL).toBeCloseTo(5.6, 10)
    expect(juice.tanninGPerL).toBeCloseTo((600 * 1.2 + 400 * 0.6) / 1000, 10)
  })

  it('estimates pH from the hydrogen-ion concentration averaged by volume (common practice), not from the pH figures', () => {
    const juice = blendMix([{ lot: A, kg: 800 }, { lot: B, kg: 625 }])!
    expect(juice.phEstimate).toBeCloseTo(3.4591, 4)
    expect(juice.phEstimate).toBeLessThan((600 * 3.8 + 400 * 3.2) / 1000)
  })

  it('leaves a property unknown when a lot that gives juice has no reading of it, and ignores lots at 0 kg', () => {
    const noTannin = lot({ tanninGPerL: null, ph: null })
    expect(blendMix([{ lot: A, kg: 800 }, { lot: noTannin, kg: 100 }])).toMatchObject({ tanninGPerL: null, phEstimate: null })
    expect(blendMix([{ lot: A, kg: 800 }, { lot: noTannin, kg: 0 }])).toMatchObject({ brix: 10, tanninGPerL: 1.2 })
  })

  it('is the lot itself for one lot, and nothing for no juice', () => {
    expect(blendMix([{ lot: B, kg: 1000 }])).toEqual({ brix: expect.closeTo(15, 12), sg: expect.closeTo(1.061, 12), taGPerL: expect.closeTo(8, 12), tanninGPerL: expect.closeTo(0.6, 12), phEstimate: expect.closeTo(3.2, 12) })
    expect(blendMix([{ lot: A, kg: 0 }])).toBeNull()
    expect(blendMix([])).toBeNull()
  })

  it('refuses a negative or missing amount, naming the part', () => {
    expect(() => blendMix([{ lot: A, kg: 10 }, { lot: B, kg: -1 }])).toThrow(/parts\[1\]\.kg/)
    expect(() => blendMix([{ lot: A, kg: Number.NaN }])).toThrow(RangeError)
  })
})
