import type { BearingCurve } from '#shared/utils/forecast'

export interface RootstockBearing {
  designation: string
  yearsToFirstCrop: number | null
  yearsToFullBearing: number | null
  yieldPerTreeKg: number | null
}

export type BearingCurveResult = { curve: BearingCurve, note: null } | { curve: null, note: string }

/**
 * The bearing curve of a catalogue rootstock, or a note saying which figure is missing, so that
 * a forecast shows 0 kg instead of a guessed number. The catalogue allows half years; a crop
 * comes once a year, so a bearing age of 2.5 counts from the first harvest at or after it (age 3).
 */
export function bearingCurveOf(rootstock: RootstockBearing): BearingCurveResult {
  const missing = [
    rootstock.yearsToFirstCrop === null ? 'years to first crop' : null,
    rootstock.yearsToFullBearing === null ? 'years to full bearing' : null,
    rootstock.yieldPerTreeKg === null ? 'yield per tree at full bearing' : null,
  ].filter((m): m is string => m !== null)
  if (missing.length > 0) {
    const listed = missing.length > 1 ? `${missing.slice(0, -1).join(', ')} or ${missing.at(-1)}` : missing[0]
    return { curve: null, note: `The catalogue has no ${listed} for rootstock ${rootstock.designation}, so its forecast shows 0 kg rather than a guess.` }
  }
  const first = Math.ceil(rootstock.yearsToFirstCrop!)
  const full = Math.ceil(rootstock.yearsToFullBearing!)
  if (first < 0 || full < first || rootstock.yieldPerTreeKg! < 0) {
    return { curve: null, note: `The catalogue's bearing figures for rootstock ${rootstock.designation} do not add up (full bearing before first crop, or a negative figure), so its forecast shows 0 kg.` }
  }
  return { curve: { yearsToFirstCrop: first, yearsToFullBearing: full, yieldPerTreeKgAtFull: rootstock.yieldPerTreeKg! }, note: null }
}
