import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { contractFixtures } from '../support/contracts'
import { exposureFixtures } from '../support/exposure'

// The nursery finds fire blight suspected in a lot of budwood this file makes (the demo's lots stay
// unmarked): it opens the lot from the budwood list, sees the runs the lot may have reached, marks
// it suspect, sees the run warn, and clears it when the wood tests clean.
const MARK = 'e2e exposure'
const { treeContract } = contractFixtures(MARK)
const { run, lot, work } = exposureFixtures(MARK)
let browser: Browser
let suspect: { id: number, label: string }
let withLot: number
let after: number

beforeAll(async () => {
  browser = await launchBrowser()
  suspect = await lot({ cutOn: '2022-08-08' })
  const linedOutOn = '2022-04-01'
  withLot = await run({ linedOutOn, linedOut: 120, treeContractId: await treeContract('accepted') })
  after = await run({ linedOutOn, linedOut: 60 })
  // Tomas budded the run with the lot first that day, then the other run with nothing named.
  await work(withLot, { on: '2022-08-10', by: 'grower-member@demo.test', dayOrder: 1, lotId: suspect.id, count: 120 })
  await work(after, { on: '2022-08-10', by: 'grower-member@demo.test', dayOrder: 2, lotId: null, count: 60 })
})

afterAll(async () => {
  await browser?.close()
})

describe('a suspect budwood lot in the browser', () => {
  it('opens the lot, lists the runs it reached, marks it suspect, and clears it', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    await page.goto('/nursery/budwood')
    const row = page.getByRole('row', { name: new RegExp(suspect.label) })
    expect(await row.innerText()).toMatch(/Not suspect/)
    await row.getByRole('link', { name: suspect.label }).click()
    await page.waitForURL(new RegExp(`/nursery/budwood/${suspect.id}$`))
    await page.getByRole('heading', { name: `Budwood lot ${suspect.label}`, level: 1 }).waitFor()

    // Before marking it, the nursery sees what the lot would reach: both runs, 120 + 60 standing.
    const list = page.getByRole('table', { name: 'Exposure list' })
    await list.waitFor()
    expect(await page.getByTestId('exposure-totals').innerText()).toBe('2 runs, 180 trees standing, 1 contract')
    expect(await list.getByRole('row', { name: new RegExp(`Run ${withLot}:`) }).innerText()).toMatch(/Worked with this lot[\s\S]*2022-08-10, no\. 1 that day: Budded 120 with .* by Tomas Reyne[\s\S]*Tree contract \d+ for Quillhurst Cider Works/)
    expect(await list.getByRole('row', { name: new RegExp(`Run ${after}:`) }).innerText()).toMatch(/Worked after this lot the same day by the same person[\s\S]*None: grown for stock/)
    expect(await page.getByRole('note').filter({ hasText: 'Fire blight' }).innerText()).toMatch(/plant health authority[\s\S]*Disinfect knives and secateurs/)

    // A reason is needed: the form says so beside the field and keeps the day typed.
    await page.getByLabel('Day suspected').fill('2022-09-01')
    await page.getByRole('button', { name: 'Mark the lot suspect' }).click()
    await page.getByText('Enter why the lot is suspect').waitFor()
    expect(await page.getByLabel('Day suspected').inputValue()).toBe('2022-09-01')
    await page.getByLabel('Reason').fill('Shoot blight on the mother tree the wood was cut from')
    await page.getByRole('button', { name: 'Mark the lot suspect' }).click()
    await page.getByTestId('budwood-facts').getByText('Suspect since 2022-09-01').waitFor()
    expect(await page.getByTestId('budwood-facts').innerText()).toMatch(/Shoot blight on the mother tree[\s\S]*Marked by Ines Varga/)
    await screenshot(page, 'nursery-budwood-suspect')

    // The run budded after it warns on its own page.
    await list.getByRole('link', { name: `Run ${after}` }).click()
    await page.waitForURL(new RegExp(`/nursery/runs/${after}$`))
    expect(await page.getByTestId('run-warnings').innerText()).toMatch(new RegExp(`after budwood lot ${suspect.label} by the same hands; the lot is suspect of disease since 2022-09-01`))
    await screenshot(page, 'nursery-run-suspect-warning')

    // The list shows it in words; the wood tests clean and the lot is cleared, its suspicion kept.
    await page.goto('/nursery/budwood')
    expect(await page.getByRole('row', { name: new RegExp(suspect.label) }).innerText()).toMatch(/Suspect since 2022-09-01/)
    await page.goto(`/nursery/budwood/${suspect.id}`)
    await page.getByLabel('Why it is cleared').fill('Laboratory test of the wood negative')
    await page.getByRole('button', { name: 'Clear the lot' }).click()
    await page.getByTestId('budwood-facts').getByText(/Cleared \d{4}-\d{2}-\d{2} \(suspect from 2022-09-01\)/).waitFor()
    expect(await page.getByTestId('budwood-facts').innerText()).toMatch(/Cleared: Laboratory test of the wood negative/)
    await page.getByRole('button', { name: 'Mark the lot suspect' }).waitFor()
    await page.context().close()
  })
})
