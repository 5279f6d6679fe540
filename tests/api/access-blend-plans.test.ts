import { beforeAll } from 'vitest'
import { accessTable } from '../support/access'
import { blendPlanFixtures } from '../support/blendPlans'
import { as, type Caller } from '../support/http'

// Blend plans and pressings are Quillhurst's (a maker) here, over a lot of Tansy Row's delivered to
// it. Its owners and members save, change and move plans; its viewer reads them (writes 403). A
// grower is refused by its kind (403) before anything is looked up; Marrowby, another maker, finds
// none of Quillhurst's (404, and its save names a lot it may not see: 404). A lot's trace is read by
// whoever may see the lot: Tansy Row (its grower) and Quillhurst; Hollowmere and Marrowby get 404.
// Each move acts on a fresh plan in the state it starts from, so every answer depends only on who asks.
const { lot, planBody, draft, committed } = blendPlanFixtures('T-ABP-')

let lotId: number
let pressingId: number

beforeAll(async () => {
  lotId = await lot(100_000, { delivered: true })
  const id = await committed(75, [lotId])
  const res = await (await as('makerOwner')).post(`/api/blend-plans/${id}/press`, { pressedOn: '2026-11-25', litresPressed: 74, vessel: 'Tank 9', lots: [{ lotId, kg: 100 }] })
  if (res.status !== 201) throw new Error(`could not press: ${JSON.stringify(res.body)}`)
  pressingId = res.body.pressing.id
})

type Expect = Record<Caller, number>
const refused = { anonymous: 401, admin: 403, growerOwner: 403, growerMember: 403, grower2Owner: 403 } as const
const reads = (ok: number): Expect => ({ ...refused, makerOwner: ok, makerViewer: ok, maker2Owner: 404 })
const writes = (ok: number): Expect => ({ ...refused, makerOwner: ok, makerViewer: 403, maker2Owner: 404 })

const fresh = (state: 'draft' | 'committed', action = '') => async () => `/api/blend-plans/${state === 'draft' ? await draft(75, [lotId]) : await committed(75, [lotId])}${action}`

accessTable('blend plans', [
  { route: 'GET /api/blend-plans', expect: { ...reads(200), maker2Owner: 200 } },
  { route: 'POST /api/blend-plans', body: () => planBody('access', 75, [lotId]), expect: writes(201) },
  { route: 'GET /api/blend-plans/:id', path: fresh('draft'), expect: reads(200) },
  { route: 'PATCH /api/blend-plans/:id', path: fresh('draft'), body: { notes: 'Press on Tuesday' }, expect: writes(200) },
  { route: 'PATCH /api/blend-plans/:id (committed)', path: fresh('committed'), body: { notes: 'Too late' }, expect: writes(409) },
  { route: 'DELETE /api/blend-plans/:id', path: fresh('draft'), expect: writes(204) },
  { route: 'POST /api/blend-plans/:id/commit', path: fresh('draft', '/commit'), expect: writes(200) },
  { route: 'POST /api/blend-plans/:id/commit (committed)', path: fresh('committed', '/commit'), expect: writes(409) },
  { route: 'POST /api/blend-plans/:id/release', path: fresh('committed', '/release'), expect: writes(200) },
  { route: 'POST /api/blend-plans/:id/release (draft)', path: fresh('draft', '/release'), expect: writes(409) },
  {
    route: 'POST /api/blend-plans/:id/press',
    path: fresh('committed', '/press'),
    body: () => ({ pressedOn: '2026-11-26', litresPressed: 75, vessel: 'Tank 9', lots: [{ lotId, kg: 100 }] }),
    expect: writes(201),
  },
  { route: 'GET /api/pressings/:id', path: () => `/api/pressings/${pressingId}`, expect: reads(200) },
  { route: 'GET /api/pressings/:id/trace', path: () => `/api/pressings/${pressingId}/trace`, expect: reads(200) },
  {
    route: 'GET /api/lots/:id/trace',
    path: () => `/api/lots/${lotId}/trace`,
    expect: { anonymous: 401, admin: 403, growerOwner: 404, growerMember: 404, grower2Owner: 200, makerOwner: 200, makerViewer: 200, maker2Owner: 404 },
  },
])
