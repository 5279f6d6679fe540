import { describe, expect, it } from 'vitest'
import { as, CALLERS, type Caller } from './http'

export interface AccessRow {
  /** e.g. 'GET /api/members' */
  route: string
  /** Request body for writes (a valid one, so only access decides the answer). */
  body?: unknown | (() => unknown | Promise<unknown>)
  /** Path, when it depends on data made at run time. */
  path?: () => string | Promise<string>
  /** The status each caller must get; every caller must be listed. */
  expect: Record<Caller, number>
}

/**
 * The access-control table: every route, every kind of caller. Another tenant's object must answer
 * 404 (never 403), a signed-out caller 401, a wrong role or organisation kind 403.
 */
export function accessTable(title: string, rows: AccessRow[]) {
  describe(`access control: ${title}`, () => {
    for (const row of rows) {
      for (const caller of CALLERS) {
        it(`${row.route} as ${caller} → ${row.expect[caller]}`, async () => {
          expect(row.expect[caller], `no expectation for ${caller}`).toBeTypeOf('number')
          const [method, staticPath] = row.route.split(' ') as [string, string]
          const path = row.path ? await row.path() : staticPath
          const body = typeof row.body === 'function' ? await (row.body as () => unknown)() : row.body
          const client = await as(caller)
          const res = await client.request(method, path, method === 'GET' || method === 'DELETE' ? undefined : (body ?? {}))
          expect(res.status, JSON.stringify(res.body)).toBe(row.expect[caller])
        })
      }
    }
  })
}
