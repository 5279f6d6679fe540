import { describe, expect, it } from 'vitest'
import { treeContractMoney, type TreeMoneyTerms } from '../../shared/utils/treeContractMoney'

// Hand-worked examples, written out in full. Rounding half up to the minor unit is the usual rule
// for money (common practice).
const terms: TreeMoneyTerms = {
  treeCount: 1200,
  unitPriceMinor: 1450, // £14.50 a tree
  royaltyPerTreeMinor: 35, // £0.35 a tree to the rootstock's owner
  depositPct: 20,
  depositIfBuyerCancels: 'kept',
  depositIfNurseryCancels: 'refunded',
}

describe('treeContractMoney', () => {
  it('works the total, the deposit and the balance before delivery', () => {
    // trees 1200 × 1450 = 1,740,000; royalty 1200 × 35 = 42,000; total 1,782,000;
    // deposit 20 % = 356,400; balance 1,782,000 − 356,400 = 1,425,600.
    expect(treeContractMoney(terms)).toEqual({
      treesMinor: 1_740_000, royaltyMinor: 42_000, totalMinor: 1_782_000, depositMinor: 356_400, balanceMinor: 1_425_600,
      deliveredValueMinor: null, depositOnCancel: null,
    })
  })

  it('leaves the balance due pro rata to the trees delivered', () => {
    // 1,150 delivered × (1450 + 35) = 1,707,750; less the 356,400 deposit = 1,351,350.
    const money = treeContractMoney(terms, { deliveredCount: 1150 })
    expect(money.deliveredValueMinor).toBe(1_707_750)
    expect(money.balanceMinor).toBe(1_351_350)
    // So few delivered that the deposit covers them: nothing more is due (never below zero).
    expect(treeContractMoney(terms, { deliveredCount: 100 }).balanceMinor).toBe(0)
  })

  it('rounds the deposit half up once', () => {
    // 3 × 1001 = 3003; 12.5 % of 3003 = 375.375 → 375; 7 trees × 1001 = 7007, 12.5 % = 875.875 → 876;
    // 1 × 1 at 50 % = 0.5 → 1.
    expect(treeContractMoney({ ...terms, treeCount: 3, unitPriceMinor: 1001, royaltyPerTreeMinor: 0, depositPct: 12.5 }).depositMinor).toBe(375)
    expect(treeContractMoney({ ...terms, treeCount: 7, unitPriceMinor: 1001, royaltyPerTreeMinor: 0, depositPct: 12.5 }).depositMinor).toBe(876)
    expect(treeContractMoney({ ...terms, treeCount: 1, unitPriceMinor: 1, royaltyPerTreeMinor: 0, depositPct: 50 }).depositMinor).toBe(1)
    // A large order stays exact: 1,000,000 × 9,999,999 at 33.33 % = 9,999,999,000,000 × 3333 ÷ 10,000 = 3,332,999,666,700 exactly.
    expect(treeContractMoney({ ...terms, treeCount: 1_000_000, unitPriceMinor: 9_999_999, royaltyPerTreeMinor: 0, depositPct: 33.33 }).depositMinor).toBe(3_332_999_666_700)
  })

  it('follows the terms on cancellation', () => {
    expect(treeContractMoney(terms, { cancelledAfterAcceptanceBy: 'buyer' }).depositOnCancel).toEqual({ outcome: 'kept', refundMinor: 0 })
    expect(treeContractMoney({ ...terms, depositIfBuyerCancels: 'refunded' }, { cancelledAfterAcceptanceBy: 'buyer' }).depositOnCancel).toEqual({ outcome: 'refunded', refundMinor: 356_400 })
    expect(treeContractMoney(terms, { cancelledAfterAcceptanceBy: 'nursery' }).depositOnCancel).toEqual({ outcome: 'refunded', refundMinor: 356_400 })
    expect(treeContractMoney({ ...terms, depositIfNurseryCancels: 'doubled' }, { cancelledAfterAcceptanceBy: 'nursery' }).depositOnCancel).toEqual({ outcome: 'doubled', refundMinor: 712_800 })
    expect(treeContractMoney(terms, { cancelledAfterAcceptanceBy: 'nursery' }).balanceMinor).toBe(0)
  })

  it('refuses figures that are not whole minor units', () => {
    expect(() => treeContractMoney({ ...terms, unitPriceMinor: 14.5 })).toThrow(RangeError)
    expect(() => treeContractMoney({ ...terms, depositPct: 120 })).toThrow(/from 0 to 100/)
    expect(() => treeContractMoney(terms, { deliveredCount: -1 })).toThrow(RangeError)
  })
})
