import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { testDb } from '../support/db'

let browser: Browser
const bedName = `Chapel stool bed ${Date.now().toString(36)}`
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
  // The bed's records and the liner lot lifted from it go with it.
  await testDb()('nursery_beds').where({ name: bedName }).delete()
})

describe('nursery beds in the browser', () => {
  it('adds a stool bed, records liners lifted and finds them in liner stock', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    await page.goto('/nursery/beds')
    await page.getByRole('button', { name: 'Add a bed' }).click()

    // A stool bed asks for its rootstock, mother plants and year; the seed source is not asked.
    await page.getByLabel('Bed name').fill(bedName)
    await page.getByLabel('Kind of bed').selectOption('stool')
    expect(await page.getByLabel('Seed source').count()).toBe(0)
    await page.getByRole('button', { name: 'Add the bed' }).click()
    await expect.poll(() => page.locator('#bed-rootstock ~ .field-error').innerText()).toMatch(/Choose the rootstock/)
    expect(await page.getByLabel('Bed name').inputValue()).toBe(bedName)

    await page.waitForSelector('#bed-rootstock option:has-text("G.890")', { state: 'attached' })
    await page.getByLabel('Rootstock').selectOption({ label: 'G.890 (apple, semi-dwarf)' })
    await page.getByLabel('Mother plants').fill('600')
    await page.getByLabel('Year established').fill('2018')
    await page.getByRole('button', { name: 'Add the bed' }).click()

    await page.waitForURL(/\/nursery\/beds\/\d+$/)
    await expect.poll(() => page.locator('h1').innerText()).toBe(bedName)
    expect(await page.locator('[data-testid="bed-summary"]').innerText()).toMatch(/Stool bed[\s\S]*G\.890[\s\S]*600[\s\S]*2018/)

    // Liners lifted ask for a count and a grade, not a hormone.
    await page.getByLabel('Work done').selectOption('liners-lifted')
    expect(await page.getByLabel('Rooting hormone').count()).toBe(0)
    await page.getByLabel('Done on').fill('2025-11-24')
    await page.getByLabel('Liners lifted').fill('1350')
    await page.getByLabel('Grade (stem diameter)').selectOption('7-10mm')
    await page.getByRole('button', { name: 'Add the record' }).click()
    await expect.poll(() => page.getByTestId('bed-record-form').getByRole('status').innerText()).toMatch(/1,350 liners of G\.890, 7-10mm, are in liner stock/)
    await expect.poll(() => page.locator('[data-testid="bed-records"]').innerText()).toMatch(/Season 2025[\s\S]*2025-11-24[\s\S]*Liners lifted[\s\S]*1,350/)
    await screenshot(page, 'nursery-bed-records')

    await page.getByRole('link', { name: 'All beds' }).click()
    await page.waitForURL(/\/nursery\/beds$/)
    expect(await page.getByRole('region', { name: 'Stool beds' }).innerText()).toContain(bedName)

    await page.goto('/nursery/liners')
    const stockRow = page.locator('[data-testid="liner-stock"] tbody tr', { hasText: 'G.890' }).filter({ hasText: '7-10mm' })
    await expect.poll(() => stockRow.count()).toBe(1)
    const lotRow = page.locator('[data-testid="liner-lots"] tbody tr', { hasText: '2025-11-24' }).filter({ hasText: '1,350' })
    expect(await lotRow.innerText()).toMatch(/G\.890[\s\S]*7-10mm[\s\S]*Lifted from our beds/)
    await screenshot(page, 'nursery-liner-stock')
    await page.context().close()
  })

  it('shows the knife caution on the budwood page, and sends a grower without a nursery away', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    await page.goto('/nursery/budwood')
    await expect.poll(() => page.getByRole('note').innerText()).toMatch(/Budding and grafting knives[\s\S]*away from your body[\s\S]*thumb guard[\s\S]*first aid/)
    expect(await page.getByTestId('budwood-form').count()).toBe(1)
    await page.context().close()

    const other = await newPage(browser)
    await signInAs(other, 'grower2@demo.test')
    await other.goto('/nursery/beds')
    await other.waitForSelector('[data-testid="user-menu"]')
    await expect.poll(() => new URL(other.url()).pathname).toBe('/')
    await other.context().close()
  })
})
