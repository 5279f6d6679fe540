import type { Knex } from 'knex'
import { formatContractMoney } from '../../../shared/utils/contractDisplay'
import { treeContractMoney } from '../../../shared/utils/treeContractMoney'
import { HOLLOWMERE, QUILLHURST, TANSY_ROW, TREE_CONTRACTS } from './data/demoContracts'

// The demo's payments. The two sellers have connected payment accounts (ids the local fake
// processor takes as connected elsewhere: it accepts any `acct_…` it did not make itself, and
// refunds a `pi_…` it did not make as a charge made elsewhere, so the demo's deposit can be refunded).
// Quillhurst paid the deposit on its Dabinett tree contract through the processor's page two days
// after accepting it, and the settlement of TR-26-003, so that delivery is paid; the settlement of
// TR-26-001 waits to be paid. Amounts are worked by the app's own rules: the deposit by
// treeContractMoney, a settlement is the delivery's total as settled. Written once; seeds run
// through the database edge (camelCase both ways).

export const DEMO_ACCOUNTS: Record<string, string> = {
  [HOLLOWMERE]: 'acct_demo_hollowmere',
  [TANSY_ROW]: 'acct_demo_tansyrow',
}

const DABINETT = TREE_CONTRACTS[0]!
const PAID_LOT = 'TR-26-003'
const at = (iso: string) => new Date(iso)

interface Person { id: number, name: string, email: string, orgId: number }

export async function seed(knex: Knex): Promise<void> {
  const orgs = await knex('organisations').whereIn('name', [HOLLOWMERE, TANSY_ROW, QUILLHURST]).select('id', 'name') as { id: number, name: string }[]
  const org = (name: string) => orgs.find(o => o.name === name)
  const [hollowmere, tansyRow, quillhurst] = [org(HOLLOWMERE), org(TANSY_ROW), org(QUILLHURST)]
  if (!hollowmere || !tansyRow || !quillhurst) {
    console.warn('Demo payments skipped: Hollowmere, Tansy Row or Quillhurst is not there (seed the demo accounts first).')
    return
  }
  if (await knex('payments').where({ payerOrgId: quillhurst.id }).first('id')) return
  const contract = await knex('treeContracts').where({ buyerOrgId: quillhurst.id, nurseryOrgId: hollowmere.id, notes: DABINETT.terms.notes }).first()
  const delivery = await knex('deliveries as d').join('harvestLots as l', 'l.id', 'd.lotId')
    .where({ 'd.makerOrgId': quillhurst.id, 'd.growerOrgId': tansyRow.id, 'l.code': PAID_LOT, 'd.state': 'settled' }).first('d.*')
  if (!contract || !delivery) {
    console.warn('Demo payments skipped: the Dabinett tree contract or the settled delivery of TR-26-003 is not there (seed them first).')
    return
  }
  const people = await knex('users').whereIn('orgId', [hollowmere.id, tansyRow.id, quillhurst.id]).where({ active: true }).whereIn('role', ['owner', 'member'])
    .select('id', 'name', 'email', 'orgId') as Person[]
  const payer = people.find(p => p.email === 'maker@demo.test')
  if (!payer) throw new Error('Demo payments: Quillhurst\'s owner is not there')
  const deposit = treeContractMoney(contract).depositMinor

  await knex.transaction(async (trx) => {
    for (const [name, account] of Object.entries(DEMO_ACCOUNTS)) await trx('organisations').where({ name }).update({ paymentAccountId: account })

    const paid = [
      {
        purpose: 'deposit', treeContractId: contract.id, deliveryId: null, payee: hollowmere, account: DEMO_ACCOUNTS[HOLLOWMERE]!,
        amountMinor: deposit, currency: contract.currency, askedAt: '2026-07-16T09:30:00Z', paidAt: '2026-07-16T09:34:00Z',
        what: `Deposit on ${contract.treeCount.toLocaleString('en-GB')} Dabinett on MM.106`, link: (id: number) => `/payments/${id}`,
      },
      {
        purpose: 'settlement', treeContractId: null, deliveryId: delivery.id, payee: tansyRow, account: DEMO_ACCOUNTS[TANSY_ROW]!,
        amountMinor: delivery.totalMinor, currency: delivery.currency, askedAt: '2026-10-20T10:00:00Z', paidAt: '2026-10-20T10:03:00Z',
        what: `Settlement of lot ${PAID_LOT} delivered on ${delivery.deliveredOn}`, link: (id: number) => `/payments/${id}`,
      },
    ]
    for (const p of paid) {
      const [inserted] = await trx('payments').insert({
        purpose: p.purpose, treeContractId: p.treeContractId, deliveryId: p.deliveryId, payerOrgId: quillhurst.id, payeeOrgId: p.payee.id,
        amountMinor: p.amountMinor, currency: p.currency, state: 'succeeded', paymentAccountId: p.account,
        checkoutSessionId: `cs_demo_${p.purpose}_${p.treeContractId ?? p.deliveryId}`, checkoutUrl: null,
        paymentIntentId: `pi_demo_${p.purpose}_${p.treeContractId ?? p.deliveryId}`, idempotencyKey: `pw-demo-${p.purpose}-${p.treeContractId ?? p.deliveryId}`,
        createdByUserId: payer.id, succeededAt: at(p.paidAt), createdAt: at(p.askedAt), updatedAt: at(p.paidAt),
      })
      const id = inserted!
      await trx('payments').where({ id }).update({ idempotencyKey: `pw-payment-${id}-demo` })
      const amount = formatContractMoney(p.amountMinor, p.currency)
      await trx('paymentEvents').insert([
        { paymentId: id, action: 'created', fromState: null, toState: 'pending', applied: true, byUserId: payer.id, byName: payer.name, note: `${amount} to pay on the processor's page`, createdAt: at(p.askedAt) },
        { paymentId: id, action: 'succeeded', fromState: 'pending', toState: 'succeeded', applied: true, processorEventId: `evt_demo_${p.purpose}_${id}`, processorEventType: 'checkout.session.completed', byName: 'the payment processor', createdAt: at(p.paidAt) },
      ])
      for (const person of people.filter(x => x.orgId === p.payee.id || x.orgId === quillhurst.id)) {
        await trx('notices').insert({
          userId: person.id, orgId: person.orgId, kind: 'payment.succeeded', link: p.link(id), readAt: at(p.paidAt), createdAt: at(p.paidAt),
          subject: `Payment succeeded: ${p.what}`, body: `${p.what} (${QUILLHURST} to ${p.payee.name}): ${amount} was paid.`,
        })
      }
    }
    await trx('deliveries').where({ id: delivery.id }).update({ state: 'paid', paidAt: at(paid[1]!.paidAt), updatedAt: at(paid[1]!.paidAt) })
    await trx('deliveryEvents').insert({ deliveryId: delivery.id, action: 'paid', version: delivery.version, byUserId: null, byOrgId: null, byName: 'Pomewright', changes: JSON.stringify([]), reason: null, createdAt: at(paid[1]!.paidAt) })
  })
}
