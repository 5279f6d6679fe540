import { describe, expect, it } from 'vitest'
import { contractFixtures, orgId, rootstockId, userId, varietyId } from '../support/contracts'
import { testDb } from '../support/db'
import { as } from '../support/http'
import { nurseryFixtures } from '../support/nursery'

// The whole life of a tree contract through the API: draft, offer, counter, acceptance, the
// nursery's work and the delivery, with the history, the notices and every refusal on the way.
const MARK = 'Tree flow'
const { treeContract } = contractFixtures(MARK)
const { dugRun } = nurseryFixtures(MARK)
const db = testDb()
const year = new Date().getUTCFullYear() + 2
const todayIso = () => new Date().toISOString().slice(0, 10)

async function draftBody(extra: Record<string, unknown> = {}) {
  return {
    nurseryOrgId: await orgId('hollowmere'), varietyId: await varietyId('Dabinett'), rootstockId: await rootstockId('MM.106'),
    treeCount: 1000, deliveryYear: year, deliverySeason: 'spring', unitPriceMinor: 1450, depositPct: 20, notes: `${MARK} draft`, ...extra,
  }
}

async function noticesOf(email: string, contractId: number) {
  return db('notices').where({ user_id: await userId(email), link: `/contracts/tree/${contractId}` }).orderBy('id').select('kind', 'subject')
}

describe('tree contracts: the negotiation', () => {
  it('drafts, edits, offers, counters and accepts, with the history and the notices', async () => {
    const maker = await as('makerOwner')
    const nursery = await as('growerOwner')

    const created = await maker.post('/api/tree-contracts', await draftBody())
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    const id = created.body.id as number
    expect(created.body).toMatchObject({
      state: 'draft', version: 0, side: 'buyer', draftedBy: 'buyer', buyerOrgId: await orgId('quillhurst'), nurseryOrgId: await orgId('hollowmere'),
      varietyName: 'Dabinett', rootstockDesignation: 'MM.106', rootstockNeedsSupport: false, treeType: 'maiden', currency: 'GBP', awaiting: null,
    })
    expect(created.body.moves.map((m: { action: string }) => m.action)).toEqual(['edit', 'offer', 'cancel'])
    // 1000 × £14.50 = £14,500; a 20 % deposit is £2,900.
    expect(created.body.money).toMatchObject({ treesMinor: 1_450_000, royaltyMinor: 0, totalMinor: 1_450_000, depositMinor: 290_000, balanceMinor: 1_160_000 })
    // ceil(1000 ÷ (0.85 × 0.9)) = ceil(1307.19…) = 1308 rootstocks to bud.
    expect(created.body.backPlan.rootstocksToBud).toBe(1308)

    // The nursery does not see the buyer's draft, in the list or by id.
    expect((await nursery.get(`/api/tree-contracts/${id}`)).status).toBe(404)
    expect(((await nursery.get('/api/tree-contracts?limit=200')).body.items as { id: number }[]).some(c => c.id === id)).toBe(false)

    const edited = await maker.patch(`/api/tree-contracts/${id}`, { treeCount: 1200, id: 999, state: 'accepted', version: 7, money: {} })
    expect(edited.status, JSON.stringify(edited.body)).toBe(200)
    expect(edited.body).toMatchObject({ id, treeCount: 1200, state: 'draft', version: 0 })

    const offered = await maker.post(`/api/tree-contracts/${id}/offer`)
    expect(offered.status, JSON.stringify(offered.body)).toBe(200)
    expect(offered.body).toMatchObject({ state: 'offered', version: 1, lastOfferBy: 'buyer', awaiting: 'them' })
    expect(offered.body.moves.map((m: { action: string }) => m.action)).toEqual(['cancel'])

    const seen = await nursery.get(`/api/tree-contracts/${id}`)
    expect(seen.body).toMatchObject({ state: 'offered', side: 'nursery', awaiting: 'you' })
    expect(seen.body.moves.map((m: { action: string }) => m.action)).toEqual(['counter', 'accept', 'decline'])
    // Both the nursery's owner and its member are told; the buyer's own people are not.
    expect(await noticesOf('grower@demo.test', id)).toEqual([expect.objectContaining({ kind: 'tree_contract.offered' })])
    expect(await noticesOf('grower-member@demo.test', id)).toHaveLength(1)
    expect(await noticesOf('maker@demo.test', id)).toHaveLength(0)

    // The buyer may not accept its own offer; the nursery's member may not counter (owners do).
    expect((await maker.post(`/api/tree-contracts/${id}/accept`, { version: 1 })).status).toBe(409)
    expect((await (await as('growerMember')).post(`/api/tree-contracts/${id}/counter`, { unitPriceMinor: 1600 })).status).toBe(403)

    // A counter that changes nothing is refused, naming the field.
    const same = await nursery.post(`/api/tree-contracts/${id}/counter`, { unitPriceMinor: 1450 })
    expect(same.status).toBe(400)
    expect(same.body.data.issues[0]).toMatchObject({ path: 'unitPriceMinor', message: 'A counter-offer changes at least one term' })

    const countered = await nursery.post(`/api/tree-contracts/${id}/counter`, { unitPriceMinor: 1600, takeRate: 0.8 })
    expect(countered.status, JSON.stringify(countered.body)).toBe(200)
    expect(countered.body).toMatchObject({ state: 'countered', version: 2, lastOfferBy: 'nursery', unitPriceMinor: 1600, awaiting: 'them' })

    // A counter to a counter: the state stays countered and the turn passes.
    const back = await maker.post(`/api/tree-contracts/${id}/counter`, { unitPriceMinor: 1550 })
    expect(back.body).toMatchObject({ state: 'countered', version: 3, lastOfferBy: 'buyer' })

    // Accepting terms not read: version 2 is not the one standing.
    const stale = await nursery.post(`/api/tree-contracts/${id}/accept`, { version: 2 })
    expect(stale.status).toBe(409)
    expect(stale.body.data).toMatchObject({ state: 'countered', version: 3 })

    const accepted = await nursery.post(`/api/tree-contracts/${id}/accept`, { version: 3 })
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200)
    expect(accepted.body).toMatchObject({ state: 'accepted', version: 3, acceptedVersion: 3, unitPriceMinor: 1550 })

    const history = await maker.get(`/api/tree-contracts/${id}/history`)
    expect(history.status).toBe(200)
    expect(history.body.total).toBe(6)
    expect(history.body.items.map((e: { action: string, version: number }) => [e.action, e.version])).toEqual([
      ['created', 0], ['edited', 0], ['offered', 1], ['countered', 2], ['countered', 3], ['accepted', 3],
    ])
    expect(history.body.items[1].changes).toEqual([{ field: 'treeCount', from: 1000, to: 1200 }])
    expect(history.body.items[3]).toMatchObject({ byName: 'Ines Varga', byUserId: await userId('grower@demo.test'), changes: [{ field: 'unitPriceMinor', from: 1450, to: 1600 }, { field: 'takeRate', from: 0.85, to: 0.8 }] })
    expect(history.body.items[4].changes).toEqual([{ field: 'unitPriceMinor', from: 1600, to: 1550 }])
    expect(history.body.items[5]).toMatchObject({ byName: 'Ines Varga' })
    expect(typeof history.body.items[5].at).toBe('string')
    expect((await noticesOf('maker@demo.test', id)).map(n => n.kind)).toEqual(['tree_contract.countered', 'tree_contract.accepted'])
    // The nursery never saw the draft, so its history starts at the offer.
    const theirs = await nursery.get(`/api/tree-contracts/${id}/history`)
    expect(theirs.body.total).toBe(4)
    expect(theirs.body.items.map((e: { action: string }) => e.action)).toEqual(['offered', 'countered', 'countered', 'accepted'])

    // The nursery's work, then a short delivery: the balance is due pro rata.
    const member = await as('growerMember')
    expect((await member.post(`/api/tree-contracts/${id}/start-propagation`)).body.state).toBe('propagating')
    expect((await member.post(`/api/tree-contracts/${id}/mark-ready`)).body.state).toBe('ready')
    expect((await member.post(`/api/tree-contracts/${id}/deliver`, { deliveredCount: 1150, deliveredOn: todayIso() })).status).toBe(403)
    const over = await nursery.post(`/api/tree-contracts/${id}/deliver`, { deliveredCount: 1201, deliveredOn: todayIso() })
    expect(over.status).toBe(400)
    expect(over.body.data.issues[0].path).toBe('deliveredCount')
    // Trees are delivered from what the contract's runs have dug: 1,100 dug do not make 1,150.
    await dugRun(id, 1100)
    const short = await nursery.post(`/api/tree-contracts/${id}/deliver`, { deliveredCount: 1150, deliveredOn: todayIso() })
    expect(short.status).toBe(400)
    expect(short.body.data.issues[0]).toEqual({ path: 'deliveredCount', message: '1,100 trees have been dug from this contract\'s runs: deliver at most that many' })
    await dugRun(id, 50)
    const delivered = await nursery.post(`/api/tree-contracts/${id}/deliver`, { deliveredCount: 1150, deliveredOn: todayIso() })
    expect(delivered.status, JSON.stringify(delivered.body)).toBe(200)
    // 1200 × £15.50 = £18,600, deposit 20 % = £3,720; 1150 delivered × £15.50 = £17,825; balance £14,105.
    expect(delivered.body).toMatchObject({ state: 'delivered', deliveredCount: 1150, deliveredOn: todayIso() })
    expect(delivered.body.money).toMatchObject({ totalMinor: 1_860_000, depositMinor: 372_000, deliveredValueMinor: 1_782_500, balanceMinor: 1_410_500 })

    // Nothing moves a delivered contract: 409 naming the state.
    const late = await nursery.post(`/api/tree-contracts/${id}/cancel`)
    expect(late.status).toBe(409)
    expect(late.body.data.state).toBe('delivered')
  })

  it('refuses unknown keys by name and keeps the parties fixed', async () => {
    const maker = await as('makerOwner')
    const unknown = await maker.post('/api/tree-contracts', await draftBody({ colour: 'red' }))
    expect(unknown.status).toBe(400)
    expect(unknown.body.data.issues).toEqual([{ path: 'colour', message: 'Unknown field' }])
    const notNursery = await maker.post('/api/tree-contracts', await draftBody({ nurseryOrgId: await orgId('tansyRow') }))
    expect(notNursery.status).toBe(400)
    expect(notNursery.body.data.issues[0]).toMatchObject({ path: 'nurseryOrgId', message: 'Tansy Row Fruit does not run a nursery' })
    const pear = await maker.post('/api/tree-contracts', await draftBody({ rootstockId: await rootstockId('Quince A') }))
    expect(pear.status).toBe(400)
    expect(pear.body.data.issues[0].path).toBe('rootstockId')
    const past = await maker.post('/api/tree-contracts', await draftBody({ deliveryYear: 2020 }))
    expect(past.body.data.issues[0].path).toBe('deliveryYear')
  })

  it('lets the nursery draft for a buyer, and the buyer answer', async () => {
    const nursery = await as('growerOwner')
    const body = { ...await draftBody(), nurseryOrgId: undefined, buyerOrgId: await orgId('quillhurst') }
    const created = await nursery.post('/api/tree-contracts', body)
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    expect(created.body).toMatchObject({ draftedBy: 'nursery', side: 'nursery', buyerOrgId: await orgId('quillhurst') })
    const id = created.body.id
    expect((await (await as('makerOwner')).get(`/api/tree-contracts/${id}`)).status).toBe(404)
    expect((await nursery.post(`/api/tree-contracts/${id}/offer`)).status).toBe(200)
    const declined = await (await as('makerOwner')).post(`/api/tree-contracts/${id}/decline`, { reason: 'We plant a year later now.' })
    expect(declined.body.state).toBe('declined')
    const history = await nursery.get(`/api/tree-contracts/${id}/history`)
    expect(history.body.items.at(-1)).toMatchObject({ action: 'declined', reason: 'We plant a year later now.', byName: 'Olu Brandt' })
  })
})

describe('tree contracts: expiry, cancellation and races', () => {
  it('an expired offer cannot be accepted, shows as expired and is recorded once', async () => {
    const id = await treeContract('offered', { expires_on: '2026-01-31' })
    const nursery = await as('growerOwner')
    const seen = await nursery.get(`/api/tree-contracts/${id}`)
    expect(seen.body).toMatchObject({ expired: true, expiresOn: '2026-01-31' })
    expect(seen.body.moves.map((m: { action: string }) => m.action)).toEqual(['counter', 'decline'])
    const accept = await nursery.post(`/api/tree-contracts/${id}/accept`, { version: 1 })
    expect(accept.status).toBe(409)
    expect(accept.body.message).toMatch(/could be accepted until 2026-01-31 and has expired/)
    // The background clock records the expiry and tells both sides, once.
    let events: { action: string }[] = []
    for (let i = 0; i < 40 && !events.some(e => e.action === 'expired'); i++) {
      await new Promise(r => setTimeout(r, 250))
      events = await db('contract_events').where({ contract_kind: 'tree', contract_id: id }).select('action')
    }
    expect(events.filter(e => e.action === 'expired')).toHaveLength(1)
    expect(await noticesOf('maker@demo.test', id)).toEqual([expect.objectContaining({ kind: 'tree_contract.expired' })])
    expect(await noticesOf('grower@demo.test', id)).toEqual([expect.objectContaining({ kind: 'tree_contract.expired' })])
    // An offer may not be made to expire in the past.
    const draft = await treeContract('draft', { expires_on: '2026-01-31' })
    const refused = await (await as('makerOwner')).post(`/api/tree-contracts/${draft}/offer`)
    expect(refused.status).toBe(400)
    expect(refused.body.data.issues[0].path).toBe('expiresOn')
  })

  it('ten simultaneous acceptances leave one acceptance, one history entry and nine 409s', async () => {
    const id = await treeContract('offered')
    const nursery = await as('growerOwner')
    const answers = await Promise.all(Array.from({ length: 10 }, () => nursery.post(`/api/tree-contracts/${id}/accept`, { version: 1 })))
    const said = JSON.stringify(answers.filter(a => a.status !== 409).map(a => [a.status, a.body?.message]))
    expect(answers.filter(a => a.status === 200), said).toHaveLength(1)
    expect(answers.filter(a => a.status === 409), said).toHaveLength(9)
    expect(await db('contract_events').where({ contract_kind: 'tree', contract_id: id, action: 'accepted' }).count({ n: '*' })).toEqual([{ n: 1 }])
    expect((await db('tree_contracts').where({ id }).first('state', 'accepted_version'))).toEqual({ state: 'accepted', accepted_version: 1 })
  })

  it('the buyer may cancel only as long as the terms say; the deposit follows the terms', async () => {
    const maker = await as('makerOwner')
    const nursery = await as('growerOwner')
    const started = await treeContract('propagating', { buyer_may_cancel_until: 'accepted' })
    const refused = await maker.post(`/api/tree-contracts/${started}/cancel`)
    expect(refused.status).toBe(409)
    expect(refused.body.message).toMatch(/may cancel only until the contract is accepted/)

    const byBuyer = await treeContract('accepted')
    const kept = await maker.post(`/api/tree-contracts/${byBuyer}/cancel`, { reason: 'The site fell through.' })
    expect(kept.body).toMatchObject({ state: 'cancelled', cancelledBy: 'buyer' })
    // 100 × £14.50 = £1,450; 20 % deposit £290, kept by the nursery.
    expect(kept.body.money.depositOnCancel).toEqual({ outcome: 'kept', refundMinor: 0 })

    const byNursery = await treeContract('propagating', { deposit_if_nursery_cancels: 'doubled' })
    const doubled = await nursery.post(`/api/tree-contracts/${byNursery}/cancel`)
    expect(doubled.body).toMatchObject({ state: 'cancelled', cancelledBy: 'nursery' })
    expect(doubled.body.money.depositOnCancel).toEqual({ outcome: 'doubled', refundMinor: 58_000 })
  })

  it('warns when the delivery season is too close for the steps still to do', async () => {
    const thisYear = new Date().getUTCFullYear()
    const close = await treeContract('offered', { delivery_year: thisYear + 1, delivery_season: 'autumn' })
    const body = (await (await as('makerOwner')).get(`/api/tree-contracts/${close}`)).body
    // Autumn delivery next year: liners lined out by 30 April this year, already past in December.
    expect(body.backPlan.steps[0]).toEqual({ step: 'linersPlanted', by: `${thisYear}-04-30` })
    expect(body.backPlan.warning).toMatch(/too close/)
    const far = await treeContract('offered', { delivery_year: thisYear + 3 })
    expect((await (await as('makerOwner')).get(`/api/tree-contracts/${far}`)).body.backPlan.warning).toBeNull()
  })

  it('filters the list by state, counterparty and year', async () => {
    const id = await treeContract('accepted', { delivery_year: year + 1 })
    const maker = await as('makerOwner')
    const hollowmere = await orgId('hollowmere')
    const found = await maker.get(`/api/tree-contracts?state=accepted&counterpartyId=${hollowmere}&year=${year + 1}`)
    expect(found.status).toBe(200)
    expect(found.body.items.map((c: { id: number }) => c.id)).toContain(id)
    expect(found.body.items.every((c: { state: string, deliveryYear: number }) => c.state === 'accepted' && c.deliveryYear === year + 1)).toBe(true)
    expect((await maker.get(`/api/tree-contracts?counterpartyId=${await orgId('tansyRow')}`)).body.items.some((c: { id: number }) => c.id === id)).toBe(false)
    expect((await maker.get('/api/tree-contracts?state=ripe')).status).toBe(400)
  })
})
