import { describe, expect, it } from 'vitest'
import { ORGANISATION_MOVES } from '#shared/utils/organisationStatus'
import { checkMove, movesFrom } from '#shared/utils/stateMachine'

const admin = { role: 'admin' } as const
const owner = { role: 'owner' } as const
const confirming = { role: 'confirming-owner' } as const

describe('organisation states', () => {
  it('offers the platform admin exactly the moves out of each state', () => {
    expect(movesFrom(ORGANISATION_MOVES, 'pending', admin).map(m => m.action)).toEqual(['open'])
    expect(movesFrom(ORGANISATION_MOVES, 'active', admin).map(m => m.action)).toEqual(['suspend'])
    expect(movesFrom(ORGANISATION_MOVES, 'suspended', admin).map(m => m.action)).toEqual(['reopen'])
  })

  it('offers an organisation’s own people no moves, and the confirming owner only confirmation', () => {
    for (const state of ['pending', 'active', 'suspended'] as const) expect(movesFrom(ORGANISATION_MOVES, state, owner)).toEqual([])
    expect(movesFrom(ORGANISATION_MOVES, 'pending', confirming).map(m => m.action)).toEqual(['confirm'])
    expect(movesFrom(ORGANISATION_MOVES, 'active', confirming)).toEqual([])
  })

  it('leads each move to its state', () => {
    expect(checkMove(ORGANISATION_MOVES, 'suspend', 'active', admin)).toEqual({ ok: true, from: 'active', to: 'suspended' })
    expect(checkMove(ORGANISATION_MOVES, 'reopen', 'suspended', admin)).toEqual({ ok: true, from: 'suspended', to: 'active' })
    expect(checkMove(ORGANISATION_MOVES, 'open', 'pending', admin)).toEqual({ ok: true, from: 'pending', to: 'active' })
    expect(checkMove(ORGANISATION_MOVES, 'confirm', 'pending', confirming)).toEqual({ ok: true, from: 'pending', to: 'active' })
  })

  it('refuses a move from the wrong state with 409 and the current state', () => {
    const check = checkMove(ORGANISATION_MOVES, 'suspend', 'suspended', admin, 'Tansy Row Fruit')
    expect(check).toMatchObject({ ok: false, statusCode: 409, state: 'suspended' })
    expect(!check.ok && check.message).toBe('Tansy Row Fruit is suspended, so it cannot be suspended now.')
    expect(checkMove(ORGANISATION_MOVES, 'reopen', 'pending', admin)).toMatchObject({ ok: false, statusCode: 409, state: 'pending' })
  })

  it('refuses a move the actor may never make with 403, whatever the state', () => {
    expect(checkMove(ORGANISATION_MOVES, 'suspend', 'active', owner)).toMatchObject({ ok: false, statusCode: 403 })
    expect(checkMove(ORGANISATION_MOVES, 'confirm', 'pending', admin)).toMatchObject({ ok: false, statusCode: 403 })
  })

  it('has every state reachable and no move that leads nowhere', () => {
    const targets = new Set(ORGANISATION_MOVES.map(m => m.to))
    expect(targets).toEqual(new Set(['active', 'suspended']))
    for (const m of ORGANISATION_MOVES) expect(m.from).not.toContain(m.to)
  })
})
