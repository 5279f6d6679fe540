import { accessTable } from '../support/access'
import type { Caller } from '../support/http'

// The season calendar is a nursery's: Hollowmere (its owner and member) is the only nursery among
// the demo organisations. Tansy Row grows fruit but runs no nursery, so it is refused (403) like the
// makers and the platform admin; a signed-out caller is asked to sign in (401), before the query is
// read. Which tasks a nursery sees (its own contracts' only) is checked in nursery-tasks.test.ts.

type Expect = Record<Caller, number>
const refused = { anonymous: 401, grower2Owner: 403, makerOwner: 403, makerViewer: 403, maker2Owner: 403, admin: 403 } as const
const nursery = (status: number): Expect => ({ ...refused, growerOwner: status, growerMember: status })

accessTable('nursery season calendar', [
  { route: 'GET /api/nursery/tasks', expect: nursery(200) },
  { route: 'GET /api/nursery/tasks?state=overdue&from=2026-01-01&to=2027-12-31', expect: nursery(200) },
  { route: 'GET /api/nursery/tasks?state=someday', expect: nursery(400) },
])
