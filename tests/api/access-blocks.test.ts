import { afterAll } from 'vitest'
import { accessTable } from '../support/access'
import { testDb } from '../support/db'

// Orchard blocks belong to grower organisations: makers and the platform admin are refused (403),
// another grower's block is not found (404), a signed-out caller is asked to sign in (401).
// Writes here touch only blocks this file makes (removed afterwards) or rewrite a demo block's
// notes with the text they already hold.
const db = testDb()
const SCRATCH = 'Access check'

afterAll(async () => {
  await db('orchard_blocks').where('name', 'like', `${SCRATCH}%`).delete()
})

async function demoBlock(): Promise<{ id: number, org_id: number, notes: string | null }> {
  return db('orchard_blocks').where({ name: 'Long Ground' }).first('id', 'org_id', 'notes')
}

async function catalogueIds(): Promise<{ varietyId: number, rootstockId: number }> {
  const variety = await db('varieties').where({ name: 'Dabinett' }).first('id')
  const rootstock = await db('rootstocks').where({ designation: 'MM.106' }).first('id')
  return { varietyId: variety.id, rootstockId: rootstock.id }
}

/** A fresh Hollowmere block for each DELETE, so the demo blocks stay. */
async function scratchBlockPath(): Promise<string> {
  const { org_id: orgId } = await demoBlock()
  const { varietyId, rootstockId } = await catalogueIds()
  const [id] = await db('orchard_blocks').insert({
    org_id: orgId, name: `${SCRATCH} ${Date.now()}`, variety_id: varietyId, rootstock_id: rootstockId,
    tree_count: 10, year_planted: 2020, area_ha: 0.05, in_row_m: 4.3, between_row_m: 5.5,
  })
  return `/api/blocks/${id}`
}

const readers = { anonymous: 401, growerOwner: 200, growerMember: 200, makerOwner: 403, makerViewer: 403, maker2Owner: 403, admin: 403 } as const

accessTable('orchard blocks', [
  { route: 'GET /api/blocks', expect: { ...readers, grower2Owner: 200 } },
  { route: 'GET /api/blocks/forecast', expect: { ...readers, grower2Owner: 200 } },
  {
    route: 'POST /api/blocks',
    body: async () => ({ name: `${SCRATCH} new`, ...await catalogueIds(), treeCount: 40, yearPlanted: 2025, areaHa: 0.1, inRowM: 4.3, betweenRowM: 5.5 }),
    expect: { ...readers, growerOwner: 201, growerMember: 201, grower2Owner: 201 },
  },
  {
    route: 'GET /api/blocks/:id',
    path: async () => `/api/blocks/${(await demoBlock()).id}`,
    expect: { ...readers, grower2Owner: 404 },
  },
  {
    route: 'PATCH /api/blocks/:id',
    path: async () => `/api/blocks/${(await demoBlock()).id}`,
    body: async () => ({ notes: (await demoBlock()).notes }),
    expect: { ...readers, grower2Owner: 404 },
  },
  {
    route: 'DELETE /api/blocks/:id',
    path: scratchBlockPath,
    expect: { ...readers, growerOwner: 204, growerMember: 204, grower2Owner: 404 },
  },
])
