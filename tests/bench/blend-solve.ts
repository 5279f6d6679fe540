// The blend planner's solver on 50, 200 and 1,000 lots with six range rows (°Brix, TA and tannin, each
// a min and a max) and the volume: the median of repeated solves through server/utils/blendSolver.ts
// (checking the input, building the model, HiGHS, the answer) beside HiGHS alone on the same model
// in the same run; then 5,000 solves in one process, the first and the last thousand timed. Against
// the bench stack, the same 200-lot model through `POST /api/blends/solve` as the demo maker (its
// lots written into the stack's database, priced and yielded as the model has them), beside the
// module and HiGHS alone. Run by `npm run bench` (scripts/stack/bench.ts); without a stack
// (`node --import tsx tests/bench/blend-solve.ts`) the API part is left out.
import { register } from 'node:module'
import loadHighs from 'highs'
import knexFactory from 'knex'
import type { SolverInput, SolverLot } from '../../shared/types/blend'
import { juiceClass } from '../../shared/utils/juiceClass'
import { brixToSg } from '../../shared/utils/sugar'
import { mulberry32 } from '../support/random'
import { as } from '../support/http'

// Server code imports shared code through Nuxt's #shared alias, which only Nuxt and vitest resolve.
const root = new URL('../../', import.meta.url).href
register(`data:text/javascript,${encodeURIComponent(`export async function resolve(specifier, context, next) {
  return specifier.startsWith('#shared/') ? next(new URL('shared/' + specifier.slice(8) + '.ts', ${JSON.stringify(root)}).href, context) : next(specifier, context)
}`)}`)
const { blendModel, solveBlend } = await import('../../server/utils/blendSolver')
const { knexConfig } = await import('../../server/db/config')

const SIZES = [50, 200, 1000]
/** Repeated solves per size; the median is the figure. */
const RUNS: Record<number, number> = { 50: 101, 200: 51, 1000: 21 }
const LONG_RUN = 5000

function season(lots: number, seed: number): SolverInput {
  const random = mulberry32(seed)
  const between = (lo: number, hi: number) => lo + (hi - lo) * random()
  const rows = Array.from({ length: lots }, (_, i): SolverLot => {
    const brix = Math.round(between(9, 17) * 10) / 10
    const taGPerL = Math.round(between(1.5, 10.5) * 100) / 100
    const tanninGPerL = Math.round(between(0.3, 3.8) * 100) / 100
    return {
      key: `BENCH-${i}`, availableKg: Math.round(between(500, 20000)), juiceYieldLPerTonne: Math.round(between(550, 780)),
      brix, sg: brixToSg(brix), taGPerL, tanninGPerL, ph: Math.round(between(3, 4) * 100) / 100,
      costPerTonneMinor: Math.round(between(12000, 48000)), varietyId: 1 + (i % 12), juiceClass: juiceClass(taGPerL, tanninGPerL),
    }
  })
  const juice = rows.reduce((sum, l) => sum + (l.availableKg / 1000) * l.juiceYieldLPerTonne, 0)
  return {
    target: { brix: { min: 12, max: 13.5 }, taGPerL: { min: 5, max: 7 }, tanninGPerL: { min: 1.5, max: 2.5 } },
    volumeL: Math.round(juice * 0.3),
    lots: rows,
  }
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!
const sum = (xs: number[]) => xs.reduce((a, b) => a + b, 0)

async function main() {
  const highs = await loadHighs()
  console.log('\nBlend solves: six range rows (°Brix, TA, tannin min and max) and the volume, median of repeated solves')
  console.log('lots   runs  status   solver module ms  HiGHS alone ms  module − HiGHS ms')
  for (const lots of SIZES) {
    const input = season(lots, 20260900 + lots)
    const model = blendModel(input)
    const first = await solveBlend(input)
    const moduleTimes: number[] = []
    const rawTimes: number[] = []
    for (let run = 0; run < RUNS[lots]!; run++) {
      let started = performance.now()
      await solveBlend(input)
      moduleTimes.push(performance.now() - started)
      started = performance.now()
      const out = highs.raw.lpCall(model)
      rawTimes.push(performance.now() - started)
      if (out.status === -1) throw new Error(`HiGHS refused the ${lots}-lot model`)
    }
    const m = median(moduleTimes)
    const r = median(rawTimes)
    console.log(`${String(lots).padStart(4)}  ${String(RUNS[lots]).padStart(5)}  ${first.status.padEnd(7)}  ${m.toFixed(2).padStart(16)}  ${r.toFixed(2).padStart(14)}  ${(m - r).toFixed(2).padStart(17)}`)
  }

  const inputs = Array.from({ length: 20 }, (_, i) => season(50, 20261000 + i))
  const times: number[] = []
  const rssBefore = process.memoryUsage().rss
  for (let k = 0; k < LONG_RUN; k++) {
    const started = performance.now()
    await solveBlend(inputs[k % inputs.length]!)
    times.push(performance.now() - started)
  }
  const rssAfter = process.memoryUsage().rss
  const firstK = sum(times.slice(0, 1000))
  const lastK = sum(times.slice(-1000))
  console.log(`\n${LONG_RUN.toLocaleString('en-GB')} solves of 50 lots in one process: first 1,000 ${firstK.toFixed(0)} ms, last 1,000 ${lastK.toFixed(0)} ms (${((lastK / firstK - 1) * 100).toFixed(0)} %), resident memory ${(rssBefore / 2 ** 20).toFixed(0)} → ${(rssAfter / 2 ** 20).toFixed(0)} MB`)
  console.log(lastK <= firstK * 1.5 ? 'No slowing over the run.' : 'SLOWS: the last thousand took over 1.5 times the first.')
}

/** The API's aim for 200 lots: a median under this, and within this many times HiGHS alone. */
const API_TARGET_MS = 50
const API_TARGET_RATIO = 1.5
const API_LOTS = 200
const API_RUNS = 51
/** A harvest year no demo contract covers, so the bench's lots and contract stand alone. */
const API_YEAR = 2016

/** Writes the model's lots as Tansy Row's, bought by Quillhurst under a contract of their own; returns their ids and a remover. */
async function benchLots(input: SolverInput) {
  const db = knexFactory(knexConfig(process.env.POMEWRIGHT_DATABASE_URL!, { caseConversion: false }))
  const org = async (name: string) => (await db('organisations').where({ name }).first('id')).id as number
  const grower = await org('Tansy Row Fruit')
  const variety = (await db('varieties').where({ name: 'Kingston Black' }).first('id')).id as number
  const [contractId] = await db('fruit_contracts').insert({
    maker_org_id: await org('Quillhurst Cider Works'), grower_org_id: grower, drafted_by: 'maker', last_offer_by: 'maker', state: 'accepted',
    version: 1, accepted_version: 1, species: 'apple', juice_class: 'bittersharp', tolerance_pct: 10, currency: 'GBP', base_price_per_tonne_minor: 21000,
    baseline_brix: 12, bonus_per_brix_per_tonne_minor: 800, deduction_per_brix_per_tonne_minor: 1200, reject_floor_brix: 9.5, crop_failure: 'forgiven', notes: 'Blend bench',
  })
  await db('fruit_contract_years').insert({ contract_id: contractId, harvest_year: API_YEAR, tonnes: 5000, window_from: `${API_YEAR}-10-01`, window_to: `${API_YEAR}-12-31` })
  const ids: number[] = []
  for (const lot of input.lots) {
    const [id] = await db('harvest_lots').insert({ org_id: grower, code: `BLEND-${lot.key}`, variety_id: variety, picked_on: `${API_YEAR}-10-01`, harvest_year: API_YEAR, net_kg: lot.availableKg })
    await db('juice_readings').insert({ org_id: grower, lot_id: id, sampled_on: `${API_YEAR}-10-02`, brix: lot.brix, ta_g_per_l: lot.taGPerL, tannin_g_per_l: lot.tanninGPerL, ph: lot.ph })
    ids.push(id!)
  }
  return {
    ids,
    async remove() {
      await db('juice_readings').whereIn('lot_id', ids).delete()
      await db('harvest_lots').whereIn('id', ids).delete()
      await db('fruit_contract_years').where({ contract_id: contractId }).delete()
      await db('fruit_contracts').where({ id: contractId }).delete()
      await db.destroy()
    },
  }
}

async function throughTheApi() {
  const input = season(API_LOTS, 20260900 + API_LOTS)
  const written = await benchLots(input)
  try {
    const maker = await as('makerOwner')
    const body = {
      target: input.target,
      volumeL: input.volumeL,
      lots: input.lots.map((lot, i) => ({ lotId: written.ids[i], juiceYieldLPerTonne: lot.juiceYieldLPerTonne, pricePerTonne: lot.costPerTonneMinor })),
    }
    const highs = await loadHighs()
    const model = blendModel(input)
    const expected = await solveBlend(input)
    const first = await maker.post('/api/blends/solve', body)
    if (first.status !== 200) throw new Error(`POST /api/blends/solve answered ${first.status}: ${JSON.stringify(first.body).slice(0, 300)}`)
    if (first.body.status !== expected.status || first.body.cost !== expected.costMinor) {
      throw new Error(`The API's blend (${first.body.status}, ${first.body.cost}) is not the module's (${expected.status}, ${expected.costMinor})`)
    }
    const api: number[] = []
    const mod: number[] = []
    const raw: number[] = []
    for (let run = 0; run < API_RUNS; run++) {
      let started = performance.now()
      const res = await maker.post('/api/blends/solve', body)
      api.push(performance.now() - started)
      if (res.status !== 200) throw new Error(`POST /api/blends/solve answered ${res.status} on run ${run + 1}`)
      started = performance.now()
      await solveBlend(input)
      mod.push(performance.now() - started)
      started = performance.now()
      highs.raw.lpCall(model)
      raw.push(performance.now() - started)
    }
    const [a, m, r] = [median(api), median(mod), median(raw)]
    console.log(`\nPOST /api/blends/solve, ${API_LOTS} lots (the same model), median of ${API_RUNS} (status ${first.body.status})`)
    console.log('through the API ms  solver module ms  HiGHS alone ms  API ÷ HiGHS')
    console.log(`${a.toFixed(2).padStart(18)}  ${m.toFixed(2).padStart(16)}  ${r.toFixed(2).padStart(14)}  ${(a / r).toFixed(2).padStart(11)}`)
    // Each aim on its own line: the request's own work (sign-in check, body, lots and readings read,
    // prices) is outside HiGHS, so the ratio says how much of the answer's time the solver is.
    console.log(a < API_TARGET_MS ? `Under ${API_TARGET_MS} ms through the API.` : `MISSES TARGET: over ${API_TARGET_MS} ms through the API.`)
    console.log(a <= r * API_TARGET_RATIO
      ? `Within ${API_TARGET_RATIO} × HiGHS alone.`
      : `MISSES TARGET: ${(a / r).toFixed(1)} × HiGHS alone through the API (aim ${API_TARGET_RATIO} ×); the solver module is ${(m / r).toFixed(2)} × HiGHS alone.`)
  }
  finally {
    await written.remove()
  }
}

await main()
if (process.env.POMEWRIGHT_APP_URL) await throughTheApi()
else console.log('\nNo bench stack (POMEWRIGHT_APP_URL unset): POST /api/blends/solve not measured.')
