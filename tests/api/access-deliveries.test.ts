import { beforeAll } from 'vitest'
import { accessTable } from '../support/access'
import { deliveryFixtures } from '../support/deliveries'
import { as, type Caller } from '../support/http'

// Deliveries are Quillhurst's (the maker) and Tansy Row's (the grower) here. Both parties read
// them; the maker's owners and members record, correct and settle (a grower is refused by kind,
// 403); either party's owners and members dispute, and only the side that disputed withdraws it
// (the other side 403). Viewers read and never write (403). Anyone else's answer is 404, never 403,
// the platform admin's 403 (it has no organisation) and a signed-out caller's 401. Each move acts
// on a fresh delivery in the state it starts from, so every answer depends only on who asks.
const { contract, testedLot, record } = deliveryFixtures('T-ACD-')

let contractId: number
let lotId: number

beforeAll(async () => {
  contractId = await contract()
  lotId = await testedLot('tansyRow', 'Kingston Black', 12.0, 100_000)
})

/** A fresh delivery of 100 kg, recorded by Quillhurst's owner; then disputed by `disputedBy`, or settled. */
async function fresh(then?: 'disputed by the grower' | 'disputed by the maker' | 'settled'): Promise<number> {
  const { status, body } = await record(await as('makerOwner'), { fruitContractId: contractId, lotId, netKg: 100 })
  if (status !== 201) throw new Error(`could not record a delivery: ${JSON.stringify(body)}`)
  if (then === 'settled') await (await as('makerOwner')).post(`/api/deliveries/${body.id}/settle`, {})
  if (then?.startsWith('disputed')) {
    const who = then === 'disputed by the grower' ? 'grower2Owner' : 'makerOwner'
    await (await as(who)).post(`/api/deliveries/${body.id}/dispute`, { reason: 'The ticket is wrong' })
  }
  return body.id
}

const path = (then?: Parameters<typeof fresh>[0], action = '') => async () => `/api/deliveries/${await fresh(then)}${action}`

type Expect = Record<Caller, number>
const outsiders = { anonymous: 401, admin: 403, growerOwner: 404, growerMember: 404, maker2Owner: 404 } as const
const parties: Expect = { ...outsiders, grower2Owner: 200, makerOwner: 200, makerViewer: 200 }
/** The maker's moves: a grower is refused by its kind before anything is looked up. */
const makersMove = (ok: number): Expect => ({ ...outsiders, growerOwner: 403, growerMember: 403, grower2Owner: 403, makerOwner: ok, makerViewer: 403 })

accessTable('deliveries', [
  { route: 'GET /api/deliveries', expect: { ...parties, growerOwner: 200, growerMember: 200, maker2Owner: 200 } },
  // Marrowby records against none of its own contracts: Quillhurst's is not there for it (404).
  { route: 'POST /api/deliveries', body: () => ({ fruitContractId: contractId, lotId, deliveredOn: '2026-10-20', netKg: 100 }), expect: makersMove(201) },
  { route: 'GET /api/deliveries/:id', path: path(), expect: parties },
  { route: 'PATCH /api/deliveries/:id', path: path(), body: { netKg: 90 }, expect: makersMove(200) },
  { route: 'PATCH /api/deliveries/:id (settled)', path: path('settled'), body: { netKg: 90 }, expect: makersMove(409) },
  { route: 'POST /api/deliveries/:id/dispute', path: path(undefined, '/dispute'), body: { reason: 'Two bins short' }, expect: { ...parties, makerViewer: 403 } },
  { route: 'POST /api/deliveries/:id/withdraw-dispute (the grower\'s)', path: path('disputed by the grower', '/withdraw-dispute'), expect: { ...parties, makerOwner: 403, makerViewer: 403 } },
  { route: 'POST /api/deliveries/:id/withdraw-dispute (the maker\'s)', path: path('disputed by the maker', '/withdraw-dispute'), expect: { ...parties, grower2Owner: 403, makerViewer: 403 } },
  { route: 'POST /api/deliveries/:id/settle', path: path(undefined, '/settle'), expect: makersMove(200) },
  { route: 'POST /api/deliveries/:id/settle (disputed)', path: path('disputed by the grower', '/settle'), expect: makersMove(409) },
])
