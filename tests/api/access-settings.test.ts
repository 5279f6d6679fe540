import { accessTable } from '../support/access'
import { testDb } from '../support/db'

// Settings belong to the caller's own organisation: every tenant role reads them, owners change
// them, the platform admin has none. The directory is open to everyone signed in.
const db = testDb()

const SIGNED_IN = (status: number) => ({ anonymous: 401, growerOwner: status, growerMember: status, grower2Owner: status, makerOwner: status, makerViewer: status, maker2Owner: status, admin: status })
const TENANTS = (status: number) => ({ ...SIGNED_IN(status), admin: 403 })
const OWNERS_ONLY = (owner: number) => ({ anonymous: 401, growerOwner: owner, growerMember: 403, grower2Owner: owner, makerOwner: owner, makerViewer: 403, maker2Owner: owner, admin: 403 })

async function hollowmerePath(): Promise<string> {
  const org = await db('organisations').where({ name: 'Hollowmere Orchard & Nursery' }).first('id')
  return `/api/organisations/${org.id}`
}

accessTable('organisation settings and the directory', [
  { route: 'GET /api/organisation', expect: TENANTS(200) },
  // Every demo organisation is in the north already: a change of nothing, allowed or refused by role.
  { route: 'PATCH /api/organisation', body: { hemisphere: 'north' }, expect: OWNERS_ONLY(200) },
  { route: 'GET /api/organisations', expect: SIGNED_IN(200) },
  { route: 'GET /api/organisations/:id', path: hollowmerePath, expect: SIGNED_IN(200) },
  { route: 'GET /api/organisations/999999', expect: SIGNED_IN(404) },
])
