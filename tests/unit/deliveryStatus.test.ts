import { describe, expect, it } from 'vitest'
import { DELIVERY_STATES, type DeliveryAction, type DeliverySide, type DeliveryState } from '#shared/types/delivery'
import {
  DELIVERY_SYSTEM, checkDeliveryMove, deliveryActionsFor, deliveryMovesFrom, type DeliveryActor, type DeliveryMoveAction, type DeliveryPosition,
} from '#shared/utils/deliveryStatus'

// M = the buying maker, G = the selling grower; O owner, M member, V viewer; SYS = Pomewright
// itself. A disputed delivery is tried twice: disputed by the maker and disputed by the grower.
type Key = 'MO' | 'MM' | 'MV' | 'GO' | 'GM' | 'GV' | 'SYS'
const KEYS: Key[] = ['MO', 'MM', 'MV', 'GO', 'GM', 'GV', 'SYS']
const ROLES = { O: 'owner', M: 'member', V: 'viewer' } as const
const ACTIONS: DeliveryMoveAction[] = ['edit', 'settle', 'dispute', 'withdraw-dispute', 'pay']

function actorFor(key: Key): DeliveryActor {
  if (key === 'SYS') return DELIVERY_SYSTEM
  return { role: ROLES[key[1] as 'O' | 'M' | 'V'], side: key[0] === 'M' ? 'maker' : 'grower' }
}

const POSITIONS: { name: string, position: DeliveryPosition }[] = [
  ...DELIVERY_STATES.filter(s => s !== 'disputed').map(state => ({ name: state, position: { state, disputedBy: null } })),
  { name: 'disputed by the maker', position: { state: 'disputed', disputedBy: 'maker' } },
  { name: 'disputed by the grower', position: { state: 'disputed', disputedBy: 'grower' } },
]

// `never`: 403 whatever the state. `ok`: who may make the move from each position. Anything else: 409,
// except a dispute the other side raised, which is not theirs to withdraw (403).
const writers: Key[] = ['MO', 'MM', 'GO', 'GM']
const makersOnly = { never: ['MV', 'GO', 'GM', 'GV', 'SYS'] as Key[] }
const EXPECTED: Record<DeliveryMoveAction, { never: Key[], ok: Partial<Record<string, Key[]>>, otherSide?: Partial<Record<string, Key[]>> }> = {
  'edit': { ...makersOnly, ok: { 'recorded': ['MO', 'MM'], 'disputed by the maker': ['MO', 'MM'], 'disputed by the grower': ['MO', 'MM'] } },
  'settle': { ...makersOnly, ok: { recorded: ['MO', 'MM'] } },
  'dispute': { never: ['MV', 'GV', 'SYS'], ok: { recorded: writers, settled: writers } },
  'withdraw-dispute': {
    never: ['MV', 'GV', 'SYS'],
    ok: { 'disputed by the maker': ['MO', 'MM'], 'disputed by the grower': ['GO', 'GM'] },
    otherSide: { 'disputed by the maker': ['GO', 'GM'], 'disputed by the grower': ['MO', 'MM'] },
  },
  'pay': { never: ['MO', 'MM', 'MV', 'GO', 'GM', 'GV'], ok: { settled: ['SYS'] } },
}
const TO: Record<DeliveryMoveAction, DeliveryState> = { 'edit': 'recorded', 'settle': 'settled', 'dispute': 'disputed', 'withdraw-dispute': 'recorded', 'pay': 'paid' }

describe('deliveries: every state × action × side and role', () => {
  for (const { name, position } of POSITIONS) {
    it(`answers every action by every actor when ${name} as the table says`, () => {
      const outcomes = (answer: (action: DeliveryMoveAction, key: Key) => string) =>
        Object.fromEntries(ACTIONS.map(action => [action, KEYS.map(key => `${key} ${answer(action, key)}`)]))
      const expected = outcomes((action, key) => {
        const row = EXPECTED[action]
        if (row.never.includes(key) || row.otherSide?.[name]?.includes(key)) return '403'
        return row.ok[name]?.includes(key) ? `→ ${TO[action]}` : '409'
      })
      const actual = outcomes((action, key) => {
        const check = checkDeliveryMove(action, position, actorFor(key))
        if (check.ok) return `→ ${check.to}`
        expect(check.state).toBe(position.state)
        return String(check.statusCode)
      })
      expect(actual).toEqual(expected)
    })
  }

  it('shows each actor exactly the moves the check allows', () => {
    for (const { name, position } of POSITIONS) {
      for (const key of KEYS) {
        const actor = actorFor(key)
        const shown = deliveryMovesFrom(position, actor).map(m => m.action)
        const allowed = ACTIONS.filter(a => checkDeliveryMove(a, position, actor).ok)
        expect(shown, `${name} · ${key}`).toEqual(allowed)
      }
    }
  })

  it('lists a person\'s actions without the payment, which no person makes', () => {
    const person = (side: DeliverySide) => ({ role: 'owner' as const, side })
    expect(deliveryActionsFor({ state: 'recorded', disputedBy: null }, person('maker'))).toEqual<DeliveryAction[]>(['edit', 'settle', 'dispute'])
    expect(deliveryActionsFor({ state: 'settled', disputedBy: null }, person('grower'))).toEqual<DeliveryAction[]>(['dispute'])
    expect(deliveryActionsFor({ state: 'paid', disputedBy: null }, person('maker'))).toEqual([])
  })

  it('says why a move is refused in words a person can act on', () => {
    expect(checkDeliveryMove('settle', { state: 'paid', disputedBy: null }, actorFor('MO'))).toMatchObject({ statusCode: 409, message: 'This delivery is paid, so it cannot be settled now.' })
    expect(checkDeliveryMove('settle', { state: 'recorded', disputedBy: null }, actorFor('GO'))).toMatchObject({ statusCode: 403, message: 'Only the maker’s owners and members can settle a delivery.' })
    expect(checkDeliveryMove('withdraw-dispute', { state: 'disputed', disputedBy: 'grower' }, actorFor('MO')))
      .toMatchObject({ statusCode: 403, message: 'The grower disputed this delivery, so only the grower can withdraw the dispute.' })
  })
})
