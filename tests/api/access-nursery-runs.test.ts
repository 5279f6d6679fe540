import { accessTable } from '../support/access'
import { rootstockId, varietyId } from '../support/contracts'
import { testDb } from '../support/db'
import type { Caller } from '../support/http'
import { nurseryFixtures } from '../support/nursery'

// The row map is a nursery's: Hollowmere (its owner and member) is the only nursery among the demo
// organisations. Tansy Row grows fruit but runs no nursery, so it is refused (403) like the makers
// and the platform admin; a signed-out caller is asked to sign in (401). Another organisation's row
// or run (here Tansy Row's, written straight into the database) is not found by the nursery (404).
// Every write acts on a fresh row or run, so each caller's answer depends only on who they are.
const MARK = 'Access nursery runs'
const { field, row, run } = nurseryFixtures(MARK)
const db = testDb()

type Expect = Record<Caller, number>
const refused = { anonymous: 401, grower2Owner: 403, makerOwner: 403, makerViewer: 403, maker2Owner: 403, admin: 403 } as const
const nursery = (status: number): Expect => ({ ...refused, growerOwner: status, growerMember: status })

const ownRun = (suffix = '') => async () => `/api/nursery/runs/${await run()}${suffix}`
const theirRun = (suffix = '') => async () => `/api/nursery/runs/${await run({ org: 'tansyRow' })}${suffix}`
const tagOf = async (id: number) => (await db('nursery_runs').where({ id }).first('tag_code')).tag_code as string

const newRun = async () => ({
  rowId: await row({ positions: 50 }), fromPosition: 1, toPosition: 50, rootstockId: await rootstockId('MM.106'),
  linedOutOn: '2025-03-20', linedOutCount: 50, varietyId: await varietyId('Dabinett'),
})
const loss = { kind: 'loss', happenedOn: '2025-06-01', count: 1, cause: 'rodents' }

accessTable('nursery rows', [
  { route: 'GET /api/nursery/rows', expect: nursery(200) },
  { route: 'POST /api/nursery/rows', body: async () => ({ fieldId: await field(), name: '1', positions: 100 }), expect: nursery(201) },
  { route: 'GET /api/nursery/rows/:id', path: async () => `/api/nursery/rows/${await row()}`, expect: nursery(200) },
  { route: 'GET /api/nursery/rows/:id (another organisation\'s)', path: async () => `/api/nursery/rows/${await row({ org: 'tansyRow' })}`, expect: nursery(404) },
  { route: 'PATCH /api/nursery/rows/:id', path: async () => `/api/nursery/rows/${await row()}`, body: { notes: 'Wet at the bottom' }, expect: nursery(200) },
  { route: 'PATCH /api/nursery/rows/:id (another organisation\'s)', path: async () => `/api/nursery/rows/${await row({ org: 'tansyRow' })}`, body: { notes: 'x' }, expect: nursery(404) },
])

accessTable('nursery runs', [
  { route: 'GET /api/nursery/runs', expect: nursery(200) },
  { route: 'POST /api/nursery/runs', body: newRun, expect: nursery(201) },
  { route: 'GET /api/nursery/runs/:id', path: ownRun(), expect: nursery(200) },
  { route: 'GET /api/nursery/runs/:id (another organisation\'s)', path: theirRun(), expect: nursery(404) },
  { route: 'PATCH /api/nursery/runs/:id', path: ownRun(), body: { notes: 'North end' }, expect: nursery(200) },
  { route: 'PATCH /api/nursery/runs/:id (another organisation\'s)', path: theirRun(), body: { notes: 'x' }, expect: nursery(404) },
  { route: 'GET /api/nursery/runs/:id/events', path: ownRun('/events'), expect: nursery(200) },
  { route: 'GET /api/nursery/runs/:id/events (another organisation\'s)', path: theirRun('/events'), expect: nursery(404) },
  { route: 'POST /api/nursery/runs/:id/events', path: ownRun('/events'), body: loss, expect: nursery(201) },
  { route: 'POST /api/nursery/runs/:id/events (another organisation\'s)', path: theirRun('/events'), body: loss, expect: nursery(404) },
  { route: 'GET /api/nursery/runs/:id/tag', path: ownRun('/tag'), expect: nursery(200) },
  { route: 'GET /api/nursery/runs/:id/tag (another organisation\'s)', path: theirRun('/tag'), expect: nursery(404) },
  { route: 'GET /api/nursery/runs/by-tag/:code', path: async () => `/api/nursery/runs/by-tag/${await tagOf(await run())}`, expect: nursery(200) },
  { route: 'GET /api/nursery/runs/by-tag/:code (another organisation\'s)', path: async () => `/api/nursery/runs/by-tag/${await tagOf(await run({ org: 'tansyRow' }))}`, expect: nursery(404) },
  { route: 'POST /api/nursery/tags/printed', body: async () => ({ runIds: [await run()] }), expect: nursery(200) },
  { route: 'POST /api/nursery/tags/printed (another organisation\'s)', body: async () => ({ runIds: [await run({ org: 'tansyRow' })] }), expect: nursery(404) },
])
