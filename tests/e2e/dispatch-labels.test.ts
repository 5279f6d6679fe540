import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { testDb } from '../support/db'

// The nursery opens the dispatch labels of the demo's ready contract (Tansy Row's 400 Stoke Red on
// M.26, 447 dug in three grades), rebundles them, and prints a sheet with only the labels on it.
const db = testDb()
let browser: Browser
let contractId: number

beforeAll(async () => {
  browser = await launchBrowser()
  const row = await db('tree_contracts as c').join('organisations as b', 'b.id', 'c.buyer_org_id').join('varieties as v', 'v.id', 'c.variety_id')
    .where({ 'b.name': 'Tansy Row Fruit', 'v.name': 'Stoke Red', 'c.state': 'ready' }).orderBy('c.id').first('c.id')
  if (!row) throw new Error('No demo contract with trees ready')
  contractId = row.id
})

afterAll(async () => {
  await browser?.close()
})

describe('dispatch labels in the browser', () => {
  it('shows the labels with their passports and totals, rebundles them, and prints the labels alone', async () => {
    const page = await newPage(browser)
    await page.addInitScript(() => {
      // The print dialog is the browser's; the test counts that it was asked for.
      window.print = () => {
        (window as unknown as { printed: number }).printed = ((window as unknown as { printed?: number }).printed ?? 0) + 1
      }
    })
    await signInAs(page, 'grower@demo.test')
    await page.goto(`/nursery/dispatch/${contractId}`)
    await page.getByRole('heading', { name: 'Dispatch labels', level: 1 }).waitFor()
    const labels = page.getByRole('article', { name: /^Label for bundle / })
    // ⌈212/10⌉ + ⌈198/10⌉ + ⌈37/10⌉ = 22 + 20 + 4 bundles of ten or fewer.
    await expect.poll(() => labels.count()).toBe(46)
    const first = labels.first()
    expect(await first.innerText()).toMatch(/Stoke Red[\s\S]*on M\.26[\s\S]*10 trees · 16 mm caliper, 160 cm, feathered[\s\S]*for Tansy Row Fruit · contract \d+ · spring 2027/)
    const passport = first.getByRole('definition').first()
    expect(await passport.innerText()).toMatch(/Malus domestica/)
    expect(await first.innerText()).toMatch(/UK plant passport[\s\S]*A\s*Malus domestica ‘Stoke Red’[\s\S]*B\s*GB-40917[\s\S]*C\s*[0-9A-Z]{10}-01[\s\S]*D\s*GB/)
    const totals = page.getByRole('region', { name: 'Totals' })
    expect(await totals.innerText()).toMatch(/All grades\s+447\s+46/)
    expect(await page.getByRole('note').filter({ hasText: 'Handling bundles of trees' }).innerText()).toMatch(/lift[\s\S]*knife/)
    expect(await page.getByText(/Print at actual size \(100 %/).isVisible()).toBe(true)
    await screenshot(page, 'dispatch-labels')

    // 25 to a bundle: ⌈212/25⌉ + ⌈198/25⌉ + ⌈37/25⌉ = 9 + 8 + 2.
    await page.getByLabel('Trees to a bundle').selectOption('25')
    await expect.poll(() => labels.count()).toBe(19)
    expect(await totals.innerText()).toMatch(/All grades\s+447\s+19/)

    await page.getByRole('button', { name: 'Print labels' }).click()
    expect(await page.evaluate(() => (window as unknown as { printed?: number }).printed)).toBe(1)
    await page.emulateMedia({ media: 'print' })
    expect(await page.getByRole('heading', { name: 'Dispatch labels' }).isVisible()).toBe(false)
    expect(await totals.isVisible()).toBe(false)
    expect(await labels.first().isVisible()).toBe(true)
    await page.context().close()
  })
})
