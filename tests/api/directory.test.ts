import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { testDb } from '../support/db'
import { as } from '../support/http'

// The directory: listed organisations with who they are and what their blocks grow, and nothing
// else of anyone's. A perry pear block is added to Hollowmere for the class searches and removed
// afterwards, and Marrowby is unlisted for a while and listed again.
const db = testDb()
const HOLLOWMERE = 'Hollowmere Orchard & Nursery'
const TANSY_ROW = 'Tansy Row Fruit'
const QUILLHURST = 'Quillhurst Cider Works'
const MARROWBY = 'Marrowby Perry House'
const PEAR_BLOCK = 'Directory test perry pears'

const ENTRY_KEYS = ['description', 'id', 'isNursery', 'juiceClasses', 'kind', 'name', 'propagates', 'region', 'varieties']
const ids: Record<string, number> = {}

beforeAll(async () => {
  for (const org of await db('organisations').whereIn('name', [HOLLOWMERE, TANSY_ROW, QUILLHURST, MARROWBY]).select('id', 'name')) ids[org.name] = org.id
  const butt = await db('varieties').where({ name: 'Butt' }).first('id')
  const quince = await db('rootstocks').where({ designation: 'Quince A' }).first('id')
  ids.butt = butt.id
  await db('orchard_blocks').insert({ org_id: ids[HOLLOWMERE], name: PEAR_BLOCK, variety_id: butt.id, rootstock_id: quince.id, tree_count: 40, year_planted: 2021, area_ha: 0.05, in_row_m: 3, between_row_m: 4.5 })
})

afterAll(async () => {
  await db('orchard_blocks').where({ name: PEAR_BLOCK }).delete()
  await db('organisations').where({ name: MARROWBY }).update({ listed: true })
})

const names = (body: { items: { name: string }[] }) => body.items.map(i => i.name)

async function search(query: string, caller: Parameters<typeof as>[0] = 'makerOwner') {
  const res = await (await as(caller)).get(`/api/organisations${query}`)
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  return res.body
}

describe('the directory', () => {
  it('lists the listed organisations by name, with only who they are and what they grow', async () => {
    const listed = await db('organisations').where({ listed: true, status: 'active' }).count({ n: '*' }).first()
    const body = await search('')
    expect(body.total).toBe(Number(listed!.n))
    expect(names(body)).toEqual(expect.arrayContaining([HOLLOWMERE, MARROWBY, QUILLHURST, TANSY_ROW]))
    expect(names(body)).toEqual([...names(body)].sort((a, b) => a.localeCompare(b)))
    for (const item of body.items) {
      expect(Object.keys(item).sort(), item.name).toEqual(ENTRY_KEYS)
      for (const v of [...item.varieties, ...item.propagates]) expect(Object.keys(v).sort()).toEqual(['id', 'name', 'species'])
    }
    // No e-mail address, phone, count, area, payment id or contract anywhere in the answer.
    const text = JSON.stringify(body)
    expect(text).not.toMatch(/@/)
    expect(text).not.toMatch(/treeCount|areaHa|contactPhone|paymentAccountId|01632/)

    const hollowmere = body.items.find((i: { name: string }) => i.name === HOLLOWMERE)
    expect(hollowmere).toMatchObject({ kind: 'grower', isNursery: true, region: 'Estry valley, north slope', propagates: [] })
    expect(hollowmere.varieties.map((v: { name: string }) => v.name)).toEqual(['Brown\'s Apple', 'Butt', 'Dabinett', 'Harry Masters Jersey', 'Yarlington Mill'])
    // Perry pear classes are kept apart from the apples'.
    expect(hollowmere.juiceClasses).toEqual(['sharp', 'bittersweet', 'perry bittersharp'])
    const tansy = body.items.find((i: { name: string }) => i.name === TANSY_ROW)
    expect(tansy.juiceClasses).toEqual(['bittersharp'])
    expect(body.items.find((i: { name: string }) => i.name === QUILLHURST).varieties).toEqual([])
  })

  it('is open to the platform admin and to every role, and not to a visitor', async () => {
    for (const caller of ['admin', 'makerViewer', 'growerMember'] as const) expect(names(await search('', caller))).toContain(HOLLOWMERE)
    expect((await (await as('anonymous')).get('/api/organisations')).status).toBe(401)
  })

  it('searches by name, region, variety by name or id, juice class and kind', async () => {
    expect(names(await search('?q=hollow'))).toEqual([HOLLOWMERE])
    expect(names(await search('?region=river%20flats'))).toEqual([TANSY_ROW])
    expect(names(await search('?region=estry')).length).toBeGreaterThanOrEqual(4)
    expect(names(await search('?variety=kingston'))).toEqual([TANSY_ROW])
    expect(names(await search(`?variety=${ids.butt}`))).toEqual([HOLLOWMERE])
    expect(names(await search('?variety=harrymasters'))).toEqual([HOLLOWMERE])
    expect(names(await search('?juiceClass=bittersharp'))).toEqual([TANSY_ROW])
    expect(names(await search('?juiceClass=perry%20bittersharp'))).toEqual([HOLLOWMERE])
    expect(names(await search('?juiceClass=bittersweet&region=north'))).toEqual([HOLLOWMERE])
    expect(names(await search('?kind=maker'))).toEqual([MARROWBY, QUILLHURST])
    expect(names(await search('?nursery=true'))).toEqual([HOLLOWMERE])
    expect(await search('?q=no%20such%20orchard')).toEqual({ items: [], total: 0 })
  })

  it('pages with limit and offset, counting all that match', async () => {
    const first = await search('?kind=maker&limit=1')
    const second = await search('?kind=maker&limit=1&offset=1')
    expect(first.total).toBe(2)
    expect(names(first)).toEqual([MARROWBY])
    expect(names(second)).toEqual([QUILLHURST])
  })

  it('refuses a bad filter with 400 naming it', async () => {
    for (const [query, field] of [['?juiceClass=purple', 'juiceClass'], ['?kind=nursery', 'kind'], ['?limit=0', 'limit'], [`?q=${'x'.repeat(121)}`, 'q']]) {
      const res = await (await as('makerOwner')).get(`/api/organisations${query}`)
      expect(res.status, query).toBe(400)
      expect(res.body.data.issues[0].path).toBe(field)
    }
  })

  it('shows one listed organisation by id, with the same fields', async () => {
    const res = await (await as('makerOwner')).get(`/api/organisations/${ids[HOLLOWMERE]}`)
    expect(res.status).toBe(200)
    expect(Object.keys(res.body).sort()).toEqual(ENTRY_KEYS)
    expect(res.body.name).toBe(HOLLOWMERE)
    expect((await (await as('makerOwner')).get('/api/organisations/99999999')).status).toBe(404)
  })

  it('hides an unlisted organisation from everyone but its own people', async () => {
    await db('organisations').where({ id: ids[MARROWBY] }).update({ listed: false })
    try {
      expect(names(await search(''))).not.toContain(MARROWBY)
      expect(names(await search('', 'maker2Owner'))).not.toContain(MARROWBY)
      for (const caller of ['makerOwner', 'growerOwner', 'admin'] as const) {
        expect((await (await as(caller)).get(`/api/organisations/${ids[MARROWBY]}`)).status, caller).toBe(404)
      }
      const own = await (await as('maker2Owner')).get(`/api/organisations/${ids[MARROWBY]}`)
      expect(own.status).toBe(200)
      expect(own.body.name).toBe(MARROWBY)
    }
    finally {
      await db('organisations').where({ id: ids[MARROWBY] }).update({ listed: true })
    }
  })

  it('leaves out a suspended organisation even when listed', async () => {
    const [id] = await db('organisations').insert({ name: 'Directory test suspended', kind: 'grower', status: 'suspended', listed: true })
    try {
      expect(names(await search('?q=directory%20test'))).toEqual([])
      expect((await (await as('makerOwner')).get(`/api/organisations/${id}`)).status).toBe(404)
    }
    finally {
      await db('organisations').where({ id }).delete()
    }
  })
})
