import { describe, it, expect } from 'vitest'
import {
  apparentToTrueSg,
  brixToPlato,
  brixToSg,
  juiceDensityKgPerL,
  sgToBrix,
  sgToPlato,
  solubleSolidsGPerL,
  sugarEstimate,
  sugarGPerL,
  trueToApparentSg,
} from '../../shared/utils/sugar'

// Apparent SG 20/20 °C of sucrose solutions.
// 10 and 20 °Bx: NBS Circular 440, Table 114.
// 0–7.9 °Bx rows: USDA AMS "Sucrose Conversion Table", Technical Inspection
// Procedures 135-A-50, which reproduces NBS Circular 440 Table 114.
// 40 °Bx: NBS Circular 440, Table 114, as quoted with the fitted polynomial
// (Wikipedia "Brix", "should not be used outside 1.00000 to 1.17874 SG").
const NBS_TABLE_114: ReadonlyArray<[brix: number, apparentSg: number]> = [
  [0, 1.00000], // USDA AMS / NBS C440
  [0.1, 1.00039], // USDA AMS / NBS C440
  [0.2, 1.00078], // USDA AMS / NBS C440
  [0.3, 1.00117], // USDA AMS / NBS C440
  [3.8, 1.01490], // USDA AMS / NBS C440
  [3.9, 1.01529], // USDA AMS / NBS C440
  [4.0, 1.01569], // USDA AMS / NBS C440
  [4.1, 1.01609], // USDA AMS / NBS C440
  [7.6, 1.03017], // USDA AMS / NBS C440
  [7.7, 1.03058], // USDA AMS / NBS C440
  [7.8, 1.03098], // USDA AMS / NBS C440
  [7.9, 1.03139], // USDA AMS / NBS C440
  [10, 1.04003], // NBS Circular 440, Table 114
  [20, 1.08297], // NBS Circular 440, Table 114
  [40, 1.17874], // NBS Circular 440, Table 114 (top of the fit)
]

describe('brixToSg (apparent SG 20/20 °C)', () => {
  it.each(NBS_TABLE_114)('%s °Bx reads %s on a hydrometer, within ±0.0002', (brix, sg) => {
    expect(Math.abs(brixToSg(brix) - sg)).toBeLessThanOrEqual(0.0002)
  })

  it('is in fact within ±0.00002 of every table row we hold', () => {
    const worst = Math.max(...NBS_TABLE_114.map(([brix, sg]) => Math.abs(brixToSg(brix) - sg)))
    expect(worst).toBeLessThan(0.00002)
  })

  // CRC Handbook densities of sucrose solutions at 20 °C, g/cm³ (from memory),
  // turned into apparent SG with the NBS air and water densities: a check
  // independent of the NBS-derived polynomial. Four-figure densities limit it to ±0.0001.
  it.each([
    [5, 1.0179],
    [15, 1.0592],
    [25, 1.1036],
    [30, 1.1270],
  ])('%s °Bx agrees with a density of %s g/cm³ within ±0.0002 SG (from memory)', (brix, densityGPerCm3) => {
    const apparent = trueToApparentSg(densityGPerCm3 / 0.998203)
    expect(Math.abs(brixToSg(brix) - apparent)).toBeLessThanOrEqual(0.0002)
  })

  it('rises steadily with sugar across 0–30 °Bx', () => {
    let previous = brixToSg(0)
    for (let brix = 0.5; brix <= 30; brix += 0.5) {
      const sg = brixToSg(brix)
      expect(sg).toBeGreaterThan(previous)
      previous = sg
    }
  })

  it('refuses °Brix outside 0–40 or not a number', () => {
    expect(() => brixToSg(-0.1)).toThrow(RangeError)
    expect(() => brixToSg(40.1)).toThrow(/°Brix must be a number from 0 to 40/)
    expect(() => brixToSg(Number.NaN)).toThrow(RangeError)
    expect(() => brixToSg(Number.POSITIVE_INFINITY)).toThrow(RangeError)
  })
})

describe('sgToBrix', () => {
  it('gives 9.993 °Bx for SG 1.040 (Wikipedia "Brix": 9.99325 °Bx from the NBS-table polynomial)', () => {
    expect(sgToBrix(1.040)).toBeCloseTo(9.99325, 3)
  })

  it.each(NBS_TABLE_114.filter(([brix]) => brix > 0))('reads %s °Bx back from the table SG %s within 0.05 °Bx', (brix, sg) => {
    expect(Math.abs(sgToBrix(sg) - brix)).toBeLessThan(0.05)
  })

  it('is the exact inverse of brixToSg', () => {
    for (const brix of [0.5, 5, 10.7, 12.5, 18, 24.2, 30, 39.9]) {
      expect(sgToBrix(brixToSg(brix))).toBeCloseTo(brix, 9)
    }
  })

  it('reads water as 0 °Bx rather than a negative sugar content', () => {
    expect(sgToBrix(1.0)).toBe(0)
  })

  it('refuses SG outside the fitted range', () => {
    expect(() => sgToBrix(0.998)).toThrow(/Specific gravity must be from 1.000/)
    expect(() => sgToBrix(1.2)).toThrow(RangeError)
    expect(() => sgToBrix(Number.NaN)).toThrow(RangeError)
  })
})

describe('apparentToTrueSg', () => {
  it('turns 10 °Bx apparent 1.04003 into true 1.03998 (NBS Circular 440, Table 114)', () => {
    expect(apparentToTrueSg(1.04003)).toBeCloseTo(1.03998, 5)
  })

  it('leaves water at 1 and makes a sugar solution slightly lighter in vacuo', () => {
    expect(apparentToTrueSg(1)).toBe(1)
    expect(apparentToTrueSg(1.08297)).toBeLessThan(1.08297)
    // Worked example: 1.08297 − 0.08297 × 0.0012 / 0.998203 = 1.08287.
    expect(apparentToTrueSg(1.08297)).toBeCloseTo(1.08287, 5)
  })

  it('round-trips with trueToApparentSg', () => {
    expect(trueToApparentSg(apparentToTrueSg(1.06))).toBeCloseTo(1.06, 12)
  })

  it('refuses a non-positive SG', () => {
    expect(() => apparentToTrueSg(0)).toThrow(RangeError)
    expect(() => trueToApparentSg(-1)).toThrow(RangeError)
  })
})

describe('sgToPlato (ASBC polynomial) and brixToPlato', () => {
  it('gives 9.9936 °P for SG 1.040 (Wikipedia "Brix": 9.99359 °P from the ASBC polynomial)', () => {
    expect(sgToPlato(1.040)).toBeCloseTo(9.99359, 3)
  })

  it('agrees with °Brix to within about 0.002 over juice strengths, 0–20 °Bx (Wikipedia "Brix")', () => {
    for (let brix = 0; brix <= 20; brix += 0.5) {
      expect(Math.abs(brixToPlato(brix) - brix)).toBeLessThan(0.002)
    }
  })

  it('reads Plato slightly above Brix for weak solutions, up to 0.002 (Wikipedia "Brix")', () => {
    expect(brixToPlato(0.5) - 0.5).toBeGreaterThan(0)
    expect(brixToPlato(0.5) - 0.5).toBeLessThan(0.002)
  })

  it('gives a small negative apparent extract for a dry cider below 1.000', () => {
    expect(sgToPlato(0.998)).toBeLessThan(0)
    expect(sgToPlato(0.998)).toBeGreaterThan(-1)
  })

  it('refuses SG below 0.980 or above the table', () => {
    expect(() => sgToPlato(0.97)).toThrow(RangeError)
    expect(() => sgToPlato(1.3)).toThrow(RangeError)
  })
})

describe('solubleSolidsGPerL', () => {
  it('is °Brix × density × 10: 10 °Bx at 1.03811 kg/L holds 103.81 g/L (worked example)', () => {
    expect(juiceDensityKgPerL(10)).toBeCloseTo(1.03811, 5)
    expect(solubleSolidsGPerL(10)).toBeCloseTo(10 * juiceDensityKgPerL(10) * 10, 12)
    expect(solubleSolidsGPerL(10)).toBeCloseTo(103.81, 2)
  })

  // C. S. Chen, "Brix and Pounds Solids Tables" (1992), from NBS Circular C440:
  // 4.0 °Bx → 0.338 and 5.0 °Bx → 0.424 lb sucrose per US gallon (weighed in air).
  // Three-decimal pounds are ±0.06 g/L and weighing in air reads ~0.06 % light, hence ±0.12 g/L.
  it.each([
    [4.0, 0.338],
    [5.0, 0.424],
  ])('%s °Bx holds %s lb sucrose per US gallon (Chen, from NBS Circular C440)', (brix, lbPerGal) => {
    const gPerL = (lbPerGal * 453.59237) / 3.785411784
    expect(Math.abs(solubleSolidsGPerL(brix) - gPerL)).toBeLessThan(0.12)
  })

  it('is zero for water', () => {
    expect(solubleSolidsGPerL(0)).toBe(0)
  })
})

describe('sugarGPerL: fermentable sugar from °Brix', () => {
  // OIV-MA-AS2-02 (Oeno 21/2004), Table II, as reproduced in the French arrêté of 14 September 2011,
  // Annex IV, column 4 (sugar of the must, g/L), including rows between the ones the module holds.
  it.each([
    [10.0, 82.2],
    [10.3, 85.4],
    [11.2, 95.0],
    [12.0, 103.5],
    [12.4, 107.8],
    [13.7, 121.9],
    [15.0, 136.1],
    [16.3, 150.5],
    [17.9, 168.3],
    [19.2, 182.9],
    [20.9, 202.1],
  ])('%s °Bx holds %s g/L of sugar (OIV Table II)', (brix, gPerL) => {
    // The table prints 0.1 g/L; straight lines between its 0.5 °Bx rows stay within that.
    expect(Math.abs(sugarGPerL(brix) - gPerL)).toBeLessThan(0.1 + 1e-9)
    expect(sugarEstimate(brix).extrapolated).toBe(false)
  })

  it('is less than the soluble solids, by about 21–24 g/L at cider gravities (same table against NBS densities)', () => {
    for (const brix of [10, 12, 14, 16, 18]) {
      const gap = solubleSolidsGPerL(brix) - sugarGPerL(brix)
      expect(gap).toBeGreaterThan(20)
      expect(gap).toBeLessThan(25)
    }
  })

  it('carries the end steps on outside the table, says so, and never goes below 0 g/L', () => {
    expect(sugarEstimate(9.5)).toEqual({ gPerL: expect.closeTo(82.2 - 5.3, 6), extrapolated: true })
    expect(sugarEstimate(22)).toEqual({ gPerL: expect.closeTo(209.0 + 5.7, 6), extrapolated: true })
    expect(sugarGPerL(0)).toBe(0)
    expect(sugarGPerL(1)).toBe(0)
  })

  it('refuses impossible °Brix', () => {
    expect(() => sugarGPerL(-2)).toThrow(RangeError)
    expect(() => sugarGPerL(Number.NaN)).toThrow(RangeError)
  })
})
