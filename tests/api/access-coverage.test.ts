import { afterAll, beforeAll } from 'vitest'
import { accessTable } from '../support/access'
import { testDb } from '../support/db'

// Coverage is a grower's (its forecast against its fruit contracts); the needs table and its supply
// are a maker's, read by all its people and saved by owners and members. The other kind of
// organisation and the platform admin are refused (403), a signed-out caller asked to sign in (401).
// The saves here overwrite the demo makers' needs, so their tables are put back afterwards.
const db = testDb()
let savedNeeds: Record<string, unknown>[] = []
let makerIds: number[] = []
let lastAuditId = 0

beforeAll(async () => {
  makerIds = (await db('users').whereIn('email', ['maker@demo.test', 'maker2@demo.test']).select('org_id')).map(u => u.org_id)
  savedNeeds = await db('maker_needs').whereIn('org_id', makerIds).select()
  lastAuditId = (await db('audit_events').max({ id: 'id' }).first())?.id ?? 0
})

afterAll(async () => {
  await db.transaction(async (trx) => {
    await trx('maker_needs').whereIn('org_id', makerIds).delete()
    if (savedNeeds.length) await trx('maker_needs').insert(savedNeeds)
    await trx('audit_events').where('id', '>', lastAuditId).whereIn('org_id', makerIds).where({ action: 'needs.replaced' }).delete()
  })
})

const growers = { anonymous: 401, growerOwner: 200, growerMember: 200, grower2Owner: 200, makerOwner: 403, makerViewer: 403, maker2Owner: 403, admin: 403 } as const
const makers = { anonymous: 401, growerOwner: 403, growerMember: 403, grower2Owner: 403, makerOwner: 200, makerViewer: 200, maker2Owner: 200, admin: 403 } as const

accessTable('coverage and needs', [
  { route: 'GET /api/coverage', expect: growers },
  { route: 'GET /api/needs', expect: makers },
  {
    route: 'PUT /api/needs',
    body: { items: [{ juiceClass: 'bittersweet', year: 2030, kg: 1000 }] },
    expect: { ...makers, makerViewer: 403 },
  },
  { route: 'GET /api/needs/supply', expect: makers },
])
