// The money of a tree contract, in integer minor units (pence, cents):
//   trees = count × unit price; royalty = count × royalty per tree; total = trees + royalty;
//   deposit = total × deposit % ÷ 100, rounded half up once;
//   before delivery the balance is total − deposit; once delivered, the balance is due pro rata to
//   the trees delivered: delivered × (price + royalty) − deposit, never below zero;
//   cancelled after acceptance, the deposit is kept, refunded, or refunded with as much again
//   (doubled), as the terms say for the side that cancelled.

export interface TreeMoneyTerms {
  treeCount: number
  unitPriceMinor: number
  royaltyPerTreeMinor: number
  /** 0–100, to 2 decimals. */
  depositPct: number
  depositIfBuyerCancels: 'kept' | 'refunded'
  depositIfNurseryCancels: 'refunded' | 'doubled'
}

export interface TreeMoneyState {
  deliveredCount?: number | null
  /** The side that cancelled an accepted contract; null or absent otherwise. */
  cancelledAfterAcceptanceBy?: 'buyer' | 'nursery' | null
}

export interface TreeMoney {
  treesMinor: number
  royaltyMinor: number
  totalMinor: number
  depositMinor: number
  balanceMinor: number
  deliveredValueMinor: number | null
  depositOnCancel: { outcome: 'kept' | 'refunded' | 'doubled', refundMinor: number } | null
}

function requireWhole(value: number, what: string): void {
  if (!Number.isSafeInteger(value) || value < 0) throw new RangeError(`${what} must be a whole number, zero or more; got ${value}`)
}

/** a × pct ÷ 100 rounded half up, pct to 2 decimals, exactly. */
function percentHalfUp(amount: number, pct: number): number {
  const hundredths = BigInt(Math.round(pct * 100))
  return Number((BigInt(2) * BigInt(amount) * hundredths + BigInt(10_000)) / BigInt(20_000))
}

export function treeContractMoney(terms: TreeMoneyTerms, state: TreeMoneyState = {}): TreeMoney {
  requireWhole(terms.treeCount, 'The number of trees')
  requireWhole(terms.unitPriceMinor, 'The price per tree')
  requireWhole(terms.royaltyPerTreeMinor, 'The royalty per tree')
  if (!Number.isFinite(terms.depositPct) || terms.depositPct < 0 || terms.depositPct > 100) throw new RangeError(`The deposit must be from 0 to 100 %; got ${terms.depositPct}`)
  const treesMinor = terms.treeCount * terms.unitPriceMinor
  const royaltyMinor = terms.treeCount * terms.royaltyPerTreeMinor
  const totalMinor = treesMinor + royaltyMinor
  const depositMinor = percentHalfUp(totalMinor, terms.depositPct)

  const delivered = state.deliveredCount ?? null
  if (delivered !== null) requireWhole(delivered, 'The number of trees delivered')
  const deliveredValueMinor = delivered === null ? null : delivered * (terms.unitPriceMinor + terms.royaltyPerTreeMinor)
  const balanceMinor = Math.max(0, (deliveredValueMinor ?? totalMinor) - depositMinor)

  let depositOnCancel: TreeMoney['depositOnCancel'] = null
  if (state.cancelledAfterAcceptanceBy === 'buyer') {
    depositOnCancel = terms.depositIfBuyerCancels === 'kept' ? { outcome: 'kept', refundMinor: 0 } : { outcome: 'refunded', refundMinor: depositMinor }
  }
  else if (state.cancelledAfterAcceptanceBy === 'nursery') {
    depositOnCancel = terms.depositIfNurseryCancels === 'doubled' ? { outcome: 'doubled', refundMinor: 2 * depositMinor } : { outcome: 'refunded', refundMinor: depositMinor }
  }
  return { treesMinor, royaltyMinor, totalMinor, depositMinor, balanceMinor: depositOnCancel ? 0 : balanceMinor, deliveredValueMinor, depositOnCancel }
}
