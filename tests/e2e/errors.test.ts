import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'

// The page a person sees at an address no page answers.
let browser: Browser
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(() => browser?.close())

describe('the not-found page', () => {
  it('names the missing address to a visitor, answers 404, and leads home and to the calculators', async () => {
    const page = await newPage(browser)
    const response = await page.goto('/no-such-orchard?from=old-link')
    expect(response?.status()).toBe(404)

    const main = page.getByRole('main')
    await expect(main.getByRole('heading', { level: 1, name: 'Page not found' }).isVisible()).resolves.toBe(true)
    await expect(main.getByText('/no-such-orchard?from=old-link').isVisible()).resolves.toBe(true)
    await expect(main.getByRole('link', { name: 'Calculators' }).getAttribute('href')).resolves.toBe('/calculators')
    const home = main.getByRole('link', { name: 'Go to the home page' })
    await expect(home.getAttribute('href')).resolves.toBe('/')
    expect(await page.title()).toBe('Page not found · Pomewright')
    await screenshot(page, 'not-found')

    // Home for someone signed out is the sign-in page.
    await home.click()
    await page.waitForURL(/\/signin/)
    await expect(page.getByRole('heading', { level: 1, name: 'Sign in' }).isVisible()).resolves.toBe(true)
    await page.context().close()
  })

  it('offers a signed-in grower the sections of their own navigation', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    await page.goto('/blocks-old/12')
    const main = page.getByRole('main')
    await expect(main.getByRole('heading', { level: 1, name: 'Page not found' }).isVisible()).resolves.toBe(true)
    const sections = main.getByRole('navigation', { name: 'Sections' })
    expect((await sections.getByRole('link').allInnerTexts()).map(s => s.trim()))
      .toEqual(expect.arrayContaining(['Orchard blocks', 'Members', 'Calculators']))

    await sections.getByRole('link', { name: 'Orchard blocks' }).click()
    await page.waitForURL(/\/blocks$/)
    await expect(page.getByRole('heading', { level: 1, name: 'Page not found' }).count()).resolves.toBe(0)
    await page.context().close()
  })
})
