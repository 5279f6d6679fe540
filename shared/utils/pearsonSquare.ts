import { juiceKgPerLitre } from './blendMix'

// The Pearson square: how much of two components makes a target value. Write the two values at the
// left corners and the target in the middle; the difference along each diagonal, without its sign,
// is the parts of the component in the opposite corner. It is the same weighted average the blend
// planner solves for many lots, so it cross-checks two-lot blends.
//
// The parts are parts of whatever the values are a fraction of: by mass for °Brix (grams per 100 g),
// by volume for % vol alcohol or for g/L figures such as acid and tannin.

export interface PearsonParts {
  /** Parts of component A: |target − b|. */
  partsA: number
  /** Parts of component B: |a − target|. */
  partsB: number
  /** A's fraction of the mix, 0–1. */
  shareA: number
  shareB: number
}

function requireFinite(name: string, value: number): void {
  if (!Number.isFinite(value)) throw new RangeError(`${name} must be a number; got ${value}`)
}

/** Parts of A (value a) and B (value b) that make the target; the target must lie between a and b. */
export function pearsonSquare(a: number, b: number, target: number): PearsonParts {
  requireFinite('a', a)
  requireFinite('b', b)
  requireFinite('target', target)
  if (a === b) throw new RangeError(`The two components are both ${a}: any mix of them gives ${a}`)
  if (target < Math.min(a, b) || target > Math.max(a, b)) {
    throw new RangeError(`target ${target} is not between ${Math.min(a, b)} and ${Math.max(a, b)}: no mix of the two reaches it`)
  }
  const partsA = Math.abs(target - b)
  const partsB = Math.abs(a - target)
  return { partsA, partsB, shareA: partsA / (partsA + partsB), shareB: partsB / (partsA + partsB) }
}

export interface BrixComponent {
  brix: number
  /** Apparent SG 20/20 °C, for the juice's density. */
  sg: number
}

export interface BrixSplit {
  massShareA: number
  massShareB: number
  /** The same split as fractions of the blend's volume: each mass over its juice's density. */
  volumeShareA: number
  volumeShareB: number
}

/**
 * Two juices to a target °Brix. °Brix is a mass fraction, so the square gives parts by mass; the
 * denser (sweeter) juice takes less room per kilogram, so its share of the volume is smaller.
 */
export function pearsonBrix(a: BrixComponent, b: BrixComponent, targetBrix: number): BrixSplit {
  if (!Number.isFinite(a.sg) || a.sg <= 0) throw new RangeError(`a.sg must be a positive number; got ${a.sg}`)
  if (!Number.isFinite(b.sg) || b.sg <= 0) throw new RangeError(`b.sg must be a positive number; got ${b.sg}`)
  const { shareA, shareB } = pearsonSquare(a.brix, b.brix, targetBrix)
  const litresA = shareA / juiceKgPerLitre(a.sg)
  const litresB = shareB / juiceKgPerLitre(b.sg)
  return { massShareA: shareA, massShareB: shareB, volumeShareA: litresA / (litresA + litresB), volumeShareB: litresB / (litresA + litresB) }
}
