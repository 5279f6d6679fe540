import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import type { Browser, Page } from 'playwright-core'
import { afterEach, expect } from 'vitest'
import { watchCsp } from './chromium'
import { DEMO_PASSWORD, testEnv } from './env'
import { randomAddress } from './http'

export { launchBrowser } from './chromium'

// Every page the app serves runs under its Content Security Policy: a violation on any page a
// test opened fails that test.
const cspViolations: string[] = []
afterEach(() => {
  expect(cspViolations.splice(0), 'Content Security Policy violations').toEqual([])
})

/** The violations seen so far in this test, cleared: for a test that provokes one on purpose. */
export function takeCspViolations(): string[] {
  return cspViolations.splice(0)
}

/** A fresh page (own cookies) whose requests carry their own client address. */
export async function newPage(browser: Browser): Promise<Page> {
  const context = await browser.newContext({ baseURL: testEnv.appUrl, extraHTTPHeaders: { 'x-forwarded-for': randomAddress() }, viewport: { width: 1280, height: 860 } })
  await watchCsp(context, cspViolations)
  return context.newPage()
}

export async function signInAs(page: Page, email: string, password = DEMO_PASSWORD): Promise<void> {
  await page.goto('/signin')
  await page.fill('input[name="email"]', email)
  await page.fill('input[name="password"]', password)
  await page.click('button[type="submit"]')
  await page.waitForSelector('[data-testid="user-menu"]')
}

export async function screenshot(page: Page, name: string): Promise<string> {
  const dir = join(testEnv.outputDir, 'screenshots')
  mkdirSync(dir, { recursive: true })
  const file = join(dir, `${name}.png`)
  await page.screenshot({ path: file, fullPage: true })
  return file
}
