import { describe, expect, it } from 'vitest'
import { depositRefund, settlementDue, treeContractDue, type TreeContractFacts } from '../../shared/utils/paymentAmount'

// What each payment asks for, hand-worked from the contract's terms (rounding half up to the minor
// unit is the usual rule for money: common practice).
const accepted: TreeContractFacts = {
  state: 'accepted',
  treeCount: 1200,
  unitPriceMinor: 1450, // £14.50 a tree
  royaltyPerTreeMinor: 35, // £0.35 a tree
  depositPct: 20,
  depositIfBuyerCancels: 'kept',
  depositIfNurseryCancels: 'refunded',
  deliveredCount: null,
  cancelledBy: null,
  acceptedVersion: 2,
}

describe('treeContractDue', () => {
  it('asks the deposit once the contract is accepted, and not before', () => {
    // 1200 × (1450 + 35) = 1,782,000; 20 % = 356,400.
    for (const state of ['accepted', 'propagating', 'ready']) expect(treeContractDue('deposit', { ...accepted, state })).toEqual({ ok: true, amountMinor: 356_400 })
    for (const state of ['draft', 'offered', 'countered', 'declined', 'cancelled']) expect(treeContractDue('deposit', { ...accepted, state }).ok, state).toBe(false)
    expect(treeContractDue('deposit', { ...accepted, depositPct: 0 })).toEqual({ ok: false, message: 'This tree contract has no deposit to pay.' })
  })

  it('asks the balance pro rata to the trees delivered, less the deposit', () => {
    // 1,137 of 1,200 delivered: 1,137 × (1450 + 35) = 1,137 × 1,485 = 1,688,445; less 356,400 = 1,332,045.
    expect(treeContractDue('balance', { ...accepted, state: 'delivered', deliveredCount: 1137 })).toEqual({ ok: true, amountMinor: 1_332_045 })
    // All 1,200: 1,782,000 − 356,400 = 1,425,600.
    expect(treeContractDue('balance', { ...accepted, state: 'delivered', deliveredCount: 1200 })).toEqual({ ok: true, amountMinor: 1_425_600 })
    // 200 delivered: 200 × 1,485 = 297,000, less than the deposit: nothing more is due.
    expect(treeContractDue('balance', { ...accepted, state: 'delivered', deliveredCount: 200 }).ok).toBe(false)
    // Before delivery there is no balance to pay yet.
    expect(treeContractDue('balance', { ...accepted, state: 'ready' })).toMatchObject({ ok: false, message: expect.stringContaining('once the trees are delivered') })
  })
})

describe('settlementDue', () => {
  it('asks a settled delivery\'s total with tax, and nothing of any other', () => {
    expect(settlementDue({ state: 'settled', totalMinor: 68_724 })).toEqual({ ok: true, amountMinor: 68_724 })
    for (const state of ['recorded', 'disputed', 'paid']) expect(settlementDue({ state, totalMinor: 68_724 }).ok, state).toBe(false)
    expect(settlementDue({ state: 'settled', totalMinor: 0 }).ok).toBe(false)
  })
})

describe('depositRefund', () => {
  const cancelled = (by: 'buyer' | 'nursery', terms: Partial<TreeContractFacts> = {}): TreeContractFacts => ({ ...accepted, state: 'cancelled', cancelledBy: by, ...terms })

  it('refunds what the terms return to the side that did not cancel, never more than was paid', () => {
    // The nursery cancelled and the terms refund the deposit: the 356,400 paid comes back.
    expect(depositRefund(cancelled('nursery'), 356_400)).toBe(356_400)
    // The terms double it (712,800), but a charge is refunded at most in full: 356,400.
    expect(depositRefund(cancelled('nursery', { depositIfNurseryCancels: 'doubled' }), 356_400)).toBe(356_400)
    expect(depositRefund(cancelled('buyer', { depositIfBuyerCancels: 'refunded' }), 356_400)).toBe(356_400)
  })

  it('refunds nothing when the terms keep it, or the contract was not cancelled after acceptance', () => {
    expect(depositRefund(cancelled('buyer'), 356_400)).toBeNull()
    expect(depositRefund({ ...accepted }, 356_400)).toBeNull()
    expect(depositRefund(cancelled('nursery', { acceptedVersion: null }), 356_400)).toBeNull()
  })
})
