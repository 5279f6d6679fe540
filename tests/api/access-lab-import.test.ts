import { beforeAll } from 'vitest'
import { accessTable } from '../support/access'
import type { Caller } from '../support/http'
import { labImportFixtures } from '../support/labImport'

// Importing is a grower's: Hollowmere's owner and member map and import their own sheets, and Tansy
// Row's owner finds no sheet of Hollowmere's (404). Makers and their viewer, and the platform admin,
// are refused (403); a signed-out caller is asked to sign in (401). Every import acts on a fresh
// sheet, so each caller's answer depends only on who they are.
const { lot, sheet } = labImportFixtures('access lab import')
beforeAll(async () => {
  await lot('FX-101', 'Dabinett', '2025-10-01')
})

type Expect = Record<Caller, number>
const grower = (own: number, other: number): Expect => ({
  anonymous: 401, growerOwner: own, growerMember: own, grower2Owner: other, makerOwner: 403, makerViewer: 403, maker2Owner: 403, admin: 403,
})
const csv = new TextEncoder().encode('Lot,Date,Brix\nFX-101,2025-10-12,12.0\n')
const ownSheet = (suffix: string) => async () => `/api/lab-sheets/${await sheet('access.csv', { bytes: csv })}${suffix}`
const theirSheet = (suffix: string) => async () => `/api/lab-sheets/${await sheet('access.csv', { bytes: csv, org: 'tansyRow' })}${suffix}`
const body = { mapping: { lotCode: 'Lot', sampledOn: 'Date', brix: 'Brix' } }

accessTable('lab sheet import', [
  { route: 'GET /api/lab-sheets/:id/mapping', path: ownSheet('/mapping'), expect: grower(200, 404) },
  { route: 'GET /api/lab-sheets/:id/mapping (another organisation\'s)', path: theirSheet('/mapping'), expect: grower(404, 200) },
  { route: 'POST /api/lab-sheets/:id/import', path: ownSheet('/import'), body, expect: grower(200, 404) },
  { route: 'POST /api/lab-sheets/:id/import (another organisation\'s)', path: theirSheet('/import'), body, expect: grower(404, 422) },
])
