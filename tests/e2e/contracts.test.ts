import type { Browser, Page } from 'playwright-core'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { launchBrowser, newPage, screenshot, signInAs } from '../support/browser'
import { contractFixtures, orgId } from '../support/contracts'
import { testDb } from '../support/db'

// A tree contract made in the browser from start to acceptance: the maker finds the nursery in the
// directory, drafts the order and sends it; the nursery's owner is told, opens it and counters on
// price; the maker accepts the counter. Both read the same history and are told of each move.
const MARK = `Browser contract ${Date.now().toString(36)}`
contractFixtures(MARK)

let browser: Browser
let contractPath = ''
beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await browser?.close()
})

/** The contract page's list of moves, and the state shown at its top. */
const moves = (page: Page) => page.getByRole('region', { name: 'What you can do' })
const standing = (page: Page) => page.getByTestId('contract-standing')
const history = (page: Page) => page.getByRole('list', { name: 'Contract history' })

describe('a tree contract in the browser', () => {
  it('lets the maker draft an order from the nursery’s directory page and send it', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'maker@demo.test')
    await page.goto('/directory')
    await page.getByRole('link', { name: 'Hollowmere Orchard & Nursery' }).click()
    await page.waitForURL(/\/directory\/\d+$/)
    await page.getByRole('navigation', { name: 'Start a contract' }).getByRole('link', { name: 'Order trees from this nursery' }).click()
    await page.waitForURL(/\/contracts\/tree\/new\?nurseryOrgId=\d+$/)

    // The nursery comes chosen; nothing else is, so saving says what is missing beside each field.
    const nursery = page.getByLabel('Nursery', { exact: true })
    await expect.poll(() => nursery.inputValue()).toBe(String(await orgId('hollowmere')))
    await page.getByRole('button', { name: 'Save draft' }).click()
    await expect.poll(() => page.getByRole('alert').first().innerText()).toBe('Some fields need attention.')
    expect(await page.locator('#tree-variety ~ .field-error').innerText()).toBe('Choose a variety')
    expect(await page.locator('#field-unitPrice-error').innerText()).toMatch(/^Enter the price per tree in GBP/)

    await page.getByLabel('Variety (scion)').selectOption({ label: 'Dabinett (apple, bittersweet)' })
    await page.getByLabel('Rootstock', { exact: true }).selectOption({ label: 'MM.106 (apple, semi-vigorous)' })
    await page.getByLabel('Number of trees').fill('400')
    await page.getByLabel('Tree type').selectOption({ label: 'Feathered maiden (one-year tree with side shoots)' })
    await page.getByLabel('Price per tree (GBP)').fill('4.20')
    await page.getByLabel('Rootstock royalty per tree (GBP)').fill('0.35')
    await page.getByLabel('Deposit, % of the total').fill('30')
    // 400 × £4.20 = £1,680.00 and 400 × £0.35 = £140.00: £1,820.00, of which 30 % is £546.00.
    const preview = page.getByTestId('tree-money')
    await expect.poll(() => preview.innerText()).toMatch(/Total\s+£1,820\.00[\s\S]*Deposit \(30 % of the total\)\s+£546\.00[\s\S]*Balance\s+£1,274\.00/)
    await page.getByLabel('A plant-health certificate is required').check()
    await page.getByLabel('Notes').fill(`${MARK}: stake at planting`)
    await page.getByRole('button', { name: 'Save draft' }).click()

    await page.waitForURL(/\/contracts\/tree\/\d+$/)
    contractPath = new URL(page.url()).pathname
    const id = contractPath.split('/').pop()
    await expect.poll(() => page.getByRole('heading', { level: 1 }).innerText()).toBe(`Tree contract ${id}`)
    expect(await standing(page).innerText()).toMatch(/Buyer\s+Quillhurst Cider Works \(your organisation\)[\s\S]*Nursery\s+Hollowmere Orchard & Nursery[\s\S]*Draft/)
    expect(await page.getByTestId('tree-terms').innerText()).toMatch(/Dabinett[\s\S]*MM\.106[\s\S]*400, Feathered maiden[\s\S]*£4\.20/)
    // ceil(400 ÷ (0.85 × 0.9)) = ceil(522.9) = 523 rootstocks to bud.
    expect(await page.getByTestId('contract-backplan').innerText()).toMatch(/Bud 523 rootstocks/)
    expect(await page.getByRole('note').innerText()).toMatch(/plant-health authority/)

    // The draft is changed before it goes: the history keeps what changed.
    await moves(page).getByRole('button', { name: 'Edit draft' }).click()
    await page.getByRole('form', { name: 'Tree contract terms' }).getByLabel('Planting site (optional)').fill('Long Ground, north end')
    await page.getByRole('button', { name: 'Save draft changes' }).click()
    await expect.poll(() => moves(page).getByRole('status').innerText()).toBe('Draft saved.')
    expect(await history(page).getByRole('listitem', { name: 'Draft edited' }).innerText()).toMatch(/Planting site: none → Long Ground, north end/)

    await moves(page).getByRole('button', { name: 'Send offer' }).click()
    await expect.poll(() => moves(page).getByRole('status').innerText()).toBe('Send offer: done. The contract is now offered.')
    expect(await standing(page).innerText()).toMatch(/Offered[\s\S]*awaiting the other side[\s\S]*Version\s+1/)
    expect(await moves(page).getByRole('button').allInnerTexts()).toEqual(['Withdraw offer'])
    await history(page).getByRole('listitem', { name: 'Offer sent, version 1' }).waitFor()
    await screenshot(page, 'contract-tree-offered')
    await page.context().close()
  })

  it('tells the nursery’s owner, who counters on price with only the price changed', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    await expect.poll(() => page.getByRole('link', { name: /^Notices,/ }).getAttribute('aria-label')).toMatch(/^Notices, \d+ unread$/)
    await page.getByRole('link', { name: /^Notices,/ }).click()
    await page.waitForURL(/\/notices$/)
    const notice = page.getByRole('listitem', { name: /^Quillhurst Cider Works sent you an offer for 400 Dabinett on MM\.106/ })
    await notice.waitFor()
    await notice.getByRole('link').click()
    await page.waitForURL(contractPath)

    expect(await standing(page).innerText()).toMatch(/Nursery\s+Hollowmere Orchard & Nursery \(your organisation\)[\s\S]*awaiting you/)
    expect(await moves(page).getByRole('button').allInnerTexts()).toEqual(['Counter-offer', 'Accept', 'Decline'])
    await moves(page).getByRole('button', { name: 'Counter-offer' }).click()
    const form = page.getByRole('form', { name: 'Counter-offer' })
    // The form opens on the terms as they stand; sending them unchanged is no counter-offer.
    expect(await form.getByLabel('Price per tree (GBP)').inputValue()).toBe('4.20')
    await form.getByRole('button', { name: 'Send counter-offer' }).click()
    await expect.poll(() => form.getByRole('alert').innerText()).toBe('Change at least one term to make a counter-offer.')

    await form.getByLabel('Price per tree (GBP)').fill('4.60')
    await form.getByRole('button', { name: 'Send counter-offer' }).click()
    await expect.poll(() => moves(page).getByRole('status').innerText()).toBe('Counter-offer sent as version 2.')
    expect(await standing(page).innerText()).toMatch(/Countered[\s\S]*awaiting the other side[\s\S]*Version\s+2/)
    const counter = history(page).getByRole('listitem', { name: 'Counter-offer, version 2' })
    await counter.waitFor()
    expect(await counter.innerText()).toMatch(/Ines Varga[\s\S]*Price per tree: £4\.20 → £4\.60/)
    // Only the price was sent, so only the price changed.
    expect(await counter.getByRole('listitem').count()).toBe(1)
    // 400 × (£4.60 + £0.35) = £1,980.00; 30 % deposit £594.00.
    expect(await page.getByTestId('tree-money').innerText()).toMatch(/Total\s+£1,980\.00[\s\S]*£594\.00/)
    await screenshot(page, 'contract-tree-countered')
    await page.context().close()
  })

  it('lets the maker accept the counter-offer, reading the terms again when they changed underneath', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'maker@demo.test')
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Contracts' }).click()
    await page.waitForURL(/\/contracts$/)
    const id = contractPath.split('/').pop()
    const row = page.getByTestId('tree-contract-table').getByRole('row').filter({ hasText: `Tree contract ${id}` })
    await row.waitFor()
    expect(await row.innerText()).toMatch(/Hollowmere Orchard & Nursery[\s\S]*400 Dabinett on MM\.106[\s\S]*Countered[\s\S]*awaiting you[\s\S]*2[\s\S]*£1,980\.00/)
    await screenshot(page, 'contracts-list')
    await row.getByRole('link', { name: `Tree contract ${id}` }).click()
    await page.waitForURL(contractPath)

    // The maker was told of the counter-offer.
    const db = testDb()
    const maker = await db('users').where({ email: 'maker@demo.test' }).first('id')
    expect(await db('notices').where({ user_id: maker.id, link: contractPath }).pluck('subject')).toEqual([expect.stringMatching(/^Hollowmere Orchard & Nursery made a counter-offer/)])

    // The terms move on while the page is open (as another owner's counter-offer would): accepting
    // what is shown is refused, the contract is read again and the page says why.
    await moves(page).getByRole('button', { name: 'Accept' }).waitFor()
    await db('tree_contracts').where({ id: Number(id) }).update({ version: 3 })
    await moves(page).getByRole('button', { name: 'Accept' }).click()
    await expect.poll(() => moves(page).getByRole('alert').innerText()).toBe('The terms changed since you opened this contract: it is now at version 3. Read them again before you accept.')
    await expect.poll(() => standing(page).innerText()).toMatch(/Version\s+3/)
    await db('tree_contracts').where({ id: Number(id) }).update({ version: 2 })
    await page.reload()

    await moves(page).getByRole('button', { name: 'Accept' }).click()
    await expect.poll(() => moves(page).getByRole('status').innerText()).toBe('Accept: done. The contract is now accepted.')
    expect(await standing(page).innerText()).toMatch(/Accepted[\s\S]*Version\s+2, accepted/)
    for (const name of ['Draft written', 'Offer sent, version 1', 'Counter-offer, version 2', 'Accepted, version 2']) {
      await history(page).getByRole('listitem', { name }).waitFor()
    }

    // Printed, the page is the contract alone: no navigation or buttons; parties, terms and history stay.
    await page.emulateMedia({ media: 'print' })
    expect(await page.getByRole('navigation', { name: 'Main' }).isVisible()).toBe(false)
    expect(await page.getByRole('button', { name: 'Print' }).isVisible()).toBe(false)
    expect(await page.getByRole('link', { name: '← All contracts' }).isVisible()).toBe(false)
    expect(await standing(page).isVisible()).toBe(true)
    expect(await page.getByTestId('tree-terms').isVisible()).toBe(true)
    expect(await history(page).isVisible()).toBe(true)
    expect(await page.getByText(/^Printed from Pomewright on/).isVisible()).toBe(true)
    await screenshot(page, 'contract-tree-print')
    await page.context().close()
  })

  it('shows the nursery the whole history and tells it of the acceptance', async () => {
    const page = await newPage(browser)
    await signInAs(page, 'grower@demo.test')
    await page.goto('/notices')
    const notice = page.getByRole('listitem', { name: /^Quillhurst Cider Works accepted the tree contract for 400 Dabinett on MM\.106/ })
    await notice.waitFor()
    expect(await notice.getByRole('link').getAttribute('href')).toBe(contractPath)

    await page.goto(contractPath)
    for (const name of ['Offer sent, version 1', 'Counter-offer, version 2', 'Accepted, version 2']) {
      await history(page).getByRole('listitem', { name }).waitFor()
    }
    expect(await standing(page).innerText()).toMatch(/Accepted/)
    expect(await moves(page).getByRole('button').allInnerTexts()).toEqual(['Cancel contract', 'Start propagation'])
    await screenshot(page, 'contract-tree-accepted')
    await page.context().close()
  })

  it('lets the maker offer to buy a grower’s fruit over two harvests, and warns the grower its forecast falls short', async () => {
    const year = new Date().getFullYear() + 2
    const page = await newPage(browser)
    await signInAs(page, 'maker@demo.test')
    await page.goto(`/contracts/fruit/new?growerOrgId=${await orgId('tansyRow')}`)
    const form = page.getByRole('form', { name: 'Fruit contract terms' })
    await expect.poll(() => form.getByLabel('Grower', { exact: true }).inputValue()).toBe(String(await orgId('tansyRow')))
    await form.getByLabel('Juice class', { exact: true }).selectOption('bittersharp')
    await form.getByLabel('Harvest year, row 1').fill(String(year))
    await form.getByLabel(`Tonnes (t) for ${year}`).fill('400')
    await form.getByLabel(`First delivery day for ${year}`).fill(`${year}-09-15`)
    await form.getByLabel(`Last delivery day for ${year}`).fill(`${year}-11-30`)
    await form.getByRole('button', { name: 'Add a harvest year' }).click()
    await form.getByLabel(`Tonnes (t) for ${year + 1}`).fill('450')
    // A third year added and taken away again leaves two.
    await form.getByRole('button', { name: 'Add a harvest year' }).click()
    await form.getByRole('button', { name: `Remove ${year + 2}` }).click()
    expect(await form.getByTestId('schedule-form').getByRole('row').count()).toBe(3)

    await form.getByLabel('Base price per tonne (GBP)').fill('210')
    await form.getByLabel('Sugar baseline, °Brix').fill('12')
    await form.getByLabel('Reject floor, °Brix').fill('9.5')
    await form.getByLabel('Bonus per °Brix above the baseline, per tonne (GBP)').fill('8')
    await form.getByLabel('Deduction per °Brix below the baseline, per tonne (GBP)').fill('12')
    // 10 t at £210.00 = £2,100.00; at 13 °Brix 10 × (£210 + £8) = £2,180.00; at 9.4 °Brix, under the floor, nothing.
    const examples = form.getByTestId('settlement-examples')
    await expect.poll(() => examples.innerText()).toMatch(/At the sugar baseline[\s\S]*£2,100\.00[\s\S]*One °Brix above[\s\S]*£2,180\.00[\s\S]*Just under the reject floor[\s\S]*£0\.00\s+rejected: under the reject floor/)
    await form.getByLabel('Notes').fill(`${MARK}: fruit`)
    await form.getByRole('button', { name: 'Save draft' }).click()

    await page.waitForURL(/\/contracts\/fruit\/\d+$/)
    const fruitPath = new URL(page.url()).pathname
    expect(await page.getByTestId('fruit-schedule').innerText()).toMatch(new RegExp(`${year}\\s+400 t[\\s\\S]*${year + 1}\\s+450 t[\\s\\S]*All years\\s+850 t`))
    await moves(page).getByRole('button', { name: 'Send offer' }).click()
    await expect.poll(() => moves(page).getByRole('status').innerText()).toBe('Send offer: done. The contract is now offered.')
    expect(await page.getByRole('note').innerText()).toMatch(/licen[cs]/)
    await page.context().close()

    const grower = await newPage(browser)
    await signInAs(grower, 'grower2@demo.test')
    await grower.goto(fruitPath)
    const warning = grower.getByTestId('coverage-warning')
    await warning.waitFor()
    expect(await warning.innerText()).toMatch(new RegExp(`bittersharp, ${year}:[\\s\\S]*if you accept this offer`))
    expect(await grower.getByTestId('settlement-examples').innerText()).toMatch(/£2,180\.00/)
    expect(await moves(grower).getByRole('button').allInnerTexts()).toEqual(['Counter-offer', 'Accept', 'Decline'])
    await screenshot(grower, 'contract-fruit-coverage-warning')
    await grower.context().close()
  })
})
