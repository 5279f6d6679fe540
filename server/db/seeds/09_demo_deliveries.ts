import type { Knex } from 'knex'
import { settleLoad } from '../../../shared/utils/deliverySettlement'
import { excessOfLoad, toleranceBandKg } from '../../../shared/utils/deliveryYear'
import { normaliseReading } from '../../../shared/utils/juiceReading'
import { formatContractMoney } from '../../../shared/utils/contractDisplay'
import type { FruitPriceTerms } from '../../../shared/utils/settlement'
import { QUILLHURST, TANSY_ROW } from './data/demoContracts'

// This season's deliveries of Tansy Row's bittersharp fruit to Quillhurst's press under their fruit
// contract: one lot above the sugar baseline, one below it, and one under the reject floor (TR-26-004,
// picked in a wet week, re-tested on the morning it went to the press). Quillhurst settled the two
// that earn money; the rejected load is recorded and waits. Each settlement is worked by the app's
// own settleLoad on the contract's terms and Tansy Row's tax rate, exactly as the delivery service
// keeps it; the three lots are wholly delivered. Tansy Row hears of each in its notices. Written once;
// seeds run through the database edge (camelCase both ways).

export interface DemoDelivery {
  lot: string
  deliveredOn: string
  ticketNo: string
  grossKg: number
  tareKg: number
  rotPct: number
  damagePct: number
  /** When Quillhurst settled it; null while it is only recorded. */
  settledAt: string | null
  notes: string | null
}

export const DEMO_DELIVERIES: DemoDelivery[] = [
  { lot: 'TR-26-003', deliveredOn: '2026-10-02', ticketNo: 'QCW-26-0112', grossKg: 5_460, tareKg: 2_140, rotPct: 1, damagePct: 2.5, settledAt: '2026-10-06T15:10:00Z', notes: null },
  { lot: 'TR-26-004', deliveredOn: '2026-10-09', ticketNo: 'QCW-26-0131', grossKg: 4_890, tareKg: 2_010, rotPct: 4, damagePct: 3, settledAt: null, notes: 'Sugar under the floor after the wet week; Tansy Row took the bins back.' },
  { lot: 'TR-26-001', deliveredOn: '2026-11-02', ticketNo: 'QCW-26-0188', grossKg: 8_030, tareKg: 2_420, rotPct: 0.5, damagePct: 1.5, settledAt: '2026-11-06T11:40:00Z', notes: 'Sweated three weeks in the bins before pressing.' },
]

/** TR-26-004 re-tested on the morning it was delivered: the seeded lab reading of 9.6 °Brix was no longer true of it. */
export const PRESS_DAY_RETEST = { lot: 'TR-26-004', sampledOn: '2026-10-09', brix: 9.3, ta: 7.8, ph: 3.2, notes: 'Re-tested by refractometer on the morning of delivery, after the wet week.' }

interface Org { id: number, name: string, taxRatePct: number | null, hydrometerCalibrationC: number }
interface Person { id: number, name: string, email: string, orgId: number, role: string }
interface Lot { id: number, code: string, netKg: number }
interface Reading { id: number, brix: number, sampledOn: string }

type ContractRow = FruitPriceTerms & { id: number, currency: string, tolerancePct: number }

const at = (iso: string) => new Date(iso)
const kg = (n: number) => `${n.toLocaleString('en-GB')} kg`

async function latestReading(trx: Knex.Transaction, lotId: number): Promise<Reading> {
  const reading = await trx('juiceReadings').where({ lotId }).whereNotNull('brix').orderBy([{ column: 'sampledOn', order: 'desc' }, { column: 'id', order: 'desc' }])
    .first('id', 'brix', 'sampledOn') as Reading | undefined
  if (!reading) throw new Error(`Demo deliveries: lot ${lotId} has no °Brix reading to pay on`)
  return reading
}

/** The notices the delivery service sends the grower's owners and members, in the app and by e-mail (sent long since). */
async function tellGrower(trx: Knex.Transaction, people: Person[], notice: { kind: string, subject: string, body: string, link: string, at: Date, read: boolean }) {
  for (const person of people) {
    await trx('notices').insert({ userId: person.id, orgId: person.orgId, kind: notice.kind, subject: notice.subject, body: notice.body, link: notice.link, readAt: notice.read ? notice.at : null, createdAt: notice.at })
    await trx('notifications').insert({
      orgId: person.orgId, userId: person.id, recipient: person.email, kind: notice.kind, subject: notice.subject, body: notice.body, link: notice.link,
      status: 'sent', attempts: 1, nextAttemptAt: notice.at, sentAt: notice.at, createdAt: notice.at,
    })
  }
}

export async function seed(knex: Knex): Promise<void> {
  const orgs = await knex('organisations').whereIn('name', [QUILLHURST, TANSY_ROW]).select('id', 'name', 'taxRatePct', 'hydrometerCalibrationC') as Org[]
  const maker = orgs.find(o => o.name === QUILLHURST)
  const grower = orgs.find(o => o.name === TANSY_ROW)
  if (!maker || !grower) {
    console.warn('Demo deliveries skipped: Quillhurst or Tansy Row is not there (seed the demo accounts first).')
    return
  }
  if (await knex('deliveries').where({ growerOrgId: grower.id }).first('id')) return
  const contract = await knex('fruitContracts').where({ makerOrgId: maker.id, growerOrgId: grower.id, juiceClass: 'bittersharp', state: 'accepted' }).orderBy('id')
    .first('id', 'currency', 'tolerancePct', 'basePricePerTonneMinor', 'baselineBrix', 'bonusPerBrixPerTonneMinor', 'deductionPerBrixPerTonneMinor', 'rejectFloorBrix', 'maxRotPct', 'maxDamagePct') as ContractRow | undefined
  const lots = await knex('harvestLots').where({ orgId: grower.id }).whereIn('code', DEMO_DELIVERIES.map(d => d.lot)).select('id', 'code', 'netKg') as Lot[]
  if (!contract || lots.length !== DEMO_DELIVERIES.length) {
    console.warn('Demo deliveries skipped: the Quillhurst–Tansy Row fruit contract or Tansy Row\'s lots are not there (seed them first).')
    return
  }
  const year = await knex('fruitContractYears').where({ contractId: contract.id, harvestYear: 2026 }).first('tonnes') as { tonnes: number } | undefined
  if (!year) throw new Error('Demo deliveries: the fruit contract has no 2026 harvest')
  const people = await knex('users').whereIn('orgId', [maker.id, grower.id]).where({ active: true }).select('id', 'name', 'email', 'orgId', 'role') as Person[]
  const recorder = people.find(p => p.email === 'maker@demo.test')
  if (!recorder) throw new Error('Demo deliveries: Quillhurst\'s owner is not there')
  const told = people.filter(p => p.orgId === grower.id && ['owner', 'member'].includes(p.role))
  const taxRatePct = grower.taxRatePct === null ? null : Number(grower.taxRatePct)
  const { highestKg } = toleranceBandKg(year.tonnes, contract.tolerancePct)

  await knex.transaction(async (trx) => {
    const retestLot = lots.find(l => l.code === PRESS_DAY_RETEST.lot)!
    const { lot: _lot, sampledOn, notes, ...raw } = PRESS_DAY_RETEST
    const normal = normaliseReading(raw, { calibrationC: Number(grower.hydrometerCalibrationC), species: 'apple' })
    if (!normal.ok) throw new Error(`Demo deliveries: the re-test of ${PRESS_DAY_RETEST.lot}: ${normal.issues.map(i => i.message).join('; ')}`)
    const growerOwner = people.find(p => p.email === 'grower2@demo.test')
    await trx('juiceReadings').insert({
      orgId: grower.id, lotId: retestLot.id, sampledOn, ...normal.reading, notes, enteredByUserId: growerOwner?.id ?? null, createdAt: at(`${sampledOn}T07:30:00Z`),
    })

    let deliveredBeforeKg = 0
    for (const d of DEMO_DELIVERIES) {
      const lot = lots.find(l => l.code === d.lot)!
      const reading = await latestReading(trx, lot.id)
      const netKg = Math.round((d.grossKg - d.tareKg) * 10) / 10
      // The whole lot goes to the press: the ticket's net is what the grower recorded.
      if (netKg !== lot.netKg) throw new Error(`Demo deliveries: ${d.lot}'s ticket nets ${netKg} kg, but the lot is ${lot.netKg} kg`)
      const excessKg = excessOfLoad(highestKg, deliveredBeforeKg, netKg)
      if (excessKg > 0) throw new Error(`Demo deliveries: ${d.lot} would go past the year's tolerance`)
      deliveredBeforeKg += netKg
      const worked = settleLoad(contract, { netKg, brix: reading.brix, rotPct: d.rotPct, damagePct: d.damagePct, excessKg }, taxRatePct)
      const recordedAt = at(`${d.deliveredOn}T16:00:00Z`)
      const settledAt = d.settledAt ? at(d.settledAt) : null
      const [id] = await trx('deliveries').insert({
        fruitContractId: contract.id, makerOrgId: maker.id, growerOrgId: grower.id, lotId: lot.id, harvestYear: 2026, deliveredOn: d.deliveredOn,
        ticketNo: d.ticketNo, grossKg: d.grossKg, tareKg: d.tareKg, netKg, readingId: reading.id, readingBrix: reading.brix, readingSampledOn: reading.sampledOn,
        rotPct: d.rotPct, damagePct: d.damagePct, qualityRejectReason: null, state: settledAt ? 'settled' : 'recorded', version: 1,
        excessKg, excessDecision: null, currency: contract.currency, settlement: JSON.stringify(worked.settlement),
        amountMinor: worked.amountMinor, taxRatePct: worked.taxRatePct, taxMinor: worked.taxMinor, totalMinor: worked.totalMinor,
        notes: d.notes, recordedByUserId: recorder.id, settledAt, createdAt: recordedAt, updatedAt: settledAt ?? recordedAt,
      })
      const event = { deliveryId: id, version: 1, byUserId: recorder.id, byOrgId: maker.id, byName: recorder.name, changes: JSON.stringify([]), reason: null }
      await trx('deliveryEvents').insert({ ...event, action: 'recorded', createdAt: recordedAt })
      if (settledAt) await trx('deliveryEvents').insert({ ...event, action: 'settled', createdAt: settledAt })
      await trx('harvestLots').where({ id: lot.id }).update({ state: 'delivered', updatedAt: recordedAt })

      const load = `${kg(netKg)} at ${worked.settlement.brixPaid.toFixed(1)} °Brix, weigh ticket ${d.ticketNo}`
      const money = formatContractMoney(worked.totalMinor, contract.currency)
      await tellGrower(trx, told, settledAt
        ? {
            kind: 'delivery.settled', at: settledAt, read: true, link: `/deliveries/${id}/statement`,
            subject: `${QUILLHURST} settled your delivery of ${d.lot}: ${money}`,
            body: `${recorder.name} of ${QUILLHURST} settled the delivery of ${d.lot} (${load}) at ${money}. Its self-billing statement is on Pomewright.`,
          }
        : {
            kind: 'delivery.recorded', at: recordedAt, read: false, link: `/deliveries/${id}`,
            subject: `${QUILLHURST} recorded your delivery of ${d.lot}: rejected`,
            body: `${recorder.name} of ${QUILLHURST} recorded the delivery of ${d.lot} (${load}). It earns nothing: ${worked.settlement.rejectedBecause.join('; ')}. If the reading is wrong, you may dispute it.`,
          })
    }
  })
}
