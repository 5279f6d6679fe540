import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { textPdf } from '../../server/db/seeds/data/labCertificate'
import { testDb } from '../support/db'
import { labImportFixtures } from '../support/labImport'

// Hollowmere's owner opens a lab sheet in the browser, maps its columns (a semicolon sheet with a
// decimal comma, dates day first, TA as tartaric and tannin in %) and imports it; then a sheet with
// bad rows is refused by row and field, and imported with the bad rows skipped; a PDF sheet is shown
// beside the form its reading is typed into.
const db = testDb()
const { lot, sheet } = labImportFixtures('e2e lab import')
let browser: Browser

beforeAll(async () => {
  browser = await launchBrowser()
  await lot('FX-101', 'Dabinett', '2025-10-01')
  await lot('FX-102', 'Kingston Black', '2025-10-06')
  await lot('FX-103', 'Blakeney Red', '2025-09-25')
})

afterAll(async () => {
  await browser?.close()
})

describe('importing a lab sheet in the browser', () => {
  it('maps the columns, imports the readings and shows the result', async () => {
    const id = await sheet('fernleigh-lab-2025-10.csv')
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    await page.goto(`/lab-sheets/${id}`)
    await page.getByRole('heading', { name: 'fernleigh-lab-2025-10.csv', level: 1 }).waitFor()
    expect(await page.getByTestId('sheet-state').innerText()).toBe('Not imported yet · 2 rows')
    const preview = page.getByRole('table', { name: 'First 2 of 2 rows' })
    expect(await preview.innerText()).toMatch(/FX-101\s+14\/10\/2025\s+12,6/)
    // Suggested from the header names.
    expect(await page.getByLabel('Lot code').inputValue()).toBe('Sample ref')
    expect(await page.getByLabel('TA reported as').inputValue()).toBe('tartaric')
    await page.getByLabel('°Brix').selectOption('°Bx')
    await page.getByLabel('Tannin unit').selectOption('%')
    await page.getByLabel('Dates are written').selectOption('DD/MM/YYYY')
    await page.getByLabel('Numbers use a decimal comma').check()
    await screenshot(page, 'lab-import-mapping')
    await page.getByRole('button', { name: 'Import' }).click()
    await page.getByRole('status').filter({ hasText: 'Imported 2 readings; 0 rows skipped.' }).waitFor()
    await expect.poll(() => page.getByTestId('sheet-state').innerText()).toMatch(/^Imported \d{4}-\d{2}-\d{2} · 2 readings kept, 0 skipped$/)
    await screenshot(page, 'lab-import-done')
    const rows = await db('juice_readings').where({ lab_sheet_id: id }).orderBy('sheet_row')
    expect(rows.map(r => [r.sampled_on, Number(r.brix), Number(r.tannin_g_per_l)])).toEqual([['2025-10-14', 12.6, 2.5], ['2025-10-15', 13.3, 2.1]])
    await page.context().close()
  })

  it('lists the bad rows by row and field, and imports the rest when asked', async () => {
    const id = await sheet('bad-rows.csv')
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    await page.goto(`/lab-sheets/${id}`)
    await page.getByRole('heading', { name: 'bad-rows.csv', level: 1 }).waitFor()
    await page.getByRole('button', { name: 'Import' }).click()
    const errors = page.getByRole('region', { name: 'Rows that cannot be imported' })
    await errors.waitFor()
    expect(await errors.getByRole('row').count()).toBe(7) // the header and six bad rows
    expect(await errors.innerText()).toMatch(/3\s+Lot code\s+No lot of yours has the code "FX-999"/)
    expect(await errors.innerText()).toMatch(/7\s+°Brix\s+°Brix of a juice is from 0 to 32; got 85/)
    expect(await db('juice_readings').where({ lab_sheet_id: id }).count({ n: '*' })).toEqual([{ n: 0 }])
    await screenshot(page, 'lab-import-errors')
    await page.getByLabel('Skip the bad rows and import the rest').check()
    await page.getByRole('button', { name: 'Import' }).click()
    await page.getByRole('status').filter({ hasText: 'Imported 2 readings; 6 rows skipped.' }).waitFor()
    expect(await page.getByRole('region', { name: 'Rows skipped' }).getByRole('row').count()).toBe(7)
    await page.context().close()
  })

  it('shows a PDF sheet beside the form, and keeps the reading typed from it with the sheet', async () => {
    const bytes = textPdf([
      { text: 'Test bench certificate', bold: true, size: 16 },
      { text: 'Lot FX-101, sampled 2025-10-20: 12.8 °Brix, TA 2.2 g/L as malic, pH 4.30' },
    ])
    const id = await sheet('bench-certificate.pdf', { bytes })
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    const shown = page.waitForResponse(res => res.url().endsWith(`/api/lab-sheets/${id}/pdf`))
    await page.goto(`/lab-sheets/${id}`)
    await page.getByRole('heading', { name: 'bench-certificate.pdf', level: 1 }).waitFor()
    // The frame loads the PDF from the app itself (the file store's links may not be framed).
    const pdf = await shown
    expect(pdf.status()).toBe(200)
    expect(pdf.headers()['content-type']).toBe('application/pdf')
    expect(await page.locator('iframe[title="The sheet bench-certificate.pdf"]').getAttribute('src')).toBe(`/api/lab-sheets/${id}/pdf#view=FitH`)

    const form = page.getByRole('form', { name: 'Type a reading in' })
    await form.getByLabel('Lot').selectOption({ label: 'FX-101 · Dabinett' })
    await form.getByLabel('Day sampled').fill('2025-10-20')
    await form.getByLabel('°Brix').fill('12.8')
    await form.getByLabel('Titratable acidity').fill('2.2')
    await form.getByLabel('pH').fill('4.30')
    // The browser's PDF viewer draws the page a moment after the frame loads: for the picture only.
    await page.waitForTimeout(1500)
    await screenshot(page, 'lab-sheet-pdf-entry')
    await form.getByRole('button', { name: 'Save the reading' }).click()
    await page.getByRole('status').filter({ hasText: 'Reading of 2025-10-20 kept for lot FX-101.' }).waitFor()
    const rows = await db('juice_readings').where({ lab_sheet_id: id })
    expect(rows.map(r => [r.sampled_on, Number(r.brix), Number(r.ta_g_per_l), r.sheet_row])).toEqual([['2025-10-20', 12.8, 2.2, null]])
    await page.context().close()
  })
})
