import type { Knex } from 'knex'
import type { BlendSolveRequest, BlendSolveResponse } from '../../../shared/types/blend'
import { potentialAbv } from '../../../shared/utils/alcohol'
import { blendMix, litresOf, type MixLot } from '../../../shared/utils/blendMix'
import { settleLoad } from '../../../shared/utils/deliverySettlement'
import type { FruitPriceTerms } from '../../../shared/utils/settlement'
import { brixToSg } from '../../../shared/utils/sugar'
import { DEMO_BLEND_TARGET } from './10_demo_blend_targets'
import { QUILLHURST, TANSY_ROW } from './data/demoContracts'

// Quillhurst's blend plans over Tansy Row's fruit delivered to its press (09_demo_deliveries.ts):
// the season's first pressing, planned as 2,400 L of Kingston Black juice from TR-26-001 and pressed
// into Tank 4 on 20 November (50 kg more than planned), and a committed plan of 600 L more of it for
// the medium-dry base, whose 800 kg the lot now holds for it. One lot alone is the whole blend, so
// each plan's answer is the planner's own: the kg for the litres at the press's yield, priced at the
// lot's contract price on its latest °Brix, as the planner works it. TR-26-001 is the dearest of the
// demo's fruit, so the medium-dry target still finds the cheaper lots it is met from. So a lot's
// trace, and a pressing's, show something on first start. Written once, into an organisation with
// no plans yet; seeds run through the database edge (camelCase both ways).

interface DemoLot extends MixLot {
  id: number
  code: string
  freeKg: number
  pricePerTonne: number
}

const at = (iso: string) => new Date(iso)
const round = (value: number, places: number) => Math.round(value * 10 ** places) / 10 ** places

/** The planner's answer for taking `kg` of each lot, in the answer's own shape. */
function answer(parts: { lot: DemoLot, kg: number }[], currency: string): BlendSolveResponse {
  const litres = parts.reduce((sum, p) => sum + litresOf(p.kg, p.lot.juiceYieldLPerTonne), 0)
  const cost = parts.reduce((sum, p) => sum + (p.kg / 1000) * p.lot.pricePerTonne, 0)
  const predicted = blendMix(parts)!
  return {
    status: 'optimal',
    lines: parts.map(({ lot, kg }) => ({
      lotId: lot.id, code: lot.code, kg, litres: round(litresOf(kg, lot.juiceYieldLPerTonne), 1), share: round(litresOf(kg, lot.juiceYieldLPerTonne) / litres, 4),
      freeKg: lot.freeKg, pricePerTonne: lot.pricePerTonne,
    })),
    predicted: { ...predicted, potentialAbv: potentialAbv(predicted) },
    cost: Math.round(cost),
    costPerLitre: round(cost / litres, 2),
    currency,
    misses: [],
    binding: [],
    rejected: [],
  }
}

const kgFor = (litres: number, lot: DemoLot) => round((litres / lot.juiceYieldLPerTonne) * 1000, 1)

export async function seed(knex: Knex): Promise<void> {
  const maker = await knex('organisations').where({ name: QUILLHURST }).first('id', 'currency', 'defaultJuiceYieldLPerT') as { id: number, currency: string, defaultJuiceYieldLPerT: number } | undefined
  const grower = await knex('organisations').where({ name: TANSY_ROW }).first('id') as { id: number } | undefined
  if (!maker || !grower) {
    console.warn('Demo blend plans skipped: Quillhurst or Tansy Row is not there (seed the demo accounts first).')
    return
  }
  if (await knex('blendPlans').where({ orgId: maker.id }).first('id')) return
  const delivered = await knex('deliveries as d').join('harvestLots as l', 'l.id', 'd.lotId').join('fruitContracts as k', 'k.id', 'd.fruitContractId')
    .where({ 'd.makerOrgId': maker.id, 'd.growerOrgId': grower.id, 'l.code': 'TR-26-001' })
    .select('l.id', 'l.code', 'd.netKg', 'k.basePricePerTonneMinor', 'k.baselineBrix', 'k.bonusPerBrixPerTonneMinor', 'k.deductionPerBrixPerTonneMinor', 'k.rejectFloorBrix') as
  ({ id: number, code: string, netKg: number } & Omit<FruitPriceTerms, 'maxRotPct' | 'maxDamagePct'>)[]
  if (delivered.length !== 1) {
    console.warn('Demo blend plans skipped: TR-26-001 is not delivered to Quillhurst (seed the demo deliveries first).')
    return
  }
  const owner = await knex('users').where({ email: 'maker@demo.test' }).first('id') as { id: number }
  const lots = new Map<string, DemoLot>()
  for (const { id, code, netKg, ...terms } of delivered) {
    const reading = await knex('juiceReadings').where({ lotId: id }).orderBy([{ column: 'sampledOn', order: 'desc' }, { column: 'id', order: 'desc' }])
      .first('brix', 'sg', 'taGPerL', 'tanninGPerL', 'ph') as { brix: number, sg: number | null, taGPerL: number, tanninGPerL: number, ph: number }
    const price = Math.max(0, Math.round(settleLoad(terms, { netKg: 1000, brix: reading.brix }, null).settlement.pricePerTonneMinor))
    lots.set(code, {
      id, code, freeKg: netKg, pricePerTonne: price, juiceYieldLPerTonne: maker.defaultJuiceYieldLPerT,
      brix: reading.brix, sg: reading.sg ?? brixToSg(reading.brix), taGPerL: reading.taGPerL, tanninGPerL: reading.tanninGPerL, ph: reading.ph,
    })
  }
  const tr001 = lots.get('TR-26-001')!

  await knex.transaction(async (trx) => {
    // The first pressing: planned, committed, pressed.
    const firstRequest: BlendSolveRequest = { target: {}, volumeL: 2400, lots: [{ lotId: tr001.id }], alcoholMethod: 'gravity-drop' }
    const first = answer([{ lot: tr001, kg: kgFor(2400, tr001) }], maker.currency)
    const [firstId] = await trx('blendPlans').insert({
      orgId: maker.id, name: 'First Kingston Black pressing', state: 'pressed', request: JSON.stringify(firstRequest), result: JSON.stringify(first), version: 3,
      notes: 'Tank 4 for the single-variety trial.', createdByUserId: owner.id, updatedByUserId: owner.id,
      committedAt: at('2026-11-12T10:05:00Z'), pressedAt: at('2026-11-20T16:30:00Z'), createdAt: at('2026-11-12T09:40:00Z'), updatedAt: at('2026-11-20T16:30:00Z'),
    })
    await trx('blendPlanLots').insert(first.lines.map(l => ({ planId: firstId, lotId: (l as { lotId: number }).lotId, kg: l.kg, litres: l.litres })))
    const taken = [{ lotId: tr001.id, kg: 3250 }]
    const [pressingId] = await trx('pressings').insert({
      orgId: maker.id, planId: firstId, pressedOn: '2026-11-20', litresPressed: 2430, vessel: 'Tank 4',
      notes: 'The last two bins went in whole to fill the tank.', recordedByUserId: owner.id, createdAt: at('2026-11-20T16:30:00Z'),
    })
    await trx('pressingLots').insert(taken.map((t, i) => ({ pressingId, lotId: t.lotId, kg: t.kg, position: i + 1 })))
    const firstEvents = [
      { action: 'saved', fromState: null, toState: 'draft', version: 1, at: at('2026-11-12T09:40:00Z') },
      { action: 'committed', fromState: 'draft', toState: 'committed', version: 2, at: at('2026-11-12T10:05:00Z') },
      { action: 'pressed', fromState: 'committed', toState: 'pressed', version: 3, at: at('2026-11-20T16:30:00Z') },
    ]
    await trx('blendPlanEvents').insert(firstEvents.map(e => ({ planId: firstId, byUserId: owner.id, ...e })))

    // The medium-dry base for December: committed, so TR-26-001 holds 800 kg for it.
    const { sgMin, sgMax, taMinGPerL, taMaxGPerL, tanninMinGPerL, tanninMaxGPerL } = DEMO_BLEND_TARGET
    const secondRequest: BlendSolveRequest = {
      target: { sg: { min: sgMin, max: sgMax }, taGPerL: { min: taMinGPerL, max: taMaxGPerL }, tanninGPerL: { min: tanninMinGPerL, max: tanninMaxGPerL } },
      volumeL: 600, lots: [{ lotId: tr001.id }], alcoholMethod: 'gravity-drop',
    }
    const second = answer([{ lot: { ...tr001, freeKg: tr001.freeKg - 3250 }, kg: kgFor(600, tr001) }], maker.currency)
    const [secondId] = await trx('blendPlans').insert({
      orgId: maker.id, name: 'Medium-dry base, December', state: 'committed', request: JSON.stringify(secondRequest), result: JSON.stringify(second), version: 2,
      notes: null, createdByUserId: owner.id, updatedByUserId: owner.id,
      committedAt: at('2026-11-24T14:15:00Z'), createdAt: at('2026-11-24T14:00:00Z'), updatedAt: at('2026-11-24T14:15:00Z'),
    })
    await trx('blendPlanLots').insert(second.lines.map(l => ({ planId: secondId, lotId: tr001.id, kg: l.kg, litres: l.litres })))
    await trx('blendPlanEvents').insert([
      { planId: secondId, action: 'saved', fromState: null, toState: 'draft', version: 1, byUserId: owner.id, at: at('2026-11-24T14:00:00Z') },
      { planId: secondId, action: 'committed', fromState: 'draft', toState: 'committed', version: 2, byUserId: owner.id, at: at('2026-11-24T14:15:00Z') },
    ])
  })
}
