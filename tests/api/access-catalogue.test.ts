import { afterAll } from 'vitest'
import { accessTable } from '../support/access'
import { testDb } from '../support/db'
import { as } from '../support/http'

const SIGNED_IN = (status: number) => ({ anonymous: 401, growerOwner: status, growerMember: status, grower2Owner: status, makerOwner: status, makerViewer: status, maker2Owner: status, admin: status })
/** The platform admin gets `admin`; every tenant role 403; signed-out 401. */
const ADMIN_ONLY = (admin: number) => ({ ...SIGNED_IN(403), admin })

const tag = Date.now().toString(36).slice(-5)
let made = 0
const unique = (prefix: string) => `${prefix} ${tag}-${++made}`

// The rows the admin's writes made here are not part of the catalogue other tests read.
const db = testDb()
afterAll(async () => {
  await db('varieties').where('name', 'like', `% ${tag}-%`).delete()
  await db('rootstocks').where('designation', 'like', `% ${tag}-%`).delete()
})

async function idOf(path: string, key: 'name' | 'designation', value: string): Promise<number> {
  const res = await (await as('makerViewer')).get(`${path}?q=${encodeURIComponent(value)}`)
  return res.body.items.find((row: Record<string, unknown>) => row[key] === value).id
}

/** A catalogue row of this test's own, made once by the admin, for the writes to aim at. */
function adminRow(path: string, body: () => Record<string, unknown>): () => Promise<string> {
  let id: Promise<number> | undefined
  return async () => {
    id ??= as('admin').then(admin => admin.post(path, body())).then(res => res.body.id as number)
    return `${path}/${await id}`
  }
}

const varietyBody = () => ({ name: unique('Estry Russet'), species: 'apple', juiceClass: 'sharp', typicalBrix: 14 })
const rootstockBody = () => ({ designation: unique('EV.9'), species: 'pear', vigour: 'dwarf', inRowM: 2 })

// The admin is the last caller in each row, so a row deleted by the admin was first refused to everyone else.
accessTable('variety and rootstock catalogue', [
  { route: 'GET /api/varieties', expect: SIGNED_IN(200) },
  { route: 'GET /api/varieties?species=pear&juiceClass=sharp&q=huff', expect: SIGNED_IN(200) },
  { route: 'GET /api/varieties/:id', path: async () => `/api/varieties/${await idOf('/api/varieties', 'name', 'Dabinett')}`, expect: SIGNED_IN(200) },
  { route: 'GET /api/varieties/999999', expect: SIGNED_IN(404) },
  { route: 'POST /api/varieties', body: varietyBody, expect: ADMIN_ONLY(201) },
  { route: 'PATCH /api/varieties/:id', path: adminRow('/api/varieties', varietyBody), body: { typicalBrix: 14.5 }, expect: ADMIN_ONLY(200) },
  { route: 'PATCH /api/varieties/999999', body: { typicalBrix: 14.5 }, expect: ADMIN_ONLY(404) },
  { route: 'DELETE /api/varieties/:id', path: adminRow('/api/varieties', varietyBody), expect: ADMIN_ONLY(204) },
  { route: 'DELETE /api/varieties/999999', expect: ADMIN_ONLY(404) },

  { route: 'GET /api/rootstocks', expect: SIGNED_IN(200) },
  { route: 'GET /api/rootstocks?species=apple&vigour=dwarf&q=G', expect: SIGNED_IN(200) },
  { route: 'GET /api/rootstocks/:id', path: async () => `/api/rootstocks/${await idOf('/api/rootstocks', 'designation', 'Quince A')}`, expect: SIGNED_IN(200) },
  { route: 'GET /api/rootstocks/999999', expect: SIGNED_IN(404) },
  { route: 'POST /api/rootstocks', body: rootstockBody, expect: ADMIN_ONLY(201) },
  { route: 'PATCH /api/rootstocks/:id', path: adminRow('/api/rootstocks', rootstockBody), body: { inRowM: 2.2 }, expect: ADMIN_ONLY(200) },
  { route: 'PATCH /api/rootstocks/999999', body: { inRowM: 2.2 }, expect: ADMIN_ONLY(404) },
  { route: 'DELETE /api/rootstocks/:id', path: adminRow('/api/rootstocks', rootstockBody), expect: ADMIN_ONLY(204) },
  { route: 'DELETE /api/rootstocks/999999', expect: ADMIN_ONLY(404) },
])
