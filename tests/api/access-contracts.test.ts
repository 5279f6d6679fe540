import { accessTable } from '../support/access'
import { contractFixtures, orgId, rootstockId, varietyId } from '../support/contracts'
import type { Caller } from '../support/http'
import { nurseryFixtures } from '../support/nursery'

// Tree contracts are Quillhurst's (buyer) and Hollowmere's (nursery); fruit contracts here are
// Quillhurst's (maker) and Tansy Row's (grower). Anyone else's answer is 404, never 403; a draft
// is the drafting side's alone (the other side gets 404 too); a wrong role is 403 (viewers make no
// moves; the platform admin has no contracts). Each move acts on a fresh contract in the state the
// move starts from, so every caller's answer depends only on who they are.
const MARK = 'Access check'
const { treeContract, fruitContract } = contractFixtures(MARK)
const { dugRun } = nurseryFixtures(MARK)
const year = new Date().getUTCFullYear() + 2

type Expect = Record<Caller, number>
/** Nobody outside the two parties sees it; the admin and viewers are refused writes. */
const outsiders = { anonymous: 401, admin: 403 } as const
const treeRead: Expect = { ...outsiders, growerOwner: 200, growerMember: 200, grower2Owner: 404, makerOwner: 200, makerViewer: 200, maker2Owner: 404 }
const fruitRead: Expect = { ...outsiders, growerOwner: 404, growerMember: 404, grower2Owner: 200, makerOwner: 200, makerViewer: 200, maker2Owner: 404 }
/** A move only the buyer's (maker's) owner may make on its own draft or offer. */
const buyerOwnerOnly = (others: number): Expect => ({ ...outsiders, growerOwner: others, growerMember: others, grower2Owner: 404, makerOwner: 200, makerViewer: 403, maker2Owner: 404 })

const treePath = (state: string, action = '', columns: Record<string, unknown> = {}) => async () => `/api/tree-contracts/${await treeContract(state, columns)}${action}`
const readyWithTrees = async () => {
  const id = await treeContract('ready')
  await dugRun(id, 100)
  return `/api/tree-contracts/${id}/deliver`
}
const fruitPath = (state: string, action = '') => async () => `/api/fruit-contracts/${await fruitContract(state)}${action}`

const newTree = async () => ({ nurseryOrgId: await orgId('hollowmere'), varietyId: await varietyId('Dabinett'), rootstockId: await rootstockId('MM.106'), treeCount: 50, deliveryYear: year, deliverySeason: 'spring', unitPriceMinor: 1500, notes: `${MARK} new` })
const newFruit = async () => ({ growerOrgId: await orgId('tansyRow'), species: 'apple', juiceClass: 'bittersharp', schedule: [{ year, tonnes: 5, windowFrom: `${year}-10-01`, windowTo: `${year}-11-15` }], basePricePerTonneMinor: 20000, baselineBrix: 12, rejectFloorBrix: 9, notes: `${MARK} new` })

accessTable('tree contracts', [
  { route: 'GET /api/tree-contracts', expect: { ...outsiders, growerOwner: 200, growerMember: 200, grower2Owner: 200, makerOwner: 200, makerViewer: 200, maker2Owner: 200 } },
  // Hollowmere cannot order from itself (400); Tansy Row and both makers may order from Hollowmere.
  { route: 'POST /api/tree-contracts', body: newTree, expect: { ...outsiders, growerOwner: 400, growerMember: 400, grower2Owner: 201, makerOwner: 201, makerViewer: 403, maker2Owner: 201 } },
  { route: 'GET /api/tree-contracts/:id', path: treePath('offered'), expect: treeRead },
  { route: 'GET /api/tree-contracts/:id (draft)', path: treePath('draft'), expect: { ...treeRead, growerOwner: 404, growerMember: 404 } },
  { route: 'GET /api/tree-contracts/:id/history', path: treePath('offered', '/history'), expect: treeRead },
  { route: 'PATCH /api/tree-contracts/:id', path: treePath('draft'), body: { treeCount: 120 }, expect: { ...outsiders, growerOwner: 404, growerMember: 404, grower2Owner: 404, makerOwner: 200, makerViewer: 403, maker2Owner: 404 } },
  { route: 'POST /api/tree-contracts/:id/offer', path: treePath('draft', '/offer'), expect: buyerOwnerOnly(404) },
  // The nursery answers the buyer's offer: its owner only; the buyer waits its turn (409).
  { route: 'POST /api/tree-contracts/:id/counter', path: treePath('offered', '/counter'), body: { unitPriceMinor: 1600 }, expect: { ...treeRead, growerMember: 403, makerOwner: 409, makerViewer: 403 } },
  { route: 'POST /api/tree-contracts/:id/accept', path: treePath('offered', '/accept'), body: { version: 1 }, expect: { ...treeRead, growerMember: 403, makerOwner: 409, makerViewer: 403 } },
  { route: 'POST /api/tree-contracts/:id/decline', path: treePath('offered', '/decline'), expect: { ...treeRead, growerMember: 403, makerOwner: 409, makerViewer: 403 } },
  // Withdrawing is the offering side's: the nursery declines instead (409).
  { route: 'POST /api/tree-contracts/:id/cancel', path: treePath('offered', '/cancel'), expect: { ...buyerOwnerOnly(409), growerMember: 403 } },
  { route: 'POST /api/tree-contracts/:id/cancel (draft)', path: treePath('draft', '/cancel'), expect: buyerOwnerOnly(404) },
  // The nursery's work: its owners and members record propagation; only owners the delivery.
  { route: 'POST /api/tree-contracts/:id/start-propagation', path: treePath('accepted', '/start-propagation'), expect: { ...treeRead, makerOwner: 403, makerViewer: 403 } },
  { route: 'POST /api/tree-contracts/:id/mark-ready', path: treePath('propagating', '/mark-ready'), expect: { ...treeRead, makerOwner: 403, makerViewer: 403 } },
  // A delivery draws on the trees dug from the contract's runs: 100 are dug for each.
  { route: 'POST /api/tree-contracts/:id/deliver', path: readyWithTrees, body: { deliveredCount: 100, deliveredOn: '2026-11-20' }, expect: { ...treeRead, growerMember: 403, makerOwner: 403, makerViewer: 403 } },
])

accessTable('fruit contracts', [
  { route: 'GET /api/fruit-contracts', expect: { ...outsiders, growerOwner: 200, growerMember: 200, grower2Owner: 200, makerOwner: 200, makerViewer: 200, maker2Owner: 200 } },
  // Only makers buy from a grower: Hollowmere is a grower too, so naming Tansy Row as its grower is refused (400).
  { route: 'POST /api/fruit-contracts', body: newFruit, expect: { ...outsiders, growerOwner: 400, growerMember: 400, grower2Owner: 400, makerOwner: 201, makerViewer: 403, maker2Owner: 201 } },
  { route: 'GET /api/fruit-contracts/:id', path: fruitPath('offered'), expect: fruitRead },
  { route: 'GET /api/fruit-contracts/:id (draft)', path: fruitPath('draft'), expect: { ...fruitRead, grower2Owner: 404 } },
  { route: 'GET /api/fruit-contracts/:id/history', path: fruitPath('offered', '/history'), expect: fruitRead },
  { route: 'PATCH /api/fruit-contracts/:id', path: fruitPath('draft'), body: { tolerancePct: 12 }, expect: { ...outsiders, growerOwner: 404, growerMember: 404, grower2Owner: 404, makerOwner: 200, makerViewer: 403, maker2Owner: 404 } },
  { route: 'POST /api/fruit-contracts/:id/offer', path: fruitPath('draft', '/offer'), expect: { ...outsiders, growerOwner: 404, growerMember: 404, grower2Owner: 404, makerOwner: 200, makerViewer: 403, maker2Owner: 404 } },
  { route: 'POST /api/fruit-contracts/:id/counter', path: fruitPath('offered', '/counter'), body: { basePricePerTonneMinor: 22000 }, expect: { ...fruitRead, makerOwner: 409, makerViewer: 403 } },
  { route: 'POST /api/fruit-contracts/:id/accept', path: fruitPath('offered', '/accept'), body: { version: 1 }, expect: { ...fruitRead, makerOwner: 409, makerViewer: 403 } },
  { route: 'POST /api/fruit-contracts/:id/decline', path: fruitPath('offered', '/decline'), expect: { ...fruitRead, makerOwner: 409, makerViewer: 403 } },
  { route: 'POST /api/fruit-contracts/:id/cancel', path: fruitPath('offered', '/cancel'), expect: { ...outsiders, growerOwner: 404, growerMember: 404, grower2Owner: 409, makerOwner: 200, makerViewer: 403, maker2Owner: 404 } },
])
