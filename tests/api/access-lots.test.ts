import { beforeAll } from 'vitest'
import { accessTable } from '../support/access'
import { contractFixtures, orgId, varietyId } from '../support/contracts'
import { lotFixtures } from '../support/lots'

// Harvest lots belong to grower organisations: every member of the owner reads them, its owners
// and members write them; another grower's lot is not found (404); a maker reads a lot only when
// its accepted fruit contract covers it (else 404) and never writes (403); the platform admin,
// having no organisation, is refused (403); a signed-out caller is asked to sign in (401).
const { lot, reading } = lotFixtures('T-ACC-')
const { fruitContract } = contractFixtures('Lots access check')

let hollowmereLot: number
let coveredLot: number

beforeAll(async () => {
  hollowmereLot = await lot(await orgId('hollowmere'), { variety_id: await varietyId('Dabinett') })
  coveredLot = await lot(await orgId('tansyRow'), { variety_id: await varietyId('Kingston Black') })
  // Quillhurst buys Tansy Row's Kingston Black of 2026: the covered lot is Quillhurst's to read.
  await fruitContract('accepted', { variety_id: await varietyId('Kingston Black'), juice_class: null, species: null }, [2026])
})

/** A fresh Hollowmere lot for each DELETE, so the others stay. */
async function scratchLotPath(): Promise<string> {
  return `/api/lots/${await lot(await orgId('hollowmere'), { variety_id: await varietyId('Dabinett') })}`
}

/** A fresh Hollowmere lot with a reading, which no one may delete. */
async function lotWithReadingPath(): Promise<string> {
  const id = await lot(await orgId('hollowmere'), { variety_id: await varietyId('Dabinett') })
  await reading(id, { brix: 12 })
  return `/api/lots/${id}`
}

const own = { anonymous: 401, growerOwner: 200, growerMember: 200, grower2Owner: 404, makerOwner: 404, makerViewer: 404, maker2Owner: 404, admin: 403 } as const
const ownWrite = { ...own, makerOwner: 403, makerViewer: 403, maker2Owner: 403 } as const
const covered = { anonymous: 401, growerOwner: 404, growerMember: 404, grower2Owner: 200, makerOwner: 200, makerViewer: 200, maker2Owner: 404, admin: 403 } as const
let n = 0
const newLot = async () => ({ code: `T-ACC-new-${Date.now().toString(36)}-${++n}`, varietyId: await varietyId('Dabinett'), pickedOn: '2026-10-01', netKg: 500 })

accessTable('harvest lots', [
  { route: 'GET /api/lots', expect: { ...own, grower2Owner: 200, makerOwner: 200, makerViewer: 200, maker2Owner: 200 } },
  { route: 'POST /api/lots', body: newLot, expect: { ...ownWrite, growerOwner: 201, growerMember: 201, grower2Owner: 201 } },
  { route: 'GET /api/lots/:id', path: async () => `/api/lots/${hollowmereLot}`, expect: own },
  { route: 'GET /api/lots/:id (covered by a contract)', path: async () => `/api/lots/${coveredLot}`, expect: covered },
  { route: 'PATCH /api/lots/:id', path: async () => `/api/lots/${hollowmereLot}`, body: { bins: 4 }, expect: ownWrite },
  { route: 'PATCH /api/lots/:id (covered by a contract)', path: async () => `/api/lots/${coveredLot}`, body: { bins: 4 }, expect: { ...covered, makerOwner: 403, makerViewer: 403, maker2Owner: 403 } },
  { route: 'DELETE /api/lots/:id', path: scratchLotPath, expect: { ...ownWrite, growerOwner: 204, growerMember: 204 } },
  { route: 'DELETE /api/lots/:id (with a reading)', path: lotWithReadingPath, expect: { ...ownWrite, growerOwner: 409, growerMember: 409 } },
  { route: 'GET /api/lots/:id/readings', path: async () => `/api/lots/${hollowmereLot}/readings`, expect: own },
  { route: 'GET /api/lots/:id/readings (covered by a contract)', path: async () => `/api/lots/${coveredLot}/readings`, expect: covered },
  {
    route: 'POST /api/lots/:id/readings',
    path: async () => `/api/lots/${hollowmereLot}/readings`,
    body: { sampledOn: '2026-10-02', brix: 12.5, ta: 3.1 },
    expect: { ...ownWrite, growerOwner: 201, growerMember: 201 },
  },
])
