// What a delivery of fruit earns under a fruit contract's terms:
//   tonnes × (base price per tonne ± sugar adjustment per tonne), where the adjustment is linear in
//   the reading's °Brix (taken to 0.1 °Brix) above or below the contract's sugar baseline: a bonus
//   per tonne per °Brix above, a deduction per tonne per °Brix below. A load under the reject floor,
//   or over the contract's limits for rot or damage, earns nothing and is flagged rejected.
// The money is worked exactly (integers: grams, tenths of a °Brix, minor units) and rounded half up
// to minor units once per delivery, never line by line.

export interface FruitPriceTerms {
  /** Base price per tonne, integer minor units (pence, cents). */
  basePricePerTonneMinor: number
  /** Sugar baseline, °Brix. */
  baselineBrix: number
  /** Added per tonne for each °Brix above the baseline, minor units. */
  bonusPerBrixPerTonneMinor: number
  /** Taken off per tonne for each °Brix below the baseline, minor units. */
  deductionPerBrixPerTonneMinor: number
  /** A load below this °Brix is rejected. */
  rejectFloorBrix: number
  /** Highest share of rotten fruit accepted, %; null when the terms set none. */
  maxRotPct?: number | null
  /** Highest share of damaged fruit accepted, %; null when the terms set none. */
  maxDamagePct?: number | null
}

export interface DeliveredLoad {
  netKg: number
  /** The reading paid on, °Brix. */
  brix: number
  rotPct?: number | null
  damagePct?: number | null
}

export type RejectReason = 'below-floor' | 'rot' | 'damage'

export interface Settlement {
  netKg: number
  /** The °Brix paid on: the reading taken to 0.1 °Brix (half up). */
  brixPaid: number
  /** °Brix above (+) or below (−) the baseline, to 0.1. */
  brixDifference: number
  /** Base price + bonus or − deduction, per tonne, minor units (may carry a fraction of a minor unit). */
  pricePerTonneMinor: number
  /** What the base price alone would pay for this load, minor units (unrounded). */
  baseAmountMinor: number
  /** The sugar bonus (+) or deduction (−) for this load, minor units (unrounded). */
  sugarAdjustmentMinor: number
  /** What is paid, rounded half up once: 0 when rejected. */
  totalMinor: number
  rejected: boolean
  rejectReasons: RejectReason[]
}

function requireMinor(value: number, what: string): void {
  if (!Number.isSafeInteger(value) || value < 0) throw new RangeError(`${what} must be a whole number of minor units, zero or more; got ${value}`)
}

function requireBrix(value: number, what: string): void {
  if (!Number.isFinite(value) || value < 0 || value > 40) throw new RangeError(`${what} must be from 0 to 40 °Brix; got ${value}`)
}

function requirePct(value: number | null | undefined, what: string): void {
  if (value === null || value === undefined) return
  if (!Number.isFinite(value) || value < 0 || value > 100) throw new RangeError(`${what} must be from 0 to 100 %; got ${value}`)
}

/** Tenths of a °Brix, half up: 11.25 → 113. */
function tenths(brix: number): number {
  return Math.round(Number((brix * 10).toFixed(6)))
}

/** a ÷ b rounded half up, for a ≥ 0 and b > 0, exactly. */
function divideHalfUp(a: bigint, b: bigint): bigint {
  return (BigInt(2) * a + b) / (BigInt(2) * b)
}

export function settleDelivery(terms: FruitPriceTerms, load: DeliveredLoad): Settlement {
  requireMinor(terms.basePricePerTonneMinor, 'The base price per tonne')
  requireMinor(terms.bonusPerBrixPerTonneMinor, 'The bonus per tonne per °Brix')
  requireMinor(terms.deductionPerBrixPerTonneMinor, 'The deduction per tonne per °Brix')
  requireBrix(terms.baselineBrix, 'The sugar baseline')
  requireBrix(terms.rejectFloorBrix, 'The reject floor')
  requireBrix(load.brix, 'The reading')
  requirePct(load.rotPct, 'Rot')
  requirePct(load.damagePct, 'Damage')
  if (!Number.isFinite(load.netKg) || load.netKg < 0) throw new RangeError(`The net weight must be zero or more kg; got ${load.netKg}`)

  const paidTenths = tenths(load.brix)
  const differenceTenths = paidTenths - tenths(terms.baselineBrix)
  const ratePerBrix = differenceTenths >= 0 ? terms.bonusPerBrixPerTonneMinor : terms.deductionPerBrixPerTonneMinor
  // Price per tonne in tenths of a minor unit: base × 10 ± difference (tenths of °Brix) × rate.
  const priceTenthsPerTonne = terms.basePricePerTonneMinor * 10 + differenceTenths * ratePerBrix
  const grams = BigInt(Math.round(load.netKg * 1000))

  const rejectReasons: RejectReason[] = []
  if (paidTenths < tenths(terms.rejectFloorBrix)) rejectReasons.push('below-floor')
  if (terms.maxRotPct != null && load.rotPct != null && load.rotPct > terms.maxRotPct) rejectReasons.push('rot')
  if (terms.maxDamagePct != null && load.damagePct != null && load.damagePct > terms.maxDamagePct) rejectReasons.push('damage')
  const rejected = rejectReasons.length > 0

  // grams × tenths-of-minor per tonne ÷ (1,000,000 g per tonne × 10); a deduction never makes a load cost money.
  const total = rejected || priceTenthsPerTonne <= 0 ? BigInt(0) : divideHalfUp(grams * BigInt(priceTenthsPerTonne), BigInt(10_000_000))
  const tonnes = load.netKg / 1000
  return {
    netKg: load.netKg,
    brixPaid: paidTenths / 10,
    brixDifference: differenceTenths / 10,
    pricePerTonneMinor: priceTenthsPerTonne / 10,
    baseAmountMinor: tonnes * terms.basePricePerTonneMinor,
    sugarAdjustmentMinor: tonnes * (differenceTenths * ratePerBrix) / 10,
    totalMinor: Number(total),
    rejected,
    rejectReasons,
  }
}

export interface SettlementExample { label: string, brix: number, settlement: Settlement }

/** What one delivery of 10 t earns at the baseline, one °Brix above it and just under the floor: for both parties to see before they accept. */
export function settlementExamples(terms: FruitPriceTerms, netKg = 10_000): SettlementExample[] {
  const underFloor = Math.max(0, (tenths(terms.rejectFloorBrix) - 1) / 10)
  return [
    { label: 'At the sugar baseline', brix: terms.baselineBrix },
    { label: 'One °Brix above the baseline', brix: Math.min(40, tenths(terms.baselineBrix) / 10 + 1) },
    { label: 'Just under the reject floor', brix: underFloor },
  ].map(e => ({ ...e, settlement: settleDelivery(terms, { netKg, brix: e.brix }) }))
}
