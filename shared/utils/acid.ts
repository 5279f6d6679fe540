// Titratable acidity (TA), g/L, expressed as malic, tartaric or sulfuric acid.
// The three differ only in the equivalent weight used to turn milliequivalents
// of acid into grams, so they convert by ratio of equivalent weights
// (AWRI Technical Note TN14, "Interconversion of acidity units").
// Pomewright stores TA as g/L malic; the lab's own basis is converted on entry.

export const ACIDS = ['malic', 'tartaric', 'sulfuric'] as const
export type Acid = (typeof ACIDS)[number]

/** Equivalent weight, g per equivalent (molar mass ÷ 2 titratable protons), AWRI TN14. */
export const ACID_EQUIVALENT_WEIGHT_G: Record<Acid, number> = {
  malic: 67.04,
  tartaric: 75.04,
  sulfuric: 49.04,
}

export type AcidityByAcid = Record<Acid, number>

function requireAcid(acid: Acid): void {
  if (!ACIDS.includes(acid)) {
    throw new RangeError(`Acid must be one of ${ACIDS.join(', ')}; got ${String(acid)}`)
  }
}

/**
 * TA in g/L as one acid → the same acidity as each acid.
 * g/L as B = g/L as A × eqWeight(B) / eqWeight(A) (AWRI TN14).
 */
export function convertAcid(gPerL: number, from: Acid): AcidityByAcid {
  requireAcid(from)
  if (!Number.isFinite(gPerL) || gPerL < 0) {
    throw new RangeError(`Titratable acidity must be zero or more g/L; got ${gPerL}`)
  }
  // The reading's own basis is returned untouched, so a lab's figure never drifts by a rounding bit.
  const as = (to: Acid): number =>
    to === from ? gPerL : (gPerL * ACID_EQUIVALENT_WEIGHT_G[to]) / ACID_EQUIVALENT_WEIGHT_G[from]
  return { malic: as('malic'), tartaric: as('tartaric'), sulfuric: as('sulfuric') }
}

export interface Titration {
  /** NaOH used to reach the end point, mL. */
  naohMl: number
  /** Normality of the NaOH, eq/L (0.1 N is usual). */
  normality: number
  /** Juice sample titrated, mL. */
  sampleMl: number
  /** Acid to express the result as. */
  as: Acid
}

/**
 * TA (g/L) from a titration with NaOH:
 * g/L = mL NaOH × normality × eqWeight / mL sample
 * (mL × N = milliequivalents; × eqWeight mg/meq = mg; ÷ mL sample = g/L). AWRI TN14.
 */
export function taFromTitration({ naohMl, normality, sampleMl, as }: Titration): number {
  requireAcid(as)
  if (!Number.isFinite(naohMl) || naohMl < 0) {
    throw new RangeError(`NaOH volume must be zero or more mL; got ${naohMl}`)
  }
  if (!Number.isFinite(normality) || normality <= 0) {
    throw new RangeError(`NaOH normality must be above 0; got ${normality}`)
  }
  if (!Number.isFinite(sampleMl) || sampleMl <= 0) {
    throw new RangeError(`Sample volume must be above 0 mL; got ${sampleMl}`)
  }
  return (naohMl * normality * ACID_EQUIVALENT_WEIGHT_G[as]) / sampleMl
}
