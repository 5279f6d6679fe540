import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { testDb } from '../support/db'

let browser: Browser
const varietyName = `Estry Fillbasket ${Date.now().toString(36)}`
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
  await testDb()('varieties').where({ name: varietyName }).delete()
})

const tableText = (page: Page, kind: 'variety' | 'rootstock') => page.locator(`[data-testid="${kind}-table"] tbody`).innerText()

describe('the catalogue in the browser', () => {
  it('lets a viewer search and filter varieties, with the class and perry notes, and read a row', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'viewer@demo.test')
    await page.goto('/catalogue')
    await page.waitForSelector('[data-testid="variety-table"]')
    expect(await tableText(page, 'variety')).toMatch(/Dabinett\s+apple\s+bittersweet/)
    expect(await page.locator('[data-testid="catalogue-class-note"]').innerText()).toMatch(/published label/)
    expect(await page.locator('a:has-text("Add a variety")').count()).toBe(0)

    await page.fill('#varieties-filter-q', 'kingston')
    await expect.poll(() => page.locator('[data-testid="variety-table"] tbody tr').count()).toBe(1)
    // Published bittersharp, yet WSU's 1.7 g/L tannin is under the 2.0 g/L line: marked †.
    expect(await tableText(page, 'variety')).toMatch(/Kingston Black\s+apple\s+bittersharp†/)

    await page.fill('#varieties-filter-q', '')
    await page.selectOption('#varieties-filter-species', 'pear')
    await expect.poll(() => tableText(page, 'variety')).toMatch(/Blakeney Red/)
    expect(await tableText(page, 'variety')).not.toMatch(/Dabinett/)
    expect(await page.locator('[data-testid="catalogue-perry-note"]').innerText()).toMatch(/sorbitol/)
    await screenshot(page, 'catalogue-pears')

    await page.click('a:has-text("Blakeney Red")')
    await page.waitForSelector('[data-testid="variety-details"]')
    expect(await page.locator('h1').innerText()).toBe('Blakeney Red')
    expect(await page.locator('[data-testid="catalogue-perry-note"]').count()).toBe(1)
    expect(await page.locator('button:has-text("Edit")').count()).toBe(0)
    await page.context().close()
  })

  it('shows rootstock spacing in feet to someone who works in US units', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'maker2@demo.test')
    await page.goto('/catalogue?tab=rootstocks')
    await page.waitForSelector('[data-testid="rootstock-table"]')
    await screenshot(page, 'catalogue-rootstocks-us')
    await page.fill('#rootstocks-filter-q', 'M26')
    await expect.poll(() => page.locator('[data-testid="rootstock-table"] tbody tr').count()).toBe(1)
    // 2.4 m = 7.9 ft and 4.3 m = 14.1 ft (1 ft = 0.3048 m exactly, NIST SP 811); 30 kg = 66 lb.
    expect(await tableText(page, 'rootstock')).toMatch(/M\.26[\s\S]*7\.9 ft × 14\.1 ft[\s\S]*66 lb/)
    await page.context().close()
  })

  it('lets the platform admin add, correct and delete a variety, with errors beside the fields', async () => {
    const page = await newPage(browser)
    page.on('dialog', dialog => void dialog.accept())
    await signInAs(page, 'admin@demo.test')
    await page.goto('/catalogue')
    await page.click('a:has-text("Add a variety")')
    await page.waitForURL(/\/catalogue\/varieties\/new$/)

    await page.fill('input[name="name"]', varietyName)
    await page.fill('input[name="typicalBrix"]', '40')
    await page.click('button[type="submit"]')
    await expect.poll(() => page.locator('#field-typicalBrix-error').innerText()).toMatch(/0 to 32 °Brix/)
    expect(await page.inputValue('input[name="name"]')).toBe(varietyName)

    await page.fill('input[name="typicalBrix"]', '13.5')
    await page.fill('input[name="typicalTaGPerL"]', '2.2')
    await page.fill('input[name="typicalTanninGPerL"]', '1.4')
    // Published as bittersweet; its tannin would make it sweet by the thresholds, and the form says so.
    expect(await page.locator('[data-testid="threshold-class"]').innerText()).toMatch(/sweet by the thresholds/)
    await page.click('button[type="submit"]')
    await page.waitForURL(/\/catalogue\/varieties\/\d+$/)
    await expect.poll(() => page.locator('h1').innerText()).toBe(varietyName)

    // A name already in the catalogue: the server's refusal shows beside the name, the typing stays.
    await page.click('button:has-text("Edit")')
    await page.fill('input[name="name"]', 'Dabinett')
    await page.fill('input[name="typicalBrix"]', '14.1')
    await page.click('button[type="submit"]')
    await expect.poll(() => page.locator('#field-name-error').innerText()).toMatch(/already in the catalogue/)
    expect(await page.inputValue('input[name="typicalBrix"]')).toBe('14.1')

    await page.fill('input[name="name"]', varietyName)
    await page.click('button[type="submit"]')
    await page.waitForSelector('[data-testid="variety-details"]')
    expect(await page.locator('[data-testid="variety-details"]').innerText()).toMatch(/14\.1 °Brix/)

    await page.click('button:has-text("Delete")')
    await page.waitForURL(/\/catalogue$/)
    expect(await testDb()('varieties').where({ name: varietyName }).first()).toBeUndefined()
    await page.context().close()
  })
})
