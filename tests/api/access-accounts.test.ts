import { accessTable } from '../support/access'
import { as } from '../support/http'

const ALL = (status: number) => ({ anonymous: status, growerOwner: status, growerMember: status, grower2Owner: status, makerOwner: status, makerViewer: status, maker2Owner: status, admin: status })
const SIGNED_IN = (status: number) => ({ ...ALL(status), anonymous: 401 })
const TENANTS = (status: number) => ({ ...SIGNED_IN(status), admin: 403 })
/** Owners get `owner`, members and viewers 403, the admin 403, signed-out 401. */
const OWNERS_ONLY = (owner: number) => ({ anonymous: 401, growerOwner: owner, growerMember: 403, grower2Owner: owner, makerOwner: owner, makerViewer: 403, maker2Owner: owner, admin: 403 })

async function hollowmereMemberId(): Promise<number> {
  const owner = await as('growerOwner')
  return (await owner.get('/api/members')).body.items.find((m: { email: string }) => m.email === 'grower-member@demo.test').id
}

accessTable('accounts and members', [
  { route: 'GET /api/health', expect: ALL(200) },
  { route: 'GET /api/health/services', expect: ALL(200) },
  { route: 'GET /api/me', expect: SIGNED_IN(200) },
  // An empty patch is refused by validation, which runs only after the role check.
  { route: 'PATCH /api/me', body: {}, expect: SIGNED_IN(400) },
  { route: 'GET /api/members', expect: TENANTS(200) },
  // Setting the member's current role again: a no-op for Hollowmere's owner, another tenant's member for the rest.
  { route: 'PATCH /api/members/:id', path: async () => `/api/members/${await hollowmereMemberId()}`, body: { role: 'member' },
    expect: { anonymous: 401, growerOwner: 200, growerMember: 403, grower2Owner: 404, makerOwner: 404, makerViewer: 403, maker2Owner: 404, admin: 403 } },
  { route: 'DELETE /api/members/999999', expect: OWNERS_ONLY(404) },
  { route: 'GET /api/invitations', expect: OWNERS_ONLY(200) },
  { route: 'POST /api/invitations', body: {}, expect: OWNERS_ONLY(400) },
  { route: 'DELETE /api/invitations/999999', expect: OWNERS_ONLY(404) },
  { route: 'GET /api/invitations/accept?token=not-a-real-token-at-all-000', expect: ALL(400) },
  { route: 'POST /api/invitations/accept', body: {}, expect: ALL(400) },
  { route: 'POST /api/signup', body: {}, expect: ALL(400) },
  { route: 'POST /api/signup/verify', body: { token: 'not-a-real-token-at-all-000' }, expect: ALL(400) },
  { route: 'POST /api/password/forgot', body: {}, expect: ALL(400) },
  { route: 'POST /api/password/reset', body: {}, expect: ALL(400) },
  { route: 'GET /api/admin/organisations', expect: { ...SIGNED_IN(403), admin: 200 } },
  { route: 'PATCH /api/admin/organisations/999999', body: { status: 'active' }, expect: { ...SIGNED_IN(403), admin: 404 } },
  { route: 'POST /api/admin/organisations/999999/open', expect: { ...SIGNED_IN(403), admin: 404 } },
  { route: 'POST /api/admin/organisations/999999/suspend', expect: { ...SIGNED_IN(403), admin: 404 } },
  { route: 'POST /api/admin/organisations/999999/reopen', expect: { ...SIGNED_IN(403), admin: 404 } },
])
