import type { MemberRole } from '../types/auth'
import { checkMove, movesFrom, type Move, type MoveCheck } from './stateMachine'

// The states of tree contracts (buyer ↔ nursery) and fruit contracts (maker ↔ grower), and who
// may make which move. Both kinds negotiate the same way:
// - owners and members of the side that drafts a contract write and edit the draft; only that
//   side's owners offer it (the other side does not see a draft at all);
// - once offered, the side that did NOT make the last offer or counter answers it: its owners
//   accept, decline or counter. A counter to a counter is allowed: the contract stays `countered`
//   and the turn passes to the other side;
// - the side that made the last offer or counter may withdraw it, which cancels the contract
//   (the other side declines instead of cancelling);
// - an offer open until a date can no longer be accepted after it, though it may still be
//   countered or declined;
// - after acceptance either side's owners may cancel; what that does to a deposit is for the
//   terms and the settlement, not for this table.
// Tree contracts then move through the nursery's work: its owners and members record that
// propagation has started and that the trees are ready; only its owners record the delivery,
// since that fixes the balance due. A fruit contract is fulfilled by Pomewright itself when its
// last delivery window closes. Viewers make no moves.

export const CONTRACT_KINDS = ['tree', 'fruit'] as const
export type ContractKind = typeof CONTRACT_KINDS[number]

export const TREE_CONTRACT_STATES = ['draft', 'offered', 'countered', 'accepted', 'propagating', 'ready', 'delivered', 'declined', 'cancelled'] as const
export type TreeContractState = typeof TREE_CONTRACT_STATES[number]
export const FRUIT_CONTRACT_STATES = ['draft', 'offered', 'countered', 'accepted', 'fulfilled', 'declined', 'cancelled'] as const
export type FruitContractState = typeof FRUIT_CONTRACT_STATES[number]

const NEGOTIATION_ACTIONS = ['edit', 'offer', 'counter', 'accept', 'decline', 'cancel'] as const
type NegotiationAction = typeof NEGOTIATION_ACTIONS[number]
type NegotiationState = TreeContractState & FruitContractState

export const TREE_CONTRACT_ACTIONS = [...NEGOTIATION_ACTIONS, 'start-propagation', 'mark-ready', 'deliver'] as const
export type TreeContractAction = typeof TREE_CONTRACT_ACTIONS[number]
export const FRUIT_CONTRACT_ACTIONS = [...NEGOTIATION_ACTIONS, 'fulfil'] as const
export type FruitContractAction = typeof FRUIT_CONTRACT_ACTIONS[number]

export const TREE_CONTRACT_SIDES = ['buyer', 'nursery'] as const
export type TreeContractSide = typeof TREE_CONTRACT_SIDES[number]
export const FRUIT_CONTRACT_SIDES = ['maker', 'grower'] as const
export type FruitContractSide = typeof FRUIT_CONTRACT_SIDES[number]

/** A person of one of the two parties, as they stand on one contract. */
export interface PartyActor<Side extends string> {
  role: MemberRole
  side: Side
  /** The side that drafted the contract. */
  draftedBy: Side
  /** The side that made the last offer or counter; null before the first offer. */
  lastOfferBy: Side | null
}

/** Pomewright itself, for the moves nobody makes by hand. */
export interface SystemActor { role: 'system' }

export type ContractActor<Side extends string> = PartyActor<Side> | SystemActor

export const CONTRACT_SYSTEM: SystemActor = { role: 'system' }

export interface ContractMove<S extends string, A extends string, Side extends string> extends Move<S, A, ContractActor<Side>> {
  /** Ends "This tree contract is offered, so it cannot be … now." */
  pastTense: string
  /** Said to someone who may never make the move. */
  whoMay: string
  /**
   * Whose turn the move needs, checked against the contract as it stands (409 when wrong):
   * `answer`, the side that did not make the last offer; `withdraw`, the side that did.
   */
  turn?: 'answer' | 'withdraw'
}

export type ContractMoveTable<S extends string, A extends string, Side extends string> = readonly ContractMove<S, A, Side>[]

const isParty = <Side extends string>(a: ContractActor<Side>): a is PartyActor<Side> => a.role !== 'system'
const isOwner = <Side extends string>(a: ContractActor<Side>) => isParty(a) && a.role === 'owner'
const isWriter = <Side extends string>(a: ContractActor<Side>) => isParty(a) && (a.role === 'owner' || a.role === 'member')
const isDrafter = <Side extends string>(a: ContractActor<Side>) => isParty(a) && a.side === a.draftedBy

function negotiationMoves<Side extends string>(): ContractMove<NegotiationState, NegotiationAction, Side>[] {
  return [
    { action: 'edit', from: ['draft'], to: 'draft', label: 'Edit draft', pastTense: 'edited', whoMay: 'Only owners and members of the side that drafted it can edit a draft.', allowed: a => isWriter(a) && isDrafter(a) },
    { action: 'offer', from: ['draft'], to: 'offered', label: 'Send offer', pastTense: 'offered', whoMay: 'Only an owner of the side that drafted it can send the offer.', allowed: a => isOwner(a) && isDrafter(a) },
    { action: 'counter', from: ['offered', 'countered'], to: 'countered', label: 'Counter-offer', pastTense: 'countered', whoMay: 'Only an owner can make a counter-offer.', allowed: isOwner, turn: 'answer' },
    { action: 'accept', from: ['offered', 'countered'], to: 'accepted', label: 'Accept', pastTense: 'accepted', whoMay: 'Only an owner can accept a contract.', allowed: isOwner, turn: 'answer' },
    { action: 'decline', from: ['offered', 'countered'], to: 'declined', label: 'Decline', pastTense: 'declined', whoMay: 'Only an owner can decline a contract.', allowed: isOwner, turn: 'answer' },
    { action: 'cancel', from: ['draft'], to: 'cancelled', label: 'Discard draft', pastTense: 'cancelled', whoMay: 'Only an owner can cancel a contract.', allowed: a => isOwner(a) && isDrafter(a) },
    { action: 'cancel', from: ['offered', 'countered'], to: 'cancelled', label: 'Withdraw offer', pastTense: 'cancelled', whoMay: 'Only an owner can cancel a contract.', allowed: isOwner, turn: 'withdraw' },
  ]
}

const isNurseryWriter = (a: ContractActor<TreeContractSide>) => isWriter(a) && isParty(a) && a.side === 'nursery'
const isNurseryOwner = (a: ContractActor<TreeContractSide>) => isOwner(a) && isParty(a) && a.side === 'nursery'

export const TREE_CONTRACT_MOVES: ContractMoveTable<TreeContractState, TreeContractAction, TreeContractSide> = [
  ...negotiationMoves<TreeContractSide>(),
  { action: 'cancel', from: ['accepted', 'propagating', 'ready'], to: 'cancelled', label: 'Cancel contract', pastTense: 'cancelled', whoMay: 'Only an owner can cancel a contract.', allowed: isOwner },
  { action: 'start-propagation', from: ['accepted'], to: 'propagating', label: 'Start propagation', pastTense: 'moved into propagation', whoMay: 'Only the nursery’s owners and members can record propagation.', allowed: isNurseryWriter },
  { action: 'mark-ready', from: ['propagating'], to: 'ready', label: 'Mark trees ready', pastTense: 'marked ready', whoMay: 'Only the nursery’s owners and members can mark the trees ready.', allowed: isNurseryWriter },
  { action: 'deliver', from: ['ready'], to: 'delivered', label: 'Record delivery', pastTense: 'delivered', whoMay: 'Only the nursery’s owners can record a delivery.', allowed: isNurseryOwner },
]

export const FRUIT_CONTRACT_MOVES: ContractMoveTable<FruitContractState, FruitContractAction, FruitContractSide> = [
  ...negotiationMoves<FruitContractSide>(),
  { action: 'cancel', from: ['accepted'], to: 'cancelled', label: 'Cancel contract', pastTense: 'cancelled', whoMay: 'Only an owner can cancel a contract.', allowed: isOwner },
  { action: 'fulfil', from: ['accepted'], to: 'fulfilled', label: 'Fulfilled', pastTense: 'fulfilled', whoMay: 'A fruit contract is fulfilled by Pomewright when its last delivery window closes.', allowed: a => a.role === 'system' },
]

/** The offer or counter that stands, as far as its expiry goes. */
export interface StandingOffer {
  /** The last day it may be accepted, YYYY-MM-DD; null or absent when it does not expire. */
  expiresOn?: string | null
}

/** What a move is checked against besides the actor: the state and the offer that stands. */
export interface ContractPosition<S extends string> extends StandingOffer {
  state: S
}

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/

function requireIsoDate(value: string, what: string): void {
  if (!ISO_DATE.test(value)) throw new RangeError(`${what} must be a date as YYYY-MM-DD; got ${value}`)
}

/** Whether the offer's last day has passed: it may still be accepted on the day it expires. */
export function isExpired(offer: StandingOffer, today: string): boolean {
  requireIsoDate(today, 'Today')
  if (!offer.expiresOn) return false
  requireIsoDate(offer.expiresOn, 'Expiry date')
  return today > offer.expiresOn
}

/** The side that made the last offer or counter once `action` is made by `actorSide`. */
export function turnAfter<Side extends string>(action: string, actorSide: Side | null, previousTurn: Side | null): Side | null {
  if (action === 'offer' || action === 'counter') return actorSide
  return previousTurn
}

const NOUN: Record<ContractKind, string> = { tree: 'This tree contract', fruit: 'This fruit contract' }

type AnyContractMove = ContractMove<string, string, string>

// The overloads below keep each kind's states, actions and sides apart for callers; inside, one
// body serves both tables.
function movesOf(kind: ContractKind): readonly AnyContractMove[] {
  return (kind === 'tree' ? TREE_CONTRACT_MOVES : FRUIT_CONTRACT_MOVES) as unknown as readonly AnyContractMove[]
}

function refuse<S extends string>(statusCode: 403 | 409, message: string, state: S): MoveCheck<S> {
  return { ok: false, statusCode, message, state }
}

/** Why the contract's turn forbids the move, or null when it allows it. */
function turnRefusal(move: AnyContractMove, actor: ContractActor<string>): string | null {
  if (!move.turn || !isParty(actor)) return null
  const offeredBy = actor.lastOfferBy ?? actor.draftedBy
  if (move.turn === 'answer' && actor.side === offeredBy) {
    return 'The last offer is yours, so the other side answers it. Withdraw it (cancel) if you want to change it.'
  }
  if (move.turn === 'withdraw' && actor.side !== offeredBy) {
    return 'The last offer came from the other side: decline it or make a counter-offer instead.'
  }
  return null
}

function expiryRefusal(action: string, contract: StandingOffer, today: string): string | null {
  if (action !== 'accept' || !isExpired(contract, today)) return null
  return `The offer could be accepted until ${contract.expiresOn} and has expired; ask the other side for a new one.`
}

/**
 * Whether `actor` may make `action` on the contract today, in the shape `checkMove` answers: 403
 * when the actor may never make the move; 409 with the current state when the state, the turn
 * or an expired offer forbids it now.
 */
export function checkContractMove(kind: 'tree', action: TreeContractAction, contract: ContractPosition<TreeContractState>, actor: ContractActor<TreeContractSide>, today: string): MoveCheck<TreeContractState>
export function checkContractMove(kind: 'fruit', action: FruitContractAction, contract: ContractPosition<FruitContractState>, actor: ContractActor<FruitContractSide>, today: string): MoveCheck<FruitContractState>
export function checkContractMove(kind: ContractKind, action: string, contract: ContractPosition<string>, actor: ContractActor<string>, today: string): MoveCheck<string> {
  requireIsoDate(today, 'Today')
  const table = movesOf(kind)
  const { state } = contract
  const check = checkMove(table, action, state, actor)
  const candidates = table.filter(m => m.action === action)
  if (!check.ok && check.statusCode === 403) return refuse(403, candidates[0]?.whoMay ?? `You cannot ${action} this contract.`, state)
  const move = candidates.find(m => m.from.includes(state) && m.allowed(actor))
  if (!check.ok || !move) {
    const pastTense = candidates[0]?.pastTense ?? action
    return refuse(409, `${NOUN[kind]} is ${state}, so it cannot be ${pastTense} now.`, state)
  }
  const refusal = turnRefusal(move, actor) ?? expiryRefusal(action, contract, today)
  if (refusal) return refuse(409, refusal, state)
  return check
}

/** The moves the page shows this actor today: the table's, less those the turn or an expired offer forbids. */
export function contractMovesFrom(kind: 'tree', contract: ContractPosition<TreeContractState>, actor: ContractActor<TreeContractSide>, today: string): ContractMove<TreeContractState, TreeContractAction, TreeContractSide>[]
export function contractMovesFrom(kind: 'fruit', contract: ContractPosition<FruitContractState>, actor: ContractActor<FruitContractSide>, today: string): ContractMove<FruitContractState, FruitContractAction, FruitContractSide>[]
export function contractMovesFrom(kind: ContractKind, contract: ContractPosition<string>, actor: ContractActor<string>, today: string): readonly unknown[] {
  requireIsoDate(today, 'Today')
  // movesFrom hands back the table's own rows, so they keep the contract fields.
  const moves = movesFrom(movesOf(kind), contract.state, actor) as AnyContractMove[]
  return moves.filter(m => !turnRefusal(m, actor) && !expiryRefusal(m.action, contract, today))
}
