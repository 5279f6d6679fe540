import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { orgId, varietyId } from '../support/contracts'
import { testDb } from '../support/db'
import { lotFixtures } from '../support/lots'

// A load at the press in the browser: the demo maker records a delivery of a Tansy Row lot under
// the demo bittersharp contract through the form, with the settlement worked beneath it as it is
// typed; the grower sees it and disputes the tare; the maker corrects the ticket; the grower reads
// the new version and opens the season's statement. The lot and its reading are this file's own
// (marked), so the figures are known and nothing of the demo is used up.
const MARK = `E2E-DLV-${Date.now().toString(36)}-`
const fixtures = lotFixtures(MARK)
const db = testDb()
// Registered after the lots' own clean-up, so it runs before it: a delivery holds on to its lot.
afterAll(async () => {
  const lots = db('harvest_lots').where('code', 'like', `${MARK}%`).select('id')
  await db('deliveries').whereIn('lot_id', lots).delete()
})

let browser: Browser
let contractId = 0
let lotCode = ''
let deliveryPath = ''

beforeAll(async () => {
  browser = await launchBrowser()
  const tansyRow = await orgId('tansyRow')
  const contract = await db('fruit_contracts').where({ maker_org_id: await orgId('quillhurst'), grower_org_id: tansyRow, juice_class: 'bittersharp' }).first('id')
  contractId = contract.id
  const block = await db('orchard_blocks').where({ org_id: tansyRow, name: 'River Strip' }).first('id')
  const lotId = await fixtures.lot(tansyRow, { variety_id: await varietyId('Kingston Black'), block_id: block.id, picked_on: '2026-10-15', net_kg: 2500, bins: 6 })
  await fixtures.reading(lotId, { sampled_on: '2026-10-16', brix: 12.8, ta_g_per_l: 6.0, ph: 3.4, tannin_g_per_l: 2.3 })
  lotCode = (await db('harvest_lots').where({ id: lotId }).first('code')).code
})
afterAll(async () => {
  await browser?.close()
})

const settlement = (page: Page) => page.getByTestId('delivery-settlement')
const standing = (page: Page) => page.getByTestId('delivery-standing')
const moves = (page: Page) => page.getByRole('region', { name: 'What you can do' })
const history = (page: Page) => page.getByRole('list', { name: 'Delivery history' })

describe('a delivery at the press in the browser', () => {
  it('lets the maker record a load through the form, with the settlement worked as it is typed', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'maker@demo.test')
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Deliveries' }).click()
    await page.waitForURL(/\/deliveries$/)
    await page.getByRole('link', { name: 'Record a delivery' }).click()
    await page.waitForURL(/\/deliveries\/new$/)
    // Typed in at the weighbridge office, on a phone.
    await page.setViewportSize({ width: 390, height: 844 })
    expect(await page.getByRole('note').allInnerTexts()).toEqual([expect.stringMatching(/dangerous machinery[\s\S]*lock out/), expect.stringMatching(/not pasteurised can carry pathogens/)])

    const contract = page.getByLabel('Fruit contract')
    await page.waitForSelector(`#delivery-contract option[value="${contractId}"]`, { state: 'attached' })
    await contract.selectOption({ label: `Fruit contract ${contractId}: bittersharp apples, Tansy Row Fruit` })
    // The lot comes from those the contract covers, with what is left of it and its latest °Brix.
    const lotLabel = `${lotCode}, Kingston Black: 2,500 kg left, 12.8 °Brix`
    await page.waitForSelector(`#delivery-lot option:has-text("${lotCode}")`, { state: 'attached' })
    expect(await page.locator('#delivery-lot option', { hasText: lotCode }).innerText()).toBe(lotLabel)
    await page.getByLabel('Lot', { exact: true }).selectOption({ label: lotLabel })
    await expect.poll(() => page.getByLabel('Reading paid on').locator('option:checked').innerText()).toBe('12.8 °Brix, sampled 16 October 2026 (latest)')
    await page.getByLabel('Day delivered').fill('2026-11-05')
    await page.getByLabel('Ticket number (optional)').fill('QH-WB-0412')

    // The net fills in as gross − tare; typed over, the difference is said beside it before sending.
    await page.getByLabel('Gross (kg, optional)').fill('5140')
    await page.getByLabel('Tare (kg, optional)').fill('2600')
    await expect.poll(() => page.getByLabel('Net (kg)').inputValue()).toBe('2540')
    await page.getByLabel('Net (kg)').fill('2530')
    expect(await page.locator('#field-net-error').innerText()).toBe('Gross − tare is 2,540 kg: the net typed differs by 10 kg')
    await page.getByLabel('Net (kg)').fill('2540')
    expect(await page.locator('#field-net-error').count()).toBe(0)
    await page.getByLabel('Rot, % (optional)').fill('2')
    await page.getByLabel('Damage, % (optional)').fill('3')

    // 2,540 kg is more than the lot holds (2,500 kg): the server says so beside the net, and what was typed stays.
    await page.getByRole('button', { name: 'Record the delivery' }).click()
    await expect.poll(() => page.locator('#field-net-error').innerText()).toBe(`Lot ${lotCode} has 2,500 kg left to deliver of its 2,500 kg: 2,540 kg is more`)
    expect(await page.getByRole('form', { name: 'Record a delivery' }).getByRole('alert').innerText()).toBe('Some fields need attention.')
    expect(await page.getByLabel('Ticket number (optional)').inputValue()).toBe('QH-WB-0412')
    expect(await page.getByLabel('Gross (kg, optional)').inputValue()).toBe('5140')

    await page.getByLabel('Tare (kg, optional)').fill('2780')
    await expect.poll(() => page.getByLabel('Net (kg)').inputValue()).toBe('2360')
    // The net typed again, its refusal goes.
    expect(await page.locator('#field-net-error').count()).toBe(0)
    // Worked by hand from the demo contract's terms (£210.00 a tonne at 12.0 °Brix, £10.00 a tonne
    // for each °Brix above): 12.8 °Brix is 0.8 above, so £210.00 + 0.8 × £10.00 = £218.00 a tonne;
    // 2.36 t × £210.00 = £495.60 base, 2.36 t × £8.00 = £18.88 bonus, £514.48 in all. Tansy Row's
    // tax rate is 0 %, applied once the load is recorded.
    const preview = page.getByTestId('settlement-preview')
    await expect.poll(() => preview.innerText()).toMatch(/Net weight\s+2,360 kg[\s\S]*0\.8 above the baseline of 12\.0\s+12\.8 °Brix[\s\S]*Price per tonne\s+£218\.00\s+Base amount\s+£495\.60\s+Sugar bonus\s+\+£18\.88\s+Amount\s+£514\.48/)
    // Nothing of the form runs off the side of the phone's screen.
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390)
    await screenshot(page, 'delivery-form-phone')
    await page.getByRole('button', { name: 'Record the delivery' }).click()

    await page.waitForURL(/\/deliveries\/\d+$/)
    await page.setViewportSize({ width: 1280, height: 860 })
    deliveryPath = new URL(page.url()).pathname
    await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toBe(`Delivery ${deliveryPath.split('/').pop()}`)
    expect(await standing(page).innerText()).toMatch(/Maker\s+Quillhurst Cider Works \(your organisation\)\s+Grower\s+Tansy Row Fruit[\s\S]*State\s+Recorded[\s\S]*Version\s+1/)
    expect(await page.getByTestId('delivery-ticket').innerText()).toMatch(/5 November 2026[\s\S]*QH-WB-0412[\s\S]*Gross\s+5,140 kg\s+Tare\s+2,780 kg\s+Net\s+2,360 kg[\s\S]*12\.8 °Brix, sampled 16 October 2026[\s\S]*Rot\s+2 %\s+Damage\s+3 %/)
    expect(await settlement(page).innerText()).toMatch(/Net weight\s+2,360 kg\s+Paid on\s+2,360 kg[\s\S]*12\.8 °Brix\s+Price per tonne\s+£218\.00\s+Base amount\s+£495\.60\s+Sugar bonus\s+\+£18\.88\s+Amount\s+£514\.48\s+Tax \(0 %\)\s+£0\.00\s+Total paid to the grower\s+£514\.48/)
    expect(await page.getByTestId('delivery-year').innerText()).toMatch(/Contracted\s+40 t[\s\S]*from 36 t to 44 t/)
    expect(await moves(page).getByRole('button').allInnerTexts()).toEqual(['Correct the delivery', 'Settle', 'Dispute'])
    await screenshot(page, 'delivery-recorded')

    // The delivery and the list on the phone: nothing runs off the side of the screen.
    await page.setViewportSize({ width: 390, height: 844 })
    await settlement(page).scrollIntoViewIfNeeded()
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390)
    await screenshot(page, 'delivery-phone')
    await page.goto('/deliveries')
    await page.getByTestId('delivery-table').waitFor()
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390)
    await page.context().close()
  })

  it('shows the grower the load at once, and lets it dispute the tare', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower2@demo.test')
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Deliveries' }).click()
    await page.waitForURL(/\/deliveries$/)
    const row = page.getByTestId('delivery-table').getByRole('row').filter({ hasText: lotCode })
    await row.waitFor()
    expect(await row.innerText()).toMatch(/2026-11-05[\s\S]*Kingston Black[\s\S]*Quillhurst Cider Works[\s\S]*QH-WB-0412[\s\S]*2,360 kg[\s\S]*12\.8[\s\S]*£514\.48[\s\S]*Recorded/)
    await row.getByRole('link').click()
    await page.waitForURL(deliveryPath)

    // The grower's one move on a recorded load is to dispute it.
    await moves(page).getByRole('button', { name: 'Dispute' }).waitFor()
    expect(await moves(page).getByRole('button').allInnerTexts()).toEqual(['Dispute'])
    await moves(page).getByRole('button', { name: 'Dispute' }).click()
    const form = page.getByRole('form', { name: 'Dispute the delivery' })
    await form.getByRole('button', { name: 'Send the dispute' }).click()
    expect(await form.locator('.field-error').innerText()).toBe('Say what is wrong with the delivery')
    await form.getByLabel('Why you dispute it').fill('The tare is the laden trailer\'s second weighing: our empty trailer is 2,730 kg.')
    await form.getByRole('button', { name: 'Send the dispute' }).click()
    await expect.poll(() => moves(page).getByRole('status').innerText()).toMatch(/disputed/i)
    await expect.poll(() => standing(page).innerText()).toMatch(/State\s+Disputed\s+by you\s+Disputed by\s+Tansy Row Fruit \(your organisation\)\s+Why\s+“The tare is the laden trailer's second weighing: our empty trailer is 2,730 kg\.”/)
    expect(await moves(page).getByRole('button').allInnerTexts()).toEqual(['Withdraw the dispute'])
    await page.context().close()
  })

  it('lets the maker correct the ticket, which answers the dispute with a new version', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'maker@demo.test')
    await page.goto('/deliveries')
    const row = page.getByTestId('delivery-table').getByRole('row').filter({ hasText: lotCode })
    // Disputed is said in words in the list, not by colour alone.
    await expect.poll(() => row.innerText()).toMatch(/Disputed\s+by the grower/)
    await row.getByRole('link').click()
    await page.waitForURL(deliveryPath)
    expect(await standing(page).innerText()).toMatch(/Disputed by\s+Tansy Row Fruit\s+Why/)

    await moves(page).getByRole('button', { name: 'Correct the delivery' }).click()
    const form = page.getByRole('form', { name: 'Correct the delivery' })
    expect(await form.getByLabel('Tare (kg, optional)').inputValue()).toBe('2780')
    await form.getByLabel('Tare (kg, optional)').fill('2730')
    await expect.poll(() => form.getByLabel('Net (kg)').inputValue()).toBe('2410')
    // 2.41 t × £218.00 = £525.38: £506.10 base and £19.28 bonus; Tansy Row's 0 % tax is known now.
    await expect.poll(() => form.getByTestId('settlement-preview').innerText()).toMatch(/Amount\s+£525\.38\s+Tax \(0 %\)\s+£0\.00\s+Total paid to the grower\s+£525\.38/)
    await form.getByRole('button', { name: 'Save the correction' }).click()
    await expect.poll(() => page.getByRole('status').first().innerText()).toBe('Corrected: this is version 2.')
    expect(await standing(page).innerText()).toMatch(/State\s+Recorded[\s\S]*Version\s+2/)
    const corrected = history(page).getByRole('listitem', { name: 'Corrected, version 2' })
    expect(await corrected.innerText()).toMatch(/Olu Brandt[\s\S]*Tare: 2,780 kg → 2,730 kg[\s\S]*Net: 2,360 kg → 2,410 kg/)
    await page.context().close()
  })

  it('shows the grower the new version, and the season statement with the demo\'s deliveries', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower2@demo.test')
    await page.goto(deliveryPath)
    await expect.poll(() => standing(page).innerText()).toMatch(/State\s+Recorded[\s\S]*Version\s+2/)
    expect(await page.getByTestId('delivery-ticket').innerText()).toMatch(/Tare\s+2,730 kg\s+Net\s+2,410 kg/)
    expect(await settlement(page).innerText()).toMatch(/Base amount\s+£506\.10\s+Sugar bonus\s+\+£19\.28\s+Amount\s+£525\.38[\s\S]*Total paid to the grower\s+£525\.38/)
    expect(await history(page).getByRole('listitem').count()).toBeGreaterThanOrEqual(3)
    expect(await history(page).getByRole('listitem', { name: 'Disputed, version 1' }).innerText()).toMatch(/Priya Halloran[\s\S]*2,730 kg/)

    await page.getByRole('link', { name: 'The 2026 season\'s statement' }).click()
    await page.waitForURL(`/statements/${contractId}/2026`)
    const lines = page.getByTestId('statement-lines').locator('tbody tr')
    await lines.first().waitFor()
    // The demo's three deliveries (the seed's TR-26-003, -004 and -001) and this file's one.
    expect(await lines.count()).toBe(4)
    const lineOf = (code: string) => lines.filter({ hasText: code })
    expect(await lineOf('TR-26-003').innerText()).toMatch(/3,320 kg[\s\S]*11\.8 °Brix[\s\S]*£207\.00[\s\S]*£697\.20[\s\S]*−£9\.96[\s\S]*£687\.24/)
    expect(await lineOf('TR-26-004').innerText()).toMatch(/Rejected: 9\.3 °Brix is under the contract's reject floor of 9\.5 °Brix/)
    expect(await lineOf('TR-26-001').innerText()).toMatch(/5,610 kg[\s\S]*13\.4 °Brix[\s\S]*£224\.00[\s\S]*£1,178\.10[\s\S]*\+£78\.54[\s\S]*£1,256\.64/)
    expect(await lineOf(lotCode).innerText()).toMatch(/5,140 kg − 2,730 kg = 2,410 kg net[\s\S]*£218\.00[\s\S]*£506\.10[\s\S]*\+£19\.28[\s\S]*£525\.38/)
    // Worked by hand on the contract's terms (£210.00 a tonne at 12.0 °Brix, +£10.00 a tonne for each
    // °Brix above, −£15.00 below, nothing under 9.5 °Brix): TR-26-003 3.32 t at 11.8 °Brix, £207.00 a
    // tonne, £687.24; TR-26-004 under the floor, £0 on 0 kg; TR-26-001 5.61 t at 13.4 °Brix, £224.00 a
    // tonne, £1,256.64; this file's 2.41 t at 12.8 °Brix, £525.38. Paid on 3,320 + 5,610 + 2,410 =
    // 11,340 kg of 14,220 kg net; base £697.20 + £1,178.10 + £506.10 = £2,381.40; sugar −£9.96 +
    // £78.54 + £19.28 = +£87.86; £2,469.26 in all, and Tansy Row's 0 % tax adds nothing.
    expect(await page.getByTestId('statement-totals').innerText()).toMatch(/What stands\s+11,340 kg\s+of 14,220 kg net\s+£2,381\.40\s+\+£87\.86\s+£2,469\.26\s+£0\.00\s+£2,469\.26/)
    await screenshot(page, 'season-statement')
    await page.context().close()
  })
})
