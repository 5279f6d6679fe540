// Sugar in juice: °Brix, specific gravity (SG), °Plato and grams of sugar per litre.
//
// Every SG here is at 20/20 °C. "Apparent" SG is the ratio of weights in air,
// which is what a hydrometer reads and what NBS Circular 440 (Bates et al.,
// 1942), Table 114, tabulates; "true" SG is the in-vacuo density ratio.
// Values are unrounded; round only for display.

/** Density of air assumed by the NBS sucrose tables, g/mL (NBS Circular 440). */
export const AIR_DENSITY_G_PER_ML = 0.0012
/** Density of pure water at 20 °C, g/mL, as used by NBS Circular 440. */
export const WATER_DENSITY_20C_G_PER_ML = 0.998203

/** The NBS-derived polynomial below is fitted over this range; outside it we refuse. */
export const BRIX_MIN = 0
export const BRIX_MAX = 40
/** Apparent SG of 40 °Bx, the top of the fit (NBS Circular 440, Table 114, as quoted with the polynomial). */
export const SG_MAX = 1.17874
/** 0 °Bx is 1.00000 in the table; the cubic gives 1.0000187 there, so accept that much below 1. */
const SG_MIN = 0.99995

/**
 * °Brix from apparent SG 20/20 °C.
 * Cubic fitted to NBS Circular 440, Table 114 (0–40 °Bx), as published in the
 * Wikipedia "Brix" article: °Bx = 182.46007 S³ − 775.68212 S² + 1262.7794 S − 669.56218,
 * stated RMS disagreement with the table 0.0009 °Bx.
 * This is the one sugar formula: brixToSg() solves it for S.
 */
function brixFromSgPolynomial(sg: number): number {
  return ((182.46007 * sg - 775.68212) * sg + 1262.7794) * sg - 669.56218
}

function brixPolynomialSlope(sg: number): number {
  return (3 * 182.46007 * sg - 2 * 775.68212) * sg + 1262.7794
}

function requireBrix(brix: number): void {
  if (!Number.isFinite(brix) || brix < BRIX_MIN || brix > BRIX_MAX) {
    throw new RangeError(`°Brix must be a number from ${BRIX_MIN} to ${BRIX_MAX}; got ${brix}`)
  }
}

function requireJuiceSg(sg: number): void {
  if (!Number.isFinite(sg) || sg < SG_MIN || sg > SG_MAX) {
    throw new RangeError(`Specific gravity must be from 1.000 to ${SG_MAX} (0–40 °Brix); got ${sg}`)
  }
}

/**
 * Apparent SG 20/20 °C → °Brix (NBS Circular 440 cubic, see above).
 * At SG 1.000 the cubic gives −0.005 °Bx, inside its own fitting error, so the
 * result is floored at 0 rather than reporting a negative sugar content.
 */
export function sgToBrix(sg: number): number {
  requireJuiceSg(sg)
  return Math.max(0, brixFromSgPolynomial(sg))
}

/**
 * °Brix → apparent SG 20/20 °C, by solving the NBS cubic for S with Newton's
 * method (the cubic's slope is positive for every S, so there is one root and
 * this converges in a few steps). Agrees with NBS Circular 440, Table 114, to about ±0.00002 SG
 * over 0–40 °Bx; the tests measure it against table values.
 */
export function brixToSg(brix: number): number {
  requireBrix(brix)
  // Start from the rule of thumb "4 gravity points per °Brix" (common practice).
  let sg = 1 + brix / 250
  for (let i = 0; i < 50; i++) {
    const step = (brixFromSgPolynomial(sg) - brix) / brixPolynomialSlope(sg)
    sg -= step
    if (Math.abs(step) < 1e-13) break
  }
  return sg
}

/**
 * Apparent (in air) SG → true (in vacuo) SG, both 20/20 °C.
 * Weighing in air loses the buoyancy of the displaced air, so
 * A = (ρs − ρair) / (ρw − ρair), hence T = A − (A − 1)·ρair/ρw
 * (NBS Circular 440; air 0.0012 g/mL, water 0.998203 g/mL at 20 °C).
 * Example (NBS Circular 440): 10 °Bx apparent 1.04003 → true 1.03998.
 */
export function apparentToTrueSg(apparentSg: number): number {
  if (!Number.isFinite(apparentSg) || apparentSg <= 0) {
    throw new RangeError(`Specific gravity must be a positive number; got ${apparentSg}`)
  }
  const airOverWater = AIR_DENSITY_G_PER_ML / WATER_DENSITY_20C_G_PER_ML
  return apparentSg - (apparentSg - 1) * airOverWater
}

/** True (in vacuo) SG → apparent (in air) SG, the inverse of apparentToTrueSg. */
export function trueToApparentSg(trueSg: number): number {
  if (!Number.isFinite(trueSg) || trueSg <= 0) {
    throw new RangeError(`Specific gravity must be a positive number; got ${trueSg}`)
  }
  const airOverWater = AIR_DENSITY_G_PER_ML / WATER_DENSITY_20C_G_PER_ML
  return (trueSg - airOverWater) / (1 - airOverWater)
}

/**
 * Apparent SG 20/20 °C → °Plato, by the ASBC polynomial (fitted to the ASBC
 * extract tables): °P = 135.997 S³ − 630.272 S² + 1111.14 S − 616.868.
 * Accepts SG a little below 1 as well, because a fermented cider's apparent
 * extract is negative and Balling's formula needs it (extrapolating the fit a
 * short way below 1.000 is common practice).
 * Measured against the NBS °Brix cubic above: within 0.0015 up to 20 °Bx
 * (every juice we handle), drifting to −0.025 °P at 30 °Bx and −0.11 at 40.
 */
export function sgToPlato(sg: number): number {
  if (!Number.isFinite(sg) || sg < 0.98 || sg > SG_MAX) {
    throw new RangeError(`Specific gravity must be from 0.980 to ${SG_MAX}; got ${sg}`)
  }
  return ((135.997 * sg - 630.272) * sg + 1111.14) * sg - 616.868
}

/** °Brix → °Plato through the apparent SG; the two scales agree to about 0.002. */
export function brixToPlato(brix: number): number {
  return sgToPlato(brixToSg(brix))
}

/** Density of a sucrose-like juice at 20 °C in kg/L (= g/mL): true SG × density of water. */
export function juiceDensityKgPerL(brix: number): number {
  return apparentToTrueSg(brixToSg(brix)) * WATER_DENSITY_20C_G_PER_ML
}

/**
 * Grams of soluble solids per litre of juice at 20 °C.
 * °Brix is g of sucrose-equivalent solids per 100 g of juice, so
 * g/L = °Bx / 100 × density (g/mL) × 1000 mL/L = °Bx × density × 10.
 * An UPPER BOUND on the sugar: a refractometer or hydrometer reads the acids, pectin and other
 * non-sugar solids of a juice as if they were sugar.
 */
export function solubleSolidsGPerL(brix: number): number {
  return brix * juiceDensityKgPerL(brix) * 10
}

/**
 * Sugar (g/L) of a must by its refractometer reading (% mass sucrose = °Brix): OIV, "Evaluation by
 * refractometry of the sugar concentration in grape musts" (OIV-MA-AS2-02, Oeno 21/2004), Table II,
 * as reproduced in the French arrêté of 14 September 2011, Annex IV (rows every 0.5 °Bx taken here).
 * The table allows for a must's non-sugar solids; apple juice's sugars are a like share of its
 * soluble solids (Fuleki, Pelayo & Palabay, J. Agric. Food Chem. 42, 1994: total sugar 8.26–13.21
 * g/100 mL at 9.7–15.0 % soluble solids).
 */
export const OIV_SUGAR_TABLE: readonly (readonly [brix: number, sugarGPerL: number])[] = [
  [10.0, 82.2], [10.5, 87.5], [11.0, 92.8], [11.5, 98.2], [12.0, 103.5], [12.5, 108.9], [13.0, 114.3],
  [13.5, 119.7], [14.0, 125.2], [14.5, 130.6], [15.0, 136.1], [15.5, 141.6], [16.0, 147.1], [16.5, 152.7],
  [17.0, 158.2], [17.5, 163.8], [18.0, 169.4], [18.5, 175.0], [19.0, 180.6], [19.5, 186.2], [20.0, 191.9],
  [20.5, 197.6], [21.0, 203.3], [21.5, 209.0],
]

export interface SugarEstimate {
  gPerL: number
  /** True outside the table's rows (10–21.5 °Bx), where the nearest step is carried on in a straight line. */
  extrapolated: boolean
}

/**
 * The fermentable sugar of a juice from its °Brix, interpolated in the OIV table (straight lines
 * between rows). Outside the rows the end step is carried on, and never below 0 g/L.
 */
export function sugarEstimate(brix: number): SugarEstimate {
  if (!Number.isFinite(brix) || brix < BRIX_MIN || brix > BRIX_MAX) {
    throw new RangeError(`°Brix must be from ${BRIX_MIN} to ${BRIX_MAX}; got ${brix}`)
  }
  const rows = OIV_SUGAR_TABLE
  const last = rows.length - 1
  const i = brix <= rows[0]![0] ? 0 : brix >= rows[last]![0] ? last - 1 : rows.findIndex(([b], k) => brix >= b && brix <= rows[k + 1]![0])
  const [b0, s0] = rows[i]!
  const [b1, s1] = rows[i + 1]!
  const gPerL = Math.max(0, s0 + ((s1 - s0) * (brix - b0)) / (b1 - b0))
  return { gPerL, extrapolated: brix < rows[0]![0] || brix > rows[last]![0] }
}

/** Fermentable sugar, g/L, from °Brix (the OIV table; see sugarEstimate). */
export function sugarGPerL(brix: number): number {
  return sugarEstimate(brix).gPerL
}
