import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'

// This season's juice page over the demo's lots: the grower sees its own lots charted; the maker
// sees Tansy Row's lots its fruit contract covers.
let browser: Browser

beforeAll(async () => {
  browser = await launchBrowser()
})

afterAll(async () => {
  await browser?.close()
})

describe('the season\'s juice page', () => {
  it('charts the grower\'s lots by acid and tannin and by sugar, with the figures beneath', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    await page.goto('/juice?year=2026')
    await page.getByRole('heading', { name: 'Apples: acid and tannin' }).waitFor()
    await page.getByRole('img', { name: 'Apples: titratable acidity against tannin, by lot' }).waitFor({ state: 'visible' })
    await page.getByRole('img', { name: '°Brix of each lot\'s latest reading' }).waitFor({ state: 'visible' })
    const table = page.getByTestId('juice-table')
    await table.getByText('HM-26-011').waitFor()
    expect(await table.locator('tbody tr').count()).toBeGreaterThanOrEqual(5)
    // The Coldwater lab gave SG only for HM-26-014: its °Brix is worked out from the SG.
    expect(await table.locator('tr', { hasText: 'HM-26-014' }).innerText()).toContain('(from SG)')
    await page.getByText('Juice safety').waitFor()
    await screenshot(page, 'juice-season')
    await page.context().close()
  })

  it('shows the maker only the lots its contracts cover', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'maker@demo.test')
    await page.goto('/juice?year=2026')
    const table = page.getByTestId('juice-table')
    await table.getByText('TR-26-001').waitFor()
    expect(await table.getByText('HM-26-011').count()).toBe(0)
    await page.context().close()
  })
})
