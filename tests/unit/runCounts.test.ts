import { describe, expect, it } from 'vitest'
import { rootstocksToBud } from '../../shared/utils/backplan'
import { CountRefusal, expectedFinished, runCounts, type RunEventForCount } from '../../shared/utils/runCounts'

// A run's counts are what its dated entries leave standing (common practice: a nursery's row book).
// The worked example follows one run through the cycle of R. Crassweller, Penn State / eXtension,
// "Nursery Production of Finished Apple Trees": liners lined out in spring, budded in late summer,
// the take seen the next spring, dug in November. The figures are made up; every result is worked
// by hand in the comment beside it.

let nextId = 1
const e = (kind: string, happenedOn: string, extra: Partial<RunEventForCount> = {}): RunEventForCount => ({ kind, happenedOn, id: nextId++, ...extra })

// 1,000 liners lined out on 20 March 2026.
const linedOut = e('lined-out', '2026-03-20', { count: 1000 })
const broken = e('loss', '2026-06-10', { count: 30, cause: 'breakage' })
const budded = e('budded', '2026-08-20', { count: 970 })
const take = e('take-counted', '2027-04-15', { count: 873 })
const blight = e('loss', '2027-07-01', { count: 13, cause: 'fire-blight' })
const dug = e('dug', '2027-11-15', { grades: [{ count: 600 }, { count: 240 }] })
const ALL = [linedOut, broken, budded, take, blight, dug]

/** The contract's back-plan rates: 85 % take, 90 % survival to sale. */
const RATES = { takeRate: 0.85, survivalRate: 0.9 }

describe('runCounts: the worked example', () => {
  it('lined out: everything stands', () => {
    expect(runCounts(1000, [linedOut])).toEqual({ linedOut: 1000, worked: 0, taken: null, takeRate: null, losses: {}, lost: 0, dug: 0, standing: 1000 })
  })

  it('a loss before budding: 1000 − 30 broken = 970 stand', () => {
    expect(runCounts(1000, [linedOut, broken])).toMatchObject({ standing: 970, lost: 30, losses: { breakage: 30 } })
  })

  it('budding records what was worked; nothing is lost yet and no take rate is known', () => {
    expect(runCounts(1000, [linedOut, broken, budded])).toMatchObject({ worked: 970, taken: null, takeRate: null, standing: 970 })
  })

  it('the take count: 873 of 970 took, so 97 failed and the take rate is 873 ÷ 970 = 0.9', () => {
    const counts = runCounts(1000, [linedOut, broken, budded, take])
    expect(counts).toMatchObject({ taken: 873, standing: 873, lost: 127, losses: { 'breakage': 30, 'failed-take': 97 } })
    expect(counts.takeRate).toBeCloseTo(0.9, 12)
  })

  it('the dig: 600 + 240 = 840 dug of 873 − 13 = 860 standing leaves 20 in the row', () => {
    const counts = runCounts(1000, ALL)
    expect(counts).toMatchObject({ worked: 970, taken: 873, dug: 840, standing: 20, lost: 140, losses: { 'breakage': 30, 'failed-take': 97, 'fire-blight': 13 } })
    // Every liner is accounted for: 840 dug + 20 standing + 140 lost = 1000.
    expect(counts.dug + counts.standing + counts.lost).toBe(1000)
  })

  it('counts in date order whatever order the entries arrive in; one day\'s entries in the order recorded', () => {
    expect(runCounts(1000, [...ALL].reverse())).toEqual(runCounts(1000, ALL))
    // Same day: a take count of 500 recorded before a loss of 10 leaves 490; the other way round, 500.
    const a = e('take-counted', '2027-04-15', { count: 500 })
    const b = e('loss', '2027-04-15', { count: 10, cause: 'rodents' })
    expect(runCounts(1000, [b, a]).standing).toBe(490)
    const c = e('loss', '2027-04-15', { count: 10, cause: 'rodents' })
    const d = e('take-counted', '2027-04-15', { count: 500 })
    expect(runCounts(1000, [d, c]).standing).toBe(500)
  })

  it('ignores entries that move no count (heading back, staking, shoots removed)', () => {
    const quiet = [e('headed-back', '2027-03-01'), e('staked', '2027-05-01'), e('shoots-removed', '2027-06-01')]
    expect(runCounts(1000, [linedOut, ...quiet])).toMatchObject({ standing: 1000, lost: 0 })
  })
})

describe('runCounts: what it refuses', () => {
  const refusal = (run: () => unknown) => {
    try {
      run()
    }
    catch (error) {
      return error
    }
    return null
  }

  it('a loss larger than what stands names the count', () => {
    const error = refusal(() => runCounts(100, [e('loss', '2026-06-01', { count: 101, cause: 'rodents' })]))
    expect(error).toBeInstanceOf(CountRefusal)
    expect(error).toMatchObject({ field: 'count', message: 'Only 100 stand in this run on 2026-06-01: a loss cannot be larger' })
  })

  it('more taken than stands names the count', () => {
    const error = refusal(() => runCounts(100, [e('loss', '2026-06-01', { count: 10, cause: 'rodents' }), e('take-counted', '2027-04-01', { count: 91 })]))
    expect(error).toMatchObject({ field: 'count', message: 'Only 90 stand in this run on 2027-04-01: more cannot have taken' })
  })

  it('more budded than lined out names the count', () => {
    const error = refusal(() => runCounts(100, [e('budded', '2026-08-01', { count: 60 }), e('budded', '2026-08-20', { count: 41 })]))
    expect(error).toMatchObject({ field: 'count', message: 'Only 40 of the 100 rootstocks lined out are still to work' })
  })

  it('more dug than stands names the grades', () => {
    const error = refusal(() => runCounts(100, [e('dug', '2027-11-15', { grades: [{ count: 60 }, { count: 41 }] })]))
    expect(error).toMatchObject({ field: 'grades', message: 'Only 100 stand in this run on 2027-11-15: more cannot be dug' })
  })

  it('a backdated loss that would leave a later take count impossible is refused', () => {
    const later = e('take-counted', '2027-04-15', { count: 95 })
    expect(() => runCounts(100, [later, e('loss', '2026-12-01', { count: 10, cause: 'winter-injury' })])).toThrow(CountRefusal)
  })
})

describe('expectedFinished: trees the run should finish', () => {
  it('before the take is counted: ⌊970 × 0.85 × 0.9⌋ = ⌊742.05⌋ = 742', () => {
    const counts = runCounts(1000, [linedOut, broken, budded])
    expect(expectedFinished(counts, RATES)).toEqual({ trees: 742, formula: '970 standing × 0.85 expected take × 0.9 survival to sale' })
  })

  it('after the take count the real take replaces the expected: ⌊873 × 0.9⌋ = ⌊785.7⌋ = 785', () => {
    const counts = runCounts(1000, [linedOut, broken, budded, take])
    expect(expectedFinished(counts, RATES)).toEqual({ trees: 785, formula: '0 dug + 873 standing × 0.9 survival to sale' })
  })

  it('a whole product is not rounded down by floating point: 860 × 0.9 = 774 exactly', () => {
    const counts = runCounts(1000, [linedOut, broken, budded, take, blight])
    expect(expectedFinished(counts, RATES).trees).toBe(774)
  })

  it('after the dig: 840 dug + ⌊20 × 0.9⌋ = 840 + 18 = 858', () => {
    expect(expectedFinished(runCounts(1000, ALL), RATES)).toEqual({ trees: 858, formula: '840 dug + 20 standing × 0.9 survival to sale' })
  })

  it('agrees with the back-plan: 1000 trees need ⌈1000 ÷ (0.85 × 0.9)⌉ = 1308 budded, which are expected to finish ⌊1308 × 0.765⌋ = 1000', () => {
    const budCount = rootstocksToBud(1000, RATES.takeRate, RATES.survivalRate)
    expect(budCount).toBe(1308)
    const counts = runCounts(budCount, [e('budded', '2026-08-20', { count: budCount })])
    expect(expectedFinished(counts, RATES).trees).toBe(1000)
    // One rootstock fewer falls short: ⌊1307 × 0.765⌋ = ⌊999.855⌋ = 999.
    expect(expectedFinished(runCounts(1307, []), RATES).trees).toBe(999)
  })

  it('refuses a rate outside (0, 1]', () => {
    const counts = runCounts(100, [])
    expect(() => expectedFinished(counts, { takeRate: 0, survivalRate: 0.9 })).toThrow(RangeError)
    expect(() => expectedFinished(counts, { takeRate: 0.85, survivalRate: 1.2 })).toThrow(RangeError)
  })
})
