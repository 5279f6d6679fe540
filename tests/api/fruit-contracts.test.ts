import { describe, expect, it } from 'vitest'
import { contractFixtures, orgId, userId, varietyId } from '../support/contracts'
import { testDb } from '../support/db'
import { as } from '../support/http'

// Fruit contracts through the API: a maker's offer to a grower by juice class or one variety, the
// schedule of tonnes per harvest year, the counter and acceptance, the settlement examples both
// parties see before they accept, and the fulfilment once the last delivery window has closed.
const MARK = 'Fruit flow'
const { fruitContract } = contractFixtures(MARK)
const db = testDb()
const year = new Date().getUTCFullYear() + 1

const window = (y: number) => ({ windowFrom: `${y}-10-01`, windowTo: `${y}-11-15` })

async function draftBody(extra: Record<string, unknown> = {}) {
  return {
    growerOrgId: await orgId('tansyRow'), species: 'apple', juiceClass: 'bittersharp',
    schedule: [{ year, tonnes: 20, ...window(year) }, { year: year + 1, tonnes: 25.5, ...window(year + 1) }],
    tolerancePct: 10, basePricePerTonneMinor: 21000, baselineBrix: 12, bonusPerBrixPerTonneMinor: 800, deductionPerBrixPerTonneMinor: 1200,
    rejectFloorBrix: 9.5, maxRotPct: 5, cropFailure: 'carried', notes: `${MARK} draft`, ...extra,
  }
}

describe('fruit contracts', () => {
  it('drafts, offers, counters and accepts, with the settlement examples and the history', async () => {
    const maker = await as('makerOwner')
    const grower = await as('grower2Owner')
    const created = await maker.post('/api/fruit-contracts', await draftBody())
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    const id = created.body.id
    expect(created.body).toMatchObject({
      state: 'draft', version: 0, side: 'maker', makerOrgName: 'Quillhurst Cider Works', growerOrgName: 'Tansy Row Fruit',
      fruitClass: 'bittersharp', totalTonnes: 45.5, cropFailure: 'carried', coverageWarning: null,
    })
    expect(created.body.schedule).toEqual([{ year, tonnes: 20, ...window(year) }, { year: year + 1, tonnes: 25.5, ...window(year + 1) }])
    // 10 t at £210/t: £2,100 at 12.0 °Brix; +1 °Brix earns £8 a tonne more, £2,180; 9.4 °Brix is under the floor, rejected.
    expect(created.body.settlementExamples.map((e: { brix: number, settlement: { totalMinor: number, rejected: boolean } }) => [e.brix, e.settlement.totalMinor, e.settlement.rejected]))
      .toEqual([[12, 210_000, false], [13, 218_000, false], [9.4, 0, true]])

    expect((await grower.get(`/api/fruit-contracts/${id}`)).status).toBe(404)
    expect((await maker.post(`/api/fruit-contracts/${id}/offer`)).body).toMatchObject({ state: 'offered', version: 1 })
    const seen = await grower.get(`/api/fruit-contracts/${id}`)
    expect(seen.body).toMatchObject({ side: 'grower', awaiting: 'you' })
    expect(Array.isArray(seen.body.coverageWarning)).toBe(true)
    const notices = await db('notices').where({ user_id: await userId('grower2@demo.test'), link: `/contracts/fruit/${id}` }).select('kind')
    expect(notices).toEqual([{ kind: 'fruit_contract.offered' }])

    const schedule = [{ year, tonnes: 18, ...window(year) }, { year: year + 1, tonnes: 25.5, ...window(year + 1) }]
    const countered = await grower.post(`/api/fruit-contracts/${id}/counter`, { schedule, basePricePerTonneMinor: 22000 })
    expect(countered.status, JSON.stringify(countered.body)).toBe(200)
    expect(countered.body).toMatchObject({ state: 'countered', version: 2, totalTonnes: 43.5, basePricePerTonneMinor: 22000 })

    expect((await maker.post(`/api/fruit-contracts/${id}/accept`, { version: 1 })).status).toBe(409)
    const accepted = await maker.post(`/api/fruit-contracts/${id}/accept`, { version: 2 })
    expect(accepted.body).toMatchObject({ state: 'accepted', acceptedVersion: 2 })

    const history = (await grower.get(`/api/fruit-contracts/${id}/history`)).body
    // The grower never saw the maker's draft: its history starts at the offer.
    expect(history.items.map((e: { action: string }) => e.action)).toEqual(['offered', 'countered', 'accepted'])
    expect((await maker.get(`/api/fruit-contracts/${id}/history`)).body.items[0].action).toBe('created')
    expect(history.items[1].changes).toEqual([
      { field: 'basePricePerTonneMinor', from: 21000, to: 22000 },
      { field: 'schedule', from: [{ year, tonnes: 20, ...window(year) }, { year: year + 1, tonnes: 25.5, ...window(year + 1) }], to: schedule },
    ])
  })

  it('contracts for one variety take its class from the catalogue', async () => {
    const maker = await as('makerOwner')
    const created = await maker.post('/api/fruit-contracts', await draftBody({ species: undefined, juiceClass: undefined, varietyId: await varietyId('Dabinett') }))
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    expect(created.body).toMatchObject({ varietyName: 'Dabinett', fruitClass: 'bittersweet', juiceClass: null })
    const both = await maker.post('/api/fruit-contracts', await draftBody({ varietyId: await varietyId('Dabinett') }))
    expect(both.status).toBe(400)
    expect(both.body.data.issues[0].path).toBe('juiceClass')
  })

  it('refuses bad terms naming the field', async () => {
    const maker = await as('makerOwner')
    const cases: [Record<string, unknown>, string][] = [
      [{ rejectFloorBrix: 13 }, 'rejectFloorBrix'],
      [{ schedule: [] }, 'schedule'],
      [{ schedule: [{ year, tonnes: 5, ...window(year) }, { year, tonnes: 6, ...window(year) }] }, 'schedule.1.year'],
      [{ schedule: [{ year, tonnes: 5, windowFrom: `${year}-11-01`, windowTo: `${year}-10-01` }] }, 'schedule.0.windowTo'],
      [{ basePricePerTonneMinor: 210.5 }, 'basePricePerTonneMinor'],
      [{ juiceClass: 'fizzy' }, 'juiceClass'],
      [{ growerOrgId: await orgId('marrowby') }, 'growerOrgId'],
      [{ tolerancePct: 60 }, 'tolerancePct'],
      [{ schedule: [{ year, tonnes: 5, ...window(year), price: 1 }] }, 'schedule.0.price'],
    ]
    for (const [change, path] of cases) {
      const res = await maker.post('/api/fruit-contracts', await draftBody(change))
      expect(res.status, `${JSON.stringify(change)} → ${JSON.stringify(res.body)}`).toBe(400)
      expect(res.body.data.issues.map((i: { path: string }) => i.path), JSON.stringify(change)).toContain(path)
    }
  })

  it('is fulfilled once its last delivery window has closed', async () => {
    const id = await fruitContract('accepted', {}, [2024, 2025])
    let state = ''
    for (let i = 0; i < 40 && state !== 'fulfilled'; i++) {
      await new Promise(r => setTimeout(r, 250))
      state = (await db('fruit_contracts').where({ id }).first('state')).state
    }
    expect(state).toBe('fulfilled')
    const body = (await (await as('makerOwner')).get(`/api/fruit-contracts/${id}/history`)).body
    expect(body.items.map((e: { action: string, byName: string }) => [e.action, e.byName])).toEqual([['fulfilled', 'Pomewright']])
    // Still open: a window that closes later keeps it accepted.
    const open = await fruitContract('accepted')
    await new Promise(r => setTimeout(r, 1200))
    expect((await db('fruit_contracts').where({ id: open }).first('state')).state).toBe('accepted')
  })

  it('the maker may withdraw its offer; the grower declines instead', async () => {
    const id = await fruitContract('offered')
    expect((await (await as('grower2Owner')).post(`/api/fruit-contracts/${id}/cancel`)).status).toBe(409)
    const withdrawn = await (await as('makerOwner')).post(`/api/fruit-contracts/${id}/cancel`, { reason: 'Pressing plans changed.' })
    expect(withdrawn.body).toMatchObject({ state: 'cancelled', cancelledBy: null })
    expect((await (await as('grower2Owner')).post(`/api/fruit-contracts/${id}/decline`)).body.data.state).toBe('cancelled')
  })
})
