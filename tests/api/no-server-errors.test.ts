import { readdirSync, statSync } from 'node:fs'
import { join, relative, resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { as, type Caller } from '../support/http'

// Every API route, found from the files under server/api, fed junk by several kinds of caller:
// bad input must come back as a 4xx, never a 500.
const apiDir = resolve(import.meta.dirname, '../../server/api')

function routeFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name)
    return statSync(path).isDirectory() ? routeFiles(path) : [path]
  })
}

const routes = routeFiles(apiDir)
  .map(file => relative(apiDir, file).replace(/\\/g, '/'))
  .filter(file => !file.startsWith('auth/'))
  .map((file) => {
    const match = file.match(/^(.*?)(?:\/index)?\.(get|post|patch|put|delete)\.ts$/)
    if (!match) throw new Error(`route file without a method suffix: ${file}`)
    return { path: `/api/${match[1]!.replace(/^index$/, '')}`.replace(/\/$/, ''), method: match[2]!.toUpperCase() }
  })

const ODD_IDS = ['abc', '-1', '0', '1.5', '99999999999999999999', '%00']
const ODD_QUERIES = ['', '?limit=-1&offset=abc', '?limit=100000', '?q=%00%27%22&species=tree', '?id=1&id=2']
const ODD_BODIES = ['{', '[]', '"text"', 'null', '{"name":{"$gt":""},"email":["a"],"trees":"many","role":1}', JSON.stringify({ token: 'x'.repeat(5000) })]
const CALLERS: Caller[] = ['anonymous', 'growerOwner', 'makerOwner', 'admin']

describe('no route answers 500 to bad input', () => {
  it('finds the routes', () => {
    expect(routes.length).toBeGreaterThan(20)
  })

  for (const route of routes) {
    it(`${route.method} ${route.path}`, async () => {
      const paths = route.path.includes('[id]') ? ODD_IDS.map(id => route.path.replace('[id]', id)) : [route.path]
      for (const caller of CALLERS) {
        const client = await as(caller)
        for (const path of paths) {
          const attempts = route.method === 'GET' || route.method === 'DELETE'
            ? ODD_QUERIES.map(q => client.request(route.method, path + q))
            : ODD_BODIES.map(body => client.request(route.method, path, body, { 'content-type': 'application/json' }))
          for (const res of await Promise.all(attempts)) {
            expect(res.status, `${caller} ${route.method} ${path}: ${JSON.stringify(res.body).slice(0, 300)}`).toBeLessThan(500)
          }
        }
      }
    })
  }
})
