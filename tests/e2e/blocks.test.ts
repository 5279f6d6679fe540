import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { testDb } from '../support/db'

let browser: Browser
const blockName = `Millpond Piece ${Date.now().toString(36)}`
const pearBlockName = `Perry Corner ${Date.now().toString(36)}`
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
  await testDb()('orchard_blocks').whereIn('name', [blockName, pearBlockName]).delete()
})

describe('orchard blocks in the browser', () => {
  it('shows the grower’s blocks with their totals and the forecast by juice class', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    await page.goto('/blocks')
    await page.waitForSelector('[data-testid="block-table"]')
    expect(await page.locator('[data-testid="block-table"] tbody').innerText()).toMatch(/Long Ground[\s\S]*Dabinett/)
    expect(await page.locator('[data-testid="block-totals"]').innerText()).toMatch(/All blocks/)
    await page.locator('[data-testid="class-forecast-chart"] canvas').waitFor({ state: 'visible' })
    expect(await page.locator('[role="note"]').innerText()).toMatch(/tripod ladder/i)
    await screenshot(page, 'blocks-list')
    await page.context().close()
  })

  it('adds a block through the form and shows its page with the forecast chart', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    await page.goto('/blocks')
    await page.click('a:has-text("Add a block")')
    await page.waitForURL(/\/blocks\/new$/)

    // Nothing chosen yet: the errors appear beside the fields and the typed name stays.
    await page.fill('input[name="blockName"]', blockName)
    await page.click('button[type="submit"]')
    await expect.poll(() => page.locator('.field-error').count()).toBeGreaterThan(2)
    expect(await page.locator('#block-variety ~ .field-error').innerText()).toBe('Choose a variety')
    expect(await page.inputValue('input[name="blockName"]')).toBe(blockName)

    await page.waitForSelector('#block-variety option:has-text("Kingston Black")', { state: 'attached' })
    await page.selectOption('#block-variety', { label: 'Kingston Black (apple, bittersharp)' })
    await page.selectOption('#block-rootstock', { label: 'M.26 (apple, semi-dwarf)' })
    // The rootstock's typical spacing fills the empty spacing boxes.
    await expect.poll(() => page.inputValue('input[name="inRow"]')).toBe('2.4')
    expect(await page.inputValue('input[name="betweenRow"]')).toBe('4.3')
    await page.fill('input[name="treeCount"]', '400')
    await page.fill('input[name="yearPlanted"]', '2023')
    await page.fill('input[name="area"]', '0.4')
    // 10,000 / (2.4 × 4.3) = 969 trees/ha.
    expect(await page.locator('[data-testid="density-preview"]').innerText()).toMatch(/969 trees\/ha/)
    await page.click('button[type="submit"]')

    await page.waitForURL(/\/blocks\/\d+$/)
    await expect.poll(() => page.locator('h1').innerText()).toBe(blockName)
    expect(await page.locator('[data-testid="block-summary"]').innerText()).toMatch(/Kingston Black[\s\S]*M\.26/)
    const canvas = page.locator('[data-testid="forecast-chart"] canvas')
    await canvas.waitFor({ state: 'visible' })
    const box = await canvas.boundingBox()
    expect(box?.width).toBeGreaterThan(200)
    expect(box?.height).toBeGreaterThan(100)
    await screenshot(page, 'block-forecast')
    await page.context().close()
  })

  it('shows the perry note on a pear block, and says why a block has no forecast', async () => {
    const db = testDb()
    const org = await db('organisations').where({ name: 'Hollowmere Orchard & Nursery' }).first('id')
    const thorn = await db('varieties').where({ name: 'Thorn' }).first('id')
    const pyrodwarf = await db('rootstocks').where({ designation: 'Pyrodwarf' }).first('id')
    const [id] = await db('orchard_blocks').insert({
      org_id: org.id, name: pearBlockName, variety_id: thorn.id, rootstock_id: pyrodwarf.id,
      tree_count: 60, year_planted: 2024, area_ha: 0.06, in_row_m: 2.7, between_row_m: 3.6,
    })
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    await page.goto(`/blocks/${id}`)
    await expect.poll(() => page.locator('h1').innerText()).toBe(pearBlockName)
    expect(await page.locator('[data-testid="perry-note"]').innerText()).toMatch(/sorbitol/)
    expect(await page.locator('[data-testid="forecast-note"]').innerText()).toMatch(/Pyrodwarf/)
    await page.context().close()
  })

  it('sends a maker away from the orchard pages', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'maker@demo.test')
    await page.goto('/blocks')
    await page.waitForSelector('[data-testid="home-maker"]')
    expect(new URL(page.url()).pathname).toBe('/')
    await page.context().close()
  })
})
