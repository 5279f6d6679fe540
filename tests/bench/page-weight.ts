// Page weight: what each main page costs a first-time visitor. Each page opens in a fresh browser
// context (empty cache) with the person's session cookie already set, and we record the
// compressed JavaScript that came over the wire and the largest contentful paint.
//   Run by `npm run bench` against the bench stack (scripts/stack/bench.ts).
import type { Browser } from 'playwright-core'
import { launchBrowser } from '../support/chromium'
import { testEnv } from '../support/env'
import { as, type Caller } from '../support/http'

/** Compressed JavaScript a page may pull on its first load. */
const JS_BUDGET_BYTES = 250 * 1000

interface PageSpec { name: string, caller: Caller, path: string, ready: string }
interface PageWeight { name: string, jsEncoded: number, jsDecoded: number, scripts: number, lcpMs: number | null }

async function pages(): Promise<PageSpec[]> {
  const grower = await as('growerOwner')
  const blocks = await grower.get<{ items: { id: number }[] }>('/api/blocks')
  const blockId = blocks.body.items[0]?.id
  if (!blockId) throw new Error('The demo grower has no orchard block to open.')
  return [
    { name: 'sign-in', caller: 'anonymous', path: '/signin', ready: 'h1' },
    { name: 'home (grower)', caller: 'growerOwner', path: '/', ready: '[data-testid="home-grower"]' },
    { name: 'home (maker)', caller: 'makerOwner', path: '/', ready: '[data-testid="home-maker"]' },
    { name: 'blocks', caller: 'growerOwner', path: '/blocks', ready: 'canvas' },
    { name: 'a block', caller: 'growerOwner', path: `/blocks/${blockId}`, ready: 'canvas' },
    { name: 'catalogue', caller: 'growerOwner', path: '/catalogue', ready: 'table' },
    { name: 'calculators', caller: 'growerOwner', path: '/calculators', ready: 'h1' },
    { name: 'members', caller: 'growerOwner', path: '/members', ready: 'table' },
    { name: 'blends', caller: 'makerOwner', path: '/blends', ready: '[data-testid="blend-lot-table"]' },
  ]
}

async function weigh(browser: Browser, spec: PageSpec): Promise<PageWeight> {
  const client = await as(spec.caller)
  const context = await browser.newContext({ baseURL: testEnv.appUrl, viewport: { width: 1280, height: 860 } })
  await context.addCookies([...client.cookies].map(([name, value]) => ({ name, value, url: testEnv.appUrl })))
  const page = await context.newPage()
  // The latest LCP candidate, kept where the page can be asked for it.
  await page.addInitScript(() => {
    new PerformanceObserver((list) => {
      const entries = list.getEntries()
      ;(window as unknown as { __lcp: number }).__lcp = entries[entries.length - 1]!.startTime
    }).observe({ type: 'largest-contentful-paint', buffered: true })
  })
  await page.goto(spec.path)
  await page.waitForSelector(spec.ready)
  await page.waitForLoadState('networkidle')
  const weight = await page.evaluate(() => {
    const scripts = (performance.getEntriesByType('resource') as PerformanceResourceTiming[])
      .filter(e => new URL(e.name).pathname.endsWith('.js'))
    return {
      jsEncoded: scripts.reduce((sum, e) => sum + e.encodedBodySize, 0),
      jsDecoded: scripts.reduce((sum, e) => sum + e.decodedBodySize, 0),
      scripts: scripts.length,
      lcpMs: (window as unknown as { __lcp?: number }).__lcp ?? null,
    }
  })
  await context.close()
  return { name: spec.name, ...weight }
}

const kB = (bytes: number) => (bytes / 1000).toFixed(1).padStart(7)

async function main() {
  const specs = await pages()
  const browser = await launchBrowser()
  const results: PageWeight[] = []
  try {
    for (const spec of specs) results.push(await weigh(browser, spec))
  }
  finally {
    await browser.close()
  }
  console.log(`\nJavaScript on first load (budget ${JS_BUDGET_BYTES / 1000} kB compressed)`)
  console.log('page             JS kB (wire)  JS kB (decoded)  files  LCP ms')
  for (const r of results) {
    const flag = r.jsEncoded > JS_BUDGET_BYTES ? '  OVER BUDGET' : ''
    const lcp = r.lcpMs === null ? '     –' : String(Math.round(r.lcpMs)).padStart(6)
    console.log(`${r.name.padEnd(16)} ${kB(r.jsEncoded)}       ${kB(r.jsDecoded)}         ${String(r.scripts).padStart(4)}  ${lcp}${flag}`)
  }
  const over = results.filter(r => r.jsEncoded > JS_BUDGET_BYTES)
  console.log(over.length ? `\n${over.length} page(s) over the JavaScript budget.` : '\nEvery page is within the JavaScript budget.')
}

await main()
