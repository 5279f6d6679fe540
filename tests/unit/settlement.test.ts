import { describe, expect, it } from 'vitest'
import { settleDelivery, settlementExamples, type FruitPriceTerms } from '#shared/utils/settlement'

// Invented terms for the worked examples (demo only): £250.00 a tonne at an 11.0 °Brix baseline,
// +£8.00 a tonne for each °Brix above, −£10.00 a tonne for each °Brix below, rejected under 9.0 °Brix,
// at most 5 % rot and 10 % damage.
const TERMS: FruitPriceTerms = {
  basePricePerTonneMinor: 25_000,
  baselineBrix: 11.0,
  bonusPerBrixPerTonneMinor: 800,
  deductionPerBrixPerTonneMinor: 1_000,
  rejectFloorBrix: 9.0,
  maxRotPct: 5,
  maxDamagePct: 10,
}

describe('settleDelivery, worked by hand', () => {
  it('pays 10 t at the baseline the base price: 10 × £250.00 = £2,500.00', () => {
    expect(settleDelivery(TERMS, { netKg: 10_000, brix: 11.0 })).toMatchObject({ totalMinor: 250_000, brixDifference: 0, rejected: false, sugarAdjustmentMinor: 0 })
  })

  it('adds the bonus above the baseline: 12.0 °Bx → 10 × (£250.00 + 1.0 × £8.00) = £2,580.00', () => {
    const s = settleDelivery(TERMS, { netKg: 10_000, brix: 12.0 })
    expect(s).toMatchObject({ totalMinor: 258_000, brixDifference: 1, pricePerTonneMinor: 25_800 })
    expect(s.baseAmountMinor + s.sugarAdjustmentMinor).toBeCloseTo(258_000, 9)
  })

  it('takes the deduction below it: 10.3 °Bx → 10 × (£250.00 − 0.7 × £10.00) = £2,430.00', () => {
    expect(settleDelivery(TERMS, { netKg: 10_000, brix: 10.3 })).toMatchObject({ totalMinor: 243_000, brixDifference: -0.7, sugarAdjustmentMinor: -7_000 })
  })

  it('takes the reading to 0.1 °Brix half up, and rounds the money half up once per delivery', () => {
    // 1,234.5 kg at 11.25 °Bx: paid on 11.3; £250.00 + 0.3 × £8.00 = £252.40 a tonne;
    // 1.2345 t × 25,240 p = 31,158.78 p → 31,159 p (£311.59).
    expect(settleDelivery(TERMS, { netKg: 1_234.5, brix: 11.25 })).toMatchObject({ brixPaid: 11.3, totalMinor: 31_159 })
    // 7,345 kg at 11.6 °Bx: 7.345 × 25,480 p = 187,150.6 p → 187,151 p.
    expect(settleDelivery(TERMS, { netKg: 7_345, brix: 11.6 }).totalMinor).toBe(187_151)
    // Exactly half a penny goes up: 500 kg at £250.01 a tonne = 12,500.5 p → 12,501 p.
    expect(settleDelivery({ ...TERMS, basePricePerTonneMinor: 25_001 }, { netKg: 500, brix: 11.0 }).totalMinor).toBe(12_501)
  })

  it('pays nothing below the floor and says why; on the floor is paid', () => {
    expect(settleDelivery(TERMS, { netKg: 10_000, brix: 8.9 })).toMatchObject({ totalMinor: 0, rejected: true, rejectReasons: ['below-floor'] })
    // 9.0 °Bx: 10 × (£250.00 − 2.0 × £10.00) = £2,300.00.
    expect(settleDelivery(TERMS, { netKg: 10_000, brix: 9.0 })).toMatchObject({ totalMinor: 230_000, rejected: false })
    // 8.96 °Bx is paid on 9.0, so it is not under the floor.
    expect(settleDelivery(TERMS, { netKg: 10_000, brix: 8.96 }).rejected).toBe(false)
  })

  it('rejects a load over the rot or damage limit, with every reason', () => {
    expect(settleDelivery(TERMS, { netKg: 4_000, brix: 12, rotPct: 6 })).toMatchObject({ totalMinor: 0, rejectReasons: ['rot'] })
    expect(settleDelivery(TERMS, { netKg: 4_000, brix: 8, rotPct: 6, damagePct: 12 }).rejectReasons).toEqual(['below-floor', 'rot', 'damage'])
    expect(settleDelivery(TERMS, { netKg: 4_000, brix: 12, rotPct: 5, damagePct: 10 }).rejected).toBe(false)
  })

  it('never charges the grower: a deduction larger than the price pays 0', () => {
    const harsh = { ...TERMS, deductionPerBrixPerTonneMinor: 20_000, rejectFloorBrix: 0 }
    expect(settleDelivery(harsh, { netKg: 1_000, brix: 9.0 }).totalMinor).toBe(0)
  })

  it('refuses figures it cannot work with', () => {
    expect(() => settleDelivery({ ...TERMS, basePricePerTonneMinor: 250.5 }, { netKg: 1, brix: 11 })).toThrow(/minor units/)
    expect(() => settleDelivery(TERMS, { netKg: -1, brix: 11 })).toThrow(/net weight/)
    expect(() => settleDelivery(TERMS, { netKg: 1, brix: 55 })).toThrow(/reading/)
    expect(() => settleDelivery(TERMS, { netKg: 1, brix: 11, rotPct: 120 })).toThrow(/Rot/)
  })
})

describe('settlementExamples', () => {
  it('shows 10 t at the baseline, one °Brix above and just under the floor', () => {
    expect(settlementExamples(TERMS).map(e => [e.label, e.brix, e.settlement.totalMinor, e.settlement.rejected])).toEqual([
      ['At the sugar baseline', 11, 250_000, false],
      ['One °Brix above the baseline', 12, 258_000, false],
      ['Just under the reject floor', 8.9, 0, true],
    ])
  })
})
