import type { BearingCurve } from '#shared/utils/forecast'
import type { BearingPace } from '#shared/schemas/block'

export interface RootstockBearing {
  designation: string
  /** Early end of the published range of years to first crop. */
  yearsToFirstCrop: number | null
  /** Late end of that range; null when the source gives one figure. */
  yearsToFirstCropLate?: number | null
  /** Years to full bearing for a tree that starts cropping at the early end. */
  yearsToFullBearing: number | null
  yieldPerTreeKg: number | null
}

export type BearingCurveResult = { curve: BearingCurve, note: null } | { curve: null, note: string }

/** How far along the rootstock's published range of bearing ages a block is taken to be: 0, ½ or all of it. */
const PACE_SHARE: Record<BearingPace, number> = { early: 0, middle: 0.5, late: 1 }

/**
 * The bearing curve of a catalogue rootstock at a block's pace, or a note saying which figure is
 * missing, so that a forecast shows 0 kg instead of a guessed number. Published bearing ages are
 * ranges (NC State: M.26 2–4 years, MM.111 4–6, seedling 6–10); a block is forecast on the middle of
 * the range unless its grower chose the early or the late end, and full bearing moves with the first
 * crop (common practice). The catalogue allows half years; a crop comes once a year, so a bearing
 * age of 2.5 counts from the first harvest at or after it (age 3).
 */
export function bearingCurveOf(rootstock: RootstockBearing, pace: BearingPace = 'middle'): BearingCurveResult {
  const missing = [
    rootstock.yearsToFirstCrop === null ? 'years to first crop' : null,
    rootstock.yearsToFullBearing === null ? 'years to full bearing' : null,
    rootstock.yieldPerTreeKg === null ? 'yield per tree at full bearing' : null,
  ].filter((m): m is string => m !== null)
  if (missing.length > 0) {
    const listed = missing.length > 1 ? `${missing.slice(0, -1).join(', ')} or ${missing.at(-1)}` : missing[0]
    return { curve: null, note: `The catalogue has no ${listed} for rootstock ${rootstock.designation}, so its forecast shows 0 kg rather than a guess.` }
  }
  const early = rootstock.yearsToFirstCrop!
  const late = rootstock.yearsToFirstCropLate ?? early
  const delay = (late - early) * PACE_SHARE[pace]
  const first = Math.ceil(early + delay)
  const full = Math.ceil(rootstock.yearsToFullBearing! + delay)
  if (early < 0 || late < early || full < first || rootstock.yieldPerTreeKg! < 0) {
    return { curve: null, note: `The catalogue's bearing figures for rootstock ${rootstock.designation} do not add up (full bearing before first crop, a range that ends before it starts, or a negative figure), so its forecast shows 0 kg.` }
  }
  return { curve: { yearsToFirstCrop: first, yearsToFullBearing: full, yieldPerTreeKgAtFull: rootstock.yieldPerTreeKg! }, note: null }
}
