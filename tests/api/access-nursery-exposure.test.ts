import { accessTable } from '../support/access'
import { testDb } from '../support/db'
import { exposureFixtures } from '../support/exposure'
import type { Caller } from '../support/http'

// A budwood lot's exposure and its suspect state are the nursery's: Hollowmere's owner and member
// read and mark them. Tansy Row runs no nursery, so it is
// refused (403) like the makers and the platform admin; a signed-out caller is asked to sign in
// (401). Another organisation's lot (Tansy Row's, written straight into the database) is not found
// (404). Every write acts on a fresh lot, so each caller's answer depends only on who they are.
const MARK = 'Access nursery exposure'
const { lot } = exposureFixtures(MARK)

type Expect = Record<Caller, number>
const refused = { anonymous: 401, grower2Owner: 403, makerOwner: 403, makerViewer: 403, maker2Owner: 403, admin: 403 } as const
const nursery = (status: number): Expect => ({ ...refused, growerOwner: status, growerMember: status })

const own = (suffix: string) => async () => `/api/nursery/budwood/${(await lot()).id}${suffix}`
const theirs = (suffix: string) => async () => `/api/nursery/budwood/${(await lot({ org: 'tansyRow' })).id}${suffix}`
const mark = { suspectOn: '2023-09-01', reason: 'Shoot blight seen on the mother tree' }

/** A fresh lot of the nursery's, already suspect, for the clearing rows. */
async function suspectLot(): Promise<string> {
  const { id } = await lot()
  await testDb()('budwood_lots').where({ id }).update({ suspect_on: '2023-09-01', suspect_reason: 'Blight', suspect_marked_at: new Date() })
  return `/api/nursery/budwood/${id}/clear`
}

accessTable('budwood lots: exposure and suspect state', [
  { route: 'GET /api/nursery/budwood/:id/exposure', path: own('/exposure'), expect: nursery(200) },
  { route: 'GET /api/nursery/budwood/:id/exposure (another organisation\'s)', path: theirs('/exposure'), expect: nursery(404) },
  { route: 'POST /api/nursery/budwood/:id/suspect', path: own('/suspect'), body: mark, expect: nursery(200) },
  { route: 'POST /api/nursery/budwood/:id/suspect (another organisation\'s)', path: theirs('/suspect'), body: mark, expect: nursery(404) },
  { route: 'POST /api/nursery/budwood/:id/clear', path: suspectLot, body: { reason: 'Laboratory test negative' }, expect: nursery(200) },
  { route: 'POST /api/nursery/budwood/:id/clear (another organisation\'s)', path: theirs('/clear'), body: { reason: 'x' }, expect: nursery(404) },
])
