import type { BuyerCancelUntil, CropFailureTerm, DepositIfBuyerCancels, DepositIfNurseryCancels, ScheduleYearInput } from '../schemas/contract'
import type { Currency } from '../schemas/organisation'
import type { BackPlanStep, DeliverySeason, TreeType } from '../utils/backplan'
import type { FruitContractAction, FruitContractSide, FruitContractState, TreeContractAction, TreeContractSide, TreeContractState } from '../utils/contractStatus'
import type { OverCommitment } from '../utils/coverage'
import type { ForecastClass } from '../utils/forecast'
import type { FruitSpecies, JuiceClass } from '../utils/juiceClass'
import type { SettlementExample } from '../utils/settlement'

/** A move the signed-in person may make now: the action is the last segment of its route. */
export interface ContractMoveOption<A extends string> { action: A, label: string }

/** One entry of a contract's history. */
export interface ContractHistoryEntry {
  id: number
  /** `created`, `edited`, `offered`, `countered`, `accepted`, `declined`, `cancelled`, `expired`, … */
  action: string
  version: number
  byUserId: number | null
  byOrgId: number | null
  byName: string
  at: string
  /** What changed from the version before (or, for a draft's edit, from the draft before). */
  changes: { field: string, from: unknown, to: unknown }[]
  /** A note the person gave with the move (a reason to decline, say). */
  reason: string | null
}

export interface ContractHistory { items: ContractHistoryEntry[], total: number }

interface ContractCommon<S extends string, Side extends string, A extends string> {
  id: number
  state: S
  /** 0 while a draft; each offer and counter makes the next. */
  version: number
  acceptedVersion: number | null
  draftedBy: Side
  lastOfferBy: Side | null
  cancelledBy: Side | null
  /** The last day the standing offer may be accepted; null when it does not expire. */
  expiresOn: string | null
  /** The standing offer's last day has passed: it can no longer be accepted. */
  expired: boolean
  /** Which side the signed-in person is on. */
  side: Side
  /** `you` when the signed-in side answers the standing offer, `them` when the other side does. */
  awaiting: 'you' | 'them' | null
  moves: ContractMoveOption<A>[]
  currency: Currency
  notes: string | null
  createdAt: string
  updatedAt: string
}

export interface TreeContractMoney {
  /** treeCount × unit price. */
  treesMinor: number
  /** treeCount × royalty per tree. */
  royaltyMinor: number
  totalMinor: number
  /** depositPct of the total, rounded half up to minor units. */
  depositMinor: number
  /** What is left to pay after the deposit: for the trees delivered once delivered (pro rata). */
  balanceMinor: number
  /** Once delivered: the value of the trees delivered (count × (price + royalty)). */
  deliveredValueMinor: number | null
  /** Once cancelled after the deposit was due: what happens to it under the terms. */
  depositOnCancel: { outcome: 'kept' | 'refunded' | 'doubled', refundMinor: number } | null
}

export interface TreeContractBackPlan {
  steps: BackPlanStep[]
  rootstocksToBud: number
  /** Set when the first step still to do is already past its date. */
  warning: string | null
}

export interface TreeContract extends ContractCommon<TreeContractState, TreeContractSide, TreeContractAction> {
  buyerOrgId: number
  buyerOrgName: string
  nurseryOrgId: number
  nurseryOrgName: string
  varietyId: number
  varietyName: string
  varietySpecies: FruitSpecies
  rootstockId: number
  rootstockDesignation: string
  /** Dwarfing stocks need a stake or wire support; taller ones stand alone. */
  rootstockNeedsSupport: boolean
  /** Worked between rootstock and variety; null when none. */
  interstem: string | null
  treeCount: number
  treeType: TreeType
  minCaliperMm: number | null
  deliveryYear: number
  deliverySeason: DeliverySeason
  unitPriceMinor: number
  royaltyPerTreeMinor: number
  depositPct: number
  depositIfBuyerCancels: DepositIfBuyerCancels
  depositIfNurseryCancels: DepositIfNurseryCancels
  buyerMayCancelUntil: BuyerCancelUntil
  certificateRequired: boolean
  takeRate: number
  survivalRate: number
  plantingSite: string | null
  deliveredCount: number | null
  deliveredOn: string | null
  money: TreeContractMoney
  backPlan: TreeContractBackPlan
}

export interface FruitContract extends ContractCommon<FruitContractState, FruitContractSide, FruitContractAction> {
  makerOrgId: number
  makerOrgName: string
  growerOrgId: number
  growerOrgName: string
  varietyId: number | null
  varietyName: string | null
  species: FruitSpecies | null
  juiceClass: JuiceClass | null
  /** The class the fruit is summed under for coverage (the variety's own, when one variety). */
  fruitClass: ForecastClass
  schedule: ScheduleYearInput[]
  totalTonnes: number
  tolerancePct: number
  basePricePerTonneMinor: number
  baselineBrix: number
  bonusPerBrixPerTonneMinor: number
  deductionPerBrixPerTonneMinor: number
  rejectFloorBrix: number
  maxRotPct: number | null
  maxDamagePct: number | null
  cropFailure: CropFailureTerm
  /** What one delivery of 10 t earns at the baseline, one °Brix above and under the floor. */
  settlementExamples: SettlementExample[]
  /** For the grower, while an offer is open: the years its forecast would not cover were it accepted. */
  coverageWarning: OverCommitment[] | null
}

export interface TreeContractList { items: TreeContract[], total: number }
export interface FruitContractList { items: FruitContract[], total: number }
