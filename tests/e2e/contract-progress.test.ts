import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { demoDabinettContract } from '../support/progress'

// The demo's Dabinett contract as its two parties open it: Quillhurst reads how its trees are
// coming on; Hollowmere also finds the way to its dispatch labels.
let browser: Browser
let id: number

beforeAll(async () => {
  browser = await launchBrowser()
  id = await demoDabinettContract()
})

afterAll(async () => {
  await browser?.close()
})

describe('a tree contract\'s timeline in the browser', () => {
  it('shows the maker each step with its days and count, what stands and the trees expected', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'maker@demo.test')
    await page.goto(`/contracts/tree/${id}`)
    const timeline = page.getByRole('region', { name: 'How the trees are coming on' })
    await timeline.waitFor()
    const steps = timeline.getByRole('list', { name: 'Propagation timeline' }).getByRole('listitem')
    // The demo's rows 10–12 (server/db/seeds/06_demo_nursery.ts): 600 + 600 + 369 lined out, 597 + 596 + 367 budded, 527 + 519 + 322 took.
    expect(await steps.filter({ hasText: 'Rootstock liners lined out' }).innerText()).toMatch(/1,569 lined out[\s\S]*3 of 3 runs[\s\S]*14 April 2026 to 15 April 2026[\s\S]*\(done\)/)
    expect(await steps.filter({ hasText: 'Budded with the variety' }).innerText()).toMatch(/1,560 budded[\s\S]*18 August 2026 to 19 August 2026/)
    expect(await steps.filter({ hasText: 'Take counted' }).innerText()).toMatch(/1,368 took[\s\S]*15 September 2026 to 16 September 2026/)
    expect(await steps.filter({ hasText: 'Headed back above the bud' }).innerText()).toMatch(/by 31 March 2027[\s\S]*\(to do\)/)
    const summary = await timeline.innerText()
    // 520 + 514 + 319 stand; ⌊520 × 0.9⌋ + ⌊514 × 0.9⌋ + ⌊319 × 0.9⌋ = 1,217 expected; 1,368 ÷ 1,560 = 87.7 %.
    expect(summary).toMatch(/Standing now\s*1,353 trees/)
    expect(summary).toMatch(/87\.7 % took/)
    expect(summary).toMatch(/1,217 of 1,200 contracted\s*17 more than the 1,200 contracted/)
    expect(summary).toMatch(/Next step\s*Headed back above the bud \(dormant\), by 31 March 2027/)
    const runs = timeline.getByRole('table', { name: 'The runs growing these trees' })
    expect(await runs.getByRole('row').count()).toBe(4)
    expect(await runs.getByRole('row', { name: /row 10/ }).innerText()).toMatch(/1–600\s+600\s+597\s+527\s+520\s+0\s+468/)
    // The buyer prints no dispatch labels.
    expect(await page.getByRole('link', { name: 'Dispatch labels' }).count()).toBe(0)
    await screenshot(page, 'contract-progress-maker')
    await page.context().close()
  })

  it('gives the nursery the same timeline and a link to its dispatch labels', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    await page.goto(`/contracts/tree/${id}`)
    await page.getByRole('region', { name: 'How the trees are coming on' }).waitFor()
    expect(await page.getByRole('link', { name: 'Dispatch labels' }).getAttribute('href')).toBe(`/nursery/dispatch/${id}`)
    await page.context().close()
  })
})
