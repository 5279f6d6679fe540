import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { NURSERY_ROOTSTOCKS, up as addNurseryRootstocks } from '../../server/db/migrations/20261202_0009_nursery_rootstocks'
import { testDb } from '../support/db'
import { as, type ApiResponse } from '../support/http'

// Beds and their yearly records, liner stock (lifted + bought − lined out) and budwood, as
// Hollowmere (the demo's nursery) records them. Everything this file makes is named with PREFIX
// and removed afterwards.
const db = testDb()
const PREFIX = 'Beds test'
const unique = (what: string) => `${PREFIX} ${what} ${Math.random().toString(36).slice(2, 8)}`

let ids: Record<'hollowmere' | 'tansy' | 'mm106' | 'g890' | 'mark' | 'seedling' | 'dabinett' | 'yarlington' | 'longGround' | 'riverStrip', number>

async function idOf(table: string, column: string, value: string): Promise<number> {
  const row = await db(table).where(column, value).first('id')
  if (!row) throw new Error(`No ${table} row with ${column} = ${value}`)
  return row.id
}

const issuePaths = (res: ApiResponse) => (res.body?.data?.issues ?? []).map((i: { path: string }) => i.path)

beforeAll(async () => {
  ids = {
    hollowmere: await idOf('organisations', 'name', 'Hollowmere Orchard & Nursery'),
    tansy: await idOf('organisations', 'name', 'Tansy Row Fruit'),
    mm106: await idOf('rootstocks', 'designation', 'MM.106'),
    g890: await idOf('rootstocks', 'designation', 'G.890'),
    mark: await idOf('rootstocks', 'designation', 'Mark'),
    seedling: await idOf('rootstocks', 'designation', 'Seedling'),
    dabinett: await idOf('varieties', 'name', 'Dabinett'),
    yarlington: await idOf('varieties', 'name', 'Yarlington Mill'),
    longGround: await idOf('orchard_blocks', 'name', 'Long Ground'),
    riverStrip: await idOf('orchard_blocks', 'name', 'River Strip'),
  }
})

afterAll(async () => {
  const beds = db('nursery_beds').where('name', 'like', `${PREFIX}%`).select('id')
  const rows = db('nursery_rows').whereIn('field_id', beds).select('id')
  await db('nursery_runs').whereIn('row_id', rows).delete()
  await db('nursery_rows').whereIn('field_id', db('nursery_beds').where('name', 'like', `${PREFIX}%`).select('id')).delete()
  // Records and the lots lifted from them go with their bed.
  await db('nursery_beds').where('name', 'like', `${PREFIX}%`).delete()
  await db('liner_lots').where('supplier', 'like', `${PREFIX}%`).delete()
  await db('budwood_lots').where('label', 'like', `${PREFIX}%`).delete()
})

function stoolBed(overrides: Record<string, unknown> = {}) {
  return { name: unique('stool'), kind: 'stool', rootstockId: ids.mm106, motherPlants: 400, yearEstablished: 2016, ...overrides }
}

async function newBed(body: Record<string, unknown>): Promise<{ id: number, name: string }> {
  const res = await (await as('growerOwner')).post('/api/nursery/beds', body)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body
}

/** The stock row for one rootstock and grade, or zeros. */
async function stockOf(rootstockId: number, grade: string) {
  const res = await (await as('growerOwner')).get('/api/nursery/liners')
  expect(res.status).toBe(200)
  return res.body.items.find((r: { rootstockId: number, grade: string }) => r.rootstockId === rootstockId && r.grade === grade)
    ?? { lifted: 0, bought: 0, linedOut: 0, inStock: 0 }
}

describe('nursery beds', () => {
  it('adds a stool bed with its rootstock, mother plants and year established, and lists it', async () => {
    const body = stoolBed({ notes: 'North headland' })
    const created = await newBed(body)
    expect(created).toMatchObject({ name: body.name, kind: 'stool', rootstockId: ids.mm106, rootstockDesignation: 'MM.106', motherPlants: 400, yearEstablished: 2016, seedSource: null, notes: 'North headland' })

    const owner = await as('growerOwner')
    const one = await owner.get(`/api/nursery/beds/${created.id}`)
    expect(one.status).toBe(200)
    expect(one.body).toEqual(created)
    const list = await owner.get('/api/nursery/beds?limit=200')
    expect(list.status).toBe(200)
    expect(list.body.total).toBeGreaterThanOrEqual(1)
    expect(list.body.items.map((b: { id: number }) => b.id)).toContain(created.id)
    // The member reads the same beds.
    expect((await (await as('growerMember')).get(`/api/nursery/beds/${created.id}`)).status).toBe(200)
  })

  it('asks a stool or cutting bed for its rootstock, naming rootstockId', async () => {
    for (const body of [stoolBed({ rootstockId: undefined }), { name: unique('cutting'), kind: 'cutting' }, { name: unique('cutting'), kind: 'cutting', rootstockId: null }]) {
      const res = await (await as('growerOwner')).post('/api/nursery/beds', body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(issuePaths(res)).toContain('rootstockId')
    }
    const cutting = await newBed({ name: unique('cutting'), kind: 'cutting', rootstockId: ids.g890 })
    expect(cutting).toMatchObject({ kind: 'cutting', rootstockDesignation: 'G.890', motherPlants: null })
  })

  it('asks a stool bed for its mother plants and year established', async () => {
    const res = await (await as('growerOwner')).post('/api/nursery/beds', stoolBed({ motherPlants: undefined, yearEstablished: null }))
    expect(res.status).toBe(400)
    expect(issuePaths(res)).toEqual(['motherPlants', 'yearEstablished'])
  })

  it('asks a seedling bed for its seed source, and lets it name its seedling stock', async () => {
    const missing = await (await as('growerOwner')).post('/api/nursery/beds', { name: unique('seedling'), kind: 'seedling' })
    expect(missing.status).toBe(400)
    expect(issuePaths(missing)).toEqual(['seedSource'])
    const bed = await newBed({ name: unique('seedling'), kind: 'seedling', seedSource: 'Open-pollinated seed, 2024 pressing', rootstockId: ids.seedling })
    expect(bed).toMatchObject({ kind: 'seedling', seedSource: 'Open-pollinated seed, 2024 pressing', rootstockDesignation: 'Seedling' })
  })

  it('refuses on a nursery-row field each fact it does not have, naming the field sent', async () => {
    const owner = await as('growerOwner')
    const withStock = await owner.post('/api/nursery/beds', { name: unique('field'), kind: 'field', rootstockId: ids.mm106 })
    expect(withStock.status).toBe(400)
    expect(withStock.body.data.issues).toEqual([{ path: 'rootstockId', message: expect.stringMatching(/nursery-row field has no rootstock/) }])
    const withSeed = await owner.post('/api/nursery/beds', { name: unique('field'), kind: 'field', seedSource: 'x', motherPlants: 5 })
    expect(withSeed.status).toBe(400)
    expect(issuePaths(withSeed)).toEqual(['motherPlants', 'seedSource'])
    const field = await newBed({ name: unique('field'), kind: 'field' })
    expect(field).toMatchObject({ kind: 'field', rootstockId: null, motherPlants: null, yearEstablished: null, seedSource: null })
  })

  it('refuses a rootstock that is not in the catalogue and a kind it does not know', async () => {
    const owner = await as('growerOwner')
    const noStock = await owner.post('/api/nursery/beds', stoolBed({ rootstockId: 99_999_999 }))
    expect(noStock.status).toBe(400)
    expect(issuePaths(noStock)).toEqual(['rootstockId'])
    const badKind = await owner.post('/api/nursery/beds', stoolBed({ kind: 'hedge' }))
    expect(badKind.status).toBe(400)
    expect(issuePaths(badKind)).toEqual(['kind'])
  })

  it('keeps bed names unique within the nursery (409 naming name)', async () => {
    const first = await newBed(stoolBed())
    const again = await (await as('growerMember')).post('/api/nursery/beds', stoolBed({ name: first.name }))
    expect(again.status).toBe(409)
    expect(issuePaths(again)).toEqual(['name'])
    expect(again.body.message).toContain(first.name)
  })

  it('refuses unknown keys by name and ignores the read-only keys a client sends back', async () => {
    const owner = await as('growerOwner')
    const unknown = await owner.post('/api/nursery/beds', stoolBed({ colour: 'green', rows: 3 }))
    expect(unknown.status).toBe(400)
    expect(issuePaths(unknown).sort()).toEqual(['colour', 'rows'])

    const body = stoolBed({ id: 1, orgId: ids.tansy, createdAt: '2000-01-01', rootstockDesignation: 'M.9' })
    const created = await newBed(body)
    expect(created.id).not.toBe(1)
    expect(created).toMatchObject({ rootstockDesignation: 'MM.106' })
    expect((await db('nursery_beds').where({ id: created.id }).first('org_id')).org_id).toBe(ids.hollowmere)
  })

  it('changes a bed, checking the change against its kind, and never changes the kind', async () => {
    const owner = await as('growerOwner')
    const bed = await newBed(stoolBed())
    const renamed = `${bed.name} renamed`
    const ok = await owner.patch(`/api/nursery/beds/${bed.id}`, { name: renamed, motherPlants: 450, kind: 'field' })
    expect(ok.status, JSON.stringify(ok.body)).toBe(200)
    expect(ok.body).toMatchObject({ name: renamed, motherPlants: 450, kind: 'stool' })

    const dropStock = await owner.patch(`/api/nursery/beds/${bed.id}`, { rootstockId: null })
    expect(dropStock.status).toBe(400)
    expect(issuePaths(dropStock)).toEqual(['rootstockId'])
    const seed = await owner.patch(`/api/nursery/beds/${bed.id}`, { seedSource: 'Bought seed' })
    expect(seed.status).toBe(400)
    expect(issuePaths(seed)).toEqual(['seedSource'])
    const nothing = await owner.patch(`/api/nursery/beds/${bed.id}`, { kind: 'field' })
    expect(nothing.status).toBe(400)
    expect((await db('nursery_beds').where({ id: bed.id }).first('kind', 'mother_plants'))).toEqual({ kind: 'stool', mother_plants: 450 })

    const other = await newBed(stoolBed())
    const clash = await owner.patch(`/api/nursery/beds/${bed.id}`, { name: other.name })
    expect(clash.status).toBe(409)
    expect(issuePaths(clash)).toEqual(['name'])
  })

  it('does not find another organisation\'s bed (404), nor its records', async () => {
    const [tansyBed] = await db('nursery_beds').insert({ org_id: ids.tansy, name: unique('Tansy'), kind: 'stool', rootstock_id: ids.mm106, mother_plants: 10, year_established: 2020 })
    const owner = await as('growerOwner')
    expect((await owner.get(`/api/nursery/beds/${tansyBed}`)).status).toBe(404)
    expect((await owner.patch(`/api/nursery/beds/${tansyBed}`, { notes: 'mine now' })).status).toBe(404)
    expect((await owner.get(`/api/nursery/beds/${tansyBed}/records`)).status).toBe(404)
    expect((await owner.post(`/api/nursery/beds/${tansyBed}/records`, { kind: 'cut-back', doneOn: '2025-03-01' })).status).toBe(404)
    expect((await db('nursery_beds').where({ id: tansyBed }).first('notes')).notes).toBeNull()
    const list = await owner.get('/api/nursery/beds?limit=200')
    expect(list.body.items.map((b: { id: number }) => b.id)).not.toContain(tansyBed)
  })
})

describe('yearly records of a bed', () => {
  it('keeps the work of a stool bed by date, the latest first', async () => {
    const owner = await as('growerOwner')
    const bed = await newBed(stoolBed())
    const cut = await owner.post(`/api/nursery/beds/${bed.id}/records`, { kind: 'cut-back', doneOn: '2025-03-12' })
    expect(cut.status, JSON.stringify(cut.body)).toBe(201)
    expect(cut.body).toMatchObject({ bedId: bed.id, kind: 'cut-back', doneOn: '2025-03-12', count: null, grade: null, linerLot: null })
    const earthed = await owner.post(`/api/nursery/beds/${bed.id}/records`, { kind: 'earthed-up', doneOn: '2025-06-20', notes: 'Sawdust, second time' })
    expect(earthed.status).toBe(201)
    const list = await owner.get(`/api/nursery/beds/${bed.id}/records`)
    expect(list.status).toBe(200)
    expect(list.body.total).toBe(2)
    expect(list.body.items.map((r: { kind: string }) => r.kind)).toEqual(['earthed-up', 'cut-back'])
  })

  it('refuses a record the bed\'s kind does not keep, naming kind', async () => {
    const owner = await as('growerOwner')
    const stool = await newBed(stoolBed())
    const stuck = await owner.post(`/api/nursery/beds/${stool.id}/records`, { kind: 'cuttings-stuck', doneOn: '2025-02-01', count: 100, hormone: 'IBA', hormoneStrength: '0.3 %' })
    expect(stuck.status).toBe(400)
    expect(issuePaths(stuck)).toEqual(['kind'])
    const field = await newBed({ name: unique('field'), kind: 'field' })
    const lifted = await owner.post(`/api/nursery/beds/${field.id}/records`, { kind: 'liners-lifted', doneOn: '2025-11-20', count: 10, grade: '5-7mm' })
    expect(lifted.status).toBe(400)
    expect(issuePaths(lifted)).toEqual(['kind'])
    const unknown = await owner.post(`/api/nursery/beds/${stool.id}/records`, { kind: 'pruned', doneOn: '2025-02-01' })
    expect(unknown.status).toBe(400)
    expect(issuePaths(unknown)).toEqual(['kind'])
  })

  it('needs a count and a grade for liners lifted, and refuses a hormone', async () => {
    const owner = await as('growerOwner')
    const bed = await newBed(stoolBed())
    const bare = await owner.post(`/api/nursery/beds/${bed.id}/records`, { kind: 'liners-lifted', doneOn: '2025-11-20' })
    expect(bare.status).toBe(400)
    expect(issuePaths(bare)).toEqual(['count', 'grade'])
    const badGrade = await owner.post(`/api/nursery/beds/${bed.id}/records`, { kind: 'liners-lifted', doneOn: '2025-11-20', count: 10, grade: '6mm' })
    expect(badGrade.status).toBe(400)
    expect(issuePaths(badGrade)).toEqual(['grade'])
    const hormone = await owner.post(`/api/nursery/beds/${bed.id}/records`, { kind: 'liners-lifted', doneOn: '2025-11-20', count: 10, grade: '5-7mm', hormone: 'IBA' })
    expect(hormone.status).toBe(400)
    expect(issuePaths(hormone)).toEqual(['hormone'])
    expect(await db('nursery_bed_records').where({ bed_id: bed.id }).count({ n: '*' })).toEqual([{ n: 0 }])
  })

  it('makes liners lifted into a liner lot of the bed\'s rootstock, which shows in liner stock', async () => {
    const owner = await as('growerOwner')
    const bed = await newBed(stoolBed({ rootstockId: ids.g890 }))
    const before = await stockOf(ids.g890, '5-7mm')
    const ownerId = (await db('users').where({ email: 'grower@demo.test' }).first('id')).id
    // The id and the person recording are the server's to set: sent back, they are ignored.
    const res = await owner.post(`/api/nursery/beds/${bed.id}/records`, { kind: 'liners-lifted', doneOn: '2025-11-24', count: 1200, grade: '5-7mm', id: 5, byUserId: ownerId + 1000 })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body).toMatchObject({ kind: 'liners-lifted', count: 1200, grade: '5-7mm', doneOn: '2025-11-24', byUserId: ownerId })
    expect(res.body.linerLot).toMatchObject({
      source: 'lifted', rootstockId: ids.g890, rootstockDesignation: 'G.890', grade: '5-7mm', count: 1200, receivedOn: '2025-11-24', bedRecordId: res.body.id, supplier: null,
    })

    const after = await stockOf(ids.g890, '5-7mm')
    expect(after.lifted - before.lifted).toBe(1200)
    expect(after.inStock - before.inStock).toBe(1200)
    expect(after.rootstockDesignation).toBe('G.890')
    const liners = await owner.get('/api/nursery/liners')
    expect(liners.body.lots.map((l: { id: number }) => l.id)).toContain(res.body.linerLot.id)
    expect(liners.body.total).toBe(liners.body.items.length)
    const audit = await db('audit_events').where({ action: 'nursery_bed_record.created', object_id: res.body.id }).first('org_id')
    expect(audit.org_id).toBe(ids.hollowmere)
  })

  it('counts two lifts sent at once both, under the stock lock', async () => {
    const owner = await as('growerOwner')
    const member = await as('growerMember')
    const bed = await newBed(stoolBed({ rootstockId: ids.mark }))
    const before = await stockOf(ids.mark, '7-10mm')
    const [a, b] = await Promise.all([
      owner.post(`/api/nursery/beds/${bed.id}/records`, { kind: 'liners-lifted', doneOn: '2025-11-25', count: 300, grade: '7-10mm' }),
      member.post(`/api/nursery/beds/${bed.id}/records`, { kind: 'liners-lifted', doneOn: '2025-11-25', count: 450, grade: '7-10mm' }),
    ])
    expect([a.status, b.status]).toEqual([201, 201])
    expect((await stockOf(ids.mark, '7-10mm')).inStock - before.inStock).toBe(750)
  })

  it('needs a count, hormone and strength for cuttings stuck, and a count for cuttings rooted', async () => {
    const owner = await as('growerOwner')
    const bed = await newBed({ name: unique('cutting'), kind: 'cutting', rootstockId: ids.mm106 })
    const noHormone = await owner.post(`/api/nursery/beds/${bed.id}/records`, { kind: 'cuttings-stuck', doneOn: '2025-01-15', count: 2000 })
    expect(noHormone.status).toBe(400)
    expect(issuePaths(noHormone)).toEqual(['hormone', 'hormoneStrength'])
    const stuck = await owner.post(`/api/nursery/beds/${bed.id}/records`, { kind: 'cuttings-stuck', doneOn: '2025-01-15', count: 2000, hormone: 'IBA in talc', hormoneStrength: '0.3 %' })
    expect(stuck.status).toBe(201)
    expect(stuck.body).toMatchObject({ count: 2000, hormone: 'IBA in talc', hormoneStrength: '0.3 %', linerLot: null })
    const rooted = await owner.post(`/api/nursery/beds/${bed.id}/records`, { kind: 'rooted', doneOn: '2025-04-02' })
    expect(rooted.status).toBe(400)
    expect(issuePaths(rooted)).toEqual(['count'])
    expect((await owner.post(`/api/nursery/beds/${bed.id}/records`, { kind: 'rooted', doneOn: '2025-04-02', count: 1400 })).status).toBe(201)
  })

  it('counts seedlings raised, and lifts liners from a seedling bed only once it names its stock', async () => {
    const owner = await as('growerOwner')
    const bed = await newBed({ name: unique('seedling'), kind: 'seedling', seedSource: 'Cider pomace seed, 2024' })
    const raised = await owner.post(`/api/nursery/beds/${bed.id}/records`, { kind: 'seedlings-raised', doneOn: '2025-05-10', count: 5000 })
    expect(raised.status).toBe(201)
    const lift = { kind: 'liners-lifted', doneOn: '2025-11-28', count: 3000, grade: '3-5mm' }
    const unnamed = await owner.post(`/api/nursery/beds/${bed.id}/records`, lift)
    expect(unnamed.status).toBe(400)
    expect(issuePaths(unnamed)).toEqual(['kind'])
    expect(unnamed.body.message).toMatch(/rootstock/)
    expect((await owner.patch(`/api/nursery/beds/${bed.id}`, { rootstockId: ids.seedling })).status).toBe(200)
    const lifted = await owner.post(`/api/nursery/beds/${bed.id}/records`, lift)
    expect(lifted.status).toBe(201)
    expect(lifted.body.linerLot).toMatchObject({ rootstockDesignation: 'Seedling', count: 3000, grade: '3-5mm' })
  })

  it('refuses unknown keys on a record by name', async () => {
    const bed = await newBed(stoolBed())
    const res = await (await as('growerOwner')).post(`/api/nursery/beds/${bed.id}/records`, { kind: 'cut-back', doneOn: '2025-03-01', weather: 'dry' })
    expect(res.status).toBe(400)
    expect(issuePaths(res)).toEqual(['weather'])
  })
})

describe('liner stock', () => {
  it('adds a lot bought in, with its supplier and certificate', async () => {
    const owner = await as('growerOwner')
    const before = await stockOf(ids.mark, '5-7mm')
    const supplier = unique('supplier')
    const res = await owner.post('/api/nursery/liners', { rootstockId: ids.mark, grade: '5-7mm', count: 500, receivedOn: '2026-02-10', supplier, certificate: 'GB-12345 / 2026-0042', source: 'lifted', id: 3 })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body).toMatchObject({ source: 'bought', rootstockDesignation: 'Mark', grade: '5-7mm', count: 500, receivedOn: '2026-02-10', supplier, certificate: 'GB-12345 / 2026-0042', bedRecordId: null })
    const after = await stockOf(ids.mark, '5-7mm')
    expect(after.bought - before.bought).toBe(500)
    expect(after.inStock - before.inStock).toBe(500)
  })

  it('refuses a lot without a supplier, a grade off the list, an unknown rootstock or key, naming each', async () => {
    const owner = await as('growerOwner')
    const body = { rootstockId: ids.mark, grade: '5-7mm', count: 10, receivedOn: '2026-02-10', supplier: unique('supplier') }
    const noSupplier = await owner.post('/api/nursery/liners', { ...body, supplier: ' ' })
    expect(issuePaths(noSupplier)).toEqual(['supplier'])
    const badGrade = await owner.post('/api/nursery/liners', { ...body, grade: 'big' })
    expect(issuePaths(badGrade)).toEqual(['grade'])
    const noStock = await owner.post('/api/nursery/liners', { ...body, rootstockId: 99_999_999 })
    expect(noStock.status).toBe(400)
    expect(issuePaths(noStock)).toEqual(['rootstockId'])
    const unknown = await owner.post('/api/nursery/liners', { ...body, price: 3 })
    expect(issuePaths(unknown)).toEqual(['price'])
  })

  it('is lifted + bought − lined out, per rootstock and grade', async () => {
    const owner = await as('growerOwner')
    const before = await stockOf(ids.g890, '10-12mm')
    const bed = await newBed(stoolBed({ rootstockId: ids.g890 }))
    expect((await owner.post(`/api/nursery/beds/${bed.id}/records`, { kind: 'liners-lifted', doneOn: '2025-11-20', count: 800, grade: '10-12mm' })).status).toBe(201)
    expect((await owner.post('/api/nursery/liners', { rootstockId: ids.g890, grade: '10-12mm', count: 200, receivedOn: '2026-01-10', supplier: unique('supplier') })).status).toBe(201)
    // 650 lined out in a run of this grade (written as the runs' own slice would write it).
    const field = await newBed({ name: unique('field'), kind: 'field' })
    const [rowId] = await db('nursery_rows').insert({ org_id: ids.hollowmere, field_id: field.id, name: 'R1', positions: 700 })
    await db('nursery_runs').insert({
      org_id: ids.hollowmere, row_id: rowId, from_position: 1, to_position: 650, rootstock_id: ids.g890, liner_grade: '10-12mm',
      lined_out_on: '2026-03-20', lined_out_count: 650, variety_id: ids.dabinett, tag_code: `BT${Math.random().toString(36).slice(2, 10)}`,
    })
    const after = await stockOf(ids.g890, '10-12mm')
    expect(after.lifted - before.lifted).toBe(800)
    expect(after.bought - before.bought).toBe(200)
    expect(after.linedOut - before.linedOut).toBe(650)
    // 800 + 200 − 650 = 350 more in stock than before.
    expect(after.inStock - before.inStock).toBe(350)
  })
})

describe('budwood', () => {
  const lot = (overrides: Record<string, unknown>) => ({ label: unique('lot'), varietyId: ids.dabinett, cutOn: '2025-08-04', sticks: 40, ...overrides })

  it('records a lot from one of the nursery\'s own blocks, of the variety that block grows', async () => {
    const owner = await as('growerOwner')
    const res = await owner.post('/api/nursery/budwood', lot({ sourceKind: 'own-block', blockId: ids.longGround, sourceNote: 'Row 4, trees 10-30' }))
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body).toMatchObject({ sourceKind: 'own-block', blockId: ids.longGround, blockName: 'Long Ground', varietyName: 'Dabinett', sticks: 40, supplier: null })
    const one = await owner.get(`/api/nursery/budwood/${res.body.id}`)
    expect(one.status).toBe(200)
    expect(one.body).toEqual(res.body)
    const list = await owner.get('/api/nursery/budwood')
    expect(list.body.items.map((l: { id: number }) => l.id)).toContain(res.body.id)
  })

  it('refuses wood said to be cut from a block that grows another variety, naming varietyId', async () => {
    const res = await (await as('growerOwner')).post('/api/nursery/budwood', lot({ sourceKind: 'own-block', blockId: ids.longGround, varietyId: ids.yarlington }))
    expect(res.status).toBe(400)
    expect(issuePaths(res)).toEqual(['varietyId'])
    expect(res.body.message).toMatch(/Long Ground grows Dabinett/)
  })

  it('takes only the nursery\'s own blocks, and needs one for wood from a block', async () => {
    const owner = await as('growerOwner')
    const other = await owner.post('/api/nursery/budwood', lot({ sourceKind: 'own-block', blockId: ids.riverStrip }))
    expect(other.status).toBe(400)
    expect(issuePaths(other)).toEqual(['blockId'])
    const none = await owner.post('/api/nursery/budwood', lot({ sourceKind: 'own-block' }))
    expect(issuePaths(none)).toEqual(['blockId'])
  })

  it('needs the tree for wood from a single tree, and the supplier and certificate for wood bought in', async () => {
    const owner = await as('growerOwner')
    const tree = await owner.post('/api/nursery/budwood', lot({ sourceKind: 'own-tree' }))
    expect(issuePaths(tree)).toEqual(['sourceNote'])
    expect((await owner.post('/api/nursery/budwood', lot({ sourceKind: 'own-tree', sourceNote: 'Old tree by the cider house' }))).status).toBe(201)

    const bought = await owner.post('/api/nursery/budwood', lot({ sourceKind: 'bought' }))
    expect(bought.status).toBe(400)
    expect(issuePaths(bought)).toEqual(['supplier', 'certificate'])
    const withBlock = await owner.post('/api/nursery/budwood', lot({ sourceKind: 'bought', supplier: 'Scion Co', certificate: 'GB-777', blockId: ids.longGround }))
    expect(issuePaths(withBlock)).toEqual(['blockId'])
    const ok = await owner.post('/api/nursery/budwood', lot({ sourceKind: 'bought', supplier: 'Scion Co', certificate: 'GB-777 / 2025-19' }))
    expect(ok.status).toBe(201)
    expect(ok.body).toMatchObject({ sourceKind: 'bought', supplier: 'Scion Co', certificate: 'GB-777 / 2025-19', blockId: null, blockName: null })
  })

  it('keeps labels unique within the nursery (409 naming label), and refuses unknown keys by name', async () => {
    const owner = await as('growerOwner')
    const first = lot({ sourceKind: 'own-tree', sourceNote: 'Tree 7' })
    expect((await owner.post('/api/nursery/budwood', first)).status).toBe(201)
    const again = await owner.post('/api/nursery/budwood', { ...first, sourceNote: 'Tree 8' })
    expect(again.status).toBe(409)
    expect(issuePaths(again)).toEqual(['label'])
    const unknown = await owner.post('/api/nursery/budwood', lot({ sourceKind: 'own-tree', sourceNote: 'Tree 9', budsPerStick: 8 }))
    expect(issuePaths(unknown)).toEqual(['budsPerStick'])
  })

  it('does not find another organisation\'s budwood (404)', async () => {
    const [id] = await db('budwood_lots').insert({ org_id: ids.tansy, label: unique('Tansy lot'), variety_id: ids.dabinett, cut_on: '2025-08-01', source_kind: 'own-tree', source_note: 'x', sticks: 5 })
    const owner = await as('growerOwner')
    expect((await owner.get(`/api/nursery/budwood/${id}`)).status).toBe(404)
    expect((await owner.get('/api/nursery/budwood?limit=200')).body.items.map((l: { id: number }) => l.id)).not.toContain(id)
  })
})

describe('the rootstocks a nursery propagates', () => {
  it('are in the catalogue once each, with the figures the data file gives, however often the migration runs', async () => {
    await addNurseryRootstocks(db)
    for (const row of NURSERY_ROOTSTOCKS) {
      const rows = await db('rootstocks').where({ designation: row.designation }).select(Object.keys(row))
      expect(rows, row.designation).toHaveLength(1)
      expect({ ...rows[0], needs_support: Boolean(rows[0].needs_support) }).toEqual(row)
    }
  })
})
