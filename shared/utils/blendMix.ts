import type { PredictedJuice, SolverLot } from '../types/blend'
import { WATER_DENSITY_20C_G_PER_ML } from './sugar'

// The juice a press blend makes, from the kilograms of fruit taken from each lot.
//
// °Brix is grams of soluble solids per 100 g of juice, a mass fraction, so it mixes by juice mass.
// SG, titratable acidity and tannin are per litre, so they mix by volume (juices' volumes add, near
// enough: apple juice is mostly water). pH does not mix linearly at all: it is a logarithm, and each
// juice's acids buffer differently. The estimate here averages the hydrogen-ion concentration,
// 10^−pH, by volume (common practice) and is only ever shown as an estimate, never planned on.

/** What the mix needs to know of a lot. */
export type MixLot = Pick<SolverLot, 'juiceYieldLPerTonne' | 'brix' | 'sg' | 'taGPerL' | 'tanninGPerL' | 'ph'>

export interface MixPart { lot: MixLot, kg: number }

/** Litres of juice pressed from this much fruit: kg / 1000 × litres per tonne. */
export function litresOf(kg: number, juiceYieldLPerTonne: number): number {
  return (kg / 1000) * juiceYieldLPerTonne
}

/**
 * Juice density at 20 °C in kg/L: SG 20/20 is the juice's density over that of water at 20 °C, and
 * water weighs 0.998203 kg/L there (NBS Circular 440). A lot's SG is the hydrometer's apparent SG;
 * the true SG is lower by (SG − 1) × 0.0012 (0.00006 at 1.050), a difference in the weights of a
 * °Brix average far below any reading's precision, so the apparent SG is used as it is. The water
 * factor cancels out of the average, but it makes the juice mass a real mass.
 */
export function juiceKgPerLitre(sg: number): number {
  return sg * WATER_DENSITY_20C_G_PER_ML
}

/** Average of a per-litre figure by volume, or null when a lot that gives juice has no value for it. */
function byVolume(parts: readonly MixPart[], litres: readonly number[], total: number, value: (lot: MixLot) => number | null): number | null {
  let sum = 0
  for (let i = 0; i < parts.length; i++) {
    if (litres[i] === 0) continue
    const v = value(parts[i]!.lot)
    if (v === null) return null
    sum += v * litres[i]!
  }
  return sum / total
}

/**
 * The predicted juice of a blend: °Brix by juice mass, SG, TA and tannin by volume, and a pH
 * estimate. A property some contributing lot has no reading for is unknown (null), not guessed
 * from the others. Null when the blend gives no juice.
 */
export function blendMix(parts: readonly MixPart[]): PredictedJuice | null {
  const litres = parts.map(({ lot, kg }, i) => {
    if (!Number.isFinite(kg) || kg < 0) throw new RangeError(`parts[${i}].kg must be a number of 0 or more; got ${kg}`)
    return litresOf(kg, lot.juiceYieldLPerTonne)
  })
  const totalLitres = litres.reduce((a, b) => a + b, 0)
  if (!(totalLitres > 0)) return null
  let juiceKg = 0
  let solidsKg = 0
  parts.forEach(({ lot }, i) => {
    const mass = litres[i]! * juiceKgPerLitre(lot.sg)
    juiceKg += mass
    solidsKg += mass * lot.brix
  })
  const hydrogen = byVolume(parts, litres, totalLitres, lot => lot.ph === null ? null : 10 ** -lot.ph)
  return {
    brix: solidsKg / juiceKg,
    sg: byVolume(parts, litres, totalLitres, lot => lot.sg)!,
    taGPerL: byVolume(parts, litres, totalLitres, lot => lot.taGPerL),
    tanninGPerL: byVolume(parts, litres, totalLitres, lot => lot.tanninGPerL),
    phEstimate: hydrogen === null ? null : -Math.log10(hydrogen),
  }
}
