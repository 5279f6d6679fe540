import { afterAll, describe, expect, it } from 'vitest'
import { orgId } from '../support/contracts'
import { testDb } from '../support/db'
import { as } from '../support/http'

// A maker's saved blend targets: named juice specs, one name once per organisation. Every target
// this file makes is named with its mark and removed when the file ends.
const db = testDb()
const MARK = 'T-BTG-'
let n = 0
const name = (what: string) => `${MARK}${what} ${++n}-${Math.random().toString(36).slice(2, 6)}`

afterAll(async () => {
  await db('blend_targets').where('name', 'like', `${MARK}%`).delete()
})

const issuePaths = (body: { data?: { issues?: { path: string }[] } }) => (body.data?.issues ?? []).map(i => i.path)

const RANGES = { sg: { min: 1.05, max: 1.056 }, taGPerL: { min: 5, max: 6.5 }, tanninGPerL: { min: 1.6, max: 2.4 } }

describe('saved blend targets', () => {
  it('creates, reads, lists, changes and deletes a target, each change audited', async () => {
    const maker = await as('makerOwner')
    const created = await maker.post('/api/blend-targets', { name: name('Dry base'), ranges: RANGES, volumeL: 8000, phNote: 'about 3.5', notes: 'House dry' })
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    expect(created.body).toMatchObject({ name: expect.stringContaining('Dry base'), ranges: RANGES, volumeL: 8000, phNote: 'about 3.5', notes: 'House dry' })
    const id = created.body.id as number
    expect((await maker.get(`/api/blend-targets/${id}`)).body).toEqual(created.body)
    const viewer = await as('makerViewer')
    const listed = await viewer.get(`/api/blend-targets?q=${MARK}&limit=200`)
    expect(listed.status).toBe(200)
    expect(listed.body.items.map((t: { id: number }) => t.id)).toContain(id)
    expect(listed.body.total).toBe(listed.body.items.length)

    // `ranges` replaces every range: TA alone is left.
    const changed = await maker.patch(`/api/blend-targets/${id}`, { ranges: { taGPerL: { min: 5.2, max: 6.2 } }, volumeL: null, notes: '' })
    expect(changed.status, JSON.stringify(changed.body)).toBe(200)
    expect(changed.body).toMatchObject({ ranges: { taGPerL: { min: 5.2, max: 6.2 } }, volumeL: null, notes: null, phNote: 'about 3.5' })
    expect(Object.keys(changed.body.ranges)).toEqual(['taGPerL'])

    expect((await maker.delete(`/api/blend-targets/${id}`)).status).toBe(204)
    expect((await maker.get(`/api/blend-targets/${id}`)).status).toBe(404)
    const audit = await db('audit_events').where({ object_type: 'blend_target', object_id: id }).orderBy('id').select('action')
    expect(audit.map(a => a.action)).toEqual(['blend_target.created', 'blend_target.updated', 'blend_target.deleted'])
  })

  it('refuses a name the organisation already uses with 409 naming the field, but another maker may use it', async () => {
    const maker = await as('makerOwner')
    const taken = name('Sweet base')
    expect((await maker.post('/api/blend-targets', { name: taken })).status).toBe(201)
    const again = await maker.post('/api/blend-targets', { name: taken })
    expect(again.status).toBe(409)
    expect(issuePaths(again.body)).toEqual(['name'])
    expect((await (await as('maker2Owner')).post('/api/blend-targets', { name: taken })).status).toBe(201)
    const other = await maker.post('/api/blend-targets', { name: name('Other') })
    const renamed = await maker.patch(`/api/blend-targets/${other.body.id}`, { name: taken })
    expect(renamed.status).toBe(409)
    expect(issuePaths(renamed.body)).toEqual(['name'])
  })

  it('refuses a range whose lowest is above its highest, and other bad fields, naming each', async () => {
    const maker = await as('makerOwner')
    const cases: [unknown, string][] = [
      [{ name: name('Bad'), ranges: { taGPerL: { min: 7, max: 5 } } }, 'ranges.taGPerL.min'],
      [{ name: name('Bad'), ranges: { sg: { min: 0.5, max: 1.05 } } }, 'ranges.sg.min'],
      [{ name: name('Bad'), ranges: { ph: { min: 3, max: 4 } } }, 'ranges.ph'],
      [{ name: name('Bad'), ranges: { brix: { min: 10 } } }, 'ranges.brix.max'],
      [{ name: '' }, 'name'],
      [{ name: name('Bad'), volumeL: -1 }, 'volumeL'],
      [{ name: name('Bad'), colour: 'gold' }, 'colour'],
    ]
    for (const [body, path] of cases) {
      const res = await maker.post('/api/blend-targets', body)
      expect(res.status, JSON.stringify(body)).toBe(400)
      expect(issuePaths(res.body), JSON.stringify(body)).toContain(path)
    }
    const created = await maker.post('/api/blend-targets', { name: name('Fine') })
    const patched = await maker.patch(`/api/blend-targets/${created.body.id}`, { ranges: { tanninGPerL: { min: 3, max: 2 } } })
    expect(patched.status).toBe(400)
    expect(issuePaths(patched.body)).toEqual(['ranges.tanninGPerL.min'])
    expect(issuePaths((await maker.patch(`/api/blend-targets/${created.body.id}`, {})).body)).toEqual(['name'])
  })

  it('keeps each maker\'s targets its own: another\'s answers 404', async () => {
    const mine = await (await as('makerOwner')).post('/api/blend-targets', { name: name('Ours') })
    const other = await as('maker2Owner')
    expect((await other.get(`/api/blend-targets/${mine.body.id}`)).status).toBe(404)
    expect((await other.patch(`/api/blend-targets/${mine.body.id}`, { notes: 'x' })).status).toBe(404)
    expect((await other.delete(`/api/blend-targets/${mine.body.id}`)).status).toBe(404)
    const theirs = await other.get(`/api/blend-targets?q=${MARK}&limit=200`)
    expect(theirs.body.items.map((t: { id: number }) => t.id)).not.toContain(mine.body.id)
    const row = await db('blend_targets').where({ id: mine.body.id }).first('org_id')
    expect(row.org_id).toBe(await orgId('quillhurst'))
  })
})
