import { beforeAll } from 'vitest'
import { accessTable } from '../support/access'
import { statementFixtures } from '../support/statements'

// Self-billing statements are the two parties' alone: every role of the maker (Quillhurst) and of the
// grower (Hollowmere) reads them, as JSON or CSV; another organisation's caller finds nothing there
// (404, never 403); the platform admin, having no organisation, is refused (403); a signed-out
// caller is asked to sign in (401). The list of seasons answers every member, each its own.
const { contract, delivery } = statementFixtures('T-SBA-')

let contractId: number
let deliveryId: number

beforeAll(async () => {
  contractId = await contract([2025])
  deliveryId = await delivery(contractId, { netKg: 4_000, brix: 11.5, deliveredOn: '2025-10-03' })
})

const everyMember = { anonymous: 401, growerOwner: 200, growerMember: 200, grower2Owner: 200, makerOwner: 200, makerViewer: 200, maker2Owner: 200, admin: 403 } as const
const parties = { ...everyMember, grower2Owner: 404, maker2Owner: 404 } as const
const nobody = { ...everyMember, growerOwner: 404, growerMember: 404, grower2Owner: 404, makerOwner: 404, makerViewer: 404, maker2Owner: 404 } as const

accessTable('self-billing statements', [
  { route: 'GET /api/statements', expect: everyMember },
  { route: 'GET /api/statements?season=2025', expect: everyMember },
  { route: 'GET /api/statements (a season)', path: () => `/api/statements?season=2025&contractId=${contractId}`, expect: parties },
  { route: 'GET /api/statements (a season as CSV)', path: () => `/api/statements?season=2025&contractId=${contractId}&format=csv`, expect: parties },
  { route: 'GET /api/statements (an unknown contract)', path: () => '/api/statements?season=2025&contractId=999999999', expect: nobody },
  { route: 'GET /api/deliveries/:id/statement', path: () => `/api/deliveries/${deliveryId}/statement`, expect: parties },
  { route: 'GET /api/deliveries/:id/statement (as CSV)', path: () => `/api/deliveries/${deliveryId}/statement?format=csv`, expect: parties },
  { route: 'GET /api/deliveries/:id/statement (an unknown delivery)', path: () => '/api/deliveries/999999999/statement', expect: nobody },
])
