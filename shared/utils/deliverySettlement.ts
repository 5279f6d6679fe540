import type { DeliverySettlement, ExcessDecision } from '../types/delivery'
import { settleDelivery, type FruitPriceTerms, type RejectReason } from './settlement'

// One delivery's settlement as it is kept and shown: the contract's sugar terms on the kilograms
// paid for (the net weight, less any excess the maker refused), a quality reject that pays nothing
// whatever the sugar, and the seller's tax on the amount, rounded half up to minor units once.

export interface DeliveredLoadFacts {
  netKg: number
  /** The °Brix of the reading paid on. */
  brix: number
  rotPct?: number | null
  damagePct?: number | null
  /** Kilograms of the load past the contract year's tolerance, and what the maker decided. */
  excessKg?: number
  excessDecision?: ExcessDecision | null
  qualityRejectReason?: string | null
}

export interface SettledLoad {
  settlement: DeliverySettlement
  amountMinor: number
  taxRatePct: number | null
  taxMinor: number
  totalMinor: number
}

const REJECTED_BECAUSE: Record<RejectReason, (terms: FruitPriceTerms, load: DeliveredLoadFacts, brixPaid: number) => string> = {
  'below-floor': (terms, _load, brixPaid) => `${brixPaid.toFixed(1)} °Brix is under the contract's reject floor of ${terms.rejectFloorBrix.toFixed(1)} °Brix`,
  'rot': (terms, load) => `${load.rotPct} % rot is over the contract's limit of ${terms.maxRotPct} %`,
  'damage': (terms, load) => `${load.damagePct} % damage is over the contract's limit of ${terms.maxDamagePct} %`,
}

/** amount × rate % rounded half up to a whole minor unit, exactly (rates to 0.01 %). */
export function taxOf(amountMinor: number, taxRatePct: number | null): number {
  if (taxRatePct === null || taxRatePct <= 0 || amountMinor <= 0) return 0
  const basisPoints = BigInt(Math.round(taxRatePct * 100))
  const numerator = BigInt(amountMinor) * basisPoints
  const denominator = BigInt(10_000)
  return Number((BigInt(2) * numerator + denominator) / (BigInt(2) * denominator))
}

export function settleLoad(terms: FruitPriceTerms, load: DeliveredLoadFacts, taxRatePct: number | null): SettledLoad {
  const refusedKg = load.excessDecision === 'refused' ? Math.min(load.netKg, load.excessKg ?? 0) : 0
  const paidKg = Math.round((load.netKg - refusedKg) * 10) / 10
  const worked = settleDelivery(terms, { netKg: paidKg, brix: load.brix, rotPct: load.rotPct, damagePct: load.damagePct })
  const qualityRejectReason = load.qualityRejectReason?.trim() || null
  const rejectedBecause = worked.rejectReasons.map(r => REJECTED_BECAUSE[r](terms, load, worked.brixPaid))
  if (qualityRejectReason) rejectedBecause.push(`Refused for quality: ${qualityRejectReason}`)
  const rejected = worked.rejected || qualityRejectReason !== null
  const settlement: DeliverySettlement = {
    ...worked,
    netKg: load.netKg,
    paidKg,
    rejected,
    totalMinor: rejected ? 0 : worked.totalMinor,
    qualityRejectReason,
    rejectedBecause,
  }
  const amountMinor = settlement.totalMinor
  const taxMinor = taxOf(amountMinor, taxRatePct)
  return { settlement, amountMinor, taxRatePct, taxMinor, totalMinor: amountMinor + taxMinor }
}
