import { describe, expect, it } from 'vitest'
import { as, type ApiResponse } from '../support/http'
import { brixToSg } from '../../shared/utils/sugar'

// The public calculators, checked against the published figures their formulas come from.
// Signed out on purpose: they need no account.

async function get(path: string): Promise<ApiResponse> {
  return (await as('anonymous')).get(path)
}

/** A 400 whose data.issues name every one of these fields. */
async function expectRefused(path: string, ...fields: string[]) {
  const res = await get(path)
  expect(res.status, JSON.stringify(res.body)).toBe(400)
  const named = (res.body.data.issues as { path: string, message: string }[]).map(issue => issue.path)
  expect(named, JSON.stringify(res.body.data.issues)).toEqual(expect.arrayContaining(fields))
  for (const issue of res.body.data.issues) expect(issue.message.length).toBeGreaterThan(5)
}

describe('GET /api/calc/sugar', () => {
  it.each([
    [10, 1.04003],
    [20, 1.08297],
  ])('%s °Bx reads %s apparent SG 20/20 °C (NBS Circular 440, Table 114)', async (brix, sg) => {
    const res = await get(`/api/calc/sugar?brix=${brix}`)
    expect(res.status).toBe(200)
    expect(Math.abs(res.body.sgApparent - sg)).toBeLessThanOrEqual(0.0002)
    expect(res.body.brix).toBe(brix)
  })

  it('gives 10 °Bx a true (in vacuo) SG of 1.03998 (NBS Circular 440)', async () => {
    const res = await get('/api/calc/sugar?brix=10')
    expect(res.body.sgTrue).toBeCloseTo(1.03998, 4)
    expect(res.body.sgTrue).toBeLessThan(res.body.sgApparent)
  })

  it('reads SG 1.040 as 9.993 °Bx and 9.994 °P (Wikipedia "Brix": 9.99325 °Bx by the NBS polynomial, 9.99359 °P by the ASBC one)', async () => {
    const res = await get('/api/calc/sugar?sg=1.040')
    expect(res.status).toBe(200)
    expect(res.body.sgApparent).toBe(1.04)
    expect(res.body.brix).toBeCloseTo(9.99325, 3)
    expect(res.body.plato).toBeCloseTo(9.99359, 3)
  })

  it.each([
    [10, 103.8],
    [20, 216.2],
  ])('%s °Bx holds %s g/L of soluble solids, an upper bound on sugar (CRC Handbook of Chemistry and Physics, "Concentrative properties of aqueous solutions", sucrose)', async (brix, gPerL) => {
    const res = await get(`/api/calc/sugar?brix=${brix}`)
    expect(Math.abs(res.body.solubleSolidsGPerL - gPerL)).toBeLessThan(0.1)
  })

  it.each([
    [10, 82.2],
    [20, 191.9],
  ])('%s °Bx holds %s g/L of sugar (OIV-MA-AS2-02, Table II, as in the arrêté of 14 Sept 2011, Annex IV)', async (brix, gPerL) => {
    const res = await get(`/api/calc/sugar?brix=${brix}`)
    expect(res.body.sugarGPerL).toBeCloseTo(gPerL, 6)
    expect(res.body.sugarExtrapolated).toBe(false)
  })

  it('says when the sugar is carried on beyond the table\'s rows', async () => {
    expect((await get('/api/calc/sugar?brix=8')).body.sugarExtrapolated).toBe(true)
  })

  it('takes potential alcohol as the gravity drop to 1.000 by default: SG 1.050 is 6.5625 % ((OG − FG) × 131.25, after Papazian)', async () => {
    const res = await get('/api/calc/sugar?sg=1.050')
    expect(res.body.method).toBe('gravity-drop')
    expect(res.body.potentialAbv).toBeCloseTo(6.5625, 10)
  })

  it('uses Hall for SG 1.050 → 1.000 when asked: about 6.61 % (Hall, Zymurgy 18(2), 1995)', async () => {
    const res = await get('/api/calc/sugar?sg=1.050&method=hall')
    expect(res.body.method).toBe('hall')
    expect(res.body.potentialAbv).toBeCloseTo(6.6082, 4)
  })

  it('uses Balling for SG 1.050 → 1.000 when asked: about 6.61 %, as Hall\'s linear form of it (Hall, Zymurgy 1995)', async () => {
    const res = await get('/api/calc/sugar?sg=1.050&method=balling')
    expect(res.body.method).toBe('balling')
    expect(res.body.potentialAbv).toBeCloseTo(6.61, 2)
  })

  it('goes by sugar when asked: table sugar ÷ 16.83, 6.15 % for 12 °Bx (OIV Table II, arrêté of 14 Sept 2011, Annex IV, column 6)', async () => {
    const res = await get('/api/calc/sugar?brix=12&method=sugar')
    expect(res.body.method).toBe('sugar')
    expect(res.body.potentialAbv).toBeCloseTo(res.body.sugarGPerL / 16.83, 12)
    expect(res.body.potentialAbv).toBeCloseTo(6.15, 2)
  })

  it('gives SG 1.050 within 0.4 % vol of gravity drop and Hall by sugar too (6.56 and 6.61 %)', async () => {
    const res = await get('/api/calc/sugar?sg=1.050&method=sugar')
    expect(Math.abs(res.body.potentialAbv - 6.5625)).toBeLessThan(0.4)
    expect(Math.abs(res.body.potentialAbv - 6.6082)).toBeLessThan(0.4)
  })

  it('reads water as 0 °Bx, SG 1.0000 and no potential alcohol (NBS Circular 440, Table 114: 0 °Bx is 1.00000)', async () => {
    const res = await get('/api/calc/sugar?brix=0')
    expect(res.status).toBe(200)
    expect(res.body.sgApparent).toBeCloseTo(1, 4)
    expect(res.body.potentialAbv).toBeCloseTo(0, 2)
  })

  it('answers unrounded numbers: the page rounds for display', async () => {
    const res = await get('/api/calc/sugar?brix=12.3')
    expect(res.body.sgApparent).toBe(brixToSg(12.3))
    expect(res.body.sgApparent).not.toBe(Number(res.body.sgApparent.toFixed(4)))
  })

  it('refuses a missing reading, and a blank one, naming both fields', async () => {
    await expectRefused('/api/calc/sugar', 'brix', 'sg')
    await expectRefused('/api/calc/sugar?brix=&sg=', 'brix', 'sg')
  })

  it('refuses °Brix and SG together, naming both', async () => {
    await expectRefused('/api/calc/sugar?brix=12&sg=1.050', 'brix', 'sg')
  })

  it('refuses a reading that is not a number', async () => {
    await expectRefused('/api/calc/sugar?brix=abc', 'brix')
    await expectRefused('/api/calc/sugar?sg=abc', 'sg')
  })

  it('refuses readings no juice has: 90 °Bx, SG 0.5, SG 1.5, below 0 °Bx', async () => {
    await expectRefused('/api/calc/sugar?brix=90', 'brix')
    await expectRefused('/api/calc/sugar?brix=-1', 'brix')
    await expectRefused('/api/calc/sugar?sg=0.5', 'sg')
    await expectRefused('/api/calc/sugar?sg=1.5', 'sg')
  })

  it('refuses an unknown method', async () => {
    await expectRefused('/api/calc/sugar?brix=12&method=guess', 'method')
  })
})

describe('GET /api/calc/alcohol', () => {
  it('defaults to the gravity drop: 1.050 → 1.000 is 6.5625 % ((OG − FG) × 131.25, after Papazian)', async () => {
    const res = await get('/api/calc/alcohol?og=1.050&fg=1.000')
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ abv: expect.any(Number), method: 'gravity-drop' })
    expect(res.body.abv).toBeCloseTo(6.5625, 10)
  })

  it('Hall: 1.050 → 1.000 is about 6.61 % (Hall, Zymurgy 18(2), 1995)', async () => {
    const res = await get('/api/calc/alcohol?og=1.050&fg=1.000&method=hall')
    expect(res.body.method).toBe('hall')
    expect(res.body.abv).toBeCloseTo(6.6082, 4)
  })

  it('Hall: a 1.060 juice fermented to 0.998 is 8.29 % (worked example of Hall\'s formula)', async () => {
    // ABW = 76.08 × 0.062 / 0.715 = 6.59716; ABV = 6.59716 × 0.998 / 0.794 = 8.2921.
    const res = await get('/api/calc/alcohol?og=1.060&fg=0.998&method=hall')
    expect(res.body.abv).toBeCloseTo(8.2921, 4)
  })

  it('Balling: 1.050 → 1.000 is about 6.61 %, within 0.01 of Hall (Hall, Zymurgy 1995)', async () => {
    const res = await get('/api/calc/alcohol?og=1.050&fg=1.000&method=balling')
    expect(res.body.method).toBe('balling')
    expect(res.body.abv).toBeCloseTo(6.61, 2)
  })

  it('gives 0 % when nothing has fermented', async () => {
    const res = await get('/api/calc/alcohol?og=1.050&fg=1.050')
    expect(res.body.abv).toBe(0)
  })

  it('refuses a final gravity above the original, naming fg', async () => {
    await expectRefused('/api/calc/alcohol?og=1.000&fg=1.050', 'fg')
  })

  it('refuses missing and non-numeric gravities', async () => {
    await expectRefused('/api/calc/alcohol', 'og', 'fg')
    await expectRefused('/api/calc/alcohol?og=1.050', 'fg')
    await expectRefused('/api/calc/alcohol?og=abc&fg=1.000', 'og')
  })

  it('refuses gravities outside 0.980–1.140 (and an OG below 1.000, which no juice has)', async () => {
    await expectRefused('/api/calc/alcohol?og=0.5&fg=0.5', 'og', 'fg')
    await expectRefused('/api/calc/alcohol?og=1.5&fg=1.000', 'og')
    await expectRefused('/api/calc/alcohol?og=0.995&fg=0.990', 'og')
    await expectRefused('/api/calc/alcohol?og=1.050&fg=0.970', 'fg')
  })

  it('refuses an unknown method (sugar belongs to the juice calculator)', async () => {
    await expectRefused('/api/calc/alcohol?og=1.050&fg=1.000&method=guess', 'method')
    await expectRefused('/api/calc/alcohol?og=1.050&fg=1.000&method=sugar', 'method')
  })
})

describe('GET /api/calc/acid', () => {
  it('turns 1 g/L as tartaric into 0.6535 g/L as sulfuric and 0.8934 as malic (AWRI TN14: molar masses 150.09, 98.08, 134.09, all diprotic)', async () => {
    const res = await get('/api/calc/acid?value=1&as=tartaric')
    expect(res.status).toBe(200)
    expect(res.body.tartaric).toBe(1)
    expect(res.body.sulfuric).toBeCloseTo(0.6535, 4)
    expect(res.body.malic).toBeCloseTo(134.09 / 150.09, 3)
  })

  it('turns 6 g/L as malic into 6.716 as tartaric and 4.389 as sulfuric (equivalent weights 67.04, 75.04, 49.04 g/eq, AWRI TN14)', async () => {
    const res = await get('/api/calc/acid?value=6&as=malic')
    expect(res.body).toEqual({ malic: 6, tartaric: expect.any(Number), sulfuric: expect.any(Number) })
    expect(res.body.tartaric).toBeCloseTo(6.716, 3)
    expect(res.body.sulfuric).toBeCloseTo(4.389, 3)
  })

  it('reads 7.5 mL of 0.1 N NaOH on a 10 mL sample as 7.5 × 0.67 g/L malic and 7.5 × 0.75 tartaric (AWRI TN14)', async () => {
    const res = await get('/api/calc/acid?naohMl=7.5&normality=0.1&sampleMl=10&as=malic')
    expect(res.status).toBe(200)
    expect(res.body.malic).toBeCloseTo(7.5 * 0.6704, 10)
    expect(res.body.malic).toBeCloseTo(7.5 * 0.67, 2)
    expect(res.body.tartaric).toBeCloseTo(7.5 * 0.75, 2)
  })

  it('12 mL of 0.1 N NaOH on 15 mL is 6.0 g/L as tartaric (common practice: TA = 75 × V × N / sample)', async () => {
    const res = await get('/api/calc/acid?naohMl=12&normality=0.1&sampleMl=15&as=tartaric')
    expect(res.body.tartaric).toBeCloseTo(6.0, 2)
  })

  it('refuses a query with neither a figure nor a complete titration', async () => {
    await expectRefused('/api/calc/acid?as=malic', 'value', 'naohMl', 'normality', 'sampleMl')
    await expectRefused('/api/calc/acid?naohMl=7.5&as=malic', 'normality', 'sampleMl')
  })

  it('refuses a figure and a titration together', async () => {
    await expectRefused('/api/calc/acid?value=6&naohMl=7.5&normality=0.1&sampleMl=10&as=malic', 'value', 'naohMl')
  })

  it('refuses non-numeric and impossible values', async () => {
    await expectRefused('/api/calc/acid?value=abc&as=malic', 'value')
    await expectRefused('/api/calc/acid?value=-1&as=malic', 'value')
    await expectRefused('/api/calc/acid?value=500&as=malic', 'value')
    await expectRefused('/api/calc/acid?naohMl=7.5&normality=0&sampleMl=10&as=malic', 'normality')
    await expectRefused('/api/calc/acid?naohMl=7.5&normality=0.1&sampleMl=-10&as=malic', 'sampleMl')
  })

  it('refuses a missing or unknown acid', async () => {
    await expectRefused('/api/calc/acid?value=6', 'as')
    await expectRefused('/api/calc/acid?value=6&as=citric', 'as')
  })
})

describe('GET /api/calc/class', () => {
  // Long Ashton Research Station classification: acid 4.5 g/L (0.45 % malic) and tannin 2.0 g/L (0.2 %)
  // (Barker; thresholds as in A. Lea, "Cider Apple Compositional Data", and Miles, King & Peck, WSU 2015).
  it.each([
    [3.0, 1.0, 'sweet'],
    [7.0, 1.0, 'sharp'],
    [2.5, 3.0, 'bittersweet'],
    [4.8, 2.3, 'bittersharp'],
  ])('TA %s g/L, tannin %s g/L is %s (Long Ashton thresholds, via Lea)', async (ta, tannin, juiceClass) => {
    const res = await get(`/api/calc/class?taGPerL=${ta}&tanninGPerL=${tannin}`)
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ juiceClass, species: 'apple' })
  })

  // Perry pear classes of Pollard & Beech (published perry pear lists): sweet acid ≤ 0.2 %, medium sharp
  // 0.2–0.6 % with tannin below 0.15 %; bittersweet and bittersharp above 0.2 % tannin, split at 0.45 % acid.
  it.each([
    [1.8, 1.0, 'sweet'],
    [4.2, 1.3, 'medium sharp'], // Blakeney Red's Brooks & Olmo figures; published medium sharp
    [3.0, 2.6, 'bittersweet'],
    [5.4, 3.2, 'bittersharp'], // Butt's figures; published bittersharp
  ])('a perry pear juice of TA %s g/L, tannin %s g/L is %s (Pollard & Beech)', async (ta, tannin, juiceClass) => {
    const res = await get(`/api/calc/class?taGPerL=${ta}&tanninGPerL=${tannin}&species=pear`)
    expect(res.status).toBe(200)
    expect(res.body).toEqual({ juiceClass, species: 'pear' })
  })

  it('refuses a species it does not know', async () => {
    await expectRefused('/api/calc/class?taGPerL=4&tanninGPerL=1&species=plum', 'species')
  })

  it.each([
    [4.5, 1.0, 'sharp'],
    [3.0, 2.0, 'bittersweet'],
    [4.5, 2.0, 'bittersharp'],
    [4.49, 1.99, 'sweet'],
  ])('TA %s, tannin %s is %s: exactly on a threshold counts as above (our rule; the source leaves it open)', async (ta, tannin, juiceClass) => {
    const res = await get(`/api/calc/class?taGPerL=${ta}&tanninGPerL=${tannin}`)
    expect(res.body.juiceClass).toBe(juiceClass)
  })

  it('needs both readings', async () => {
    await expectRefused('/api/calc/class', 'taGPerL', 'tanninGPerL')
    await expectRefused('/api/calc/class?taGPerL=4.8', 'tanninGPerL')
  })

  it('refuses non-numeric, negative and impossible readings', async () => {
    await expectRefused('/api/calc/class?taGPerL=abc&tanninGPerL=2', 'taGPerL')
    await expectRefused('/api/calc/class?taGPerL=5&tanninGPerL=-0.1', 'tanninGPerL')
    await expectRefused('/api/calc/class?taGPerL=900&tanninGPerL=2', 'taGPerL')
  })
})

describe('GET /api/calc/planting', () => {
  it('3 m × 5 m is 10,000 / 15 = 666.67 trees/ha and 269.79 trees/acre (1 acre = 4046.8564224 m², NIST SP 811)', async () => {
    const res = await get('/api/calc/planting?inRowM=3&betweenRowM=5')
    expect(res.status).toBe(200)
    expect(res.body.treesPerHectare).toBeCloseTo(10_000 / 15, 10)
    expect(res.body.treesPerHectare).toBeCloseTo(666.67, 2)
    expect(res.body.treesPerAcre).toBeCloseTo(res.body.treesPerHectare * 0.40468564224, 8)
    expect(res.body.treesPerAcre).toBeCloseTo(269.79, 2)
  })

  it('14 ft × 4 ft is about 778 trees/acre (eXtension apples, "Dwarfing Apple Rootstocks"; 43,560 / 56)', async () => {
    const res = await get('/api/calc/planting?inRowFt=4&betweenRowFt=14')
    expect(res.status).toBe(200)
    expect(res.body.treesPerAcre).toBeCloseTo(43_560 / 56, 10)
    expect(Math.round(res.body.treesPerAcre)).toBe(778)
    expect(res.body.treesPerHectare).toBeCloseTo(res.body.treesPerAcre / 0.40468564224, 8)
  })

  it('refuses missing spacing, naming the fields in both units', async () => {
    await expectRefused('/api/calc/planting', 'inRowM', 'betweenRowM', 'inRowFt', 'betweenRowFt')
    await expectRefused('/api/calc/planting?inRowM=3', 'betweenRowM')
    await expectRefused('/api/calc/planting?inRowFt=10', 'betweenRowFt')
  })

  it('refuses non-numeric, zero, negative and absurd spacing', async () => {
    await expectRefused('/api/calc/planting?inRowM=abc&betweenRowM=5', 'inRowM')
    await expectRefused('/api/calc/planting?inRowM=-3&betweenRowM=5', 'inRowM')
    await expectRefused('/api/calc/planting?inRowM=3&betweenRowM=0', 'betweenRowM')
    await expectRefused('/api/calc/planting?inRowM=3&betweenRowM=500', 'betweenRowM')
    await expectRefused('/api/calc/planting?inRowFt=-4&betweenRowFt=14', 'inRowFt')
  })

  it('refuses metres and feet mixed', async () => {
    await expectRefused('/api/calc/planting?inRowM=3&betweenRowFt=16', 'inRowM', 'betweenRowFt')
  })
})

describe('odd input never breaks a calculator', () => {
  const fields: Record<string, string> = {
    sugar: 'brix',
    alcohol: 'og',
    acid: 'value',
    class: 'taGPerL',
    planting: 'inRowM',
  }
  const valid: Record<string, string> = {
    sugar: '',
    alcohol: 'fg=0.999',
    acid: 'as=malic',
    class: 'tanninGPerL=1',
    planting: 'betweenRowM=4',
  }
  const odd = ['NaN', 'Infinity', '-Infinity', '1e400', '%20', '1,5', 'true', '[]', '{}', '1;DROP', '0x', 'null']

  it.each(Object.keys(fields))('%s answers 400 naming the field for every odd value', async (route) => {
    for (const value of odd) {
      const res = await get(`/api/calc/${route}?${fields[route]}=${value}&${valid[route]}`)
      expect(res.status, `${route} ${value}: ${JSON.stringify(res.body)}`).toBe(400)
      expect(res.body.data.issues.map((issue: { path: string }) => issue.path)).toContain(fields[route])
    }
  })

  it.each(Object.keys(fields))('%s answers 400 for a field given twice', async (route) => {
    const res = await get(`/api/calc/${route}?${fields[route]}=1&${fields[route]}=2&${valid[route]}`)
    expect(res.status).toBe(400)
  })
})
