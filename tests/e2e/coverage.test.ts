import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { testDb } from '../support/db'

// The grower's coverage page and the maker's needs page. The contract made here and the demo
// maker's needs table are put back as they were afterwards.
const db = testDb()
const year = new Date().getUTCFullYear() + 2
let browser: Browser
let contractId: number
let makerOrgId: number
let savedNeeds: Record<string, unknown>[] = []

beforeAll(async () => {
  browser = await launchBrowser()
  const grower = await db('organisations').where({ name: 'Hollowmere Orchard & Nursery' }).first('id')
  const maker = await db('organisations').where({ name: 'Quillhurst Cider Works' }).first('id')
  makerOrgId = maker.id
  savedNeeds = await db('maker_needs').where({ org_id: makerOrgId }).select()
  // 400 t of bittersweet in one year, far beyond what Hollowmere's four blocks bear.
  const [id] = await db('fruit_contracts').insert({
    maker_org_id: maker.id, grower_org_id: grower.id, drafted_by: 'maker', last_offer_by: 'maker', state: 'accepted', version: 1, accepted_version: 1,
    species: 'apple', juice_class: 'bittersweet', tolerance_pct: 10, currency: 'GBP', base_price_per_tonne_minor: 25_000, baseline_brix: 12, reject_floor_brix: 9, crop_failure: 'forgiven',
  })
  contractId = id!
  await db('fruit_contract_years').insert({ contract_id: id, harvest_year: year, tonnes: 400, window_from: `${year}-10-01`, window_to: `${year}-11-30` })
})

afterAll(async () => {
  await browser?.close()
  await db('fruit_contracts').where({ id: contractId }).delete()
  await db.transaction(async (trx) => {
    await trx('maker_needs').where({ org_id: makerOrgId }).delete()
    if (savedNeeds.length) await trx('maker_needs').insert(savedNeeds)
  })
})

describe('coverage and needs in the browser', () => {
  it('shows the grower its contracts against the forecast, the over-commitment marked, with a link to the contract', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    await page.goto('/coverage')
    await page.getByRole('heading', { name: 'Coverage', level: 1 }).waitFor()
    const row = page.getByRole('row', { name: new RegExp(`bittersweet ${year}`) })
    await expect.poll(() => row.innerText()).toMatch(/400(\.0)? t[\s\S]*Over-committed/)
    const warnings = page.getByRole('region', { name: 'Over-committed' })
    expect(await warnings.innerText()).toMatch(new RegExp(`bittersweet ${year}: the accepted contracts call for at least 360(\\.00)? t`))
    const link = page.getByRole('link', { name: /Fruit contract \d+ with Quillhurst Cider Works/ })
    expect(await link.getAttribute('href')).toBe(`/contracts/fruit/${contractId}`)
    await page.getByRole('img', { name: /bittersweet: forecast against contracts/ }).waitFor({ state: 'visible' })
    await screenshot(page, 'coverage')
    await page.context().close()
  })

  it('lets the maker add needs, shows a refusal beside the cell, saves, and charts need against supply', async () => {
    await db('maker_needs').where({ org_id: makerOrgId }).delete()
    const page = await newPage(browser)
    await signInAs(page, 'maker@demo.test')
    await page.goto('/needs')
    await page.getByRole('heading', { name: 'Fruit needs', level: 1 }).waitFor()
    await page.getByRole('button', { name: 'Add a row' }).click()
    await page.getByLabel('Juice class, row 1').selectOption('bittersweet')
    await page.getByLabel('Harvest year, row 1').fill(String(year))
    await page.getByLabel('Need in t, row 1').fill('-2')
    await page.getByRole('button', { name: 'Save the needs' }).click()
    await expect.poll(() => page.getByText('Enter from 0 to 100,000,000 kg').count()).toBe(1)
    // What was typed stays; corrected, it saves.
    expect(await page.getByLabel('Harvest year, row 1').inputValue()).toBe(String(year))
    await page.getByLabel('Need in t, row 1').fill('12.5')
    await page.getByRole('button', { name: 'Add a row' }).click()
    await page.getByLabel('Need in t, row 2').fill('3')
    await page.getByRole('button', { name: 'Save the needs' }).click()
    await page.getByRole('status').filter({ hasText: 'The needs are saved.' }).waitFor()
    expect(await db('maker_needs').where({ org_id: makerOrgId }).orderBy('harvest_year').select('juice_class', 'harvest_year', 'kg'))
      .toEqual([{ juice_class: 'bittersweet', harvest_year: year, kg: 12_500 }, { juice_class: 'bittersweet', harvest_year: year + 1, kg: 3000 }])
    await page.getByRole('img', { name: /bittersweet: need against supply/ }).waitFor({ state: 'visible' })
    await screenshot(page, 'needs')

    // A row removed is gone once saved.
    await page.getByRole('button', { name: 'Remove row 2' }).click()
    await page.getByRole('button', { name: 'Save the needs' }).click()
    await expect.poll(async () => (await db('maker_needs').where({ org_id: makerOrgId }).select('harvest_year')).map(r => r.harvest_year)).toEqual([year])
    await page.context().close()
  })

  it('shows a viewer the needs without a way to change them', async () => {
    await db('maker_needs').where({ org_id: makerOrgId }).delete()
    await db('maker_needs').insert({ org_id: makerOrgId, juice_class: 'sharp', harvest_year: year, kg: 4200 })
    const page = await newPage(browser)
    await signInAs(page, 'viewer@demo.test')
    await page.goto('/needs')
    const row = page.getByRole('row', { name: new RegExp(`sharp ${year}`) })
    await expect.poll(() => row.innerText()).toMatch(/4\.2(00)? t/)
    expect(await page.getByRole('button', { name: 'Save the needs' }).count()).toBe(0)
    expect(await page.getByRole('button', { name: 'Add a row' }).count()).toBe(0)
    await page.context().close()
  })
})
