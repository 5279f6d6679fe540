import { afterAll, beforeAll } from 'vitest'
import { orgId } from '../support/contracts'
import { accessTable } from '../support/access'
import { testDb } from '../support/db'
import { deliveryFixtures } from '../support/deliveries'
import type { Caller } from '../support/http'

// The blend planner is a maker's: its owners and members solve and keep targets, its viewers read
// the lots and targets (403 on a write), a grower is refused by its kind (403) and the platform
// admin by its role (403), a signed-out caller gets 401. Another maker's target, or a lot it may
// not see, answers 404. The lot solved here is Tansy Row's of 2017, which only this file's
// contract with Quillhurst covers; targets are made fresh for each write and removed at the end.
const db = testDb()
const MARK = 'T-ACB-'
const { contract, lot, reading } = deliveryFixtures(MARK)
let lotId: number
let n = 0
const fresh = () => `${MARK}${++n}-${Math.random().toString(36).slice(2, 8)}`

beforeAll(async () => {
  await contract({ years: { 2017: 100 } })
  lotId = await lot('tansyRow', 'Kingston Black', 5000, '2017-10-01')
  await reading(lotId, { sampled_on: '2017-10-02', brix: 12.5, ta_g_per_l: 6, tannin_g_per_l: 2 })
})

afterAll(async () => {
  await db('blend_targets').where('name', 'like', `${MARK}%`).delete()
})

/** A target of Quillhurst's, made for one request. */
async function quillhurstTarget(): Promise<number> {
  const [id] = await db('blend_targets').insert({ org_id: await orgId('quillhurst'), name: fresh(), ta_min_g_per_l: 5, ta_max_g_per_l: 6.5 })
  return id!
}

const target = (suffix = '') => async () => `/api/blend-targets/${await quillhurstTarget()}${suffix}`

type Expect = Record<Caller, number>
const notMakers = { anonymous: 401, admin: 403, growerOwner: 403, growerMember: 403, grower2Owner: 403 } as const
const readers: Expect = { ...notMakers, makerOwner: 200, makerViewer: 200, maker2Owner: 200 }
/** Quillhurst's own object: another maker finds nothing there. */
const quillhurstReads: Expect = { ...readers, maker2Owner: 404 }
const quillhurstWrites = (ok: number): Expect => ({ ...notMakers, makerOwner: ok, makerViewer: 403, maker2Owner: 404 })

accessTable('blend planner', [
  { route: 'GET /api/blends/lots', expect: readers },
  { route: 'POST /api/blends/solve', body: () => ({ volumeL: 500, lots: [{ lotId, juiceYieldLPerTonne: 700 }] }), expect: quillhurstWrites(200) },
  { route: 'GET /api/blend-targets', expect: readers },
  { route: 'POST /api/blend-targets', body: () => ({ name: fresh(), ranges: { taGPerL: { min: 5, max: 6.5 } } }), expect: { ...notMakers, makerOwner: 201, makerViewer: 403, maker2Owner: 201 } },
  { route: 'GET /api/blend-targets/:id', path: target(), expect: quillhurstReads },
  { route: 'PATCH /api/blend-targets/:id', path: target(), body: () => ({ notes: 'Checked' }), expect: quillhurstWrites(200) },
  { route: 'DELETE /api/blend-targets/:id', path: target(), expect: quillhurstWrites(204) },
])
