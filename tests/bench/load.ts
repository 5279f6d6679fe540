// HTTP load on the signed-in routes, measured against the health route (one database ping) on the
// same server in the same run: health, me, health, blocks, health, varieties, each for a fixed time
// at 50 connections, so a slow machine moves both sides of each ratio alike.
//   Run by `npm run bench` against the bench stack (scripts/stack/bench.ts).
import autocannon from 'autocannon'
import { testEnv } from '../support/env'
import { as } from '../support/http'

const CONNECTIONS = 50
const SECONDS = 10
/** A signed-in route should keep at least this share of the health route's throughput… */
const MIN_RATIO = 0.5
/** …and answer 99 requests in 100 within this. */
const MAX_P99_MS = 100

const ROUTES = ['/api/me', '/api/blocks', '/api/varieties?limit=50']

interface Run { path: string, rps: number, p99: number, non2xx: number, errors: number }

async function hammer(path: string, cookie: string): Promise<Run> {
  const result = await autocannon({
    url: `${testEnv.appUrl}${path}`,
    connections: CONNECTIONS,
    duration: SECONDS,
    headers: { cookie },
  })
  return { path, rps: result.requests.average, p99: result.latency.p99, non2xx: result.non2xx, errors: result.errors + result.timeouts }
}

async function main() {
  const grower = await as('growerOwner')
  const cookie = [...grower.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
  for (const path of ROUTES) {
    const probe = await grower.get(path)
    if (probe.status !== 200) throw new Error(`${path} answered ${probe.status} to the demo grower; cannot measure it.`)
  }
  // A short warm-up, so the first measured run does not pay for the server's first requests.
  await autocannon({ url: `${testEnv.appUrl}/api/me`, connections: 10, duration: 2, headers: { cookie } })

  const rows: { run: Run, health: Run }[] = []
  for (const path of ROUTES) {
    const health = await hammer('/api/health', cookie)
    rows.push({ health, run: await hammer(path, cookie) })
  }
  console.log(`\nThroughput at ${CONNECTIONS} connections, ${SECONDS} s a run (demo grower signed in)`)
  console.log('route                     req/s  health req/s  ratio  p99 ms  non-2xx  errors')
  let misses = 0
  for (const { run, health } of rows) {
    const ratio = run.rps / health.rps
    const miss = ratio < MIN_RATIO || run.p99 > MAX_P99_MS || run.non2xx > 0 || run.errors > 0
    if (miss) misses++
    console.log(`${run.path.padEnd(24)} ${run.rps.toFixed(0).padStart(6)}  ${health.rps.toFixed(0).padStart(12)}  ${ratio.toFixed(2).padStart(5)}  ${String(run.p99).padStart(6)}  ${String(run.non2xx).padStart(7)}  ${String(run.errors).padStart(6)}${miss ? '  MISSES TARGET' : ''}`)
  }
  const healthP99 = rows.map(r => r.health.p99)
  console.log(`health p99 ms: ${healthP99.join(', ')}`)
  console.log(misses
    ? `\n${misses} route(s) below ${MIN_RATIO} × health throughput or over ${MAX_P99_MS} ms at p99.`
    : `\nEvery signed-in route keeps ≥ ${MIN_RATIO} × health throughput with p99 ≤ ${MAX_P99_MS} ms.`)
}

await main()
