import { describe, it, expect } from 'vitest'
import { correctHydrometerSg, hydrometerCorrectionPoints } from '../../shared/utils/hydrometer'

// C. Lyons, "Hydrometer Temperature Corrections", Homebrew Digest #963 (1992), brewery.org library:
// the table of corrections in thousandths of SG relative to 59 °F (15 °C), from CRC water densities.
// The table's corrections are rounded to 0.01 point, so we ask for agreement within 0.02.
const LYONS_TABLE_FROM_15C: Array<[tempC: number, points: number]> = [
  [0, -0.74], [5, -0.86], [10, -0.6], [15, 0], [18, 0.51], [20, 0.9], [25, 2.06], [30, 3.46], [35, 5.07], [40, 6.89],
]

describe('hydrometerCorrectionPoints', () => {
  it.each(LYONS_TABLE_FROM_15C)('at %s °C on a 15 °C hydrometer is %s points (Lyons, HBD #963, table)', (tempC, points) => {
    expect(Math.abs(hydrometerCorrectionPoints(tempC, 15) - points)).toBeLessThan(0.02)
  })

  it('is 1.16 points at 25 °C on a 20 °C hydrometer (Lyons, HBD #963: 2.06 − 0.90, relative to another temperature)', () => {
    expect(Math.abs(hydrometerCorrectionPoints(25, 20) - 1.16)).toBeLessThan(0.1)
  })

  it('is nothing at the calibration temperature and negative below it (Lyons, HBD #963)', () => {
    expect(hydrometerCorrectionPoints(20, 20)).toBe(0)
    expect(hydrometerCorrectionPoints(10, 20)).toBeLessThan(0)
  })

  it('falls between the table\'s rows at 22.5 °C on a 20 °C hydrometer: about 0.58 points (Lyons, HBD #963: halfway between 0.99823 and 0.99707 g/mL)', () => {
    expect(Math.abs(hydrometerCorrectionPoints(22.5, 20) - 0.58)).toBeLessThan(0.05)
  })

  it('refuses temperatures outside the table (0–100 °C, Lyons, HBD #963)', () => {
    expect(() => hydrometerCorrectionPoints(-5, 20)).toThrow(RangeError)
    expect(() => hydrometerCorrectionPoints(20, 120)).toThrow(RangeError)
  })
})

describe('correctHydrometerSg', () => {
  it('reads 1.050 at 30 °C on a 15 °C hydrometer as about 1.0535 (Lyons, HBD #963: + 0.99913 − 0.99567)', () => {
    expect(correctHydrometerSg(1.05, 30, 15)).toBeCloseTo(1.05346, 5)
  })

  it('reads 1.050 at 10 °C on a 20 °C hydrometer as about 1.0485 (Lyons, HBD #963: + 0.99823 − 0.99973)', () => {
    expect(correctHydrometerSg(1.05, 10, 20)).toBeCloseTo(1.0485, 5)
  })

  it('refuses an SG that is not a positive number', () => {
    expect(() => correctHydrometerSg(0, 20, 20)).toThrow(RangeError)
  })
})
