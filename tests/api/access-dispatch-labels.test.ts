import { accessTable } from '../support/access'
import { dispatchFixtures } from '../support/dispatch'
import type { Caller } from '../support/http'
import { nurseryFixtures } from '../support/nursery'

// Dispatch labels are the nursery's: its owners, members and viewers read them (200). Everyone
// else is refused before any contract is looked at, since only organisations that run a nursery
// may ask (403: the buyer Quillhurst, Tansy Row, Marrowby, the platform admin); a signed-out caller
// gets 401. A contract Hollowmere cannot see, or one that is not there, is 404 to it. (A nursery
// that is the buyer gets 403, and a nursery that is no party 404: tests/api/dispatch-labels.test.ts.)
const MARK = 'Access dispatch labels'
const { run } = nurseryFixtures(MARK)
const { contract, dig } = dispatchFixtures(MARK)

type Expect = Record<Caller, number>
const notNursery = { anonymous: 401, admin: 403, grower2Owner: 403, makerOwner: 403, makerViewer: 403, maker2Owner: 403 } as const
const nurseryReads: Expect = { ...notNursery, growerOwner: 200, growerMember: 200 }
const nurseryMisses: Expect = { ...notNursery, growerOwner: 404, growerMember: 404 }

const labelsPath = (state: string, options: Parameters<typeof contract>[1] = {}) => async () => {
  const id = await contract(state, options)
  const runId = await run({ linedOut: 12, treeContractId: id })
  await dig(runId, [{ caliperMm: 14, heightCm: 150, feathered: true, count: 12 }])
  return `/api/tree-contracts/${id}/dispatch-labels`
}

accessTable('dispatch labels', [
  { route: 'GET /api/tree-contracts/:id/dispatch-labels (ready, Quillhurst buys)', path: labelsPath('ready'), expect: nurseryReads },
  { route: 'GET /api/tree-contracts/:id/dispatch-labels (delivered, Tansy Row buys)', path: labelsPath('delivered', { buyer: 'tansyRow' }), expect: nurseryReads },
  { route: 'GET /api/tree-contracts/:id/dispatch-labels?bundleSize=25', path: async () => `${await labelsPath('propagating')()}?bundleSize=25`, expect: nurseryReads },
  // The buyer's own draft is not the nursery's to see.
  { route: 'GET /api/tree-contracts/:id/dispatch-labels (the buyer\'s draft)', path: labelsPath('draft'), expect: nurseryMisses },
  { route: 'GET /api/tree-contracts/:id/dispatch-labels (no such contract)', path: () => '/api/tree-contracts/99999999/dispatch-labels', expect: nurseryMisses },
])
