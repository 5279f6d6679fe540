import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { contractFixtures, orgId, rootstockId, varietyId } from '../support/contracts'
import { testDb } from '../support/db'
import { as } from '../support/http'

// The season calendar of the demo nursery, Hollowmere: its Dabinett rows lined out, budded and
// counted (done) and their heading back still to do; and a run on an interstem, made for this file,
// whose interstem budding and knip cut-back are recorded on its page and so done in the calendar.
const db = testDb()
const mark = `e2e nursery tasks ${Date.now().toString(36)}`
const { treeContract } = contractFixtures(mark)
let browser: Browser
let fieldId: number
let contractId: number

const year = new Date().getUTCFullYear()

beforeAll(async () => {
  browser = await launchBrowser()
  const [bed] = await db('nursery_beds').insert({ org_id: await orgId('hollowmere'), name: mark, kind: 'field' })
  fieldId = bed!
  const grower = await as('growerOwner')
  const row = await grower.post('/api/nursery/rows', { fieldId, name: '40', positions: 200 })
  expect(row.status).toBe(201)
  // A knip tree on an interstem for autumn next year: lined out two springs ago (back-plan).
  contractId = await treeContract('propagating', { tree_count: 100, tree_type: 'knip', interstem: true, delivery_year: year + 1, delivery_season: 'autumn' })
  const created = await grower.post('/api/nursery/runs', {
    rowId: row.body.id, fromPosition: 1, toPosition: 131, rootstockId: await rootstockId('MM.106'), interstem: 'Beauty of Bath',
    linedOutOn: `${year - 2}-04-20`, linedOutCount: 131, varietyId: await varietyId('Dabinett'), treeContractId: contractId,
  })
  expect(created.status, JSON.stringify(created.body)).toBe(201)
})

afterAll(async () => {
  await browser?.close()
  const rows = (await db('nursery_rows').where({ field_id: fieldId }).select('id')).map(r => r.id as number)
  const runs = (await db('nursery_runs').whereIn('row_id', rows).select('id')).map(r => r.id as number)
  await db('propagation_events').whereIn('run_id', runs).delete()
  await db('nursery_runs').whereIn('id', runs).delete()
  await db('nursery_rows').whereIn('id', rows).delete()
  await db('nursery_beds').where({ id: fieldId }).delete()
})

async function growerPage(): Promise<Page> {
  const page = await newPage(browser)
  await signInAs(page, 'grower@demo.test')
  return page
}

describe('the season calendar', () => {
  it('shows the demo nursery\'s tasks by month, done ones with their day and open ones linked to their run', async () => {
    const page = await growerPage()
    await page.goto('/nursery')
    await page.getByRole('navigation', { name: 'Nursery' }).getByRole('link', { name: 'Season calendar' }).click()
    await page.getByRole('heading', { name: 'Season calendar', level: 1 }).waitFor()

    // Quillhurst's 1,200 Dabinett for spring 2028: 1,569 liners by 30 April 2026, lined out 14 and 15 April.
    const april = page.getByRole('region', { name: /^April 2026/ })
    const lineOut = april.getByRole('listitem').filter({ hasText: 'Line out 1,569 liners of MM.106 for Quillhurst Cider Works\' Dabinett' })
    expect(await lineOut.innerText()).toMatch(/Done 15 April 2026/)
    const september = page.getByRole('region', { name: /^September 2026/ })
    expect(await september.getByRole('listitem').filter({ hasText: 'Bud row 10, positions 1–600: 600 MM.106 liners with Dabinett' }).innerText()).toMatch(/Done 18 August 2026/)
    // Heading back by 31 March 2027 (back-plan), still to do, with the way to record it.
    const march = page.getByRole('region', { name: /^March 2027/ })
    const headBack = march.getByRole('listitem').filter({ hasText: 'Head back row 10, positions 1–600 above the Dabinett bud' })
    expect(await headBack.innerText()).toMatch(/Due by 31 March 2027[\s\S]*To do/)
    await screenshot(page, 'nursery-tasks-calendar')

    await page.getByLabel('Show', { exact: true }).selectOption('done')
    await expect.poll(() => page.getByText('Head back row 10, positions 1–600 above the Dabinett bud').count()).toBe(0)
    expect(await page.getByText('Line out 1,569 liners of MM.106 for Quillhurst Cider Works\' Dabinett').count()).toBe(1)

    await page.getByLabel('Show', { exact: true }).selectOption('open')
    const open = page.getByRole('listitem').filter({ hasText: 'Head back row 10, positions 1–600 above the Dabinett bud' })
    await open.getByRole('link', { name: /^Record on the run/ }).click()
    await page.getByRole('heading', { name: 'Dabinett', level: 1 }).waitFor()
    expect(page.url()).toMatch(/\/nursery\/runs\/\d+$/)
    await page.close()
  })

  it('marks an overdue task in words, and does it once its event is recorded on the run', async () => {
    const page = await growerPage()
    await page.goto('/nursery/tasks')
    await page.getByLabel('Tree contract', { exact: true }).selectOption(String(contractId))
    // The interstem was due to be budded by 30 September two years ago.
    const interstem = page.getByRole('listitem').filter({ hasText: 'Bud row 40, positions 1–131 with the interstem Beauty of Bath: 131 MM.106 liners' })
    await expect.poll(async () => (await interstem.count()) === 1 && /Overdue/.test(await interstem.innerText())).toBe(true)
    await screenshot(page, 'nursery-tasks-overdue')
    await interstem.getByRole('link', { name: /^Record on the run/ }).click()
    await page.getByRole('heading', { name: 'Dabinett', level: 1 }).waitFor()
    const still = page.getByRole('region', { name: 'Still to do on this run' })
    await still.getByText(/^Bud row 40, positions 1–131 with the interstem/).waitFor()
    expect(await still.innerText()).toMatch(/Overdue: was due by 30 September \d{4}/)

    await page.getByText('Budded (interstem or variety) or grafted').click()
    await page.getByLabel('Interstem', { exact: true }).check()
    const work = page.getByRole('form', { name: 'Budded or grafted' })
    expect(await work.getByLabel('Variety put on').count()).toBe(0)
    await work.getByLabel('Method').selectOption('chip-bud')
    await work.getByLabel('Rootstocks budded with the interstem').fill('131')
    await work.getByLabel('Worked on').fill(`${year - 2}-08-20`)
    await work.getByRole('button', { name: 'Record the interstem budding' }).click()
    await work.getByText('Budded with the interstem 131: recorded.').waitFor()
    // Recorded, the task leaves the run's list of what is still to do.
    await expect.poll(() => still.getByText(/^Bud row 40, positions 1–131 with the interstem/).count()).toBe(0)

    await page.getByText('Cut back to a knip').first().click()
    const knip = page.getByRole('form', { name: 'Cut back to a knip' })
    await knip.getByLabel('Done on').fill(`${year - 1}-01-20`)
    await knip.getByRole('button', { name: 'Record: cut back to a knip' }).click()
    await knip.getByText('Cut back to a knip: recorded.').waitFor()
    await screenshot(page, 'nursery-tasks-run-interstem')

    await page.getByRole('link', { name: 'Season calendar' }).click()
    await page.getByLabel('Tree contract', { exact: true }).selectOption(String(contractId))
    const done = page.getByRole('listitem').filter({ hasText: 'Bud row 40, positions 1–131 with the interstem Beauty of Bath' })
    await expect.poll(async () => (await done.count()) === 1 && /Done 20 August/.test(await done.innerText())).toBe(true)
    expect(await done.innerText()).not.toMatch(/Overdue/)
    await page.close()
  })
})
