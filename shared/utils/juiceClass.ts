// Juice class of a juice reading from its acid and tannin.
//
// Apples: the Long Ashton Research Station classification (B. T. P. Barker, 1903; thresholds as in
// A. Lea, "Cider Apple Compositional Data", and Miles, King & Peck, "Commonly Grown Cider Apple
// Cultivars in the U.S.", WSU, 2015): malic acid 0.45 % w/v (4.5 g/L) divides sharp from sweet,
// tannin 0.2 % w/v (2.0 g/L) makes a juice "bitter".
//
// Perry pears have classes of their own (Pollard & Beech, as set out in "Perry Pear Varieties" and
// cider-making.co.uk's perry pear lists): sweet (acid about 0.2 % w/v as malic or below, tannin
// below 0.15 %), medium sharp (acid 0.2–0.6 %, tannin below 0.15 %), bittersweet (acid below
// 0.45 %, tannin above 0.2 %) and bittersharp (acid above 0.45 %, tannin above 0.2 %). There is no
// "sharp" pear class.
//
// A variety's published class is data and may not follow these thresholds; this computes the
// class of one reading.

export const APPLE_CLASSES = ['sweet', 'sharp', 'bittersweet', 'bittersharp'] as const
export const PEAR_CLASSES = ['sweet', 'medium sharp', 'bittersweet', 'bittersharp'] as const
/** Every class either species can have, in the order pages list them. */
export const JUICE_CLASSES = ['sweet', 'sharp', 'medium sharp', 'bittersweet', 'bittersharp'] as const
export type JuiceClass = (typeof JUICE_CLASSES)[number]
export type FruitSpecies = 'apple' | 'pear'

export const CLASSES_OF: Record<FruitSpecies, readonly JuiceClass[]> = { apple: APPLE_CLASSES, pear: PEAR_CLASSES }

export const ACID_THRESHOLD_G_PER_L = 4.5
export const TANNIN_THRESHOLD_G_PER_L = 2.0

/** Perry pear thresholds (Pollard & Beech), % w/v × 10 = g/L. */
export const PEAR_THRESHOLDS_G_PER_L = {
  /** At or below: sweet, when not bitter. */
  sweetAcidMax: 2.0,
  /** The published top of medium sharp; no pear class lies above it, so it does not divide classes. */
  mediumSharpAcidMax: 6.0,
  /** Below: not bitter (the published sweet and medium sharp limit). */
  lowTanninMax: 1.5,
  /** At or above: bitter. */
  bitterTanninMin: 2.0,
  /** At or above, when bitter: bittersharp. */
  bittersharpAcidMin: 4.5,
} as const

function requireFigures(taGPerL: number, tanninGPerL: number): void {
  if (!Number.isFinite(taGPerL) || taGPerL < 0) {
    throw new RangeError(`Titratable acidity must be zero or more g/L as malic; got ${taGPerL}`)
  }
  if (!Number.isFinite(tanninGPerL) || tanninGPerL < 0) {
    throw new RangeError(`Tannin must be zero or more g/L; got ${tanninGPerL}`)
  }
}

/**
 * Class of a juice from titratable acidity (g/L as malic) and tannin (g/L), apple thresholds unless
 * the juice is pear. The sources say "above" and "below" and leave the thresholds themselves (and,
 * for pears, the gaps between classes) undefined. Pomewright's rules:
 * - apples: a value AT or ABOVE a threshold counts as high (4.5 g/L acid is sharp, 2.0 g/L tannin is bitter);
 * - pears: tannin at or above 2.0 g/L is bitter, and then acid at or above 4.5 g/L is bittersharp;
 *   tannin below 2.0 g/L (the 1.5–2.0 gap included) is not bitter, and then acid at or below 2.0 g/L
 *   is sweet and anything above it medium sharp (above 6.0 g/L too: there is no sharper pear class).
 */
export function juiceClass(taGPerL: number, tanninGPerL: number, species: FruitSpecies = 'apple'): JuiceClass {
  requireFigures(taGPerL, tanninGPerL)
  if (species === 'pear') {
    const t = PEAR_THRESHOLDS_G_PER_L
    if (tanninGPerL >= t.bitterTanninMin) return taGPerL >= t.bittersharpAcidMin ? 'bittersharp' : 'bittersweet'
    return taGPerL <= t.sweetAcidMax ? 'sweet' : 'medium sharp'
  }
  const highAcid = taGPerL >= ACID_THRESHOLD_G_PER_L
  const highTannin = tanninGPerL >= TANNIN_THRESHOLD_G_PER_L
  if (highTannin) return highAcid ? 'bittersharp' : 'bittersweet'
  return highAcid ? 'sharp' : 'sweet'
}

/** Whether a species has this class (a pear is never "sharp", an apple never "medium sharp"). */
export function isClassOf(species: FruitSpecies, juice: JuiceClass): boolean {
  return CLASSES_OF[species].includes(juice)
}
