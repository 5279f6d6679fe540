import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'

// Blend plans in the browser: the demo maker solves a small blend of TR-26-001 (delivered to its
// press) to its medium-dry target, saves it as a plan, commits it (the fruit is then held for it),
// records the pressing with what was actually taken, sees planned against actual, and opens the
// pressing's trace back to the lot's grower, block and delivery.

let browser: Browser
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

describe('blend plans in the browser', () => {
  it('saves, commits and presses a plan, then traces the pressing back to its orchard', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'maker@demo.test')
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Blends' }).click()
    await page.waitForURL(/\/blends$/)
    await page.getByTestId('blend-lot-table').waitFor()
    await page.waitForSelector('#blend-target option:has-text("Medium-dry base")', { state: 'attached' })
    await page.getByLabel('Saved target').selectOption({ label: 'Medium-dry base' })
    await expect.poll(() => page.getByLabel('Lowest SG').inputValue()).toBe('1.05')
    // 150 L at the press's 750 L a tonne is 200 kg of TR-26-001.
    await page.getByLabel('Volume of juice').fill('150')
    await page.getByTestId('blend-lot-table').getByRole('checkbox', { name: 'Use TR-26-001' }).check()
    await page.getByRole('button', { name: 'Solve the blend' }).click()
    await expect.poll(() => page.getByTestId('blend-status').innerText()).toMatch(/^Optimal/)

    const name = `Trial tank ${Math.random().toString(36).slice(2, 7)}`
    await page.getByLabel('Plan name').fill(name)
    await page.getByRole('button', { name: 'Save as plan' }).click()
    await page.waitForURL(/\/blends\/plans\/\d+$/)
    await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toBe(name)
    expect(await page.getByTestId('plan-state').innerText()).toMatch(/draft/i)
    expect(await page.getByTestId('plan-lines').innerText()).toMatch(/TR-26-001[\s\S]*200/)

    await page.getByRole('button', { name: 'Commit and reserve the fruit' }).click()
    await expect.poll(() => page.getByTestId('plan-state').innerText()).toMatch(/committed/i)
    expect(await page.getByTestId('plan-held').innerText()).toMatch(/TR-26-001[\s\S]*200/)
    await screenshot(page, 'blend-plan-committed')

    const form = page.getByRole('form', { name: 'Record the pressing' })
    expect(await form.getByRole('note').first().innerText()).toMatch(/pathogen/i)
    expect(await form.getByText(/carbon dioxide/i).count()).toBeGreaterThan(0)
    await form.getByLabel('Pressed on').fill('2026-11-28')
    await form.getByLabel('Litres of juice pressed').fill('148')
    await form.getByLabel('Vessel or tank').fill('Tank 7')
    await form.getByLabel('kg taken from TR-26-001').fill('205')
    await form.getByRole('button', { name: 'Record the pressing' }).click()
    await expect.poll(() => page.getByTestId('plan-state').innerText()).toMatch(/pressed/i)
    // Planned 200 kg, taken 205 kg: 5 kg more than the plan.
    expect(await page.getByTestId('plan-actual').innerText()).toMatch(/TR-26-001[\s\S]*200[\s\S]*205[\s\S]*\+5/)
    await screenshot(page, 'blend-plan-pressed')

    await page.getByRole('link', { name: 'Trace this pressing' }).click()
    await page.waitForURL(/\/blends\/pressings\/\d+$/)
    const trace = page.getByTestId('pressing-trace')
    await expect.poll(() => trace.innerText()).toMatch(/TR-26-001/)
    const text = await trace.innerText()
    expect(text).toMatch(/Tansy Row Fruit/)
    expect(text).toMatch(/River Strip/)
    expect(text).toMatch(/QCW-26-0188/)
    await screenshot(page, 'blend-pressing-trace')

    await page.getByRole('link', { name: 'TR-26-001' }).first().click()
    await page.waitForURL(/\/lots\/\d+$/)
    await expect.poll(() => page.getByTestId('lot-trace').innerText()).toMatch(new RegExp(name))
    await page.context().close()
  })
})
