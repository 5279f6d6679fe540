import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { testDb } from '../support/db'

let browser: Browser
const code = `E2E-LOT-${Date.now().toString(36)}`

beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
  const db = testDb()
  const ids = (await db('harvest_lots').where('code', 'like', 'E2E-LOT-%').select('id')).map((r: { id: number }) => r.id)
  await db('juice_readings').whereIn('lot_id', ids).delete()
  await db('harvest_lots').whereIn('id', ids).delete()
})

describe('harvest lots in the browser', () => {
  it('a grower records a lot from a block, adds a reading by hand and sees it on the lot and in the list', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    await page.goto('/lots')
    await page.getByRole('link', { name: 'Record a lot' }).click()
    await page.waitForURL(/\/lots\/new$/)

    // Nothing typed: the errors appear beside the fields.
    await page.getByLabel('Net weight (kg)').fill('')
    await page.getByRole('button', { name: 'Record the lot' }).click()
    await expect.poll(() => page.locator('#field-code-error').innerText()).toBe('Enter the lot\'s code')

    await page.getByLabel('Lot code').fill(code)
    await page.getByLabel('Day picked').fill('2026-10-12')
    await page.waitForSelector('#lot-block option:has-text("Long Ground")', { state: 'attached' })
    await page.getByLabel('Block (optional)').selectOption({ label: 'Long Ground (Dabinett)' })
    // The block brings its variety.
    await expect.poll(() => page.getByLabel('Variety', { exact: true }).inputValue()).not.toBe('')
    await page.getByLabel('Net weight (kg)').fill('1250')
    await page.getByLabel('Bins (optional)').fill('4')
    await page.getByRole('button', { name: 'Record the lot' }).click()

    await page.waitForURL(/\/lots\/\d+$/)
    await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toBe(`Lot ${code}`)
    expect(await page.getByTestId('lot-summary').innerText()).toMatch(/Dabinett[\s\S]*Long Ground[\s\S]*1,250 kg/)
    expect(await page.getByText('No readings yet.').count()).toBe(1)
    expect(await page.getByRole('note').first().innerText()).toMatch(/patulin/i)

    const form = page.getByRole('form', { name: 'Add a reading' })
    await form.getByLabel('°Brix', { exact: true }).fill('12')
    await form.getByLabel('Specific gravity as read').fill('1.047')
    await form.getByLabel('Juice temperature (°C)').fill('25')
    await form.getByLabel('Titratable acidity').fill('2.3')
    await form.getByLabel('Tannin', { exact: true }).fill('3.1')
    await form.getByLabel('pH', { exact: true }).fill('3.9')
    await form.getByRole('button', { name: 'Add the reading' }).click()

    // 1.047 at 25 °C on the demo's 20 °C hydrometer: + 0.99823 − 0.99707 (Lyons, HBD #963) = 1.0482.
    await page.getByTestId('reading-table').waitFor()
    const row = await page.getByTestId('reading-table').locator('tbody tr').first().innerText()
    expect(row).toMatch(/1\.0482/)
    expect(row).toMatch(/1\.0470/)
    // Long Ashton: acid under 4.5 g/L with tannin over 2.0 g/L is bittersweet.
    expect(row).toMatch(/bittersweet/)
    await expect.poll(() => page.getByTestId('lot-class').innerText()).toBe('bittersweet')
    await screenshot(page, 'lot-with-reading')

    await page.getByRole('link', { name: '← All lots' }).click()
    await page.waitForURL(/\/lots$/)
    await page.getByLabel('Search code, variety, block or notes').fill(code)
    await expect.poll(() => page.getByTestId('lot-table').locator('tbody tr').count()).toBe(1)
    const listed = await page.getByTestId('lot-table').locator('tbody tr').first().innerText()
    expect(listed).toMatch(new RegExp(`${code}[\\s\\S]*Dabinett[\\s\\S]*12 °Bx[\\s\\S]*bittersweet`))
    expect(await page.getByTestId('lot-totals').innerText()).toMatch(/1 lot[\s\S]*1,250 kg/)
    await screenshot(page, 'lots-list')
    await page.context().close()
  })
})
