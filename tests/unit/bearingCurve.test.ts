import { describe, expect, it } from 'vitest'
import { bearingCurveOf } from '../../server/utils/bearingCurve'

describe('bearing curve of a catalogue rootstock', () => {
  it('takes the catalogue figures as they are when whole years', () => {
    // M.26 in the catalogue: first crop 2 y, full bearing 6 y, 30 kg a tree (catalogue data).
    expect(bearingCurveOf({ designation: 'M.26', yearsToFirstCrop: 2, yearsToFullBearing: 6, yieldPerTreeKg: 30 }))
      .toEqual({ curve: { yearsToFirstCrop: 2, yearsToFullBearing: 6, yieldPerTreeKgAtFull: 30 }, note: null })
  })

  it('counts a half-year bearing age from the next harvest, since a tree crops once a year', () => {
    const { curve } = bearingCurveOf({ designation: 'X', yearsToFirstCrop: 2.5, yearsToFullBearing: 5.5, yieldPerTreeKg: 20 })
    expect(curve).toEqual({ yearsToFirstCrop: 3, yearsToFullBearing: 6, yieldPerTreeKgAtFull: 20 })
  })

  it('names every missing figure instead of guessing one', () => {
    const result = bearingCurveOf({ designation: 'Pyrodwarf', yearsToFirstCrop: 2, yearsToFullBearing: null, yieldPerTreeKg: null })
    expect(result.curve).toBeNull()
    expect(result.note).toBe('The catalogue has no years to full bearing or yield per tree at full bearing for rootstock Pyrodwarf, so its forecast shows 0 kg rather than a guess.')
  })

  it('refuses figures that put full bearing before the first crop', () => {
    const result = bearingCurveOf({ designation: 'Y', yearsToFirstCrop: 5, yearsToFullBearing: 3, yieldPerTreeKg: 20 })
    expect(result.curve).toBeNull()
    expect(result.note).toMatch(/do not add up/)
  })

  // NC State Extension, 'Apple Rootstocks and Tree Spacing', Table 1: M.26 bears at 2–4 years,
  // MM.111 at 4–6, seedling at 6–10. Full bearing moving with the first crop is common practice.
  it('forecasts on the middle of a published range by default, or on either end when chosen', () => {
    const m26 = { designation: 'M.26', yearsToFirstCrop: 2, yearsToFirstCropLate: 4, yearsToFullBearing: 6, yieldPerTreeKg: 30 }
    expect(bearingCurveOf(m26).curve).toEqual({ yearsToFirstCrop: 3, yearsToFullBearing: 7, yieldPerTreeKgAtFull: 30 })
    expect(bearingCurveOf(m26, 'early').curve).toEqual({ yearsToFirstCrop: 2, yearsToFullBearing: 6, yieldPerTreeKgAtFull: 30 })
    expect(bearingCurveOf(m26, 'late').curve).toEqual({ yearsToFirstCrop: 4, yearsToFullBearing: 8, yieldPerTreeKgAtFull: 30 })
    const seedling = { designation: 'Seedling', yearsToFirstCrop: 6, yearsToFirstCropLate: 10, yearsToFullBearing: 12, yieldPerTreeKg: 150 }
    expect(bearingCurveOf(seedling).curve).toMatchObject({ yearsToFirstCrop: 8, yearsToFullBearing: 14 })
  })

  it('rounds a half-year middle up to the next harvest (G.41 2–3 years: from memory)', () => {
    const g41 = { designation: 'G.41', yearsToFirstCrop: 2, yearsToFirstCropLate: 3, yearsToFullBearing: 5, yieldPerTreeKg: 20 }
    expect(bearingCurveOf(g41).curve).toEqual({ yearsToFirstCrop: 3, yearsToFullBearing: 6, yieldPerTreeKgAtFull: 20 })
  })

  it('refuses a range that ends before it starts', () => {
    const result = bearingCurveOf({ designation: 'Z', yearsToFirstCrop: 4, yearsToFirstCropLate: 3, yearsToFullBearing: 8, yieldPerTreeKg: 20 })
    expect(result.curve).toBeNull()
    expect(result.note).toMatch(/do not add up/)
  })
})
