import type { MemberRole } from '../types/auth'
import type { BlendPlanAction, BlendPlanState } from '../types/blendPlan'
import { checkMove, movesFrom, type Move, type MoveCheck } from './stateMachine'

// The states of a maker's blend plan and who may move it: a draft is edited or deleted until it is
// committed (its kilograms of each lot then held for it); a committed plan is pressed (what was
// actually taken leaves the lots) or released (its kilograms free again). Pressed and released
// plans are kept as they are. The maker's owners and members make every move; viewers read.

export interface BlendPlanActor { role: MemberRole }

export interface BlendPlanMove extends Move<BlendPlanState, BlendPlanAction, BlendPlanActor> {
  /** Ends "This plan is committed, so it cannot be … now." */
  pastTense: string
}

const isWriter = (a: BlendPlanActor) => a.role === 'owner' || a.role === 'member'

export const BLEND_PLAN_MOVES: readonly BlendPlanMove[] = [
  { action: 'edit', from: ['draft'], to: 'draft', label: 'Edit', pastTense: 'edited', allowed: isWriter },
  { action: 'commit', from: ['draft'], to: 'committed', label: 'Commit and reserve the fruit', pastTense: 'committed', allowed: isWriter },
  { action: 'press', from: ['committed'], to: 'pressed', label: 'Record the pressing', pastTense: 'pressed', allowed: isWriter },
  { action: 'release', from: ['committed'], to: 'released', label: 'Release the fruit', pastTense: 'released', allowed: isWriter },
  { action: 'delete', from: ['draft'], to: 'draft', label: 'Delete', pastTense: 'deleted', allowed: isWriter },
]

/**
 * Whether `actor` may make `action` on a plan in `state`: 403 when the actor may never make it, 409
 * naming the current state when the state forbids it.
 */
export function checkBlendPlanMove(action: BlendPlanAction, state: BlendPlanState, actor: BlendPlanActor): MoveCheck<BlendPlanState> {
  const check = checkMove(BLEND_PLAN_MOVES, action, state, actor, 'This plan')
  if (check.ok) return check
  if (check.statusCode === 403) return { ...check, message: 'Only the maker\'s owners and members can change a blend plan.' }
  const move = BLEND_PLAN_MOVES.find(m => m.action === action)
  return { ...check, message: `This plan is ${state}, so it cannot be ${move?.pastTense ?? action} now.` }
}

/** The moves the page shows this actor on a plan in `state`. */
export function blendPlanMovesFrom(state: BlendPlanState, actor: BlendPlanActor): BlendPlanMove[] {
  return movesFrom(BLEND_PLAN_MOVES, state, actor) as BlendPlanMove[]
}
