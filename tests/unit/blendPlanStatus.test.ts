import { describe, expect, it } from 'vitest'
import type { MemberRole } from '#shared/types/auth'
import { BLEND_PLAN_STATES, type BlendPlanAction, type BlendPlanState } from '#shared/types/blendPlan'
import { blendPlanMovesFrom, checkBlendPlanMove } from '#shared/utils/blendPlanStatus'

// The plan's move table, every action from every state for every role: owners and members make
// each move from the states it starts from (anything else is 409 with the current state), and a
// viewer never makes one (403).
const ACTIONS: BlendPlanAction[] = ['edit', 'delete', 'commit', 'release', 'press']
const WRITERS: MemberRole[] = ['owner', 'member']
const FROM: Record<BlendPlanAction, { from: BlendPlanState[], to: BlendPlanState }> = {
  edit: { from: ['draft'], to: 'draft' },
  delete: { from: ['draft'], to: 'draft' },
  commit: { from: ['draft'], to: 'committed' },
  release: { from: ['committed'], to: 'released' },
  press: { from: ['committed'], to: 'pressed' },
}

describe('the blend plan\'s moves', () => {
  for (const action of ACTIONS) {
    for (const state of BLEND_PLAN_STATES) {
      it(`${action} from ${state}`, () => {
        for (const role of WRITERS) {
          const check = checkBlendPlanMove(action, state, { role })
          if (FROM[action].from.includes(state)) expect(check).toEqual({ ok: true, from: state, to: FROM[action].to })
          else expect(check).toMatchObject({ ok: false, statusCode: 409, state, message: expect.stringContaining(`This plan is ${state}`) })
        }
        expect(checkBlendPlanMove(action, state, { role: 'viewer' })).toMatchObject({ ok: false, statusCode: 403, state })
      })
    }
  }

  it('shows each person only the moves the state allows them', () => {
    expect(blendPlanMovesFrom('draft', { role: 'member' }).map(m => m.action)).toEqual(['edit', 'commit', 'delete'])
    expect(blendPlanMovesFrom('committed', { role: 'owner' }).map(m => m.action)).toEqual(['press', 'release'])
    expect(blendPlanMovesFrom('pressed', { role: 'owner' })).toEqual([])
    expect(blendPlanMovesFrom('released', { role: 'owner' })).toEqual([])
    expect(blendPlanMovesFrom('draft', { role: 'viewer' })).toEqual([])
  })

  it('says a committed plan cannot be committed again in words', () => {
    expect(checkBlendPlanMove('commit', 'committed', { role: 'owner' })).toMatchObject({ message: 'This plan is committed, so it cannot be committed now.' })
  })
})
