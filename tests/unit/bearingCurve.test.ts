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
})
