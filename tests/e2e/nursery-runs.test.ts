import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { contractFixtures, orgId, rootstockId, varietyId } from '../support/contracts'
import { testDb } from '../support/db'
import { as } from '../support/http'

// The row map, the runs list, the tag sheet and a run's page on a phone, against a field, a row
// and two runs of Hollowmere's made for this file and removed afterwards.
const db = testDb()
const mark = `e2e nursery runs ${Date.now().toString(36)}`
const fieldName = `Brookside ${Date.now().toString(36)}`
const { treeContract } = contractFixtures(mark)
let browser: Browser
let fieldId: number
let rowId: number
let budded: { id: number, tagCode: string }
let plain: { id: number, tagCode: string }

const daysAgo = (n: number) => new Date(Date.now() - n * 86_400_000).toISOString().slice(0, 10)

beforeAll(async () => {
  browser = await launchBrowser()
  const [bed] = await db('nursery_beds').insert({ org_id: await orgId('hollowmere'), name: fieldName, kind: 'field' })
  fieldId = bed!
  const grower = await as('growerOwner')
  const row = await grower.post('/api/nursery/rows', { fieldId, name: '7', positions: 200, spacingCm: 33 })
  expect(row.status).toBe(201)
  rowId = row.body.id
  const contractId = await treeContract('accepted')
  const a = await grower.post('/api/nursery/runs', {
    rowId, fromPosition: 1, toPosition: 120, rootstockId: await rootstockId('MM.106'), linedOutOn: daysAgo(150), linedOutCount: 120,
    varietyId: await varietyId('Dabinett'), treeContractId: contractId,
  })
  expect(a.status).toBe(201)
  budded = a.body
  // Budded with no budwood lot named: the run warns that its buds cannot be traced.
  const buds = await grower.post(`/api/nursery/runs/${budded.id}/events`, { kind: 'budded', happenedOn: daysAgo(100), method: 'chip-bud', varietyId: await varietyId('Dabinett'), count: 120 })
  expect(buds.status).toBe(201)
  const b = await grower.post('/api/nursery/runs', {
    rowId, fromPosition: 121, toPosition: 180, rootstockId: await rootstockId('M.9'), linedOutOn: daysAgo(150), linedOutCount: 60,
    varietyId: await varietyId('Kingston Black'),
  })
  expect(b.status).toBe(201)
  plain = b.body
})

afterAll(async () => {
  await browser?.close()
  const runIds = (await db('nursery_runs').where({ row_id: rowId }).select('id')).map(r => r.id as number)
  await db('propagation_events').whereIn('run_id', runIds).delete()
  await db('nursery_runs').whereIn('id', runIds).delete()
  await db('nursery_rows').where({ id: rowId }).delete()
  await db('nursery_beds').where({ id: fieldId }).delete()
})

async function growerPage(): Promise<Page> {
  const page = await newPage(browser)
  await signInAs(page, 'grower@demo.test')
  return page
}

describe('the nursery row map and runs in the browser', () => {
  it('draws the field with its runs by variety, marks the run with warnings, sums the runs and opens a run', async () => {
    const page = await growerPage()
    await page.goto('/nursery')
    await page.getByRole('heading', { name: fieldName }).waitFor()
    const flagged = page.getByRole('link', { name: new RegExp(`^Run ${budded.id}: Dabinett on MM\\.106, positions 1–120, 120 standing, 1 warning`) })
    await flagged.waitFor()
    const clean = page.getByRole('link', { name: new RegExp(`^Run ${plain.id}: Kingston Black on M\\.9, positions 121–180, 60 standing$`) })
    // The two stretches split the 200-position row at position 120: 60 % and 30 % of its length.
    const [boxA, boxB] = [await flagged.boundingBox(), await clean.boundingBox()]
    expect(boxB!.width / boxA!.width).toBeCloseTo(60 / 120, 1)
    const legend = page.getByRole('region', { name: 'Legend' })
    expect(await legend.innerText()).toMatch(/Dabinett[\s\S]*Kingston Black[\s\S]*Has warnings/)
    expect(await page.getByRole('region', { name: 'Summary' }).innerText()).toMatch(/Runs\s*\d+[\s\S]*Liners lined out[\s\S]*Standing[\s\S]*Expected finished trees/)
    // Printed, the plan leaves out the navigation and adds the table of runs.
    await page.emulateMedia({ media: 'print' })
    expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false)
    const plan = page.getByRole('table', { name: 'Plan of runs' })
    expect(await plan.isVisible()).toBe(true)
    expect(await plan.innerText()).toMatch(new RegExp(`${fieldName}\\s+7\\s+1–120\\s+Dabinett\\s+MM\\.106`))
    await page.emulateMedia({ media: 'screen' })
    await screenshot(page, 'nursery-map')
    await clean.click()
    await page.waitForURL(new RegExp(`/nursery/runs/${plain.id}$`))
    await page.getByRole('heading', { name: 'Kingston Black', level: 1 }).waitFor()
    expect(await page.getByTestId('run-facts').innerText()).toMatch(/Needs a stake or wire: M\.9/)
    await page.context().close()
  })

  it('lists runs by filter, and prints the chosen runs’ tags, recording the printing only when printed', async () => {
    const page = await growerPage()
    await page.addInitScript(() => {
      // The print dialog is the browser's; the test counts that it was asked for.
      window.print = () => {
        (window as unknown as { printed: number }).printed = ((window as unknown as { printed?: number }).printed ?? 0) + 1
      }
    })
    await page.goto('/nursery/runs')
    await page.getByLabel('Row').selectOption({ label: `${fieldName}, row 7` })
    await page.getByLabel('Warnings').selectOption('true')
    const table = page.getByRole('table', { name: 'Runs' })
    await expect.poll(() => table.getByRole('row').count()).toBe(2)
    expect(await table.getByRole('row', { name: new RegExp(`Run ${budded.id}`) }).innerText()).toMatch(/1 warning/)
    await page.getByLabel('Warnings').selectOption('')
    await expect.poll(() => table.getByRole('row').count()).toBe(3)
    expect(await page.getByTestId('runs-count').innerText()).toMatch(/^2 runs; 180 standing/)
    await page.getByLabel(`Choose run ${budded.id}`).check()
    await page.getByLabel(`Choose run ${plain.id}`).check()
    await page.getByRole('link', { name: 'Print tags (2)' }).click()
    await page.waitForURL(new RegExp(`/nursery/tags\\?runs=${budded.id}(,|%2C)${plain.id}$`))

    const label = page.getByRole('article', { name: `Tag for run ${budded.id}` })
    await label.waitFor()
    expect(await label.innerText()).toMatch(new RegExp(`Dabinett[\\s\\S]*on MM\\.106[\\s\\S]*${fieldName} · row 7 · 1–120[\\s\\S]*for Quillhurst Cider Works[\\s\\S]*${budded.tagCode}`))
    const qr = label.getByRole('img', { name: `QR code opening run ${budded.id}` })
    // decode() refuses an image the browser could not load or read.
    expect(await qr.evaluate(img => (img as HTMLImageElement).decode().then(() => true))).toBe(true)
    // Looking at the sheet records nothing.
    expect((await db('nursery_runs').whereIn('id', [budded.id, plain.id]).whereNotNull('tag_printed_at')).length).toBe(0)
    await screenshot(page, 'nursery-tags')

    const posted = page.waitForRequest(r => r.url().endsWith('/api/nursery/tags/printed') && r.method() === 'POST')
    await page.getByRole('button', { name: 'Print' }).click()
    expect((await posted).postDataJSON()).toEqual({ runIds: [budded.id, plain.id] })
    await page.getByRole('status').filter({ hasText: 'Recorded as printed' }).waitFor()
    expect(await page.evaluate(() => (window as unknown as { printed: number }).printed)).toBe(1)
    expect((await db('nursery_runs').whereIn('id', [budded.id, plain.id]).whereNotNull('tag_printed_at')).length).toBe(2)
    // Printed, the sheet is the labels alone.
    await page.emulateMedia({ media: 'print' })
    expect(await page.getByRole('button', { name: 'Print' }).isVisible()).toBe(false)
    expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false)
    const box = await label.boundingBox()
    // 70 × 37 mm at 96 px to the inch (CSS 2.1: 1 in = 96 px = 25.4 mm).
    expect(box!.width).toBeCloseTo((70 / 25.4) * 96, 0)
    expect(box!.height).toBeCloseTo((37 / 25.4) * 96, 0)
    await page.context().close()
  })

  it('opens a run by its tag on a phone, records a take count, and keeps a loss made offline until the signal returns', async () => {
    const page = await growerPage()
    await page.setViewportSize({ width: 390, height: 844 })
    await page.goto(`/nursery/t/${budded.tagCode}`)
    await page.waitForURL(new RegExp(`/nursery/runs/${budded.id}$`))
    await page.getByRole('heading', { name: 'Dabinett', level: 1 }).waitFor()
    const standing = page.getByTestId('run-standing')
    expect(await standing.innerText()).toBe('120')
    expect(await page.getByTestId('run-warnings').innerText()).toMatch(/no budwood lot named/)
    expect(await page.getByTestId('run-facts').innerText()).toMatch(/Expected finished trees\s*91\s*120 standing × 0\.85 expected take × 0\.9 survival to sale/)

    // Thumb-sized: every button and box of the quick forms is at least 44 px tall.
    const takeButton = page.getByRole('button', { name: 'Record the take count' })
    for (const target of [takeButton, page.getByLabel('Buds that took'), page.getByLabel('Cause'), page.getByRole('button', { name: 'Record the loss' })]) {
      expect((await target.boundingBox())!.height).toBeGreaterThanOrEqual(44)
    }
    // The entry forms date themselves once the page runs in the phone's browser.
    await expect.poll(() => page.getByLabel('Counted on').inputValue()).toMatch(/^\d{4}-\d{2}-\d{2}$/)
    await page.getByLabel('Buds that took').fill('100')
    await takeButton.click()
    await page.getByRole('status').filter({ hasText: 'Take count of 100: recorded.' }).waitFor()
    await expect.poll(() => standing.innerText()).toBe('100')
    expect(await page.getByTestId('run-facts').innerText()).toMatch(/Take rate\s*83\.3 % \(100 of 120\)/)

    // No signal: the loss is kept on the phone and shown as waiting.
    await page.context().setOffline(true)
    await page.getByLabel('Trees lost').fill('3')
    await page.getByLabel('Cause').selectOption({ label: 'Voles, rabbits or other animals' })
    await page.getByRole('button', { name: 'Record the loss' }).click()
    const waiting = page.getByRole('region', { name: 'On this phone' })
    await waiting.getByText('Loss of 3 (voles, rabbits or other animals)').waitFor()
    expect(await waiting.innerText()).toMatch(/No connection[\s\S]*Waiting to send/)
    expect(await standing.innerText()).toBe('100')
    await screenshot(page, 'nursery-run-phone')

    // The signal returns: it is sent, once, and the count follows.
    await page.context().setOffline(false)
    await expect.poll(() => standing.innerText()).toBe('97')
    await waiting.waitFor({ state: 'detached' })
    const losses = await db('propagation_events').where({ run_id: budded.id, kind: 'loss' }).select('count', 'cause', 'client_key')
    expect(losses).toHaveLength(1)
    expect(losses[0]).toMatchObject({ count: 3, cause: 'rodents' })
    expect(losses[0].client_key).toMatch(/^[A-Za-z0-9_-]{22}$/)
    expect(await page.getByTestId('run-history').innerText()).toMatch(/Loss[\s\S]*3 lost: Voles, rabbits or other animals[\s\S]*Take counted[\s\S]*100 took/)

    // A loss larger than what stands, made offline, is refused once sent: shown with the server's reason, not sent again.
    await page.context().setOffline(true)
    await page.getByLabel('Trees lost').fill('500')
    await page.getByLabel('Cause').selectOption({ label: 'Winter injury' })
    await page.getByRole('button', { name: 'Record the loss' }).click()
    await waiting.getByText('Waiting to send').waitFor()
    await page.context().setOffline(false)
    await waiting.getByText(/Not recorded: .*Only 97 stand in this run/).waitFor()
    await page.evaluate(() => window.dispatchEvent(new Event('online')))
    await page.waitForTimeout(300)
    expect(await db('propagation_events').where({ run_id: budded.id, kind: 'loss' }).count({ n: '*' })).toEqual([{ n: 1 }])
    await waiting.getByRole('button', { name: 'Dismiss' }).click()
    await waiting.waitFor({ state: 'detached' })
    expect(await standing.innerText()).toBe('97')
    await page.context().close()
  })

  it('lines out a run from the form, showing an overlap beside the positions and keeping what was typed', async () => {
    const page = await growerPage()
    await page.goto('/nursery/runs/new')
    const form = page.getByRole('form', { name: 'Line out a run' })
    await form.getByLabel('Row').locator(`option:has-text("${fieldName}, row 7")`).waitFor({ state: 'attached' })
    await form.getByLabel('Row').selectOption({ label: `${fieldName}, row 7` })
    await form.getByLabel('First position').fill('170')
    await form.getByLabel('Last position').fill('200')
    await form.getByLabel('Variety it is meant for').selectOption({ label: 'Yarlington Mill (apple)' })
    await form.getByLabel('Rootstock').selectOption({ label: 'M.26 (apple, semi-dwarf)' })
    // One liner per position fills the count.
    expect(await form.getByLabel('Liners lined out').inputValue()).toBe('31')
    await form.getByRole('button', { name: 'Line out the run' }).click()
    const overlap = `Positions 121–180 of row 7 hold run ${plain.id} (Kingston Black on M.9)`
    await form.getByRole('alert').filter({ hasText: overlap }).waitFor()
    expect(await page.locator('#field-fromPosition-error').innerText()).toBe(overlap)
    expect(await form.getByLabel('Last position').inputValue()).toBe('200')

    await form.getByLabel('First position').fill('181')
    await form.getByLabel('Liners lined out').fill('20')
    await form.getByRole('button', { name: 'Line out the run' }).click()
    await page.waitForURL(/\/nursery\/runs\/\d+$/)
    await page.getByRole('heading', { name: 'Yarlington Mill', level: 1 }).waitFor()
    expect(await page.getByTestId('run-facts').innerText()).toMatch(new RegExp(`${fieldName}, row 7, positions 181–200`))
    await page.context().close()
  })
})
