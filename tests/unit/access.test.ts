import { describe, expect, it } from 'vitest'
import type { SessionUser } from '../../shared/types/auth'
import { decideAccess, OWNERS, WRITERS } from '../../shared/utils/access'

const person = (over: Partial<SessionUser>): SessionUser => ({ id: 1, email: 'a@example.test', name: 'A', orgId: 1, orgKind: 'grower', isNursery: false, role: 'member', units: 'metric', ...over })

describe('role checks', () => {
  it('asks a signed-out caller to sign in (401)', () => {
    expect(decideAccess(null)).toMatchObject({ ok: false, statusCode: 401 })
  })

  it('lets any member of an organisation through by default, but not the platform admin', () => {
    for (const role of ['owner', 'member', 'viewer'] as const) expect(decideAccess(person({ role })).ok).toBe(true)
    expect(decideAccess(person({ role: 'admin', orgId: null, orgKind: null }))).toMatchObject({ ok: false, statusCode: 403 })
  })

  it('keeps viewers out of writes and non-owners out of owner actions (403)', () => {
    expect(decideAccess(person({ role: 'viewer' }), { roles: WRITERS })).toMatchObject({ ok: false, statusCode: 403 })
    expect(decideAccess(person({ role: 'member' }), { roles: WRITERS }).ok).toBe(true)
    expect(decideAccess(person({ role: 'member' }), { roles: OWNERS })).toMatchObject({ ok: false, statusCode: 403 })
    expect(decideAccess(person({ role: 'owner' }), { roles: OWNERS }).ok).toBe(true)
  })

  it('checks the organisation kind and the nursery flag', () => {
    expect(decideAccess(person({ orgKind: 'maker' }), { orgKind: 'grower' })).toMatchObject({ ok: false, statusCode: 403 })
    expect(decideAccess(person({ orgKind: 'grower' }), { orgKind: 'grower' }).ok).toBe(true)
    expect(decideAccess(person({ isNursery: false }), { nursery: true })).toMatchObject({ ok: false, statusCode: 403 })
    expect(decideAccess(person({ isNursery: true }), { nursery: true }).ok).toBe(true)
  })

  it('lets the admin through only where a rule names the admin', () => {
    const admin = person({ role: 'admin', orgId: null, orgKind: null })
    expect(decideAccess(admin, { roles: ['admin'] }).ok).toBe(true)
    expect(decideAccess(person({ role: 'owner' }), { roles: ['admin'] })).toMatchObject({ ok: false, statusCode: 403 })
  })
})
