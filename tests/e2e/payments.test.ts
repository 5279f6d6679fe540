import type { Browser } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { orgId } from '../support/contracts'
import { testDb } from '../support/db'
import { paymentsUrl } from '../support/payments'

// Paying a settlement in the browser: the demo maker pays the settlement of TR-26-001 (the demo's
// settled delivery that waits for payment, £1,256.64 as worked in demo-deliveries.test.ts) on the
// fake processor's own page, comes back to Pomewright and sees it paid; the grower then sees the
// payment and its delivery paid.
let browser: Browser
let paymentPath = ''
const WHAT = 'Settlement of lot TR-26-001 delivered on 2026-11-02'

beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

describe('paying a settlement on the processor\'s page', () => {
  it('lets the demo maker pay the waiting settlement and come back to it paid', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'maker@demo.test')
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Payments' }).click()
    await page.waitForURL(/\/payments$/)
    const due = page.getByTestId('payments-due')
    await due.getByRole('link', { name: WHAT }).waitFor()
    expect(await due.getByRole('listitem').filter({ hasText: WHAT }).innerText()).toMatch(/Delivery settlement: £1,256\.64 owed by you to Tansy Row Fruit/)
    await screenshot(page, 'payments-owed')

    await due.getByRole('button', { name: `Pay £1,256.64: ${WHAT}` }).click()
    await page.waitForURL(url => url.href.startsWith(`${paymentsUrl()}/pay/`))
    expect(await page.getByRole('heading', { level: 1 }).innerText()).toBe('Test payment')
    expect(await page.locator('body').innerText()).toContain('acct_demo_tansyrow')
    await screenshot(page, 'payments-hosted-page')
    await page.getByRole('button', { name: 'Pay £1,256.64' }).click()

    await page.waitForURL(/\/payments\/\d+\?returned=paid$/)
    paymentPath = new URL(page.url()).pathname
    await page.getByText('Paid. Tansy Row Fruit has been told.').waitFor()
    const facts = page.getByTestId('payment-facts')
    expect(await facts.innerText()).toMatch(/Amount\s+£1,256\.64[\s\S]*State\s+Paid/)
    expect(await page.getByTestId('payment-history').innerText()).toMatch(/Payment asked for[\s\S]*Olu Brandt[\s\S]*Paid[\s\S]*the payment processor/)
    await screenshot(page, 'payments-paid')
    await page.context().close()
  })

  it('shows the grower the payment and its delivery paid', async () => {
    expect(paymentPath).toMatch(/^\/payments\/\d+$/)
    const page = await newPage(browser)
    await signInAs(page, 'grower2@demo.test')
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Payments' }).click()
    await page.waitForURL(/\/payments$/)
    const row = page.getByTestId('payment-table').getByRole('row').filter({ hasText: WHAT })
    expect(await row.innerText()).toMatch(/from Quillhurst Cider Works[\s\S]*£1,256\.64[\s\S]*Paid/)
    expect(await page.getByTestId('payments-due').filter({ hasText: WHAT }).count()).toBe(0)
    await row.getByRole('link').first().click()
    await page.waitForURL(url => url.pathname === paymentPath)
    expect(await page.getByTestId('payment-facts').innerText()).toMatch(/Paid to\s+Tansy Row Fruit \(you\)[\s\S]*State\s+Paid/)
    await page.getByTestId('payment-facts').getByRole('link', { name: WHAT }).click()
    await page.waitForURL(/\/deliveries\/\d+$/)
    expect(await page.getByTestId('delivery-standing').innerText()).toContain('Paid')
    await screenshot(page, 'payments-grower-delivery-paid')
    await page.context().close()
  })

  it('shows a tree contract\'s deposit on its page: paid, or a Pay button while it is owed', async () => {
    const db = testDb()
    const quillhurst = await orgId('quillhurst')
    const contractOf = async (treeCount: number) => (await db('tree_contracts').where({ buyer_org_id: quillhurst, tree_count: treeCount }).whereIn('state', ['accepted', 'propagating']).first('id')).id as number
    const page = await newPage(browser)
    await signInAs(page, 'maker@demo.test')
    await page.goto(`/contracts/tree/${await contractOf(1200)}`)
    const payments = page.getByRole('region', { name: 'Payments' })
    expect(await payments.innerText()).toMatch(/Tree deposit: £3,480\.00\s*—\s*Paid/)
    await page.goto(`/contracts/tree/${await contractOf(600)}`)
    // 600 Kingston Black at £15.00, 20 % deposit: £9,000.00 × 20 % = £1,800.00.
    await page.getByRole('region', { name: 'Payments' }).getByRole('button', { name: 'Pay the deposit (£1,800.00)' }).waitFor()
    await screenshot(page, 'payments-tree-contract-owed')
    await page.context().close()
  })
})
