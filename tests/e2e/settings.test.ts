import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { testDb } from '../support/db'

// An owner changes the hemisphere and the listing on the settings page; a maker finds the nursery
// in the directory and opens its page. Tansy Row's settings are put back afterwards.
let browser: Browser
let tansyRow: Record<string, unknown>
beforeAll(async () => {
  browser = await launchBrowser()
  tansyRow = await testDb()('organisations').where({ name: 'Tansy Row Fruit' }).first('id', 'hemisphere', 'listed')
})
afterAll(async () => {
  await browser?.close()
  const { id, ...row } = tansyRow
  await testDb()('organisations').where({ id }).update(row)
})

describe('settings and the directory in the browser', () => {
  it('lets an owner move the organisation to the southern hemisphere and take it out of the directory', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower2@demo.test')
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Settings' }).click()
    await page.waitForURL(/\/settings$/)
    const hemisphere = page.getByLabel('Hemisphere')
    await expect.poll(() => hemisphere.inputValue()).toBe('north')
    const listed = page.getByLabel('List this organisation in the directory')
    expect(await listed.isChecked()).toBe(true)
    // A grower without a nursery has neither a press nor a plant-health registration number.
    expect(await page.getByLabel('Press type').count()).toBe(0)
    expect(await page.getByLabel('Plant-health registration number').count()).toBe(0)

    await hemisphere.selectOption({ label: 'Southern hemisphere' })
    await listed.uncheck()
    await page.getByRole('button', { name: 'Save settings' }).click()
    await expect.poll(() => page.getByRole('status').innerText()).toBe('Settings saved.')
    await screenshot(page, 'settings-saved')

    await page.reload()
    await expect.poll(() => page.getByLabel('Hemisphere').inputValue()).toBe('south')
    expect(await page.getByLabel('List this organisation in the directory').isChecked()).toBe(false)
    const row = await testDb()('organisations').where({ name: 'Tansy Row Fruit' }).first('hemisphere', 'listed')
    expect(row).toEqual({ hemisphere: 'south', listed: false })

    // A bad figure is refused beside its field and what was typed stays.
    await page.getByLabel('Tax on sales (%)').fill('120')
    await page.getByRole('button', { name: 'Save settings' }).click()
    await expect.poll(() => page.locator('#field-taxRatePct-error').innerText()).toMatch(/0 to 100/)
    expect(await page.getByLabel('Tax on sales (%)').inputValue()).toBe('120')
    await page.context().close()
  })

  it('shows a viewer the settings without a way to change them', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'viewer@demo.test')
    await page.goto('/settings')
    await expect.poll(() => page.getByLabel('Press type').inputValue()).toBe('belt')
    expect(await page.getByLabel('Press type').isDisabled()).toBe(true)
    expect(await page.getByRole('button', { name: 'Save settings' }).count()).toBe(0)
    await page.context().close()
  })

  it('lets a maker find the nursery in the directory and open its page', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'maker@demo.test')
    await page.waitForSelector('[data-testid="home-maker"]')
    await page.getByTestId('home-maker').getByRole('link', { name: 'Directory' }).click()
    await page.waitForURL(/\/directory$/)
    await page.getByRole('search').getByLabel('Variety grown').fill('Dabinett')
    const nursery = page.getByRole('link', { name: 'Hollowmere Orchard & Nursery' })
    await nursery.waitFor()
    await expect.poll(() => page.getByTestId('directory-list').getByRole('listitem').count()).toBe(1)
    await screenshot(page, 'directory-search')

    await nursery.click()
    await page.waitForURL(/\/directory\/\d+$/)
    await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toBe('Hollowmere Orchard & Nursery')
    expect(await page.getByText('Grower and nursery').first().isVisible()).toBe(true)
    expect(await page.getByTestId('directory-entry').innerText()).toMatch(/Dabinett[\s\S]*bittersweet/)
    // A maker may order trees from the nursery and offer to buy the grower's fruit.
    const start = page.getByRole('navigation', { name: 'Start a contract' })
    expect(await start.getByRole('link', { name: 'Order trees from this nursery' }).getAttribute('href')).toMatch(/^\/contracts\/tree\/new\?nurseryOrgId=\d+$/)
    expect(await start.getByRole('link', { name: 'Offer to buy fruit' }).getAttribute('href')).toMatch(/^\/contracts\/fruit\/new\?growerOrgId=\d+$/)
    expect(await page.locator('body').innerText()).not.toMatch(/@/)
    await screenshot(page, 'directory-nursery')
    await page.context().close()
  })
})
