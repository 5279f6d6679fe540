import { afterAll } from 'vitest'
import { accessTable } from '../support/access'
import { testDb } from '../support/db'

// The nursery's beds, liner stock and budwood belong to organisations that run a nursery: in the
// demo only Hollowmere. Another grower (Tansy Row, no nursery), the makers (their viewer too) and
// the platform admin are refused (403); a signed-out caller is asked to sign in (401); another
// organisation's bed or lot is not found (404). Everything made here is named SCRATCH and removed.
const db = testDb()
const SCRATCH = 'Access nursery'
const stamp = () => `${SCRATCH} ${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`

afterAll(async () => {
  await db('nursery_beds').where('name', 'like', `${SCRATCH}%`).delete()
  await db('liner_lots').where('supplier', 'like', `${SCRATCH}%`).delete()
  await db('budwood_lots').where('label', 'like', `${SCRATCH}%`).delete()
})

const orgId = async (name: string): Promise<number> => (await db('organisations').where({ name }).first('id')).id
const rootstockId = async (): Promise<number> => (await db('rootstocks').where({ designation: 'MM.106' }).first('id')).id
const varietyId = async (): Promise<number> => (await db('varieties').where({ name: 'Dabinett' }).first('id')).id

/** A stool bed of the organisation, made once per file. */
const beds = new Map<string, Promise<number>>()
function bedOf(org: string): Promise<number> {
  if (!beds.has(org)) {
    beds.set(org, (async () => {
      const [id] = await db('nursery_beds').insert({ org_id: await orgId(org), name: stamp(), kind: 'stool', rootstock_id: await rootstockId(), mother_plants: 50, year_established: 2019, notes: 'Access check' })
      return id!
    })())
  }
  return beds.get(org)!
}

const lots = new Map<string, Promise<number>>()
function budwoodOf(org: string): Promise<number> {
  if (!lots.has(org)) {
    lots.set(org, (async () => {
      const [id] = await db('budwood_lots').insert({ org_id: await orgId(org), label: stamp(), variety_id: await varietyId(), cut_on: '2025-08-01', source_kind: 'own-tree', source_note: 'Access check', sticks: 5 })
      return id!
    })())
  }
  return lots.get(org)!
}

const HOLLOWMERE = 'Hollowmere Orchard & Nursery'
const TANSY = 'Tansy Row Fruit'

// The nursery's own people read; everyone else is refused or asked to sign in.
const readers = { anonymous: 401, growerOwner: 200, growerMember: 200, grower2Owner: 403, makerOwner: 403, makerViewer: 403, maker2Owner: 403, admin: 403 } as const
const writers = { ...readers, growerOwner: 201, growerMember: 201 } as const
// Another organisation's bed or lot: not found by the nursery, refused to everyone without one.
const elsewhere = { ...readers, growerOwner: 404, growerMember: 404 } as const

accessTable('nursery beds, liners and budwood', [
  { route: 'GET /api/nursery/beds', expect: readers },
  { route: 'POST /api/nursery/beds', body: async () => ({ name: stamp(), kind: 'stool', rootstockId: await rootstockId(), motherPlants: 20, yearEstablished: 2024 }), expect: writers },
  { route: 'GET /api/nursery/beds/:id', path: async () => `/api/nursery/beds/${await bedOf(HOLLOWMERE)}`, expect: readers },
  { route: 'PATCH /api/nursery/beds/:id', path: async () => `/api/nursery/beds/${await bedOf(HOLLOWMERE)}`, body: { notes: 'Access check' }, expect: readers },
  { route: 'GET /api/nursery/beds/:id/records', path: async () => `/api/nursery/beds/${await bedOf(HOLLOWMERE)}/records`, expect: readers },
  { route: 'POST /api/nursery/beds/:id/records', path: async () => `/api/nursery/beds/${await bedOf(HOLLOWMERE)}/records`, body: { kind: 'cut-back', doneOn: '2025-03-01' }, expect: writers },
  { route: 'GET /api/nursery/beds/:id (Tansy Row\'s)', path: async () => `/api/nursery/beds/${await bedOf(TANSY)}`, expect: elsewhere },
  { route: 'PATCH /api/nursery/beds/:id (Tansy Row\'s)', path: async () => `/api/nursery/beds/${await bedOf(TANSY)}`, body: { notes: 'Not yours' }, expect: elsewhere },
  { route: 'GET /api/nursery/beds/:id/records (Tansy Row\'s)', path: async () => `/api/nursery/beds/${await bedOf(TANSY)}/records`, expect: elsewhere },
  { route: 'POST /api/nursery/beds/:id/records (Tansy Row\'s)', path: async () => `/api/nursery/beds/${await bedOf(TANSY)}/records`, body: { kind: 'cut-back', doneOn: '2025-03-01' }, expect: elsewhere },
  { route: 'GET /api/nursery/liners', expect: readers },
  { route: 'POST /api/nursery/liners', body: async () => ({ rootstockId: await rootstockId(), grade: '5-7mm', count: 10, receivedOn: '2026-02-01', supplier: stamp() }), expect: writers },
  { route: 'GET /api/nursery/budwood', expect: readers },
  { route: 'POST /api/nursery/budwood', body: async () => ({ label: stamp(), varietyId: await varietyId(), cutOn: '2025-08-04', sourceKind: 'own-tree', sourceNote: 'Access check', sticks: 3 }), expect: writers },
  { route: 'GET /api/nursery/budwood/:id', path: async () => `/api/nursery/budwood/${await budwoodOf(HOLLOWMERE)}`, expect: readers },
  { route: 'GET /api/nursery/budwood/:id (Tansy Row\'s)', path: async () => `/api/nursery/budwood/${await budwoodOf(TANSY)}`, expect: elsewhere },
])
