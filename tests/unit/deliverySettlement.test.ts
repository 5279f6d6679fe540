import { describe, expect, it } from 'vitest'
import { settleLoad, taxOf } from '#shared/utils/deliverySettlement'
import type { FruitPriceTerms } from '#shared/utils/settlement'

// Invented terms for the worked examples (demo only): £210.00 a tonne at a 12.0 °Brix baseline,
// +£8.00 a tonne for each °Brix above, −£12.00 a tonne for each °Brix below, rejected under 9.5 °Brix,
// at most 5 % rot and 10 % damage. Every figure below is worked by hand in the comment beside it.
const TERMS: FruitPriceTerms = {
  basePricePerTonneMinor: 21_000,
  baselineBrix: 12.0,
  bonusPerBrixPerTonneMinor: 800,
  deductionPerBrixPerTonneMinor: 1_200,
  rejectFloorBrix: 9.5,
  maxRotPct: 5,
  maxDamagePct: 10,
}

describe('taxOf', () => {
  it('rounds the seller\'s tax half up to a whole minor unit', () => {
    // 182,858 p × 20 % = 36,571.6 p → 36,572 p.
    expect(taxOf(182_858, 20)).toBe(36_572)
    // Half a penny goes up: 26,250 p × 5 % = 1,312.5 p → 1,313 p; 1 p × 50 % = 0.5 p → 1 p.
    expect(taxOf(26_250, 5)).toBe(1_313)
    expect(taxOf(1, 50)).toBe(1)
    // Just under half stays down: 3 p × 16.66 % = 0.4998 p → 0 p; just over goes up: 3 p × 16.67 % = 0.5001 p → 1 p.
    expect(taxOf(3, 16.66)).toBe(0)
    expect(taxOf(3, 16.67)).toBe(1)
  })

  it('is nothing without a rate, at a rate of 0 % or on nothing', () => {
    expect(taxOf(10_000, null)).toBe(0)
    expect(taxOf(10_000, 0)).toBe(0)
    expect(taxOf(0, 20)).toBe(0)
  })
})

describe('settleLoad, worked by hand', () => {
  it('pays a load above the baseline with the bonus, and the seller\'s tax on top', () => {
    // 8,450 kg at 12.8 °Bx: 0.8 °Bx above; £210.00 + 0.8 × £8.00 = £216.40 a tonne;
    // 8.45 t × 21,640 p = 182,858 p; tax 20 % = 36,571.6 p → 36,572 p; in all 219,430 p (£2,194.30).
    const done = settleLoad(TERMS, { netKg: 8_450, brix: 12.8 }, 20)
    expect(done).toMatchObject({ amountMinor: 182_858, taxRatePct: 20, taxMinor: 36_572, totalMinor: 219_430 })
    expect(done.settlement).toMatchObject({ netKg: 8_450, paidKg: 8_450, brixPaid: 12.8, brixDifference: 0.8, pricePerTonneMinor: 21_640, totalMinor: 182_858, rejected: false, rejectedBecause: [], qualityRejectReason: null })
  })

  it('rounds a half penny of tax up', () => {
    // 1,250 kg at the 12.0 °Bx baseline: 1.25 t × 21,000 p = 26,250 p; tax 5 % = 1,312.5 p → 1,313 p; in all 27,563 p.
    expect(settleLoad(TERMS, { netKg: 1_250, brix: 12.0 }, 5)).toMatchObject({ amountMinor: 26_250, taxMinor: 1_313, totalMinor: 27_563 })
  })

  it('takes the deduction below the baseline, and no tax from a seller with none set', () => {
    // 6,000 kg at 11.25 °Bx, paid on 11.3 (half up): 0.7 °Bx below; £210.00 − 0.7 × £12.00 = £201.60 a tonne;
    // 6 t × 20,160 p = 120,960 p (£1,209.60).
    const done = settleLoad(TERMS, { netKg: 6_000, brix: 11.25 }, null)
    expect(done).toMatchObject({ amountMinor: 120_960, taxRatePct: null, taxMinor: 0, totalMinor: 120_960 })
    expect(done.settlement).toMatchObject({ brixPaid: 11.3, brixDifference: -0.7, pricePerTonneMinor: 20_160 })
  })

  it('pays nothing for a load under the reject floor, and says why', () => {
    const done = settleLoad(TERMS, { netKg: 5_000, brix: 9.4 }, 20)
    expect(done).toMatchObject({ amountMinor: 0, taxMinor: 0, totalMinor: 0 })
    expect(done.settlement).toMatchObject({ rejected: true, rejectReasons: ['below-floor'], rejectedBecause: ['9.4 °Brix is under the contract\'s reject floor of 9.5 °Brix'] })
  })

  it('pays nothing for a load the maker refuses for its quality, whatever the sugar', () => {
    const done = settleLoad(TERMS, { netKg: 5_000, brix: 13.0, qualityRejectReason: '  Bins full of leaves and stones ' }, 20)
    expect(done.totalMinor).toBe(0)
    expect(done.settlement).toMatchObject({ rejected: true, rejectReasons: [], qualityRejectReason: 'Bins full of leaves and stones', rejectedBecause: ['Refused for quality: Bins full of leaves and stones'] })
    // A blank reason is no refusal: 5 t × (£210.00 + 1.0 × £8.00) = 109,000 p.
    expect(settleLoad(TERMS, { netKg: 5_000, brix: 13.0, qualityRejectReason: '   ' }, null)).toMatchObject({ totalMinor: 109_000 })
  })

  it('pays nothing for rot or damage over the contract\'s limits, and names each', () => {
    const done = settleLoad(TERMS, { netKg: 5_000, brix: 12.0, rotPct: 7.5, damagePct: 12 }, 20)
    expect(done.totalMinor).toBe(0)
    expect(done.settlement.rejectedBecause).toEqual(['7.5 % rot is over the contract\'s limit of 5 %', '12 % damage is over the contract\'s limit of 10 %'])
    // At the limits exactly the load is paid: 5 t × 21,000 p = 105,000 p.
    expect(settleLoad(TERMS, { netKg: 5_000, brix: 12.0, rotPct: 5, damagePct: 10 }, null).totalMinor).toBe(105_000)
  })

  it('does not pay the kilograms past the tolerance the maker refused, and pays those it accepted', () => {
    // 6,000 kg at 12.0 °Bx with 1,500 kg past the year's tolerance, refused: 4,500 kg paid;
    // 4.5 t × 21,000 p = 94,500 p; tax 20 % = 18,900 p; in all 113,400 p.
    const refused = settleLoad(TERMS, { netKg: 6_000, brix: 12.0, excessKg: 1_500, excessDecision: 'refused' }, 20)
    expect(refused).toMatchObject({ amountMinor: 94_500, taxMinor: 18_900, totalMinor: 113_400 })
    expect(refused.settlement).toMatchObject({ netKg: 6_000, paidKg: 4_500 })
    // Accepted, all 6,000 kg are paid: 6 t × 21,000 p = 126,000 p.
    expect(settleLoad(TERMS, { netKg: 6_000, brix: 12.0, excessKg: 1_500, excessDecision: 'accepted' }, null)).toMatchObject({ amountMinor: 126_000 })
    // Before the decision (none yet) every kilogram is counted: 126,000 p.
    expect(settleLoad(TERMS, { netKg: 6_000, brix: 12.0, excessKg: 1_500, excessDecision: null }, null).settlement.paidKg).toBe(6_000)
    // A refused excess is never more than the load: 0 kg paid, 0 p.
    expect(settleLoad(TERMS, { netKg: 800, brix: 12.0, excessKg: 900, excessDecision: 'refused' }, null)).toMatchObject({ amountMinor: 0, settlement: { paidKg: 0 } })
  })

  it('works the refused kilograms to 0.1 kg', () => {
    // 1,000.3 kg less 0.2 kg refused = 1,000.1 kg; 1.0001 t × 21,000 p = 21,002.1 p → 21,002 p.
    const done = settleLoad(TERMS, { netKg: 1_000.3, brix: 12.0, excessKg: 0.2, excessDecision: 'refused' }, null)
    expect(done.settlement.paidKg).toBe(1_000.1)
    expect(done.amountMinor).toBe(21_002)
  })
})
