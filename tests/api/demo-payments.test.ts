import { describe, expect, it } from 'vitest'
import type { Payment } from '../../shared/types/payment'
import { as } from '../support/http'

// The demo's payments as each party sees them. The Dabinett deposit: 1,200 trees × £14.50, no
// royalty, 20 % deposit = £17,400.00 × 20 % = £3,480.00. TR-26-003's settlement is its total as
// settled, £687.24 (worked by hand in demo-deliveries.test.ts).
const demoPayments = async (caller: Parameters<typeof as>[0]) => ((await (await as(caller)).get('/api/payments?limit=200')).body.items as Payment[])
  .filter(p => p.description === 'Deposit on 1,200 Dabinett on MM.106' || p.description === 'Settlement of lot TR-26-003 delivered on 2026-10-02')

describe('the demo\'s payments', () => {
  it('has Quillhurst\'s Dabinett deposit and one Tansy Row settlement paid', async () => {
    const items = await demoPayments('makerOwner')
    expect(items.map(p => [p.description, p.payeeOrgName, p.amountMinor, p.state, p.side]).sort()).toEqual([
      ['Deposit on 1,200 Dabinett on MM.106', 'Hollowmere Orchard & Nursery', 348_000, 'succeeded', 'payer'],
      ['Settlement of lot TR-26-003 delivered on 2026-10-02', 'Tansy Row Fruit', 68_724, 'succeeded', 'payer'],
    ])
    expect((await demoPayments('growerOwner')).map(p => [p.amountMinor, p.side])).toEqual([[348_000, 'payee']])
    expect((await demoPayments('grower2Owner')).map(p => [p.amountMinor, p.side])).toEqual([[68_724, 'payee']])
    expect(await demoPayments('maker2Owner')).toEqual([])
  })

  it('leaves the other settled delivery waiting for payment', async () => {
    const due = (await (await as('makerOwner')).get('/api/payments/due')).body.items as { description: string, amountMinor: number, payeeOrgName: string, side: string }[]
    // TR-26-001: £1,256.64 (worked by hand in demo-deliveries.test.ts).
    expect(due).toContainEqual(expect.objectContaining({ description: 'Settlement of lot TR-26-001 delivered on 2026-11-02', amountMinor: 125_664, payeeOrgName: 'Tansy Row Fruit', side: 'payer' }))
    expect(due.map(d => d.description)).not.toContain('Deposit on 1,200 Dabinett on MM.106')
  })

  it('has connected the two sellers\' payment accounts', async () => {
    expect((await (await as('growerOwner')).get('/api/organisation')).body.paymentAccountId).toBe('acct_demo_hollowmere')
    expect((await (await as('grower2Owner')).get('/api/organisation')).body.paymentAccountId).toBe('acct_demo_tansyrow')
    expect((await (await as('makerOwner')).get('/api/organisation')).body.paymentAccountId).toBeNull()
  })
})
