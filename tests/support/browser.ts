import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import { chromium, type Browser, type Page } from 'playwright-core'
import { DEMO_PASSWORD, testEnv } from './env'
import { randomAddress } from './http'

/** Debian's Chromium, headless, with nothing reaching outside this machine. */
export async function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH || '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage'],
  })
}

/** A fresh page (own cookies) whose requests carry their own client address. */
export async function newPage(browser: Browser): Promise<Page> {
  const context = await browser.newContext({ baseURL: testEnv.appUrl, extraHTTPHeaders: { 'x-forwarded-for': randomAddress() }, viewport: { width: 1280, height: 860 } })
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
