import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { testDb } from '../support/db'

let browser: Browser
const subject = `Osier Bed: Foxwhelp block checked ${Date.now().toString(36)}`

beforeAll(async () => {
  browser = await launchBrowser()
  // Tansy Row's owner starts with everything read but one new notice about a block.
  const user = await testDb()('users').where({ email: 'grower2@demo.test' }).first('id', 'org_id')
  await testDb()('notices').where({ user_id: user.id }).whereNull('read_at').update({ read_at: new Date() })
  await testDb()('notices').insert({ user_id: user.id, org_id: user.org_id, kind: 'test.block', subject, body: 'The stakes on the river end were checked after the flood.', link: '/blocks' })
})
afterAll(async () => {
  await browser?.close()
  await testDb()('notices').where({ subject }).delete()
})

describe('notices in the browser', () => {
  it('shows a new notice in the bell, lists it, and marks it read', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower2@demo.test')
    const bell = page.getByRole('link', { name: /^Notices,/ })
    await expect.poll(() => bell.getAttribute('aria-label')).toBe('Notices, 1 unread')
    await screenshot(page, 'notices-bell-unread')

    await bell.click()
    await page.waitForURL(/\/notices$/)
    const item = page.getByRole('listitem', { name: subject })
    await item.waitFor()
    expect(await item.getByRole('link', { name: subject }).getAttribute('href')).toBe('/blocks')

    await item.getByRole('button', { name: `Mark read: ${subject}` }).click()
    await expect.poll(() => bell.getAttribute('aria-label')).toBe('Notices, none unread')
    expect(await item.getByRole('button').count()).toBe(0)
    await screenshot(page, 'notices-read')
    await page.context().close()
  })

  it('shows an owner the organisation’s sent messages on the settings page, and not a member', async () => {
    const owner = await newPage(browser)
    await signInAs(owner, 'maker@demo.test')
    await owner.goto('/settings')
    await owner.getByRole('heading', { name: 'Messages sent from your organisation' }).waitFor()
    // The demo's refused address: shown with its state, its tries and the relay's answer.
    await owner.getByLabel('Show').selectOption('failed')
    const failed = owner.getByRole('row').filter({ hasText: 'cellar@quilhurst.example' })
    await failed.waitFor()
    await expect(failed.textContent()).resolves.toMatch(/failed after 5 tries.*mailbox unavailable/)
    await screenshot(owner, 'settings-outbox')
    await owner.context().close()

    const page = await newPage(browser)
    await signInAs(page, 'grower-member@demo.test')
    await page.goto('/settings')
    await page.getByRole('heading', { name: 'Settings', level: 1 }).waitFor()
    expect(await page.getByRole('heading', { name: 'Messages sent from your organisation' }).count()).toBe(0)
    await page.context().close()
  })
})
