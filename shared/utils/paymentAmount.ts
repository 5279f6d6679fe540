import { treeContractMoney, type TreeMoneyTerms } from './treeContractMoney'

// What a payment is for, worked from its object, never sent by the payer (integer minor units):
// - a tree contract's deposit, once the contract is accepted (and not cancelled): the deposit of
//   treeContractMoney (total × deposit % ÷ 100, rounded half up once);
// - its balance, once the trees are delivered: pro rata to the trees delivered,
//   delivered × (price + royalty) − deposit, never below zero (treeContractMoney again);
// - a settled delivery's settlement: its total with the grower's tax, as it was settled.
// And what a cancellation gives back of a paid deposit: the terms' refund, at most what was paid
// (the processor refunds a charge, never more than it; a doubled deposit's second half is the
// nursery's to pay apart).

export interface TreeContractFacts extends TreeMoneyTerms {
  state: string
  deliveredCount: number | null
  cancelledBy: 'buyer' | 'nursery' | null
  acceptedVersion: number | null
}

export type Due = { ok: true, amountMinor: number } | { ok: false, message: string }

/** The states in which a tree contract's deposit is owed: from acceptance until the trees are delivered (a late deposit is still owed). */
const DEPOSIT_STATES = ['accepted', 'propagating', 'ready', 'delivered']

export function treeContractDue(purpose: 'deposit' | 'balance', contract: TreeContractFacts): Due {
  const delivered = contract.state === 'delivered' ? contract.deliveredCount : null
  const money = treeContractMoney(contract, { deliveredCount: delivered })
  if (purpose === 'deposit') {
    if (!DEPOSIT_STATES.includes(contract.state)) return { ok: false, message: `This tree contract is ${contract.state}: a deposit is paid once it is accepted.` }
    if (money.depositMinor <= 0) return { ok: false, message: 'This tree contract has no deposit to pay.' }
    return { ok: true, amountMinor: money.depositMinor }
  }
  if (contract.state !== 'delivered') return { ok: false, message: `This tree contract is ${contract.state}: the balance is paid once the trees are delivered.` }
  if (money.balanceMinor <= 0) return { ok: false, message: 'The deposit already covers the trees delivered: there is no balance to pay.' }
  return { ok: true, amountMinor: money.balanceMinor }
}

export function settlementDue(delivery: { state: string, totalMinor: number }): Due {
  if (delivery.state !== 'settled') return { ok: false, message: `This delivery is ${delivery.state}: a settlement is paid once the delivery is settled.` }
  if (delivery.totalMinor <= 0) return { ok: false, message: 'This delivery earns nothing, so there is nothing to pay.' }
  return { ok: true, amountMinor: delivery.totalMinor }
}

/**
 * What to refund of a deposit paid (`paidMinor`) on a contract cancelled after acceptance, by the
 * terms for the side that cancelled; null when the contract is not cancelled after acceptance or
 * the terms keep the deposit.
 */
export function depositRefund(contract: TreeContractFacts, paidMinor: number): number | null {
  if (contract.state !== 'cancelled' || contract.acceptedVersion === null || !contract.cancelledBy) return null
  const { depositOnCancel } = treeContractMoney(contract, { cancelledAfterAcceptanceBy: contract.cancelledBy })
  if (!depositOnCancel || depositOnCancel.refundMinor === 0) return null
  return Math.min(depositOnCancel.refundMinor, paidMinor)
}
