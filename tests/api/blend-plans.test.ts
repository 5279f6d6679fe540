import { describe, expect, it } from 'vitest'
import { testDb } from '../support/db'
import { blendPlanFixtures } from '../support/blendPlans'
import { as } from '../support/http'

// Quillhurst's blend plans over this file's own Tansy Row lots. Every lot reads 12.0 °Brix, so it
// costs the contract's base £210.00 a tonne, and Quillhurst's press yields 750 L a tonne (the demo's
// setting): 300 L of juice is 400 kg of fruit, 75 L is 100 kg (kg = L ÷ 750 × 1000, worked by hand).
const db = testDb()
const MARK = 'T-BPL-'
const { lot, planBody, draft, committed, reservedKg, freeKg } = blendPlanFixtures(MARK)

const issuePaths = (body: { data?: { issues?: { path: string }[] } }) => (body.data?.issues ?? []).map(i => i.path)
const pressBody = (lots: { lotId: number, kg: number }[]) => ({ pressedOn: '2026-11-25', litresPressed: 300, vessel: 'Tank 2', lots })

describe('saving and editing a draft', () => {
  it('saves the solve request with its answer, and lets owners and members make the draft\'s moves', async () => {
    const lotId = await lot(1000)
    const res = await (await as('makerOwner')).post('/api/blend-plans', planBody('draft', 300, [lotId]))
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    // 300 L at 750 L/t is 400 kg; 0.4 t × £210.00 = £84.00 = 8,400 p.
    expect(res.body).toMatchObject({ state: 'draft', status: 'optimal', volumeL: 300, cost: 8400, currency: 'GBP', version: 1, lots: [], pressing: null })
    expect(res.body.result.lines).toMatchObject([{ lotId, kg: 400, litres: 300 }])
    expect(res.body.moves).toEqual(['edit', 'commit', 'delete'])
    expect(res.body.history).toMatchObject([{ action: 'saved', toState: 'draft', byName: 'Olu Brandt' }])
    const viewer = await (await as('makerViewer')).get(`/api/blend-plans/${res.body.id}`)
    expect(viewer.status).toBe(200)
    expect(viewer.body.moves).toEqual([])
    const list = await (await as('makerViewer')).get('/api/blend-plans?state=draft&q=T-BPL-draft')
    expect(list.body.items.map((p: { id: number }) => p.id)).toContain(res.body.id)
  })

  it('solves a changed request again while a draft, and refuses a change once committed (409 with the state)', async () => {
    const lotId = await lot(1000)
    const id = await draft(300, [lotId])
    const maker = await as('makerOwner')
    const changed = await maker.patch(`/api/blend-plans/${id}`, { name: `${MARK}bigger`, request: { volumeL: 450, lots: [{ lotId }] } })
    expect(changed.status, JSON.stringify(changed.body)).toBe(200)
    // 450 L is 600 kg.
    expect(changed.body).toMatchObject({ name: `${MARK}bigger`, version: 2, volumeL: 450 })
    expect(changed.body.result.lines).toMatchObject([{ lotId, kg: 600 }])
    expect((await maker.post(`/api/blend-plans/${id}/commit`, {})).status).toBe(200)
    const refused = await maker.patch(`/api/blend-plans/${id}`, { name: `${MARK}late` })
    expect(refused.status).toBe(409)
    expect(refused.body.data.state).toBe('committed')
    const deleted = await maker.request('DELETE', `/api/blend-plans/${id}`)
    expect(deleted.status).toBe(409)
  })

  it('deletes a draft', async () => {
    const id = await draft(75, [await lot(1000)])
    const maker = await as('makerOwner')
    expect((await maker.request('DELETE', `/api/blend-plans/${id}`)).status).toBe(204)
    expect((await maker.get(`/api/blend-plans/${id}`)).status).toBe(404)
  })

  it('answers 400 naming the fields', async () => {
    const maker = await as('makerOwner')
    const lotId = await lot(1000)
    const noName = await maker.post('/api/blend-plans', { request: { volumeL: 75, lots: [{ lotId }] } })
    expect(noName.status).toBe(400)
    expect(issuePaths(noName.body)).toContain('name')
    const badVolume = await maker.post('/api/blend-plans', { name: `${MARK}x`, request: { volumeL: -5, lots: [] } })
    expect(badVolume.status).toBe(400)
    expect(issuePaths(badVolume.body)).toEqual(expect.arrayContaining(['request.volumeL', 'request.lots']))
    const id = await committed(75, [lotId])
    const badPress = await maker.post(`/api/blend-plans/${id}/press`, { pressedOn: '2026-13-01', litresPressed: 0, lots: [{ lotId, kg: -1 }] })
    expect(badPress.status).toBe(400)
    expect(issuePaths(badPress.body)).toEqual(expect.arrayContaining(['pressedOn', 'litresPressed', 'vessel', 'lots.0.kg']))
    const stranger = await maker.post(`/api/blend-plans/${id}/press`, pressBody([{ lotId: await lot(500), kg: 10 }]))
    expect(stranger.status).toBe(400)
    expect(issuePaths(stranger.body)).toEqual(['lots.0.lotId'])
  })

  it('answers 404 for another maker\'s plan', async () => {
    const id = await draft(75, [await lot(1000)])
    expect((await (await as('maker2Owner')).get(`/api/blend-plans/${id}`)).status).toBe(404)
    expect((await (await as('maker2Owner')).post(`/api/blend-plans/${id}/commit`, {})).status).toBe(404)
  })
})

describe('committing holds the fruit', () => {
  it('never lets ten plans committed at once hold more of one lot than is free (the sum checked in the database)', async () => {
    const lotId = await lot(1000)
    // Each plan wants 300 L, 400 kg: two fit in 1,000 kg, a third does not.
    const ids = await Promise.all(Array.from({ length: 10 }, () => draft(300, [lotId])))
    const maker = await as('makerOwner')
    const answers = await Promise.all(ids.map(id => maker.post(`/api/blend-plans/${id}/commit`, {})))
    const statuses = answers.map(a => a.status)
    expect(statuses.filter(s => s === 200)).toHaveLength(2)
    expect(statuses.filter(s => s === 409)).toHaveLength(8)
    expect(await reservedKg(lotId)).toBe(800)
    expect(await reservedKg(lotId)).toBeLessThanOrEqual(1000)
    for (const refused of answers.filter(a => a.status === 409)) {
      expect(refused.body.data.state).toBe('draft')
      expect(refused.body.data.lots).toEqual([{ lotId, code: expect.stringMatching(/^T-BPL-/), freeKg: 200 }])
      expect(refused.body.message).toContain('200 kg free')
    }
    expect(await freeKg(lotId)).toBe(200)
  })

  it('offers a partly reserved lot\'s free kg to the next solve, and a commit that no longer fits reserves nothing', async () => {
    const lotId = await lot(1000)
    const late = await draft(300, [lotId])
    await committed(600, [lotId]) // 800 kg held
    // The next solve sees 200 kg: 150 L at most, so the nearest mix.
    const solve = await (await as('makerOwner')).post('/api/blends/solve', { volumeL: 300, lots: [{ lotId }] })
    expect(solve.body.status).toBe('nearest')
    expect(solve.body.lines).toMatchObject([{ lotId, kg: 200, freeKg: 200 }])
    const res = await (await as('makerOwner')).post(`/api/blend-plans/${late}/commit`, {})
    expect(res.status).toBe(409)
    expect(res.body.data.lots).toMatchObject([{ lotId, freeKg: 200 }])
    expect(await db('blend_plan_lots').where({ plan_id: late }).count({ n: '*' })).toEqual([{ n: 0 }])
    expect((await db('blend_plans').where({ id: late }).first('state')).state).toBe('draft')
    expect(await reservedKg(lotId)).toBe(800)
  })

  it('frees the kg again on release', async () => {
    const lotId = await lot(1000)
    const id = await committed(300, [lotId])
    expect(await freeKg(lotId)).toBe(600)
    const res = await (await as('makerOwner')).post(`/api/blend-plans/${id}/release`, {})
    expect(res.status).toBe(200)
    expect(res.body.state).toBe('released')
    expect(await freeKg(lotId)).toBe(1000)
    expect(await reservedKg(lotId)).toBe(0)
    const again = await (await as('makerOwner')).post(`/api/blend-plans/${id}/release`, {})
    expect(again.status).toBe(409)
    expect(again.body.data.state).toBe('released')
  })
})

describe('pressing', () => {
  it('refuses a lot still at the grower\'s (409 naming it)', async () => {
    const lotId = await lot(1000)
    const id = await committed(300, [lotId])
    const code = (await db('harvest_lots').where({ id: lotId }).first('code')).code
    const res = await (await as('makerOwner')).post(`/api/blend-plans/${id}/press`, pressBody([{ lotId, kg: 400 }]))
    expect(res.status).toBe(409)
    expect(res.body.message).toContain(code)
    expect(res.body.message).toContain('still at the grower')
    expect((await db('blend_plans').where({ id }).first('state')).state).toBe('committed')
    expect(await db('pressings').where({ plan_id: id }).count({ n: '*' })).toEqual([{ n: 0 }])
  })

  it('takes the pressed kg out of the lot, which may differ from the plan, and a wholly pressed lot is pressed', async () => {
    const lotId = await lot(1000, { delivered: true })
    const first = await committed(300, [lotId]) // 400 kg held
    const maker = await as('makerOwner')
    const res = await maker.post(`/api/blend-plans/${first}/press`, pressBody([{ lotId, kg: 420 }]))
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    expect(res.body.state).toBe('pressed')
    expect(res.body.pressing).toMatchObject({ pressedOn: '2026-11-25', litresPressed: 300, vessel: 'Tank 2', lots: [{ lotId, kg: 420, position: 1 }] })
    expect(res.body.lots).toMatchObject([{ lotId, kg: 400 }]) // planned against the 420 taken
    // 1,000 kg weighed in − 420 kg pressed; the plan's 400 kg no longer held.
    expect(await freeKg(lotId)).toBe(580)
    expect(await reservedKg(lotId)).toBe(0)
    const rest = await committed(435, [lotId]) // 580 kg
    const tooMuch = await maker.post(`/api/blend-plans/${rest}/press`, pressBody([{ lotId, kg: 600 }]))
    expect(tooMuch.status).toBe(400)
    expect(issuePaths(tooMuch.body)).toEqual(['lots.0.kg'])
    expect((await maker.post(`/api/blend-plans/${rest}/press`, pressBody([{ lotId, kg: 580 }]))).status).toBe(201)
    expect((await db('harvest_lots').where({ id: lotId }).first('state')).state).toBe('pressed')
    expect(await freeKg(lotId)).toBe(0)
  })
})

describe('the trace', () => {
  it('answers the same in both directions, and the grower sees only who pressed its lot and when', async () => {
    const a = await lot(1000, { delivered: true })
    const b = await lot(800, { delivered: true })
    const id = await committed(600, [a, b])
    const maker = await as('makerOwner')
    const pressed = await maker.post(`/api/blend-plans/${id}/press`, pressBody([{ lotId: b, kg: 300 }, { lotId: a, kg: 500 }]))
    expect(pressed.status, JSON.stringify(pressed.body)).toBe(201)
    const pressingId = pressed.body.pressing.id as number

    const back = await maker.get(`/api/pressings/${pressingId}/trace`)
    expect(back.status).toBe(200)
    expect(back.body.lots).toMatchObject([
      { lotId: b, kg: 300, position: 1, grower: { name: 'Tansy Row Fruit' }, variety: { name: 'Kingston Black' }, deliveries: [{ netKg: 800 }] },
      { lotId: a, kg: 500, position: 2, grower: { name: 'Tansy Row Fruit' }, deliveries: [{ netKg: 1000 }] },
    ])
    for (const source of back.body.lots as { lotId: number, kg: number }[]) {
      const forward = await maker.get(`/api/lots/${source.lotId}/trace`)
      expect(forward.body.view).toBe('maker')
      expect(forward.body.pressings).toContainEqual(expect.objectContaining({ id: pressingId, planId: id, kg: source.kg, vessel: 'Tank 2' }))
      expect(forward.body.plans).toContainEqual(expect.objectContaining({ id, state: 'pressed' }))
    }
    const forwardA = await maker.get(`/api/lots/${a}/trace`)
    for (const p of forwardA.body.pressings as { id: number, kg: number }[]) {
      const trace = await maker.get(`/api/pressings/${p.id}/trace`)
      expect(trace.body.lots).toContainEqual(expect.objectContaining({ lotId: a, kg: p.kg }))
    }

    const grower = await (await as('grower2Owner')).get(`/api/lots/${a}/trace`)
    expect(grower.status).toBe(200)
    expect(grower.body).toEqual({
      lotId: a, code: expect.any(String), view: 'grower', plans: [],
      pressings: [{ id: null, planId: null, makerName: 'Quillhurst Cider Works', pressedOn: '2026-11-25', kg: 500, vessel: null, litresPressed: null }],
    })
    expect((await (await as('grower2Owner')).get(`/api/pressings/${pressingId}/trace`)).status).toBe(403)
    expect((await (await as('maker2Owner')).get(`/api/pressings/${pressingId}/trace`)).status).toBe(404)
    expect((await (await as('growerOwner')).get(`/api/lots/${a}/trace`)).status).toBe(404)
  })
})
