import { randomBytes } from 'node:crypto'
import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { testDb } from '../support/db'

let browser: Browser
const name = `harvest-lab-${randomBytes(4).toString('hex')}.csv`
const csv = `Sample,Date,Brix,TA\r\nTR-7,2026-10-02,12.4,4.1\r\n# ${name}\r\n`

beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
  await testDb()('lab_sheets').where({ name }).delete()
})

describe('lab sheets in the browser', () => {
  it('a grower uploads a CSV, watches its progress and finds it in the list', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower2@demo.test')
    await page.goto('/lab-sheets')
    await page.getByLabel('Files').setInputFiles([{ name, mimeType: 'text/csv', buffer: Buffer.from(csv) }])
    await page.getByRole('button', { name: 'Upload' }).click()

    const bar = page.getByRole('progressbar', { name: `Upload of ${name}` })
    await expect.poll(() => bar.getAttribute('value')).toBe('100')
    await expect.poll(() => page.getByRole('list', { name: 'Uploads' }).getByRole('status').innerText()).toMatch(new RegExp(`Stored\\. Open ${name.replace('.', '\\.')}`))
    const row = page.getByRole('table', { name: 'Lab sheets' }).getByRole('row').filter({ hasText: name })
    await expect.poll(() => row.innerText()).toMatch(/CSV/)
    expect(await row.innerText()).toMatch(/Not yet/)
    await screenshot(page, 'lab-sheets-uploaded')

    // The same file again is said to be a copy, with a link to the sheet already kept.
    await page.getByLabel('Files').setInputFiles([{ name: `copy of ${name}`, mimeType: 'text/csv', buffer: Buffer.from(csv) }])
    await page.getByRole('button', { name: 'Upload' }).click()
    await expect.poll(() => page.getByText('This file was uploaded before').count()).toBe(1)
    const earlier = await page.getByRole('link', { name: 'Open the earlier sheet' }).getAttribute('href')
    expect(earlier).toBe(await row.getByRole('link').getAttribute('href'))

    // A picture named as a CSV is refused in words, naming the file.
    await page.getByLabel('Files').setInputFiles([{ name: 'photo.csv', mimeType: 'text/csv', buffer: Buffer.from('89504e470d0a1a0a0000000d49484452', 'hex') }])
    await page.getByRole('button', { name: 'Upload' }).click()
    await expect.poll(() => page.getByRole('list', { name: 'Uploads' }).getByRole('alert').innerText()).toMatch(/photo\.csv is a PNG file/)
    await screenshot(page, 'lab-sheets-refused')
  })
})
