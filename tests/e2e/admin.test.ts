import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { testDb } from '../support/db'

// The platform admin moves an organisation through its states with the buttons the state table offers.
let browser: Browser
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

describe('organisations page', () => {
  it('offers only the moves each state allows, and the page follows each move', async () => {
    const name = `Brambleside Orchard ${Date.now().toString(36)}`
    await testDb()('organisations').insert({ name, kind: 'grower', status: 'pending', region: 'Estry valley' })
    const page = await newPage(browser)
    await signInAs(page, 'admin@demo.test')
    await page.goto('/admin/organisations')
    const row = page.getByRole('row').filter({ hasText: name })
    await expect(row.getByRole('cell', { name: 'pending' }).isVisible()).resolves.toBe(true)
    await expect(row.getByRole('button').allTextContents()).resolves.toEqual(['Open without e-mail check'])

    await row.getByRole('button', { name: 'Open without e-mail check' }).click()
    await row.getByRole('cell', { name: 'active' }).waitFor()
    await expect(row.getByRole('button').allTextContents()).resolves.toEqual(['Suspend'])

    page.once('dialog', dialog => dialog.accept())
    await row.getByRole('button', { name: 'Suspend' }).click()
    await row.getByRole('cell', { name: 'suspended' }).waitFor()
    await expect(row.getByRole('button').allTextContents()).resolves.toEqual(['Reopen'])
    await screenshot(page, 'admin-organisations')

    await row.getByRole('button', { name: 'Reopen' }).click()
    await row.getByRole('cell', { name: 'active' }).waitFor()
    expect((await testDb()('organisations').where({ name }).first('status')).status).toBe('active')
  })

  it('sends a grower who tries the page home, and never links it for them', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    await expect(page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Organisations' }).count()).resolves.toBe(0)
    await page.goto('/admin/organisations')
    await page.waitForURL(url => url.pathname === '/')
    await expect(page.getByRole('heading', { name: 'Organisations', level: 1 }).count()).resolves.toBe(0)
  })
})
