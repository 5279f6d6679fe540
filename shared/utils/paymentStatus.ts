import type { MemberRole } from '../types/auth'
import type { PaymentAction, PaymentSide, PaymentState } from '../types/payment'
import { checkMove, movesFrom, type Move, type MoveCheck } from './stateMachine'

// The states of a payment and who moves it:
// - the payer's owners pay a pending payment on the processor's hosted page (the state stays
//   pending until the processor's event says how it went);
// - the processor's events, through Pomewright ('system'), make it succeeded or failed; a payment
//   that failed may still succeed (the payer tries again on the same page), but a succeeded payment
//   never goes back to pending or failed;
// - a succeeded payment is refunded by the payee's owners (a deposit the terms return) or by
//   Pomewright when a cancellation returns it; refunded is the end.
// An event that arrives after a later one (a failure after success) changes nothing.

export interface PaymentPartyActor { role: MemberRole, side: PaymentSide }
export interface PaymentSystemActor { role: 'system' }
export type PaymentActor = PaymentPartyActor | PaymentSystemActor
export const PAYMENT_SYSTEM: PaymentSystemActor = { role: 'system' }

export type PaymentMoveAction = PaymentAction | 'succeed' | 'fail'

const isSystem = (a: PaymentActor) => a.role === 'system'
const isOwnerOf = (side: PaymentSide) => (a: PaymentActor) => !isSystem(a) && a.role === 'owner' && (a as PaymentPartyActor).side === side

export const PAYMENT_MOVES: readonly Move<PaymentState, PaymentMoveAction, PaymentActor>[] = [
  { action: 'pay', from: ['pending'], to: 'pending', label: 'Pay', allowed: isOwnerOf('payer') },
  { action: 'succeed', from: ['pending', 'failed'], to: 'succeeded', label: 'Succeeded', allowed: isSystem },
  { action: 'fail', from: ['pending'], to: 'failed', label: 'Failed', allowed: isSystem },
  { action: 'refund', from: ['succeeded'], to: 'refunded', label: 'Refund', allowed: a => isSystem(a) || isOwnerOf('payee')(a) },
]

/** Whether the actor may make the move from this state (403 / 409 with the state otherwise). */
export function checkPaymentMove(action: PaymentMoveAction, state: PaymentState, actor: PaymentActor): MoveCheck<PaymentState> {
  return checkMove(PAYMENT_MOVES, action, state, actor, 'This payment')
}

/** The live states: a second payment for the same purpose and object is not made while one is. */
export const LIVE_PAYMENT_STATES: readonly PaymentState[] = ['pending', 'succeeded']

/**
 * The buttons a person sees on a payment: Pay for the payer's owners while pending; Refund for the
 * payee's owners when the payment may be refunded now (`refundable`, decided from its object).
 */
export function paymentActionsFor(state: PaymentState, actor: PaymentPartyActor, refundable: boolean): PaymentAction[] {
  return movesFrom(PAYMENT_MOVES, state, actor)
    .map(m => m.action)
    .filter((a): a is PaymentAction => a === 'pay' || (a === 'refund' && refundable))
}
