import GLPK from 'glpk.js/node'
import loadHighs, { type Highs } from 'highs'
import { beforeAll, describe, expect, it } from 'vitest'
import { BlendInputError, BlendSolverError, createBlendSolver, solveBlend, solveBlendExact, type BlendSolution } from '../../server/utils/blendSolver'
import { BLEND_PROPERTIES, type BlendProperty, type Range, type SolverInput, type SolverLot } from '../../shared/types/blend'
import { pearsonBrix } from '../../shared/utils/pearsonSquare'
import { juiceClass } from '../../shared/utils/juiceClass'
import { brixToSg } from '../../shared/utils/sugar'
import { mulberry32 } from '../support/random'

const WATER_KG_PER_L = 0.998203

function lot(key: string, over: Partial<SolverLot> = {}): SolverLot {
  return {
    key, availableKg: 5000, juiceYieldLPerTonne: 720, brix: 12, sg: 1.048, taGPerL: 5, tanninGPerL: 1.5, ph: 3.5,
    costPerTonneMinor: 20000, varietyId: null, juiceClass: null, ...over,
  }
}

const litresOf = (l: SolverLot, kg: number) => (kg / 1000) * l.juiceYieldLPerTonne

/** The blend's figures from kg, written out again here rather than taken from blendMix. */
function averages(lots: SolverLot[], kg: number[]) {
  let litres = 0
  let mass = 0
  const sums = { brix: 0, sg: 0, taGPerL: 0, tanninGPerL: 0 }
  lots.forEach((l, i) => {
    const v = litresOf(l, kg[i]!)
    const m = v * l.sg * WATER_KG_PER_L
    litres += v
    mass += m
    sums.brix += l.brix * m
    sums.sg += l.sg * v
    sums.taGPerL += (l.taGPerL ?? Number.NaN) * v
    sums.tanninGPerL += (l.tanninGPerL ?? Number.NaN) * v
  })
  return { litres, brix: sums.brix / mass, sg: sums.sg / litres, taGPerL: sums.taGPerL / litres, tanninGPerL: sums.tanninGPerL / litres }
}

const kgOf = (s: BlendSolution, key: string, input: SolverInput) => s.kg[input.lots.findIndex(l => l.key === key)]!

// ---------------------------------------------------------------------------------------------

describe('hand-worked blends', () => {
  // Two lots to at least 12 °Brix, 1,000 L. Worked by hand:
  //   A: 10 °Bx, SG 1.040, 700 L/t, 20,000 minor/t (the cheaper); B: 15 °Bx, SG 1.061, 650 L/t, 30,000 minor/t.
  //   °Brix is a mass fraction: the Pearson square gives |12 − 15| = 3 parts of A to |10 − 12| = 2 of B by MASS.
  //   Litres: A 0.6 / 1.040 and B 0.4 / 1.061 per kg of juice (0.998203 cancels), so of 1,000 L
  //   A = 1000 × 0.576923 / (0.576923 + 0.377003) = 604.79 L and B = 395.21 L;
  //   kg: A 604.79 / 0.700 = 863.98 kg, B 395.21 / 0.650 = 608.02 kg;
  //   cost 0.86398 t × 20,000 + 0.60802 t × 30,000 = 35,520.2 minor.
  //   The saving per °Brix: cost = 1000 × 20/0.7 + v_B × (30/0.65 − 20/0.7) with mass share φ = (b − 10)/5 of B,
  //   v_B = 1000 φ × 1.040 / ((1 − φ) × 1.061 + φ × 1.040); dv_B/db = 1000 × 1.040 × 1.061 / 1.0526² / 5 = 199.18 L,
  //   × 17.5824 minor/L = 3,502.1 minor per °Brix.
  const twoLots: SolverInput = {
    target: { brix: { min: 12, max: 20 } },
    volumeL: 1000,
    lots: [
      lot('A', { brix: 10, sg: 1.040, juiceYieldLPerTonne: 700, costPerTonneMinor: 20000 }),
      lot('B', { brix: 15, sg: 1.061, juiceYieldLPerTonne: 650, costPerTonneMinor: 30000 }),
    ],
  }

  it('two lots: splits °Brix by mass, as the Pearson square does, at the least cost', async () => {
    const result = await solveBlend(twoLots)
    expect(result.status).toBe('optimal')
    expect(result.lines).toEqual([
      { key: 'A', kg: 864.0, litres: 604.8, share: 0.6048 },
      { key: 'B', kg: 608.0, litres: 395.2, share: 0.3952 },
    ])
    expect(result.costMinor).toBe(35520)
    expect(result.costPerLitreMinor).toBe(35.52)
    expect(result.predicted!.brix).toBeCloseTo(12, 6)
    const square = pearsonBrix({ brix: 10, sg: 1.040 }, { brix: 15, sg: 1.061 }, 12)
    const exact = await solveBlendExact(twoLots)
    expect(litresOf(twoLots.lots[0]!, kgOf(exact, 'A', twoLots)) / 1000).toBeCloseTo(square.volumeShareA, 9)
    expect(exact.costMinor).toBeCloseTo(35520.2085, 3)
  })

  it('two lots: the °Brix minimum binds, and lowering it by 1 °Brix saves 3,502.1 minor', async () => {
    const result = await solveBlend(twoLots)
    expect(result.binding).toEqual([{ property: 'brix', bound: 'min', costPerUnit: expect.closeTo(3502.12, 1) }])
  })

  // Three lots to TA 5–8 g/L and tannin 1.5–4 g/L, 1,000 L; all 720 L/t, so cost per litre is cost per
  // tonne / 720: S (sweet) TA 2.0, tannin 0.5, 25 minor/L; H (sharp) TA 10.0, tannin 0.8, 40 minor/L;
  // B (bittersweet) TA 2.5, tannin 3.0, 50 minor/L. Worked by hand: S is cheapest, H brings acid,
  // B tannin; with both minimums tight, writing v_S = 1000 − v_H − v_B:
  //   TA:     2 v_S + 10 v_H + 2.5 v_B = 5000   →  8 v_H + 0.5 v_B = 3000
  //   tannin: 0.5 v_S + 0.8 v_H + 3 v_B = 1500 →  0.3 v_H + 2.5 v_B = 1000
  //   determinant 8 × 2.5 − 0.5 × 0.3 = 19.85; v_H = (2.5 × 3000 − 0.5 × 1000) / 19.85 = 352.645 L,
  //   v_B = (8 × 1000 − 0.3 × 3000) / 19.85 = 357.683 L, v_S = 289.673 L.
  //   cost = 25,000 + 15 v_H + 25 v_B = 39,231.74 minor.
  //   Per g/L of TA minimum: (15 × 2.5 × 1000 − 25 × 0.3 × 1000) / 19.85 = 1,511.34 minor;
  //   per g/L of tannin minimum: (−15 × 0.5 × 1000 + 25 × 8 × 1000) / 19.85 = 9,697.73 minor.
  const threeLots: SolverInput = {
    target: { taGPerL: { min: 5, max: 8 }, tanninGPerL: { min: 1.5, max: 4 } },
    volumeL: 1000,
    lots: [
      lot('S', { brix: 12, sg: 1.048, taGPerL: 2.0, tanninGPerL: 0.5, ph: 3.9, costPerTonneMinor: 18000, varietyId: 1, juiceClass: 'sweet' }),
      lot('H', { brix: 11, sg: 1.044, taGPerL: 10.0, tanninGPerL: 0.8, ph: 3.1, costPerTonneMinor: 28800, varietyId: 2, juiceClass: 'sharp' }),
      lot('B', { brix: 13, sg: 1.052, taGPerL: 2.5, tanninGPerL: 3.0, ph: 3.8, costPerTonneMinor: 36000, varietyId: 3, juiceClass: 'bittersweet' }),
    ],
  }

  it('three lots: both minimums tight, the volumes and cost as worked by hand', async () => {
    const exact = await solveBlendExact(threeLots)
    expect(exact.status).toBe('optimal')
    const litres = (key: string) => litresOf(threeLots.lots.find(l => l.key === key)!, kgOf(exact, key, threeLots))
    expect(litres('H')).toBeCloseTo(7000 / 19.85, 6)
    expect(litres('B')).toBeCloseTo(7100 / 19.85, 6)
    expect(litres('S')).toBeCloseTo(1000 - 14100 / 19.85, 6)
    expect(exact.costMinor).toBeCloseTo(25000 + (15 * 7000 + 25 * 7100) / 19.85, 6)
    const result = await solveBlend(threeLots)
    expect(result.costMinor).toBe(39232)
    expect(result.lines.map(l => l.litres)).toEqual([289.7, 352.6, 357.7])
    expect(result.predicted).toMatchObject({ taGPerL: expect.closeTo(5, 9), tanninGPerL: expect.closeTo(1.5, 9) })
  })

  it('three lots: what each tight minimum costs, from the dual values', async () => {
    const result = await solveBlend(threeLots)
    expect(result.binding).toEqual([
      { property: 'taGPerL', bound: 'min', costPerUnit: expect.closeTo(30000 / 19.85, 2) },
      { property: 'tanninGPerL', bound: 'min', costPerUnit: expect.closeTo(192500 / 19.85, 2) },
    ])
  })

  it('a share rule: sharp fruit at most 34 % of the volume', async () => {
    // Worked by hand: v_H = 340 L at the share's limit; TA: 2 (660 − v_B) + 3400 + 2.5 v_B ≥ 5000 → v_B ≥ 560;
    // tannin: 0.5 (660 − v_B) + 272 + 3 v_B ≥ 1500 → v_B ≥ 359.2; so v_B = 560, v_S = 100;
    // cost 25 × 100 + 40 × 340 + 50 × 560 = 44,100 minor.
    const result = await solveBlend({ ...threeLots, shares: [{ juiceClass: 'sharp', max: 0.34 }] })
    expect(result.status).toBe('optimal')
    expect(result.lines.map(l => [l.key, l.litres, l.share])).toEqual([['S', 100, 0.1], ['H', 340, 0.34], ['B', 560, 0.56]])
    expect(result.costMinor).toBe(44100)
    // The same rule by variety id (H is variety 2) gives the same blend.
    const byVariety = await solveBlend({ ...threeLots, shares: [{ varietyId: 2, max: 0.34 }] })
    expect(byVariety.lines).toEqual(result.lines)
  })

  it('a minimum share: at least 60 % bittersweet', async () => {
    // Worked by hand: v_B = 600 L; TA: 2 v_S + 10 v_H + 1500 ≥ 5000 with v_S = 400 − v_H → 8 v_H ≥ 2700 →
    // v_H = 337.5 L, v_S = 62.5 L (tannin 0.03125 + 0.27 + 1.8 = 2.10 g/L, inside its range);
    // cost 25 × 62.5 + 40 × 337.5 + 50 × 600 = 45,062.5 minor.
    const exact = await solveBlendExact({ ...threeLots, shares: [{ juiceClass: 'bittersweet', min: 0.6 }] })
    expect(exact.costMinor).toBeCloseTo(45062.5, 6)
    expect(litresOf(threeLots.lots[1]!, kgOf(exact, 'H', threeLots))).toBeCloseTo(337.5, 6)
  })

  it('leaves out a lot without a reading the target needs, and says so', async () => {
    const input: SolverInput = { ...threeLots, lots: [...threeLots.lots, lot('X', { taGPerL: null, costPerTonneMinor: 1000 })] }
    const result = await solveBlend(input)
    expect(result.excluded).toEqual([{ key: 'X', reason: 'no TA reading, and the target has a TA range' }])
    expect(result.lines.map(l => l.key)).not.toContain('X')
    expect(result.costMinor).toBe(39232)
    // Without a TA range the cheap lot is used, and the blend's TA is not known.
    const noAcid = await solveBlend({ ...input, target: { tanninGPerL: { min: 0, max: 4 } } })
    expect(noAcid.excluded).toBeUndefined()
    expect(noAcid.lines).toEqual([{ key: 'X', kg: 1388.9, litres: 1000, share: 1 }])
    expect(noAcid.predicted!.taGPerL).toBeNull()
  })
})

describe('the nearest mix when none fits', () => {
  const lots = [
    lot('S', { brix: 12, sg: 1.048, taGPerL: 2.0, tanninGPerL: 0.5, costPerTonneMinor: 18000 }),
    lot('H', { brix: 11, sg: 1.044, taGPerL: 10.0, tanninGPerL: 0.8, costPerTonneMinor: 28800 }),
    lot('B', { brix: 13, sg: 1.052, taGPerL: 2.5, tanninGPerL: 3.0, costPerTonneMinor: 36000 }),
  ]

  it('a °Brix no lot reaches: all of the sweetest lot, and the miss', async () => {
    const result = await solveBlend({ target: { brix: { min: 14, max: 15 } }, volumeL: 1000, lots })
    expect(result.status).toBe('nearest')
    expect(result.lines).toEqual([{ key: 'B', kg: 1388.9, litres: 1000, share: 1 }])
    expect(result.misses).toEqual([{ property: 'brix', min: 14, max: 15, achieved: expect.closeTo(13, 6) }])
    expect(result.binding).toEqual([])
    expect(result.costMinor).toBe(50000)
  })

  it('less free juice than the volume: all of it, and the shortfall', async () => {
    // 3 × 5,000 kg × 0.720 L/kg = 10,800 L of 20,000 L; TA (2 + 10 + 2.5) / 3 = 4.833 g/L and tannin
    // (0.5 + 0.8 + 3.0) / 3 = 1.433 g/L fall short of their ranges too (worked by hand).
    const result = await solveBlend({ target: { taGPerL: { min: 5, max: 8 }, tanninGPerL: { min: 1.5, max: 4 } }, volumeL: 20000, lots })
    expect(result.status).toBe('nearest')
    expect(result.lines.map(l => l.kg)).toEqual([5000, 5000, 5000])
    expect(result.misses).toEqual([
      { property: 'taGPerL', min: 5, max: 8, achieved: expect.closeTo(14.5 / 3, 6) },
      { property: 'tanninGPerL', min: 1.5, max: 4, achieved: expect.closeTo(4.3 / 3, 6) },
      { property: 'volumeL', min: 20000, max: 20000, achieved: 10800 },
    ])
    expect(result.costMinor).toBe(5 * (18000 + 28800 + 36000))
  })

  it('short of juice but every range met: only the volume is missed', async () => {
    const result = await solveBlend({ target: { taGPerL: { min: 2, max: 11 } }, volumeL: 20000, lots })
    expect(result.misses).toEqual([{ property: 'volumeL', min: 20000, max: 20000, achieved: 10800 }])
  })

  it('two ranges that cannot hold together: the nearer one is met and the other missed by as little as it can be', async () => {
    // A: 12 °Bx, SG 1.048; B: 16 °Bx, SG 1.064. Target 14–16 °Bx and SG 1.040–1.052. °Brix 14 needs half
    // the juice MASS from B; SG 1.052 allows only a quarter of the VOLUME from B. Missing by a range's width
    // weighs the same for each, and each step of B toward 14 °Bx closes the °Brix miss (in widths) faster
    // than it opens the SG miss, so the nearest mix stops at 14 °Bx: B's volume share is then
    // 1.048 / (1.048 + 1.064) = 0.496212, and SG = 1.048 + 0.016 × 0.496212 = 1.055939 (worked by hand).
    const input: SolverInput = {
      target: { brix: { min: 14, max: 16 }, sg: { min: 1.040, max: 1.052 } },
      volumeL: 1000,
      lots: [lot('A', { brix: 12, sg: 1.048 }), lot('B', { brix: 16, sg: 1.064, costPerTonneMinor: 10000 })],
    }
    const result = await solveBlend(input)
    expect(result.status).toBe('nearest')
    expect(result.predicted!.brix).toBeCloseTo(14, 6)
    expect(result.misses).toEqual([{ property: 'sg', min: 1.040, max: 1.052, achieved: expect.closeTo(1.055939, 6) }])
    expect(result.lines.find(l => l.key === 'B')!.share).toBe(0.4962)
  })

  it('no lot with the readings the target needs: an empty blend short of the whole volume', async () => {
    const result = await solveBlend({ target: { taGPerL: { min: 5, max: 8 } }, volumeL: 1000, lots: [lot('X', { taGPerL: null })] })
    expect(result).toMatchObject({
      status: 'nearest', lines: [], predicted: null, costMinor: 0, costPerLitreMinor: 0,
      misses: [{ property: 'volumeL', min: 1000, max: 1000, achieved: 0 }],
      excluded: [{ key: 'X', reason: expect.stringContaining('TA') }],
    })
  })

  it('share rules that leave no room: nothing can be pressed', async () => {
    const result = await solveBlend({ target: {}, volumeL: 1000, lots, shares: [{ juiceClass: 'sweet', min: 0.5 }] })
    expect(result.status).toBe('nearest')
    expect(result.misses).toEqual([{ property: 'volumeL', min: 1000, max: 1000, achieved: 0 }])
  })
})

describe('bad input', () => {
  const good: SolverInput = { target: { brix: { min: 11, max: 13 } }, volumeL: 1000, lots: [lot('A'), lot('B', { brix: 13 })] }
  const cases: [string, SolverInput, RegExp][] = [
    ['no lots', { ...good, lots: [] }, /^lots must hold at least one lot/],
    ['a range with min above max', { ...good, target: { taGPerL: { min: 7, max: 5 } } }, /^target\.taGPerL min 7 is above max 5/],
    ['a negative weight', { ...good, lots: [lot('A', { availableKg: -5 })] }, /^lots\[0\]\.availableKg must be a number of 0 or more; got -5/],
    ['a °Brix that is not a number', { ...good, lots: [lot('A'), lot('B', { brix: Number.NaN })] }, /^lots\[1\]\.brix/],
    ['an endless juice yield', { ...good, lots: [lot('A', { juiceYieldLPerTonne: Infinity })] }, /^lots\[0\]\.juiceYieldLPerTonne/],
    ['a negative price', { ...good, lots: [lot('A', { costPerTonneMinor: -1 })] }, /^lots\[0\]\.costPerTonneMinor/],
    ['a negative TA', { ...good, lots: [lot('A', { taGPerL: -0.1 })] }, /^lots\[0\]\.taGPerL/],
    ['no volume', { ...good, volumeL: 0 }, /^volumeL must be a number of more than 0/],
    ['a negative volume', { ...good, volumeL: -10 }, /^volumeL/],
    ['a range bound that is not finite', { ...good, target: { brix: { min: 10, max: Infinity } } }, /^target\.brix\.max/],
    ['a negative range bound', { ...good, target: { tanninGPerL: { min: -1, max: 2 } } }, /^target\.tanninGPerL\.min/],
    ['a range that is not a range', { ...good, target: { brix: null as unknown as Range } }, /^target\.brix must be a range/],
    ['a property a blend is not planned on', { ...good, target: { ph: { min: 3.2, max: 3.6 } } as SolverInput['target'] }, /^target\.ph is not a property/],
    ['a share with min above max', { ...good, shares: [{ juiceClass: 'sharp', min: 0.6, max: 0.4 }] }, /^shares\[0\] min 0\.6 is above max 0\.4/],
    ['a share above 1', { ...good, shares: [{ varietyId: 1, max: 1.5 }] }, /^shares\[0\]\.max/],
    ['a share of nothing', { ...good, shares: [{ max: 0.5 }] }, /^shares\[0\] must name a varietyId or a juiceClass/],
    ['the same lot twice', { ...good, lots: [lot('A'), lot('A')] }, /^lots\[1\]\.key A is given twice/],
  ]

  it.each(cases)('%s throws a RangeError naming the field', async (_name, input, message) => {
    const attempt = solveBlend(input)
    await expect(attempt).rejects.toThrow(RangeError)
    await expect(attempt).rejects.toThrow(message)
    await expect(attempt).rejects.toBeInstanceOf(BlendInputError)
  })

  it('gives the path of the field for the API\'s issues', async () => {
    const error = await solveBlend({ ...good, lots: [lot('A'), lot('B', { sg: 0 })] }).catch((e: unknown) => e)
    expect(error).toMatchObject({ path: ['lots', 1, 'sg'] })
  })
})

describe('a solve that throws inside HiGHS', () => {
  /** A runtime whose solves throw as a WebAssembly abort does, around the real one. */
  function aborting(real: Highs): Highs {
    const lpCall = () => {
      throw new WebAssembly.RuntimeError('Aborted(). Build with -sASSERTIONS for more info.')
    }
    return { ...real, raw: { ...real.raw, lpCall } }
  }
  const input: SolverInput = { target: { brix: { min: 11, max: 13 } }, volumeL: 1000, lots: [lot('A', { brix: 10 }), lot('B', { brix: 14 })] }

  it('is tried once more on a fresh instance, which answers', async () => {
    let loads = 0
    const solver = createBlendSolver(async () => {
      loads += 1
      const real = await loadHighs()
      return loads === 1 ? aborting(real) : real
    })
    const result = await solver.solve(input)
    expect(result.status).toBe('optimal')
    expect(loads).toBe(2)
    // The fresh instance is kept for the next solve.
    await solver.solve(input)
    expect(loads).toBe(2)
  })

  it('throws when the fresh instance throws too', async () => {
    let loads = 0
    const solver = createBlendSolver(async () => {
      loads += 1
      return aborting(await loadHighs())
    })
    const failure = await solver.solve(input).catch((e: unknown) => e)
    expect(failure).toBeInstanceOf(BlendSolverError)
    expect((failure as Error).cause).toBeInstanceOf(WebAssembly.RuntimeError)
    expect(loads).toBe(2)
  })
})

// ---------------------------------------------------------------------------------------------
// Random blends against an independent solver

function randomInstance(random: () => number): SolverInput {
  const between = (lo: number, hi: number) => lo + (hi - lo) * random()
  const round = (x: number, places: number) => Math.round(x * 10 ** places) / 10 ** places
  const n = 2 + Math.floor(random() * 11)
  const lots = Array.from({ length: n }, (_, i): SolverLot => {
    const brix = round(between(9, 17), 1)
    const taGPerL = random() < 0.08 ? null : round(between(1.5, 10.5), 2)
    const tanninGPerL = random() < 0.08 ? null : round(between(0.3, 3.8), 2)
    return {
      key: `L${i}`,
      availableKg: random() < 0.05 ? 0 : round(between(200, 20000), 0),
      juiceYieldLPerTonne: round(between(550, 780), 0),
      brix,
      sg: round(brixToSg(brix) + between(-0.001, 0.001), 4),
      taGPerL,
      tanninGPerL,
      ph: random() < 0.1 ? null : round(between(3.0, 4.0), 2),
      costPerTonneMinor: round(between(12000, 48000), 0),
      varietyId: 1 + Math.floor(random() * 4),
      juiceClass: juiceClass(taGPerL ?? 3, tanninGPerL ?? 1),
    }
  })
  const juice = lots.reduce((sum, l) => sum + litresOf(l, l.availableKg), 0)
  const range = (lo: number, hi: number, minWidth: number, maxWidth: number, places: number) => {
    const min = round(between(lo, hi), places)
    return { min, max: random() < 0.05 ? min : round(min + between(minWidth, maxWidth), places) }
  }
  const target: SolverInput['target'] = {}
  if (random() < 0.65) target.brix = range(10.5, 13, 0.5, 4, 1)
  if (random() < 0.25) target.sg = range(1.042, 1.052, 0.004, 0.014, 3)
  if (random() < 0.6) target.taGPerL = range(3.5, 6, 1, 3.5, 1)
  if (random() < 0.5) target.tanninGPerL = range(0.5, 1.8, 0.5, 2.5, 1)
  const shares: SolverInput['shares'] = []
  if (random() < 0.3) shares.push({ juiceClass: lots[0]!.juiceClass!, ...(random() < 0.5 ? { min: round(between(0, 0.3), 2) } : { max: round(between(0.3, 0.8), 2) }) })
  if (random() < 0.15) shares.push({ varietyId: 1 + Math.floor(random() * 4), max: round(between(0.2, 0.7), 2) })
  // Mostly less than the free juice; one blend in seven asks for more than there is.
  const volumeL = round(juice * (random() < 0.15 ? between(1, 1.3) : between(0.05, 0.8)), 0)
  return { target, volumeL: volumeL || 100, lots, shares }
}

/** glpk.js on the same blend, formulated afresh from the blend's definition, in kg. */
function glpkModel(glpk: Awaited<ReturnType<typeof GLPK>>, input: SolverInput, objective: 'cost' | 'volume') {
  const constrained = BLEND_PROPERTIES.filter(p => input.target[p])
  const usable = input.lots.filter(l => constrained.every(p => l[p] !== null))
  const v = (l: SolverLot) => `x${input.lots.indexOf(l)}`
  const litresPerKg = (l: SolverLot) => l.juiceYieldLPerTonne / 1000
  const weight = (l: SolverLot, p: BlendProperty) => p === 'brix' ? litresPerKg(l) * l.sg * WATER_KG_PER_L : litresPerKg(l)
  const atLeastZero = { type: glpk.GLP_LO, lb: 0, ub: 0 }
  const subjectTo = [
    objective === 'cost'
      ? { name: 'volume', vars: usable.map(l => ({ name: v(l), coef: litresPerKg(l) })), bnds: { type: glpk.GLP_FX, lb: input.volumeL, ub: input.volumeL } }
      : { name: 'volume', vars: usable.map(l => ({ name: v(l), coef: litresPerKg(l) })), bnds: { type: glpk.GLP_UP, lb: 0, ub: input.volumeL } },
  ]
  if (objective === 'cost') {
    for (const p of constrained) {
      const { min, max } = input.target[p]!
      subjectTo.push({ name: `${p}-min`, vars: usable.map(l => ({ name: v(l), coef: (l[p]! - min) * weight(l, p) })), bnds: atLeastZero })
      subjectTo.push({ name: `${p}-max`, vars: usable.map(l => ({ name: v(l), coef: (max - l[p]!) * weight(l, p) })), bnds: atLeastZero })
    }
  }
  ;(input.shares ?? []).forEach((rule, k) => {
    const member = (l: SolverLot) => (rule.varietyId === undefined || l.varietyId === rule.varietyId) && (rule.juiceClass === undefined || l.juiceClass === rule.juiceClass) ? 1 : 0
    if (rule.min !== undefined) subjectTo.push({ name: `share${k}-min`, vars: usable.map(l => ({ name: v(l), coef: (member(l) - rule.min!) * litresPerKg(l) })), bnds: atLeastZero })
    if (rule.max !== undefined) subjectTo.push({ name: `share${k}-max`, vars: usable.map(l => ({ name: v(l), coef: (rule.max! - member(l)) * litresPerKg(l) })), bnds: atLeastZero })
  })
  return {
    name: 'blend',
    objective: objective === 'cost'
      ? { direction: glpk.GLP_MIN, name: 'cost', vars: usable.map(l => ({ name: v(l), coef: l.costPerTonneMinor / 1000 })) }
      : { direction: glpk.GLP_MAX, name: 'litres', vars: usable.map(l => ({ name: v(l), coef: litresPerKg(l) })) },
    subjectTo,
    bounds: usable.map(l => l.availableKg > 0
      ? { name: v(l), type: glpk.GLP_DB, lb: 0, ub: l.availableKg }
      : { name: v(l), type: glpk.GLP_FX, lb: 0, ub: 0 }),
  }
}

describe('random blends, checked against glpk.js', () => {
  let glpk: Awaited<ReturnType<typeof GLPK>>
  const random = mulberry32(20260914)
  const instances = Array.from({ length: 400 }, () => randomInstance(random))
  beforeAll(async () => {
    glpk = await GLPK()
  })

  function glpkSolve(input: SolverInput, objective: 'cost' | 'volume') {
    const usable = glpkModel(glpk, input, objective)
    if (usable.bounds.length === 0) return { status: glpk.GLP_NOFEAS, z: 0 }
    return glpk.solve(usable, { msglev: glpk.GLP_MSG_OFF, presol: false }).result
  }

  it('finds the same least cost, meets every constraint, and answers "nearest" exactly when glpk finds no mix', async () => {
    let optimal = 0
    let nearest = 0
    for (const input of instances) {
      const mine = await solveBlendExact(input)
      const theirs = glpkSolve(input, 'cost')
      const where = JSON.stringify(input)
      if (theirs.status === glpk.GLP_OPT) {
        optimal += 1
        expect(mine.status, where).toBe('optimal')
        expect(Math.abs(mine.costMinor - theirs.z), where).toBeLessThanOrEqual(1e-6 * Math.max(1, theirs.z))
        // Every constraint holds for the solution found, checked from its kg.
        input.lots.forEach((l, i) => {
          expect(mine.kg[i]!).toBeGreaterThanOrEqual(0)
          expect(mine.kg[i]!).toBeLessThanOrEqual(l.availableKg)
        })
        const used = input.lots.map((l, i) => mine.kg[i]! > 0 ? i : -1).filter(i => i >= 0)
        const avg = averages(used.map(i => input.lots[i]!), used.map(i => mine.kg[i]!))
        expect(Math.abs(avg.litres - input.volumeL), where).toBeLessThanOrEqual(1e-6 * input.volumeL)
        for (const p of BLEND_PROPERTIES) {
          const range = input.target[p]
          if (!range) continue
          const tolerance = 1e-6 * (p === 'sg' ? 0.001 : 1)
          expect(avg[p], `${p} of ${where}`).toBeGreaterThanOrEqual(range.min - tolerance)
          expect(avg[p], `${p} of ${where}`).toBeLessThanOrEqual(range.max + tolerance)
        }
        for (const rule of input.shares ?? []) {
          const share = used.filter(i => (rule.varietyId === undefined || input.lots[i]!.varietyId === rule.varietyId) && (rule.juiceClass === undefined || input.lots[i]!.juiceClass === rule.juiceClass))
            .reduce((sum, i) => sum + litresOf(input.lots[i]!, mine.kg[i]!), 0) / avg.litres
          if (rule.min !== undefined) expect(share, where).toBeGreaterThanOrEqual(rule.min - 1e-6)
          if (rule.max !== undefined) expect(share, where).toBeLessThanOrEqual(rule.max + 1e-6)
        }
      }
      else {
        nearest += 1
        expect(theirs.status, where).toBe(glpk.GLP_NOFEAS)
        expect(mine.status, where).toBe('nearest')
        expect(mine.misses.length, where).toBeGreaterThan(0)
        checkNearest(input, mine, glpkSolve(input, 'volume').z)
      }
    }
    expect(optimal + nearest).toBe(400)
    expect(optimal).toBeGreaterThanOrEqual(200)
    expect(nearest).toBeGreaterThanOrEqual(60)
  }, 120_000)

  /** The nearest mix presses as much juice as glpk can, and its misses are what its juice really is. */
  function checkNearest(input: SolverInput, mine: BlendSolution, mostLitres: number) {
    const where = JSON.stringify(input)
    const used = input.lots.map((_, i) => i).filter(i => mine.kg[i]! > 0)
    const avg = averages(used.map(i => input.lots[i]!), used.map(i => mine.kg[i]!))
    expect(Math.abs(avg.litres - mostLitres), where).toBeLessThanOrEqual(1e-6 * input.volumeL)
    const volumeMiss = mine.misses.find(m => m.property === 'volumeL')
    if (mostLitres < input.volumeL * (1 - 1e-6)) {
      expect(volumeMiss, where).toMatchObject({ property: 'volumeL', min: input.volumeL, max: input.volumeL })
      // Rounded to 0.1 L.
      expect(Math.abs(volumeMiss!.achieved - mostLitres), where).toBeLessThanOrEqual(0.05 + 1e-6 * input.volumeL)
    }
    else {
      expect(volumeMiss, where).toBeUndefined()
    }
    if (used.length === 0) return
    for (const p of BLEND_PROPERTIES) {
      const range = input.target[p]
      if (!range) continue
      const miss = mine.misses.find(m => m.property === p)
      const tolerance = 1e-5 * (p === 'sg' ? 0.001 : 1)
      if (avg[p] < range.min - tolerance || avg[p] > range.max + tolerance) {
        expect(miss, `${p} of ${where}`).toEqual({ property: p, min: range.min, max: range.max, achieved: expect.closeTo(avg[p], 9) })
      }
      else if (avg[p] >= range.min && avg[p] <= range.max) {
        expect(miss, `${p} of ${where}`).toBeUndefined()
      }
    }
  }

  it('rounds the answer as the API gives it: kg to 0.1, litres to 0.1, shares to 4 places, cost to whole units', async () => {
    for (const input of instances.slice(0, 60)) {
      const exact = await solveBlendExact(input)
      const result = await solveBlend(input)
      expect(result.costMinor).toBe(Math.round(exact.costMinor))
      expect(result.predicted).toEqual(exact.predicted)
      for (const line of result.lines) {
        const i = input.lots.findIndex(l => l.key === line.key)
        expect(line.kg).toBeGreaterThan(0)
        expect(line.kg).toBe(Math.round(exact.kg[i]! * 10) / 10)
        expect(line.litres).toBe(Math.round(litresOf(input.lots[i]!, exact.kg[i]!) * 10) / 10)
        expect(line.share).toBe(Math.round((litresOf(input.lots[i]!, exact.kg[i]!) / exact.litres) * 1e4) / 1e4)
      }
      expect(result.lines.length).toBe(exact.kg.filter(kg => Math.round(kg * 10) > 0).length)
    }
  })

  it('quotes what each binding range saves as a re-solve with the bound moved finds it, where the blend keeps its shape', async () => {
    let compared = 0
    for (const input of instances) {
      const base = await solveBlendExact(input)
      if (base.status !== 'optimal') continue
      for (const b of base.binding) {
        const unit = b.property === 'sg' ? 0.001 : 1
        const step = 1e-3 * unit
        const range = input.target[b.property]!
        const moved: SolverInput = { ...input, target: { ...input.target, [b.property]: b.bound === 'min' ? { min: range.min - step, max: range.max } : { min: range.min, max: range.max + step } } }
        const after = await solveBlendExact(moved)
        // Compare only where the same lots are used and the same ranges bind: the basis has not changed.
        const sameLots = base.kg.every((kg, i) => (kg > 1e-6) === (after.kg[i]! > 1e-6))
        const sameBinding = JSON.stringify(after.binding.map(x => [x.property, x.bound])) === JSON.stringify(base.binding.map(x => [x.property, x.bound]))
        if (!sameLots || !sameBinding) continue
        compared += 1
        const saved = (base.costMinor - after.costMinor) / (step / unit)
        expect(Math.abs(saved - b.costPerUnit), `${b.property} ${b.bound}: ${saved} against ${b.costPerUnit} in ${JSON.stringify(input)}`)
          .toBeLessThanOrEqual(Math.max(0.01, 1e-3 * b.costPerUnit))
      }
    }
    expect(compared).toBeGreaterThanOrEqual(100)
  }, 120_000)

  it('solves 5,000 blends in one process without failing, and each the same every time', async () => {
    const sample = instances.slice(0, 50)
    const first = await Promise.all(sample.map(input => solveBlendExact(input)))
    const times: number[] = []
    for (let k = 0; k < 5000; k++) {
      const started = performance.now()
      const again = await solveBlendExact(sample[k % 50]!)
      times.push(performance.now() - started)
      expect(again.status).toBe(first[k % 50]!.status)
      expect(again.costMinor).toBe(first[k % 50]!.costMinor)
    }
    const sum = (xs: number[]) => xs.reduce((a, b) => a + b, 0)
    // Speed is the bench's to judge (tests/bench/blend-solve.ts); this only shows the two ends.
    console.info(`5,000 solves: first 1,000 took ${sum(times.slice(0, 1000)).toFixed(0)} ms, last 1,000 ${sum(times.slice(-1000)).toFixed(0)} ms`)
    expect(times).toHaveLength(5000)
  }, 300_000)
})
