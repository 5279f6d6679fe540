import type { CropFailureTerm } from '../schemas/contract'
import type { RejectReason, Settlement } from '../utils/settlement'

// Deliveries of fruit at the press and the statements made of them, as the API answers them: kg,
// °Brix, money in integer minor units of the contract's currency, dates as YYYY-MM-DD.

export const DELIVERY_STATES = ['recorded', 'settled', 'paid', 'disputed'] as const
export type DeliveryState = typeof DELIVERY_STATES[number]
export type DeliverySide = 'maker' | 'grower'
export type DeliveryAction = 'edit' | 'dispute' | 'withdraw-dispute' | 'settle'
export const EXCESS_DECISIONS = ['accepted', 'refused'] as const
export type ExcessDecision = typeof EXCESS_DECISIONS[number]

/** The settlement of one delivery, line by line, as it was worked and kept. */
export interface DeliverySettlement extends Settlement {
  /** The kilograms paid on: the net weight, less any excess the maker refused. */
  paidKg: number
  /** Set when the maker refused the load for its quality. */
  qualityRejectReason: string | null
  /** Every reason the load earns nothing, in words. */
  rejectedBecause: string[]
  rejectReasons: RejectReason[]
}

export interface Delivery {
  id: number
  fruitContractId: number
  makerOrgId: number
  makerOrgName: string
  growerOrgId: number
  growerOrgName: string
  lotId: number
  lotCode: string
  varietyName: string
  harvestYear: number
  deliveredOn: string
  ticketNo: string | null
  grossKg: number | null
  tareKg: number | null
  netKg: number
  /** The reading paid on; null when it was since deleted (its figures are kept below). */
  readingId: number | null
  readingBrix: number
  readingSampledOn: string
  rotPct: number | null
  damagePct: number | null
  qualityRejectReason: string | null
  state: DeliveryState
  version: number
  disputedBy: DeliverySide | null
  disputeReason: string | null
  /** Kilograms of this load past the contract year's tolerance, and the maker's decision on them. */
  excessKg: number
  excessDecision: ExcessDecision | null
  currency: string
  settlement: DeliverySettlement
  /** The settlement's total, before tax. */
  amountMinor: number
  /** The grower's (seller's) tax rate, when it has one set. */
  taxRatePct: number | null
  taxMinor: number
  /** Amount plus tax: what the grower is paid. */
  totalMinor: number
  notes: string | null
  /** Which side the caller is on. */
  side: DeliverySide
  /** The moves the caller may make now. */
  moves: DeliveryAction[]
  settledAt: string | null
  paidAt: string | null
  createdAt: string
  updatedAt: string
}

export interface DeliveryEvent {
  id: number
  action: 'recorded' | 'corrected' | 'disputed' | 'dispute-withdrawn' | 'settled' | 'paid'
  version: number
  byName: string
  byOrgName: string | null
  changes: { field: string, from: unknown, to: unknown }[]
  reason: string | null
  at: string
}

export interface DeliveryDetail extends Delivery {
  history: DeliveryEvent[]
  /** The contract year this delivery counts against, as it stands now. */
  year: ContractYearSummary
}

export interface DeliveryList { items: Delivery[], total: number }

/** One fruit contract's year: delivered against contracted, with its tolerance. */
export interface ContractYearSummary {
  fruitContractId: number
  harvestYear: number
  contractedTonnes: number
  tolerancePct: number
  /** Contracted less and plus the tolerance. */
  lowestTonnes: number
  highestTonnes: number
  /** Every delivery's net weight that year (a disputed one included). */
  deliveredTonnes: number
  /** Below the lowest tonnes the tolerance allows; 0 when none. */
  shortfallTonnes: number
  /** Above the highest tonnes the tolerance allows; 0 when none. */
  excessTonnes: number
  cropFailure: CropFailureTerm
  /** What the contract's crop-failure term does with the shortfall, in words; null without one. */
  shortfallMeans: string | null
}

/** A party on a statement, as it stands in the organisation's settings. */
export interface StatementParty {
  orgId: number
  name: string
  contactName: string | null
  email: string | null
  phone: string | null
  taxRatePct: number | null
}

export interface StatementLine {
  deliveryId: number
  deliveredOn: string
  lotCode: string
  varietyName: string
  ticketNo: string | null
  grossKg: number | null
  tareKg: number | null
  netKg: number
  paidKg: number
  readingBrix: number
  readingSampledOn: string
  brixPaid: number
  brixDifference: number
  pricePerTonneMinor: number
  baseAmountMinor: number
  sugarAdjustmentMinor: number
  rejected: boolean
  rejectedBecause: string[]
  amountMinor: number
  taxMinor: number
  totalMinor: number
  state: DeliveryState
}

/**
 * A self-billing statement: the maker (buyer) states what it owes the grower (seller) for the
 * deliveries on it. One per delivery, or one per contract and harvest year.
 */
export interface Statement {
  /** Its reference: SB-<contract>-<year> for a season, SB-<contract>-D<delivery> for one delivery. */
  reference: string
  kind: 'delivery' | 'season'
  issuedOn: string
  buyer: StatementParty
  seller: StatementParty
  fruitContractId: number
  contractDescription: string
  harvestYear: number
  currency: string
  basePricePerTonneMinor: number
  baselineBrix: number
  bonusPerBrixPerTonneMinor: number
  deductionPerBrixPerTonneMinor: number
  rejectFloorBrix: number
  lines: StatementLine[]
  totals: { netKg: number, paidKg: number, baseAmountMinor: number, sugarAdjustmentMinor: number, amountMinor: number, taxMinor: number, totalMinor: number }
  /** The season's delivered tonnes against the contract (season statements only). */
  year: ContractYearSummary | null
}
