import { accessTable } from '../support/access'
import { contractFixtures } from '../support/contracts'
import type { Caller } from '../support/http'
import { nurseryFixtures } from '../support/nursery'

// A tree contract's progress is Quillhurst's (buyer) and Hollowmere's (nursery) to read, every role
// of either; anyone else's answer is 404, never 403; the other side's draft is 404 too; the platform
// admin has no contracts (403).
const MARK = 'Progress access check'
const { treeContract } = contractFixtures(MARK)
const { run } = nurseryFixtures(MARK)

const outsiders = { anonymous: 401, admin: 403 } as const
const bothParties: Record<Caller, number> = { ...outsiders, growerOwner: 200, growerMember: 200, grower2Owner: 404, makerOwner: 200, makerViewer: 200, maker2Owner: 404 }

const progressOf = (state: string) => async () => `/api/tree-contracts/${await treeContract(state)}/progress`
const growing = async () => {
  const id = await treeContract('propagating')
  await run({ linedOut: 100, treeContractId: id })
  return `/api/tree-contracts/${id}/progress`
}

accessTable('tree contract progress', [
  { route: 'GET /api/tree-contracts/:id/progress', path: progressOf('accepted'), expect: bothParties },
  { route: 'GET /api/tree-contracts/:id/progress (with a run)', path: growing, expect: bothParties },
  { route: 'GET /api/tree-contracts/:id/progress (delivered)', path: progressOf('delivered'), expect: bothParties },
  { route: 'GET /api/tree-contracts/:id/progress (buyer\'s draft)', path: progressOf('draft'), expect: { ...bothParties, growerOwner: 404, growerMember: 404 } },
  { route: 'GET /api/tree-contracts/:id/progress (unknown)', path: async () => '/api/tree-contracts/999999999/progress', expect: { ...outsiders, growerOwner: 404, growerMember: 404, grower2Owner: 404, makerOwner: 404, makerViewer: 404, maker2Owner: 404 } },
])
