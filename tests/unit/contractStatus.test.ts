import { describe, expect, it } from 'vitest'
import type { MemberRole } from '#shared/types/auth'
import {
  CONTRACT_SYSTEM,
  FRUIT_CONTRACT_ACTIONS,
  FRUIT_CONTRACT_MOVES,
  FRUIT_CONTRACT_STATES,
  TREE_CONTRACT_ACTIONS,
  TREE_CONTRACT_MOVES,
  TREE_CONTRACT_STATES,
  checkContractMove,
  contractMovesFrom,
  isExpired,
  turnAfter,
  type ContractActor,
  type FruitContractAction,
  type FruitContractSide,
  type FruitContractState,
  type TreeContractAction,
  type TreeContractSide,
  type TreeContractState,
} from '#shared/utils/contractStatus'

const today = '2027-02-15'

function treeActor(side: TreeContractSide, role: MemberRole, lastOfferBy: TreeContractSide | null = null, draftedBy: TreeContractSide = 'buyer'): ContractActor<TreeContractSide> {
  return { role, side, draftedBy, lastOfferBy }
}

function fruitActor(side: FruitContractSide, role: MemberRole, lastOfferBy: FruitContractSide | null = null, draftedBy: FruitContractSide = 'maker'): ContractActor<FruitContractSide> {
  return { role, side, draftedBy, lastOfferBy }
}

const ROLES = { O: 'owner', M: 'member', V: 'viewer' } as const

describe('tree contracts: every state × action × actor', () => {
  // Drafted by the buyer. The buyer made the offer that stands in `offered`; the nursery made the
  // counter that stands in `countered` (and, for the later states, the one the buyer accepted).
  // B = buyer, N = nursery; O owner, M member, V viewer; SYS = Pomewright itself.
  type Key = 'BO' | 'BM' | 'BV' | 'NO' | 'NM' | 'NV' | 'SYS'
  const KEYS: Key[] = ['BO', 'BM', 'BV', 'NO', 'NM', 'NV', 'SYS']
  const lastOfferIn = (state: TreeContractState): TreeContractSide | null => {
    if (state === 'draft') return null
    return state === 'offered' ? 'buyer' : 'nursery'
  }
  const actorFor = (key: Key, state: TreeContractState): ContractActor<TreeContractSide> => {
    if (key === 'SYS') return CONTRACT_SYSTEM
    const side = key[0] === 'B' ? 'buyer' : 'nursery'
    return treeActor(side, ROLES[key[1] as 'O' | 'M' | 'V'], lastOfferIn(state))
  }

  // `never`: 403 whatever the state. `ok`: who may make the move in each state. Anything else: 409.
  const answering = { never: ['BM', 'BV', 'NM', 'NV', 'SYS'], ok: { offered: ['NO'], countered: ['BO'] } } as const
  const nurseryWork = { never: ['BO', 'BM', 'BV', 'NV', 'SYS'] } as const
  const EXPECTED: Record<TreeContractAction, { never: readonly Key[], ok: Partial<Record<TreeContractState, readonly Key[]>> }> = {
    'edit': { never: ['BV', 'NO', 'NM', 'NV', 'SYS'], ok: { draft: ['BO', 'BM'] } },
    'offer': { never: ['BM', 'BV', 'NO', 'NM', 'NV', 'SYS'], ok: { draft: ['BO'] } },
    'counter': answering,
    'accept': answering,
    'decline': answering,
    'cancel': {
      never: ['BM', 'BV', 'NM', 'NV', 'SYS'],
      ok: { draft: ['BO'], offered: ['BO'], countered: ['NO'], accepted: ['BO', 'NO'], propagating: ['BO', 'NO'], ready: ['BO', 'NO'] },
    },
    'start-propagation': { ...nurseryWork, ok: { accepted: ['NO', 'NM'] } },
    'mark-ready': { ...nurseryWork, ok: { propagating: ['NO', 'NM'] } },
    'deliver': { never: ['BO', 'BM', 'BV', 'NM', 'NV', 'SYS'], ok: { ready: ['NO'] } },
  }
  const TO: Record<TreeContractAction, TreeContractState> = {
    'edit': 'draft', 'offer': 'offered', 'counter': 'countered', 'accept': 'accepted', 'decline': 'declined',
    'cancel': 'cancelled', 'start-propagation': 'propagating', 'mark-ready': 'ready', 'deliver': 'delivered',
  }

  for (const state of TREE_CONTRACT_STATES) {
    it(`answers every action by every actor from ${state} as the table says`, () => {
      const outcomes = (answer: (action: typeof TREE_CONTRACT_ACTIONS[number], key: Key) => string) =>
        Object.fromEntries(TREE_CONTRACT_ACTIONS.map(action => [action, KEYS.map(key => `${key} ${answer(action, key)}`)]))
      const expected = outcomes((action, key) => {
        if (EXPECTED[action].never.includes(key)) return '403'
        return EXPECTED[action].ok[state]?.includes(key) ? `→ ${TO[action]}` : '409'
      })
      const actual = outcomes((action, key) => {
        const check = checkContractMove('tree', action, { state }, actorFor(key, state), today)
        if (check.ok) return `→ ${check.to}`
        expect(check.state).toBe(state)
        return String(check.statusCode)
      })
      expect(actual).toEqual(expected)
    })
  }

  it('shows each actor exactly the moves the check allows', () => {
    for (const state of TREE_CONTRACT_STATES) {
      for (const key of KEYS) {
        const actor = actorFor(key, state)
        const shown = contractMovesFrom('tree', { state }, actor, today).map(m => m.action)
        const allowed = TREE_CONTRACT_ACTIONS.filter(a => checkContractMove('tree', a, { state }, actor, today).ok)
        expect(shown, `${state} · ${key}`).toEqual(allowed)
      }
    }
  })
})

describe('fruit contracts: every state × action × actor', () => {
  // Drafted by the maker, offered by the maker, countered by the grower. M = maker, G = grower.
  type Key = 'MO' | 'MM' | 'MV' | 'GO' | 'GM' | 'GV' | 'SYS'
  const KEYS: Key[] = ['MO', 'MM', 'MV', 'GO', 'GM', 'GV', 'SYS']
  const lastOfferIn = (state: FruitContractState): FruitContractSide | null => {
    if (state === 'draft') return null
    return state === 'offered' ? 'maker' : 'grower'
  }
  const actorFor = (key: Key, state: FruitContractState): ContractActor<FruitContractSide> => {
    if (key === 'SYS') return CONTRACT_SYSTEM
    const side = key[0] === 'M' ? 'maker' : 'grower'
    return fruitActor(side, ROLES[key[1] as 'O' | 'M' | 'V'], lastOfferIn(state))
  }

  const answering = { never: ['MM', 'MV', 'GM', 'GV', 'SYS'], ok: { offered: ['GO'], countered: ['MO'] } } as const
  const EXPECTED: Record<FruitContractAction, { never: readonly Key[], ok: Partial<Record<FruitContractState, readonly Key[]>> }> = {
    edit: { never: ['MV', 'GO', 'GM', 'GV', 'SYS'], ok: { draft: ['MO', 'MM'] } },
    offer: { never: ['MM', 'MV', 'GO', 'GM', 'GV', 'SYS'], ok: { draft: ['MO'] } },
    counter: answering,
    accept: answering,
    decline: answering,
    cancel: { never: ['MM', 'MV', 'GM', 'GV', 'SYS'], ok: { draft: ['MO'], offered: ['MO'], countered: ['GO'], accepted: ['MO', 'GO'] } },
    fulfil: { never: ['MO', 'MM', 'MV', 'GO', 'GM', 'GV'], ok: { accepted: ['SYS'] } },
  }
  const TO: Record<FruitContractAction, FruitContractState> = {
    edit: 'draft', offer: 'offered', counter: 'countered', accept: 'accepted', decline: 'declined', cancel: 'cancelled', fulfil: 'fulfilled',
  }

  for (const state of FRUIT_CONTRACT_STATES) {
    it(`answers every action by every actor from ${state} as the table says`, () => {
      const outcomes = (answer: (action: typeof FRUIT_CONTRACT_ACTIONS[number], key: Key) => string) =>
        Object.fromEntries(FRUIT_CONTRACT_ACTIONS.map(action => [action, KEYS.map(key => `${key} ${answer(action, key)}`)]))
      const expected = outcomes((action, key) => {
        if (EXPECTED[action].never.includes(key)) return '403'
        return EXPECTED[action].ok[state]?.includes(key) ? `→ ${TO[action]}` : '409'
      })
      const actual = outcomes((action, key) => {
        const check = checkContractMove('fruit', action, { state }, actorFor(key, state), today)
        if (check.ok) return `→ ${check.to}`
        expect(check.state).toBe(state)
        return String(check.statusCode)
      })
      expect(actual).toEqual(expected)
    })
  }

  it('shows each actor exactly the moves the check allows', () => {
    for (const state of FRUIT_CONTRACT_STATES) {
      for (const key of KEYS) {
        const actor = actorFor(key, state)
        const shown = contractMovesFrom('fruit', { state }, actor, today).map(m => m.action)
        const allowed = FRUIT_CONTRACT_ACTIONS.filter(a => checkContractMove('fruit', a, { state }, actor, today).ok)
        expect(shown, `${state} · ${key}`).toEqual(allowed)
      }
    }
  })
})

describe('negotiation', () => {
  it('runs a tree contract from draft to delivery, the turn passing with each counter', () => {
    let state: TreeContractState = 'draft'
    let lastOfferBy: TreeContractSide | null = null
    const steps: [TreeContractSide, MemberRole, TreeContractAction, TreeContractState][] = [
      ['buyer', 'member', 'edit', 'draft'],
      ['buyer', 'owner', 'offer', 'offered'],
      ['nursery', 'owner', 'counter', 'countered'],
      ['buyer', 'owner', 'counter', 'countered'],
      ['nursery', 'owner', 'accept', 'accepted'],
      ['nursery', 'member', 'start-propagation', 'propagating'],
      ['nursery', 'member', 'mark-ready', 'ready'],
      ['nursery', 'owner', 'deliver', 'delivered'],
    ]
    for (const [side, role, action, to] of steps) {
      const check = checkContractMove('tree', action, { state }, treeActor(side, role, lastOfferBy), today)
      expect(check, `${side} ${role} ${action}`).toEqual({ ok: true, from: state, to })
      state = to
      lastOfferBy = turnAfter(action, side, lastOfferBy)
    }
    expect(state).toBe('delivered')
    // The last counter was the buyer's, and the nursery accepted it.
    expect(lastOfferBy).toBe('buyer')
  })

  it('allows a counter to a counter: the state stays countered and the turn passes', () => {
    expect(turnAfter('counter', 'nursery', 'buyer')).toBe('nursery')
    expect(turnAfter('counter', 'buyer', 'nursery')).toBe('buyer')
    const check = checkContractMove('tree', 'counter', { state: 'countered' }, treeActor('buyer', 'owner', 'nursery'), today)
    expect(check).toEqual({ ok: true, from: 'countered', to: 'countered' })
    // Having countered, the buyer waits: a second counter of its own is refused.
    const again = checkContractMove('tree', 'counter', { state: 'countered' }, treeActor('buyer', 'owner', 'buyer'), today)
    expect(again).toMatchObject({ ok: false, statusCode: 409, state: 'countered' })
  })

  it('records who made the last offer only on offers and counters', () => {
    expect(turnAfter('offer', 'maker', null)).toBe('maker')
    for (const action of ['accept', 'decline', 'cancel', 'edit', 'fulfil', 'deliver']) {
      expect(turnAfter(action, 'grower', 'maker')).toBe('maker')
    }
  })

  it('refuses to let the side that made the offer accept, decline or counter it', () => {
    for (const action of ['accept', 'decline', 'counter'] as const) {
      const check = checkContractMove('fruit', action, { state: 'offered' }, fruitActor('maker', 'owner', 'maker'), today)
      expect(check).toEqual({
        ok: false,
        statusCode: 409,
        state: 'offered',
        message: 'The last offer is yours, so the other side answers it. Withdraw it (cancel) if you want to change it.',
      })
    }
  })

  it('lets the side that made the last offer withdraw it, and tells the other side to decline instead', () => {
    expect(checkContractMove('fruit', 'cancel', { state: 'countered' }, fruitActor('grower', 'owner', 'grower'), today))
      .toEqual({ ok: true, from: 'countered', to: 'cancelled' })
    expect(checkContractMove('fruit', 'cancel', { state: 'countered' }, fruitActor('maker', 'owner', 'grower'), today)).toEqual({
      ok: false,
      statusCode: 409,
      state: 'countered',
      message: 'The last offer came from the other side: decline it or make a counter-offer instead.',
    })
  })

  it('lets either side draft; the other side answers the drafter’s offer', () => {
    const quote = (side: TreeContractSide, lastOfferBy: TreeContractSide | null) => treeActor(side, 'owner', lastOfferBy, 'nursery')
    expect(checkContractMove('tree', 'offer', { state: 'draft' }, quote('nursery', null), today)).toMatchObject({ ok: true, to: 'offered' })
    expect(checkContractMove('tree', 'offer', { state: 'draft' }, quote('buyer', null), today)).toMatchObject({ ok: false, statusCode: 403 })
    expect(checkContractMove('tree', 'accept', { state: 'offered' }, quote('buyer', 'nursery'), today)).toMatchObject({ ok: true, to: 'accepted' })
    // An offer whose maker was not recorded is taken as the drafter's.
    expect(checkContractMove('tree', 'accept', { state: 'offered' }, quote('nursery', null), today)).toMatchObject({ ok: false, statusCode: 409 })
    expect(checkContractMove('tree', 'accept', { state: 'offered' }, quote('buyer', null), today)).toMatchObject({ ok: true })
  })

  it('names the current state in a 409 and the people who may in a 403', () => {
    const late = checkContractMove('tree', 'start-propagation', { state: 'offered' }, treeActor('nursery', 'member', 'buyer'), today)
    expect(late).toEqual({ ok: false, statusCode: 409, state: 'offered', message: 'This tree contract is offered, so it cannot be moved into propagation now.' })
    const done = checkContractMove('fruit', 'cancel', { state: 'fulfilled' }, fruitActor('grower', 'owner', 'grower'), today)
    expect(done).toEqual({ ok: false, statusCode: 409, state: 'fulfilled', message: 'This fruit contract is fulfilled, so it cannot be cancelled now.' })
    const member = checkContractMove('tree', 'deliver', { state: 'ready' }, treeActor('nursery', 'member', 'nursery'), today)
    expect(member).toEqual({ ok: false, statusCode: 403, state: 'ready', message: 'Only the nursery’s owners can record a delivery.' })
    const byHand = checkContractMove('fruit', 'fulfil', { state: 'accepted' }, fruitActor('maker', 'owner', 'grower'), today)
    expect(byHand).toMatchObject({ ok: false, statusCode: 403, message: 'A fruit contract is fulfilled by Pomewright when its last delivery window closes.' })
  })

  it('gives viewers no moves in any state, and 403 for every action', () => {
    for (const state of TREE_CONTRACT_STATES) {
      for (const side of ['buyer', 'nursery'] as const) {
        const viewer = treeActor(side, 'viewer', 'buyer')
        expect(contractMovesFrom('tree', { state }, viewer, today)).toEqual([])
        for (const action of TREE_CONTRACT_ACTIONS) expect(checkContractMove('tree', action, { state }, viewer, today)).toMatchObject({ ok: false, statusCode: 403 })
      }
    }
    for (const state of FRUIT_CONTRACT_STATES) {
      for (const side of ['maker', 'grower'] as const) {
        const viewer = fruitActor(side, 'viewer', 'maker')
        expect(contractMovesFrom('fruit', { state }, viewer, today)).toEqual([])
        for (const action of FRUIT_CONTRACT_ACTIONS) expect(checkContractMove('fruit', action, { state }, viewer, today)).toMatchObject({ ok: false, statusCode: 403 })
      }
    }
  })

  it('has no move out of a finished contract and every state reachable', () => {
    const finished = ['delivered', 'fulfilled', 'declined', 'cancelled']
    for (const table of [TREE_CONTRACT_MOVES, FRUIT_CONTRACT_MOVES]) {
      for (const move of table) for (const state of finished) expect(move.from as readonly string[]).not.toContain(state)
    }
    expect(new Set(TREE_CONTRACT_MOVES.map(m => m.to))).toEqual(new Set(TREE_CONTRACT_STATES))
    expect(new Set(FRUIT_CONTRACT_MOVES.map(m => m.to))).toEqual(new Set(FRUIT_CONTRACT_STATES))
  })
})

describe('offer expiry', () => {
  it('lets an offer be accepted up to and on its last day, not after', () => {
    expect(isExpired({ expiresOn: '2027-03-01' }, '2027-02-28')).toBe(false)
    expect(isExpired({ expiresOn: '2027-03-01' }, '2027-03-01')).toBe(false)
    expect(isExpired({ expiresOn: '2027-03-01' }, '2027-03-02')).toBe(true)
    expect(isExpired({ expiresOn: null }, '2099-01-01')).toBe(false)
    expect(isExpired({}, '2099-01-01')).toBe(false)
  })

  it('refuses to accept an expired offer with a 409 saying what to do, but still lets it be countered or declined', () => {
    const grower = fruitActor('grower', 'owner', 'maker')
    const offer = { state: 'offered', expiresOn: '2027-03-01' } as const
    expect(checkContractMove('fruit', 'accept', offer, grower, '2027-03-01')).toEqual({ ok: true, from: 'offered', to: 'accepted' })
    expect(checkContractMove('fruit', 'accept', offer, grower, '2027-03-02')).toEqual({
      ok: false,
      statusCode: 409,
      state: 'offered',
      message: 'The offer could be accepted until 2027-03-01 and has expired; ask the other side for a new one.',
    })
    expect(checkContractMove('fruit', 'counter', offer, grower, '2027-03-02')).toMatchObject({ ok: true, to: 'countered' })
    expect(checkContractMove('fruit', 'decline', offer, grower, '2027-03-02')).toMatchObject({ ok: true, to: 'declined' })
    expect(contractMovesFrom('fruit', offer, grower, '2027-03-02').map(m => m.action)).toEqual(['counter', 'decline'])
    expect(contractMovesFrom('fruit', offer, grower, '2027-03-01').map(m => m.action)).toEqual(['counter', 'accept', 'decline'])
  })

  it('checks the turn before the expiry, so the offer’s own side hears whose turn it is', () => {
    const check = checkContractMove('tree', 'accept', { state: 'offered', expiresOn: '2027-01-01' }, treeActor('buyer', 'owner', 'buyer'), today)
    expect(check).toMatchObject({ ok: false, statusCode: 409, message: expect.stringMatching(/^The last offer is yours/) })
  })

  it('refuses dates that are not YYYY-MM-DD', () => {
    expect(() => isExpired({ expiresOn: '1 March 2027' }, today)).toThrow(/Expiry date must be a date as YYYY-MM-DD/)
    expect(() => checkContractMove('tree', 'accept', { state: 'offered' }, treeActor('nursery', 'owner', 'buyer'), '15/02/2027')).toThrow(/Today/)
  })
})
