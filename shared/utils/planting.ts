// Planting density: how many trees a rectangular (square or hedgerow) planting
// holds per unit area. Trees per area = area of the unit ÷ area each tree
// occupies (in-row spacing × between-row spacing). Extension tables print
// rounded, and sometimes wrong, densities; the formula is what we trust.
//   per hectare = 10,000 m² / (in-row m × between-row m)
//   per acre    = 43,560 ft² / (in-row ft × between-row ft)

import { FT2_PER_ACRE, M2_PER_HA, ftToM, mToFt } from './units'

function treesPerUnitArea(unitArea: number, inRow: number, betweenRow: number, unit: string): number {
  if (!Number.isFinite(inRow) || inRow <= 0) {
    throw new RangeError(`In-row spacing must be above 0 ${unit}; got ${inRow}`)
  }
  if (!Number.isFinite(betweenRow) || betweenRow <= 0) {
    throw new RangeError(`Between-row spacing must be above 0 ${unit}; got ${betweenRow}`)
  }
  return unitArea / (inRow * betweenRow)
}

/** Trees per hectare from spacings in metres. */
export function treesPerHectare(inRowM: number, betweenRowM: number): number {
  return treesPerUnitArea(M2_PER_HA, inRowM, betweenRowM, 'm')
}

/** Trees per acre from spacings in feet. */
export function treesPerAcre(inRowFt: number, betweenRowFt: number): number {
  return treesPerUnitArea(FT2_PER_ACRE, inRowFt, betweenRowFt, 'ft')
}

export type SpacingUnit = 'm' | 'ft'

export interface PlantingDensity {
  perHa: number
  perAcre: number
}

/** Both densities from spacings given in metres or feet (per acre = per ha × 0.40468564224). */
export function plantingDensity(inRow: number, betweenRow: number, unit: SpacingUnit): PlantingDensity {
  if (unit === 'm') {
    return { perHa: treesPerHectare(inRow, betweenRow), perAcre: treesPerAcre(mToFt(inRow), mToFt(betweenRow)) }
  }
  if (unit === 'ft') {
    return { perHa: treesPerHectare(ftToM(inRow), ftToM(betweenRow)), perAcre: treesPerAcre(inRow, betweenRow) }
  }
  throw new RangeError(`Spacing unit must be 'm' or 'ft'; got ${String(unit)}`)
}

/** Trees needed to plant an area (ha) at a density (trees/ha), rounded up to whole trees. */
export function treesForArea(areaHa: number, perHa: number): number {
  if (!Number.isFinite(areaHa) || areaHa < 0) throw new RangeError(`Area must be zero or more ha; got ${areaHa}`)
  if (!Number.isFinite(perHa) || perHa < 0) throw new RangeError(`Density must be zero or more trees/ha; got ${perHa}`)
  // Guard against 2857.0000000000005 → 2858 from binary rounding.
  return Math.ceil(areaHa * perHa - 1e-9)
}
