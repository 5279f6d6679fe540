import type { MemberRole } from '../types/auth'
import type { DeliveryAction, DeliverySide, DeliveryState } from '../types/delivery'
import { checkMove, movesFrom, type Move, type MoveCheck } from './stateMachine'

// The states of a delivery at the press and who may make which move:
// - the buying maker's owners and members record a load, correct it while it is recorded or
//   disputed (a correction of a disputed load answers the dispute and makes it recorded again),
//   and settle a recorded load;
// - either party's owners and members dispute a load that is recorded or settled, with a reason;
// - only the side that disputed a load withdraws its dispute, which makes it recorded again;
// - a settled load is marked paid by its payment, never by hand.
// Viewers make no moves.

export type DeliveryMoveAction = DeliveryAction | 'pay'

/** A person of one of the two parties, as they stand on one delivery. */
export interface DeliveryPartyActor {
  role: MemberRole
  side: DeliverySide
}

/** Pomewright itself, for the payment it records. */
export interface DeliverySystemActor { role: 'system' }

export type DeliveryActor = DeliveryPartyActor | DeliverySystemActor

export const DELIVERY_SYSTEM: DeliverySystemActor = { role: 'system' }

export interface DeliveryMove extends Move<DeliveryState, DeliveryMoveAction, DeliveryActor> {
  /** Ends "This delivery is settled, so it cannot be … now." */
  pastTense: string
  /** Said to someone who may never make the move. */
  whoMay: string
}

/** What a move is checked against besides the actor. */
export interface DeliveryPosition {
  state: DeliveryState
  /** The side whose dispute stands; null when none does. */
  disputedBy: DeliverySide | null
}

const isParty = (a: DeliveryActor): a is DeliveryPartyActor => a.role !== 'system'
const isWriter = (a: DeliveryActor) => isParty(a) && (a.role === 'owner' || a.role === 'member')
const isMakerWriter = (a: DeliveryActor) => isWriter(a) && isParty(a) && a.side === 'maker'

export const DELIVERY_MOVES: readonly DeliveryMove[] = [
  { action: 'edit', from: ['recorded', 'disputed'], to: 'recorded', label: 'Correct', pastTense: 'corrected', whoMay: 'Only the maker’s owners and members can correct a delivery.', allowed: isMakerWriter },
  { action: 'settle', from: ['recorded'], to: 'settled', label: 'Settle', pastTense: 'settled', whoMay: 'Only the maker’s owners and members can settle a delivery.', allowed: isMakerWriter },
  { action: 'dispute', from: ['recorded', 'settled'], to: 'disputed', label: 'Dispute', pastTense: 'disputed', whoMay: 'Only owners and members of either party can dispute a delivery.', allowed: isWriter },
  { action: 'withdraw-dispute', from: ['disputed'], to: 'recorded', label: 'Withdraw dispute', pastTense: 'withdrawn from dispute', whoMay: 'Only owners and members of the side that disputed it can withdraw a dispute.', allowed: isWriter },
  { action: 'pay', from: ['settled'], to: 'paid', label: 'Paid', pastTense: 'paid', whoMay: 'A delivery is marked paid by its payment, not by hand.', allowed: a => a.role === 'system' },
]

/** Why the dispute that stands forbids the move to this actor, or null when nothing does. */
function disputeRefusal(action: DeliveryMoveAction, position: DeliveryPosition, actor: DeliveryActor): string | null {
  if (action !== 'withdraw-dispute' || !isParty(actor) || position.disputedBy === null) return null
  if (actor.side === position.disputedBy) return null
  return `The ${position.disputedBy} disputed this delivery, so only the ${position.disputedBy} can withdraw the dispute.`
}

/**
 * Whether `actor` may make `action` on the delivery now, in the shape `checkMove` answers: 403
 * when the actor may never make it (or it is the other side's dispute to withdraw), 409 with the
 * current state when the state forbids it.
 */
export function checkDeliveryMove(action: DeliveryMoveAction, position: DeliveryPosition, actor: DeliveryActor): MoveCheck<DeliveryState> {
  const { state } = position
  const check = checkMove(DELIVERY_MOVES, action, state, actor, 'This delivery')
  const move = DELIVERY_MOVES.find(m => m.action === action)
  if (!check.ok && check.statusCode === 403) return { ...check, message: move?.whoMay ?? check.message }
  if (!check.ok) return { ...check, message: `This delivery is ${state}, so it cannot be ${move?.pastTense ?? action} now.` }
  const refusal = disputeRefusal(action, position, actor)
  if (refusal) return { ok: false, statusCode: 403, message: refusal, state }
  return check
}

/** The moves the page shows this actor now: the table's, less the other side's dispute to withdraw. */
export function deliveryMovesFrom(position: DeliveryPosition, actor: DeliveryActor): DeliveryMove[] {
  // movesFrom hands back the table's own rows, so they keep the delivery fields.
  const moves = movesFrom(DELIVERY_MOVES, position.state, actor) as DeliveryMove[]
  return moves.filter(m => !disputeRefusal(m.action, position, actor))
}

/** The actions a person may make now, as the API lists them. */
export function deliveryActionsFor(position: DeliveryPosition, actor: DeliveryPartyActor): DeliveryAction[] {
  return deliveryMovesFrom(position, actor).map(m => m.action).filter((a): a is DeliveryAction => a !== 'pay')
}
