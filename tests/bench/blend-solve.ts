// The blend planner's solver on 50, 200 and 1,000 lots with six range rows (°Brix, TA and tannin, each
// a min and a max) and the volume: the median of repeated solves through server/utils/blendSolver.ts
// (checking the input, building the model, HiGHS, the answer) beside HiGHS alone on the same model
// in the same run; then 5,000 solves in one process, the first and the last thousand timed.
// Run by `npm run bench` (scripts/stack/bench.ts); it needs no stack: `node --import tsx tests/bench/blend-solve.ts`.
import { register } from 'node:module'
import loadHighs from 'highs'
import type { SolverInput, SolverLot } from '../../shared/types/blend'
import { juiceClass } from '../../shared/utils/juiceClass'
import { brixToSg } from '../../shared/utils/sugar'
import { mulberry32 } from '../support/random'

// Server code imports shared code through Nuxt's #shared alias, which only Nuxt and vitest resolve.
const root = new URL('../../', import.meta.url).href
register(`data:text/javascript,${encodeURIComponent(`export async function resolve(specifier, context, next) {
  return specifier.startsWith('#shared/') ? next(new URL('shared/' + specifier.slice(8) + '.ts', ${JSON.stringify(root)}).href, context) : next(specifier, context)
}`)}`)
const { blendModel, solveBlend } = await import('../../server/utils/blendSolver')

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

await main()
