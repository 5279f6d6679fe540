import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'

// The calculators page as a visitor and as a signed-in maker who works in US units.
let browser: Browser
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

describe('calculators page', () => {
  it('works signed out: 10 °Bx reads SG 1.0400 with its source, and a bad reading is named beside the field', async () => {
    const page = await newPage(browser)
    await page.goto('/calculators')
    await expect(page.getByRole('heading', { name: 'Calculators', level: 1 }).isVisible()).resolves.toBe(true)

    await page.fill('input[name="sugarReading"]', 'abc')
    await page.locator('#calc-sugar-title + form button[type="submit"]').click()
    await expect(page.locator('#field-sugarReading-error').textContent()).resolves.toContain('Enter °Brix as a number from 0 to 32')

    await page.fill('input[name="sugarReading"]', '10')
    await page.locator('#calc-sugar-title + form button[type="submit"]').click()
    const sugar = page.locator('[data-testid="sugar-result"]')
    await sugar.waitFor()
    // NBS Circular 440, Table 114: 10 °Bx is 1.04003 apparent SG, shown to 4 places.
    await expect(sugar.textContent()).resolves.toContain('1.0400')
    await expect(sugar.textContent()).resolves.toContain('NBS Circular 440')
    // OIV-MA-AS2-02, Table II: 10 °Bx holds 82.2 g/L of sugar; the soluble solids (103.8 g/L) are its upper bound.
    await expect(sugar.textContent()).resolves.toContain('82.2')
    await expect(sugar.getByText('Soluble solids per litre (upper bound on sugar)').isVisible()).resolves.toBe(true)

    await page.fill('input[name="alcoholOg"]', '1.050')
    await page.fill('input[name="alcoholFg"]', '1.000')
    await page.locator('#calc-alcohol-title + form button[type="submit"]').click()
    // (OG − FG) × 131.25 = 6.5625, after Papazian; shown to 2 places.
    await expect(page.locator('[data-testid="alcohol-result"]').textContent()).resolves.toContain('6.56')

    // A perry pear juice is classed by the pear thresholds (Pollard & Beech): Blakeney Red's figures are medium sharp.
    await page.getByLabel('Perry pear').check()
    await page.fill('input[name="classTa"]', '4.2')
    await page.fill('input[name="classTannin"]', '1.3')
    await page.locator('#calc-class-title + form button[type="submit"]').click()
    const juiceClass = page.locator('[data-testid="class-result"]')
    await juiceClass.waitFor()
    await expect(juiceClass.textContent()).resolves.toContain('medium sharp')
    await expect(juiceClass.textContent()).resolves.toContain('Pollard and Beech')

    await page.fill('input[name="plantingInRow"]', '3')
    await page.fill('input[name="plantingBetweenRow"]', '5')
    await page.locator('#calc-planting-title + form button[type="submit"]').click()
    // 10,000 / (3 × 5) = 666.67 trees/ha.
    await expect(page.locator('[data-testid="planting-result"]').textContent()).resolves.toContain('666.67')

    await page.fill('input[name="backplanYear"]', '2028')
    await page.fill('input[name="backplanTrees"]', '500')
    await page.locator('#calc-backplan-title + form button[type="submit"]').click()
    const plan = page.locator('[data-testid="backplan-result"]')
    await plan.waitFor()
    // Worked example: 500 ÷ (0.85 × 0.90) = 653.6 → 654 rootstocks; budded in late summer the year before.
    await expect(plan.textContent()).resolves.toContain('654')
    await expect(plan.textContent()).resolves.toContain('by 30 September 2027')
    await screenshot(page, 'calculators-signed-out')
  })

  it('takes spacing in feet for a signed-in maker who works in US units', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'maker2@demo.test')
    await page.goto('/calculators')
    await expect(page.locator('#planting-unit').inputValue()).resolves.toBe('ft')
    await page.fill('input[name="plantingInRow"]', '4')
    await page.fill('input[name="plantingBetweenRow"]', '14')
    await page.locator('#calc-planting-title + form button[type="submit"]').click()
    // eXtension apples, "Dwarfing Apple Rootstocks": 4 ft × 14 ft ≈ 778 trees/acre (43,560 / 56 = 777.86).
    await expect(page.locator('[data-testid="planting-result"]').textContent()).resolves.toContain('777.86')
  })
})
