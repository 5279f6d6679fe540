// Juice class of a juice reading from its acid and tannin, by the Long Ashton
// Research Station classification (B. T. P. Barker, 1903; thresholds as in
// A. Lea, "Cider Apple Compositional Data", and Miles, King & Peck,
// "Commonly Grown Cider Apple Cultivars in the U.S.", WSU, 2015):
// malic acid 0.45 % w/v (4.5 g/L) divides sharp from sweet, tannin 0.2 % w/v
// (2.0 g/L) makes a juice "bitter".
// A variety's published class is data and may not follow these thresholds;
// this computes the class of one reading.

export const JUICE_CLASSES = ['sweet', 'sharp', 'bittersweet', 'bittersharp'] as const
export type JuiceClass = (typeof JUICE_CLASSES)[number]

export const ACID_THRESHOLD_G_PER_L = 4.5
export const TANNIN_THRESHOLD_G_PER_L = 2.0

/**
 * Class of a juice from titratable acidity (g/L as malic) and tannin (g/L).
 * The source says "above" and "below" and leaves the threshold itself
 * undefined; Pomewright's rule: a value AT or ABOVE a threshold counts as high
 * (4.5 g/L acid is sharp, 2.0 g/L tannin is bitter).
 */
export function juiceClass(taGPerL: number, tanninGPerL: number): JuiceClass {
  if (!Number.isFinite(taGPerL) || taGPerL < 0) {
    throw new RangeError(`Titratable acidity must be zero or more g/L as malic; got ${taGPerL}`)
  }
  if (!Number.isFinite(tanninGPerL) || tanninGPerL < 0) {
    throw new RangeError(`Tannin must be zero or more g/L; got ${tanninGPerL}`)
  }
  const highAcid = taGPerL >= ACID_THRESHOLD_G_PER_L
  const highTannin = tanninGPerL >= TANNIN_THRESHOLD_G_PER_L
  if (highTannin) return highAcid ? 'bittersharp' : 'bittersweet'
  return highAcid ? 'sharp' : 'sweet'
}
