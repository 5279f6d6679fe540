// The pure part of every object with states (organisations now; contracts, lots, sheets, plans and
// payments later): a table of moves, each from some states to one state, and who may make it. The
// service checks a move under a row lock with `checkMove`; the page shows `movesFrom` as buttons.

export interface Move<S extends string, A extends string, Actor> {
  /** The action's name, also the last segment of its route (`…/[id]/suspend.post.ts`). */
  action: A
  from: readonly S[]
  to: S
  /** The button's words. */
  label: string
  /** Who may make it; the server asks the same question. */
  allowed: (actor: Actor) => boolean
}

export type MoveTable<S extends string, A extends string, Actor> = readonly Move<S, A, Actor>[]

export type MoveCheck<S extends string>
  = | { ok: true, from: S, to: S }
    | { ok: false, statusCode: 403 | 409, message: string, state: S }

/** The moves this actor may make from this state, in the table's order. */
export function movesFrom<S extends string, A extends string, Actor>(table: MoveTable<S, A, Actor>, state: S, actor: Actor): Move<S, A, Actor>[] {
  return table.filter(m => m.from.includes(state) && m.allowed(actor))
}

/**
 * Whether `action` may be made now: 403 when the actor may never make it, 409 naming the current
 * state when the object is not in a state the move starts from.
 */
export function checkMove<S extends string, A extends string, Actor>(
  table: MoveTable<S, A, Actor>, action: A, state: S, actor: Actor, noun = 'This record',
): MoveCheck<S> {
  const candidates = table.filter(m => m.action === action)
  if (!candidates.some(m => m.allowed(actor))) return { ok: false, statusCode: 403, message: `You cannot ${action} this.`, state }
  const move = candidates.find(m => m.from.includes(state) && m.allowed(actor))
  if (!move) return { ok: false, statusCode: 409, message: `${noun} is ${state}, so it cannot be ${pastTense(action)} now.`, state }
  return { ok: true, from: state, to: move.to }
}

function pastTense(action: string): string {
  const words = action.replace(/-/g, ' ')
  if (words.endsWith('e')) return `${words}d`
  return `${words}ed`
}
