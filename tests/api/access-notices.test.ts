import { accessTable } from '../support/access'

const ALL = (status: number) => ({ anonymous: status, growerOwner: status, growerMember: status, grower2Owner: status, makerOwner: status, makerViewer: status, maker2Owner: status, admin: status })
const TENANTS = (status: number) => ({ ...ALL(status), anonymous: 401, admin: 403 })
const OWNERS_ONLY = (owner: number) => ({ anonymous: 401, growerOwner: owner, growerMember: 403, grower2Owner: owner, makerOwner: owner, makerViewer: 403, maker2Owner: owner, admin: 403 })

accessTable('notices and the outbox', [
  { route: 'GET /api/notices', expect: TENANTS(200) },
  { route: 'GET /api/notices?limit=0', expect: TENANTS(400) },
  { route: 'POST /api/notices/99999999/read', expect: TENANTS(404) },
  { route: 'POST /api/notices/read-all', expect: TENANTS(200) },
  { route: 'GET /api/organisation/outbox', expect: OWNERS_ONLY(200) },
  { route: 'GET /api/organisation/outbox?status=lost', expect: OWNERS_ONLY(400) },
])
