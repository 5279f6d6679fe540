import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs, takeCspViolations } from '../support/browser'

let browser: Browser
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

async function navLabels(page: import('playwright-core').Page): Promise<string[]> {
  return (await page.locator('[data-testid="main-nav"] a').allInnerTexts()).map(s => s.trim())
}

describe('the app shell', () => {
  it('refuses script the server did not put on the page, and the tests see the refusal', async () => {
    const page = await newPage(browser)
    await page.goto('/signin')
    // An inline event handler, as an injected piece of markup would carry: script-src-attr 'none'.
    const directive = await page.evaluate(() => new Promise<string>((resolve) => {
      document.addEventListener('securitypolicyviolation', e => resolve(e.effectiveDirective), { once: true })
      const img = document.createElement('img')
      img.setAttribute('onerror', 'document.title = "injected"')
      img.src = '/no-such-image.png'
      document.body.append(img)
    }))
    expect(directive).toBe('script-src-attr')
    expect(await page.title()).not.toBe('injected')
    // Both ways a violation reaches the tests: the browser's event and its console.
    const seen: string[] = []
    const collect = () => {
      seen.push(...takeCspViolations())
      return seen
    }
    await expect.poll(collect).toEqual(expect.arrayContaining([
      expect.stringContaining('script-src-attr blocked'),
      expect.stringMatching(/inline event handler.*Content Security Policy/),
    ]))
    await page.context().close()
  })

  it('sends a signed-out visitor to the sign-in page', async () => {
    const page = await newPage(browser)
    await page.goto('/')
    await page.waitForURL(/\/signin/)
    expect(await page.locator('h1').innerText()).toBe('Sign in')
    await page.context().close()
  })

  it('shows a wrong password beside the form and stays signed out', async () => {
    const page = await newPage(browser)
    await page.goto('/signin')
    await page.fill('input[name="email"]', 'maker@demo.test')
    await page.fill('input[name="password"]', 'not-the-password')
    await page.click('button[type="submit"]')
    await expect.poll(() => page.locator('[role="alert"]').innerText()).toMatch(/do not match/)
    expect(await page.locator('[data-testid="user-menu"]').count()).toBe(0)
    await page.context().close()
  })

  it('signs in the demo maker: maker home and navigation, then signs out', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'maker@demo.test')
    await page.waitForSelector('[data-testid="home-maker"]')
    expect(await page.locator('h1').first().innerText()).toBe('Quillhurst Cider Works')
    const labels = await navLabels(page)
    expect(labels).toEqual(expect.arrayContaining(['Home', 'Members', 'Calculators']))
    expect(labels).not.toContain('Orchard blocks')
    await screenshot(page, 'home-maker')

    await page.click('[data-testid="user-menu"]')
    await page.click('[data-testid="sign-out"]')
    await page.waitForURL(/\/signin/)
    await page.goto('/members')
    await page.waitForURL(/\/signin/)
    await page.context().close()
  })

  it('signs in the demo grower: grower home with the orchard pages and the ladder caution', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    await page.waitForSelector('[data-testid="home-grower"]')
    expect(await page.locator('h1').first().innerText()).toBe('Hollowmere Orchard & Nursery')
    expect(await navLabels(page)).toEqual(expect.arrayContaining(['Home', 'Orchard blocks', 'Members']))
    expect(await page.locator('[role="note"]').innerText()).toMatch(/ladder/i)
    await screenshot(page, 'home-grower')
    await page.context().close()
  })

  it('keeps the units preference chosen in the user menu', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower-member@demo.test')
    await page.click('[data-testid="user-menu"]')
    const saved = page.waitForResponse(r => r.url().endsWith('/api/me') && r.request().method() === 'PATCH')
    await page.selectOption('#units', 'us')
    expect((await saved).status()).toBe(200)
    await page.reload()
    await page.click('[data-testid="user-menu"]')
    expect(await page.locator('#units').inputValue()).toBe('us')
    await page.selectOption('#units', 'metric')
    await page.context().close()
  })
})
