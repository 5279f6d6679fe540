import { describe, it, expect } from 'vitest'
import { plantingDensity, treesForArea, treesPerAcre, treesPerHectare } from '../../shared/utils/planting'
import { mToFt } from '../../shared/utils/units'

describe('treesPerHectare', () => {
  it('is 10,000 / (in-row × between-row): 1 m × 3.5 m gives 2857.14 trees/ha (worked example)', () => {
    expect(treesPerHectare(1, 3.5)).toBeCloseTo(10_000 / 3.5, 10)
    expect(treesPerHectare(1, 3.5)).toBeCloseTo(2857.14, 2)
  })

  it('gives 400 trees/ha at 5 m × 5 m and 10,000 at 1 m × 1 m (worked example)', () => {
    expect(treesPerHectare(5, 5)).toBe(400)
    expect(treesPerHectare(1, 1)).toBe(10_000)
  })

  it('does not care which spacing is in-row and which between rows', () => {
    expect(treesPerHectare(1.2, 4)).toBe(treesPerHectare(4, 1.2))
  })

  it('refuses zero, negative or missing spacing', () => {
    expect(() => treesPerHectare(0, 3.5)).toThrow(/In-row spacing must be above 0 m/)
    expect(() => treesPerHectare(1, -3)).toThrow(/Between-row spacing must be above 0 m/)
    expect(() => treesPerHectare(Number.NaN, 3)).toThrow(RangeError)
  })
})

describe('treesPerAcre', () => {
  it('is 43,560 / (in-row × between-row): 4 ft × 12 ft gives 907.5 trees/acre (worked example)', () => {
    expect(treesPerAcre(4, 12)).toBe(907.5)
  })

  // eXtension apples, "Dwarfing Apple Rootstocks" and "Standard Apple Rootstocks".
  it.each([
    [14, 4, 778],
    [14, 2, 1556],
    [26, 20, 84],
  ])('%s ft × %s ft is about %s trees/acre (eXtension apples)', (a, b, printed) => {
    expect(Math.round(treesPerAcre(a, b))).toBe(printed)
  })

  it('shows the printed 173 trees/acre for 20 ft × 14 ft is a misprint (eXtension apples): the formula gives 155.6', () => {
    expect(treesPerAcre(20, 14)).toBeCloseTo(155.57, 2)
    expect(Math.round(treesPerAcre(18, 14))).toBe(173) // what the printed figure fits
  })

  it('refuses negative spacing in feet', () => {
    expect(() => treesPerAcre(-4, 12)).toThrow(/In-row spacing must be above 0 ft/)
  })
})

describe('plantingDensity (metres or feet in, both densities out)', () => {
  it('is consistent: per acre = per ha × 0.40468564224, whichever unit the spacing came in', () => {
    for (const [inRow, betweenRow] of [[1, 3.5], [0.9, 3.2], [2.5, 5], [6, 7]] as const) {
      const fromMetres = plantingDensity(inRow, betweenRow, 'm')
      expect(fromMetres.perAcre).toBeCloseTo(fromMetres.perHa * 0.40468564224, 8)
      const fromFeet = plantingDensity(mToFt(inRow), mToFt(betweenRow), 'ft')
      expect(fromFeet.perHa).toBeCloseTo(fromMetres.perHa, 8)
      expect(fromFeet.perAcre).toBeCloseTo(fromMetres.perAcre, 8)
    }
  })

  it('1 m × 3.5 m is 2857.14 trees/ha and 1156.24 trees/acre (worked example)', () => {
    const d = plantingDensity(1, 3.5, 'm')
    expect(d.perHa).toBeCloseTo(2857.1429, 4)
    expect(d.perAcre).toBeCloseTo(1156.2447, 4)
  })

  it('refuses an unknown unit', () => {
    // @ts-expect-error: only metres and feet
    expect(() => plantingDensity(1, 3, 'yd')).toThrow(/Spacing unit must be 'm' or 'ft'/)
  })
})

describe('treesForArea', () => {
  it('rounds up to whole trees: 2.5 ha at 1 m × 3.5 m needs 7143 trees (worked example)', () => {
    expect(treesForArea(2.5, treesPerHectare(1, 3.5))).toBe(7143)
  })

  it('does not add a tree for binary rounding when the answer is whole', () => {
    expect(treesForArea(0.7, 1000)).toBe(700)
    expect(treesForArea(3, treesPerHectare(5, 5))).toBe(1200)
  })

  it('refuses a negative area', () => {
    expect(() => treesForArea(-1, 400)).toThrow(RangeError)
  })
})
