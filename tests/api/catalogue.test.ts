import { describe, expect, it } from 'vitest'
import { testDb } from '../support/db'
import { as } from '../support/http'

interface VarietyRow { id: number, name: string, species: string, juiceClass: string, typicalBrix: number | null, typicalTaGPerL: number | null, typicalTanninGPerL: number | null, harvestSeason: string | null, source: string | null }
interface RootstockRow { id: number, designation: string, species: string, vigour: string, sizePctOfSeedling: number | null, needsSupport: boolean, inRowM: number | null, betweenRowM: number | null, yearsToFirstCrop: number | null, yearsToFullBearing: number | null, yieldPerTreeKg: number | null }

/** Invented names, unique per run, so a rerun against the same database does not collide. */
const run = Date.now().toString(36).slice(-5)
const invented = (name: string) => `${name} ${run}`

async function allVarieties(query = ''): Promise<{ items: VarietyRow[], total: number }> {
  const res = await (await as('makerViewer')).get(`/api/varieties?limit=200${query}`)
  expect(res.status).toBe(200)
  return res.body
}

async function allRootstocks(query = ''): Promise<{ items: RootstockRow[], total: number }> {
  const res = await (await as('growerMember')).get(`/api/rootstocks?limit=200${query}`)
  expect(res.status).toBe(200)
  return res.body
}

async function adminId(): Promise<number> {
  return (await testDb()('users').where({ email: 'admin@demo.test' }).first('id')).id
}

describe('the seeded catalogue', () => {
  it('holds the classic cider varieties with their published class and typical juice', async () => {
    const { items, total } = await allVarieties()
    expect(total).toBe(items.length)
    expect(total).toBeGreaterThanOrEqual(39)
    // Paged, every page carries the count of all; a page past the end is empty with the same count.
    const admin = await as('admin')
    const firstPage = (await admin.get('/api/varieties?limit=5')).body
    expect(firstPage.items).toHaveLength(5)
    expect(firstPage.total).toBe(total)
    expect(Object.keys(firstPage.items[0]).sort()).toEqual(Object.keys(items[0]!).sort())
    expect((await admin.get(`/api/varieties?limit=5&offset=${total + 10}`)).body).toEqual({ items: [], total })
    // Bittersweet: UMass Extension cider apple programme; WSU Mount Vernon analyses 2003-2013
    // give tannin 0.29 %, malic 2.55 g/L and 14.0 °Brix.
    expect(items.find(v => v.name === 'Dabinett')).toMatchObject({
      species: 'apple', juiceClass: 'bittersweet', typicalBrix: 14, typicalTaGPerL: 2.55, typicalTanninGPerL: 2.9, harvestSeason: 'late',
    })
    // Bittersharp by its published label although WSU measured 1.7 g/L tannin, under the 2.0 g/L line.
    expect(items.find(v => v.name === 'Kingston Black')).toMatchObject({ juiceClass: 'bittersharp', typicalTanninGPerL: 1.7 })
    // Perry pears carry their own published classes (Pollard & Beech lists): Blakeney Red is medium sharp.
    expect(items.find(v => v.name === 'Blakeney Red')).toMatchObject({ species: 'pear', juiceClass: 'medium sharp' })
    expect(items.find(v => v.name === 'Dabinett')!.source).toMatch(/WSU/)
  })

  it('holds apple rootstocks and pear rootstocks, quince and pear seedling among the pear ones', async () => {
    const { items } = await allRootstocks()
    const by = new Map(items.map(r => [r.designation, r]))
    for (const apple of ['M.9', 'M.26', 'M.7', 'MM.106', 'MM.111', 'G.41', 'G.935', 'Seedling']) {
      expect(by.get(apple)?.species, apple).toBe('apple')
    }
    for (const pear of ['Quince A', 'Quince C', 'Pear seedling']) {
      expect(by.get(pear)?.species, pear).toBe('pear')
    }
    // NC State Extension, 'Apple Rootstocks and Tree Spacing', Table 1: M.26 50 %, M.7 70 %, MM.106 80 % of seedling.
    expect(by.get('M.26')).toMatchObject({ vigour: 'semi-dwarf', sizePctOfSeedling: 50, needsSupport: true })
    expect(by.get('M.7')).toMatchObject({ sizePctOfSeedling: 70, needsSupport: false })
    expect(by.get('MM.106')).toMatchObject({ vigour: 'semi-vigorous', sizePctOfSeedling: 80 })
    // Seedling is the yardstick: 100 % of itself, and the slowest to bear (NC State: 6-10 years).
    expect(by.get('Seedling')).toMatchObject({ vigour: 'vigorous', sizePctOfSeedling: 100, yearsToFirstCrop: 6, yearsToFirstCropLate: 10 })
    expect(by.get('Quince A')!.inRowM).toBeTypeOf('number')
  })
})

describe('listing, searching and filtering', () => {
  it('finds a variety by part of its name, ignoring case and punctuation', async () => {
    expect((await allVarieties('&q=dabin')).items.map(v => v.name)).toEqual(['Dabinett'])
    expect((await allVarieties('&q=TREMLETTS')).items.map(v => v.name)).toEqual(["Tremlett's Bitter"])
    expect((await allVarieties('&q=no-such-apple')).total).toBe(0)
  })

  it('finds a rootstock by its designation written with or without the dots', async () => {
    expect((await allRootstocks('&q=MM106')).items.map(r => r.designation)).toEqual(['MM.106'])
    expect((await allRootstocks('&q=quince')).items.map(r => r.designation).sort()).toEqual(['Quince A', 'Quince C'])
    // A % in the search is a character, not a wildcard.
    expect((await allRootstocks('&q=%25')).total).toBe(0)
  })

  it('filters varieties by species and by juice class', async () => {
    const pears = await allVarieties('&species=pear')
    expect(pears.total).toBeGreaterThan(0)
    expect(pears.items.every(v => v.species === 'pear')).toBe(true)
    expect(pears.items.map(v => v.name)).toContain('Blakeney Red')

    const bittersharpApples = await allVarieties('&species=apple&juiceClass=bittersharp')
    expect(bittersharpApples.items.every(v => v.species === 'apple' && v.juiceClass === 'bittersharp')).toBe(true)
    expect(bittersharpApples.items.map(v => v.name)).toEqual(expect.arrayContaining(['Kingston Black', 'Foxwhelp', 'Stoke Red']))
    expect(bittersharpApples.items.map(v => v.name)).not.toContain('Butt')
  })

  it('filters rootstocks by species and vigour', async () => {
    const dwarfPear = await allRootstocks('&species=pear&vigour=dwarf')
    expect(dwarfPear.items.every(r => r.species === 'pear' && r.vigour === 'dwarf')).toBe(true)
    // Quince C is the more dwarfing quince; Quince A is semi-dwarf.
    expect(dwarfPear.items.map(r => r.designation)).toContain('Quince C')
    expect(dwarfPear.items.map(r => r.designation)).not.toContain('Quince A')
    const vigorous = await allRootstocks('&vigour=vigorous')
    expect(vigorous.items.map(r => r.designation)).toEqual(expect.arrayContaining(['Seedling', 'MM.111', 'Pear seedling']))
    expect(vigorous.items.every(r => r.vigour === 'vigorous')).toBe(true)
  })

  it('pages with limit and offset, the total counting every match', async () => {
    const client = await as('makerOwner')
    const all = await allVarieties('&species=apple')
    const first = await client.get('/api/varieties?species=apple&limit=5&offset=0')
    const second = await client.get('/api/varieties?species=apple&limit=5&offset=5')
    expect(first.body.total).toBe(all.total)
    expect(second.body.total).toBe(all.total)
    expect(first.body.items.map((v: VarietyRow) => v.name)).toEqual(all.items.slice(0, 5).map(v => v.name))
    expect(second.body.items.map((v: VarietyRow) => v.name)).toEqual(all.items.slice(5, 10).map(v => v.name))
    const rootstocks = await client.get('/api/rootstocks?limit=2&offset=1')
    expect(rootstocks.body.items).toHaveLength(2)
  })

  it('refuses an unknown filter value or page size, naming the parameter', async () => {
    const client = await as('grower2Owner')
    const plum = await client.get('/api/varieties?species=plum')
    expect(plum.status).toBe(400)
    expect(plum.body.data.issues[0].path).toBe('species')
    const giant = await client.get('/api/rootstocks?vigour=giant')
    expect(giant.status).toBe(400)
    expect(giant.body.data.issues[0].path).toBe('vigour')
    expect((await client.get('/api/varieties?limit=0')).body.data.issues[0].path).toBe('limit')
  })

  it('answers one row by id, and 404 for an id not in the catalogue', async () => {
    const client = await as('maker2Owner')
    const dabinett = (await allVarieties('&q=Dabinett')).items[0]!
    const one = await client.get(`/api/varieties/${dabinett.id}`)
    expect(one.status).toBe(200)
    expect(one.body).toMatchObject({ id: dabinett.id, name: 'Dabinett', juiceClass: 'bittersweet' })
    const g41 = (await allRootstocks('&q=G.41')).items[0]!
    expect((await client.get(`/api/rootstocks/${g41.id}`)).body).toMatchObject({ designation: 'G.41', species: 'apple', vigour: 'dwarf' })
    expect((await client.get('/api/varieties/999999')).status).toBe(404)
    expect((await client.get('/api/rootstocks/999999')).status).toBe(404)
    expect((await client.get('/api/rootstocks/not-a-number')).status).toBe(400)
  })
})

describe('the platform admin curates the catalogue', () => {
  it('adds a variety, corrects it and deletes it, each step audited', async () => {
    const admin = await as('admin')
    const name = invented('Estry Redstreak')
    const created = await admin.post('/api/varieties', { name, species: 'apple', juiceClass: 'bittersweet', typicalBrix: 13.2, typicalTaGPerL: 2.1, typicalTanninGPerL: 2.6, harvestSeason: 'mid', source: 'Hollowmere trial press notes' })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ name, species: 'apple', juiceClass: 'bittersweet', typicalBrix: 13.2, typicalTaGPerL: 2.1, typicalTanninGPerL: 2.6, harvestSeason: 'mid' })
    const id = created.body.id as number
    expect((await (await as('makerViewer')).get(`/api/varieties/${id}`)).body.name).toBe(name)

    const patched = await admin.patch(`/api/varieties/${id}`, { typicalBrix: 13.8, harvestSeason: null })
    expect(patched.status).toBe(200)
    expect(patched.body).toMatchObject({ name, typicalBrix: 13.8, harvestSeason: null, typicalTaGPerL: 2.1 })

    expect((await admin.delete(`/api/varieties/${id}`)).status).toBe(204)
    expect((await admin.get(`/api/varieties/${id}`)).status).toBe(404)
    expect((await admin.delete(`/api/varieties/${id}`)).status).toBe(404)

    const audit = await testDb()('audit_events').where({ object_type: 'variety', object_id: id }).orderBy('id').select('action', 'actor_user_id', 'org_id')
    expect(audit.map(a => a.action)).toEqual(['variety.created', 'variety.updated', 'variety.deleted'])
    expect(audit.every(a => a.org_id === null)).toBe(true)
    expect(new Set(audit.map(a => a.actor_user_id))).toEqual(new Set([await adminId()]))
  })

  it('adds a rootstock with its spacing and bearing figures, corrects it and deletes it', async () => {
    const admin = await as('admin')
    const designation = invented('EV.12')
    const created = await admin.post('/api/rootstocks', { designation, species: 'apple', vigour: 'semi-dwarf', sizePctOfSeedling: 55, needsSupport: true, inRowM: 2.5, betweenRowM: 4.5, yearsToFirstCrop: 3, yearsToFullBearing: 6, yieldPerTreeKg: 35 })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ designation, sizePctOfSeedling: 55, needsSupport: true, inRowM: 2.5, betweenRowM: 4.5, yearsToFirstCrop: 3, yearsToFullBearing: 6, yieldPerTreeKg: 35, source: null })
    const id = created.body.id as number

    const patched = await admin.patch(`/api/rootstocks/${id}`, { needsSupport: false, yieldPerTreeKg: null })
    expect(patched.body).toMatchObject({ needsSupport: false, yieldPerTreeKg: null, inRowM: 2.5 })

    // Full bearing cannot come before the first crop, even when only one of the two is sent.
    const early = await admin.patch(`/api/rootstocks/${id}`, { yearsToFullBearing: 2 })
    expect(early.status).toBe(400)
    expect(early.body.data.issues[0].path).toBe('yearsToFullBearing')
    const late = await admin.patch(`/api/rootstocks/${id}`, { yearsToFirstCrop: 7 })
    expect(late.status).toBe(400)
    expect(late.body.data.issues[0].path).toBe('yearsToFirstCrop')
    expect((await admin.get(`/api/rootstocks/${id}`)).body).toMatchObject({ yearsToFirstCrop: 3, yearsToFullBearing: 6 })

    expect((await admin.delete(`/api/rootstocks/${id}`)).status).toBe(204)
    expect((await admin.get(`/api/rootstocks/${id}`)).status).toBe(404)
    const audit = await testDb()('audit_events').where({ object_type: 'rootstock', object_id: id }).orderBy('id').pluck('action')
    expect(audit).toEqual(['rootstock.created', 'rootstock.updated', 'rootstock.deleted'])
  })

  it('answers 404 when correcting a row that is not in the catalogue', async () => {
    const admin = await as('admin')
    expect((await admin.patch('/api/varieties/999999', { typicalBrix: 12 })).status).toBe(404)
    expect((await admin.patch('/api/rootstocks/999999', { inRowM: 2 })).status).toBe(404)
    expect((await admin.delete('/api/rootstocks/999999')).status).toBe(404)
  })

  it('refuses an empty correction', async () => {
    const res = await (await as('admin')).patch('/api/varieties/1', {})
    expect(res.status).toBe(400)
    expect(res.body.message).toMatch(/Nothing to change/)
  })
})

describe('validation names the field at fault', () => {
  const variety = { name: invented('Estry Bitter'), species: 'apple', juiceClass: 'bittersweet' }
  const rootstock = { designation: invented('EV.30'), species: 'apple', vigour: 'dwarf' }

  // The physical limits the catalogue accepts: °Brix 0-32, TA 0-30 g/L, tannin 0-8 g/L, size 1-150 %,
  // spacing 0.3-15 m, 0-20 years, 0-1000 kg per tree.
  it.each([
    ['typicalBrix', 32.5],
    ['typicalBrix', -1],
    ['typicalTaGPerL', 31],
    ['typicalTanninGPerL', 8.5],
    ['species', 'plum'],
    ['juiceClass', 'bittersour'],
    ['harvestSeason', 'winter'],
    ['name', '  '],
  ])('variety %s = %j → 400', async (field, value) => {
    const res = await (await as('admin')).post('/api/varieties', { ...variety, [field]: value })
    expect(res.status).toBe(400)
    expect(res.body.data.issues.map((i: { path: string }) => i.path)).toEqual([field])
  })

  it.each([
    ['sizePctOfSeedling', 0],
    ['sizePctOfSeedling', 151],
    ['inRowM', 0.2],
    ['betweenRowM', 16],
    ['yearsToFirstCrop', 21],
    ['yearsToFullBearing', -1],
    ['yieldPerTreeKg', 1001],
    ['vigour', 'giant'],
    ['needsSupport', 'yes'],
  ])('rootstock %s = %j → 400', async (field, value) => {
    const res = await (await as('admin')).post('/api/rootstocks', { ...rootstock, [field]: value })
    expect(res.status).toBe(400)
    expect(res.body.data.issues.map((i: { path: string }) => i.path)).toEqual([field])
  })

  it('refuses a pear class for an apple and an apple class for a pear, also when a patch changes one of them', async () => {
    const admin = await as('admin')
    const sharpPear = await admin.post('/api/varieties', { ...variety, species: 'pear', juiceClass: 'sharp' })
    expect(sharpPear.status).toBe(400)
    expect(sharpPear.body.data.issues.map((i: { path: string }) => i.path)).toEqual(['juiceClass'])
    expect(sharpPear.body.data.issues[0].message).toMatch(/medium sharp/)
    const mediumApple = await admin.post('/api/varieties', { ...variety, species: 'apple', juiceClass: 'medium sharp' })
    expect(mediumApple.status).toBe(400)
    const created = await admin.post('/api/varieties', { ...variety, name: `${variety.name} Pear`, species: 'pear', juiceClass: 'medium sharp' })
    expect(created.status).toBe(201)
    const toApple = await admin.patch(`/api/varieties/${created.body.id}`, { species: 'apple' })
    expect(toApple.status).toBe(400)
    expect(toApple.body.data.issues[0].path).toBe('juiceClass')
    expect((await admin.delete(`/api/varieties/${created.body.id}`)).status).toBe(204)
  })

  it('refuses a range of years to first crop that ends before it starts, also against the stored figure', async () => {
    const admin = await as('admin')
    const res = await admin.post('/api/rootstocks', { ...rootstock, yearsToFirstCrop: 4, yearsToFirstCropLate: 3 })
    expect(res.status).toBe(400)
    expect(res.body.data.issues.map((i: { path: string }) => i.path)).toEqual(['yearsToFirstCropLate'])
    const created = await admin.post('/api/rootstocks', { ...rootstock, yearsToFirstCrop: 2, yearsToFirstCropLate: 4, yearsToFullBearing: 6 })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ yearsToFirstCrop: 2, yearsToFirstCropLate: 4 })
    const later = await admin.patch(`/api/rootstocks/${created.body.id}`, { yearsToFirstCrop: 5, yearsToFullBearing: 8 })
    expect(later.status).toBe(400)
    expect(later.body.data.issues[0].path).toBe('yearsToFirstCrop')
    expect((await admin.delete(`/api/rootstocks/${created.body.id}`)).status).toBe(204)
  })

  it('refuses full bearing before the first crop', async () => {
    const res = await (await as('admin')).post('/api/rootstocks', { ...rootstock, yearsToFirstCrop: 5, yearsToFullBearing: 4 })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0]).toMatchObject({ path: 'yearsToFullBearing' })
  })

  it('refuses an out-of-range correction the same way', async () => {
    const res = await (await as('admin')).patch('/api/varieties/1', { typicalTaGPerL: 45 })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0].path).toBe('typicalTaGPerL')
  })
})

describe('names are unique and rows in use stay', () => {
  it('answers 409 on the name field for a variety already in the catalogue, whatever its case', async () => {
    const admin = await as('admin')
    for (const name of ['Dabinett', 'dabinett']) {
      const res = await admin.post('/api/varieties', { name, species: 'apple', juiceClass: 'bittersweet' })
      expect(res.status).toBe(409)
      expect(res.body.data.issues[0].path).toBe('name')
    }
    const kingston = (await allVarieties('&q=Kingston')).items[0]!
    const rename = await admin.patch(`/api/varieties/${kingston.id}`, { name: 'Dabinett' })
    expect(rename.status).toBe(409)
    expect(rename.body.data.issues[0]).toMatchObject({ path: 'name', message: expect.stringMatching(/already in the catalogue/) })
  })

  it('answers 409 on the designation field for a rootstock already in the catalogue', async () => {
    const res = await (await as('admin')).post('/api/rootstocks', { designation: 'M.26', species: 'apple', vigour: 'semi-dwarf' })
    expect(res.status).toBe(409)
    expect(res.body.data.issues[0].path).toBe('designation')
  })

  it('will not delete a variety or rootstock that an orchard block is planted with', async () => {
    const admin = await as('admin')
    const variety = (await admin.post('/api/varieties', { name: invented('Estry Sharp'), species: 'apple', juiceClass: 'sharp' })).body
    const rootstock = (await admin.post('/api/rootstocks', { designation: invented('EV.40'), species: 'apple', vigour: 'dwarf' })).body
    const db = testDb()
    const org = await db('organisations').where({ name: 'Hollowmere Orchard & Nursery' }).first('id')
    const [blockId] = await db('orchard_blocks').insert({ org_id: org.id, name: invented('Test Strip'), variety_id: variety.id, rootstock_id: rootstock.id, tree_count: 10, year_planted: 2024, area_ha: 0.1, in_row_m: 1.5, between_row_m: 4 })
    try {
      const v = await admin.delete(`/api/varieties/${variety.id}`)
      expect(v.status).toBe(409)
      expect(v.body.message).toMatch(/cannot be deleted/)
      const r = await admin.delete(`/api/rootstocks/${rootstock.id}`)
      expect(r.status).toBe(409)
      expect(r.body.message).toMatch(/cannot be deleted/)
      expect((await admin.get(`/api/varieties/${variety.id}`)).status).toBe(200)
    }
    finally {
      await db('orchard_blocks').where({ id: blockId }).delete()
    }
    expect((await admin.delete(`/api/varieties/${variety.id}`)).status).toBe(204)
    expect((await admin.delete(`/api/rootstocks/${rootstock.id}`)).status).toBe(204)
  })
})
