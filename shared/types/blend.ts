import type { LotState } from './lot'
import type { PotentialAlcoholMethod } from '../utils/alcohol'
import type { FruitSpecies, JuiceClass } from '../utils/juiceClass'

// The blend planner's question and answer, as the API takes and gives them: kg, litres, °Brix, SG,
// g/L (TA as malic), money in integer minor units of the maker's currency per tonne.

/** The properties a blend is planned on. pH is predicted but never a constraint: it does not mix linearly. */
export const BLEND_PROPERTIES = ['brix', 'sg', 'taGPerL', 'tanninGPerL'] as const
export type BlendProperty = typeof BLEND_PROPERTIES[number]
export interface Range { min: number, max: number }
export type BlendTargetRanges = Partial<Record<BlendProperty, Range>>

/** One lot the solver may take juice from, with everything it needs already worked out. */
export interface SolverLot {
  /** The lot's id, or the code of a what-if lot. */
  key: string
  availableKg: number
  /** Litres of juice per tonne of fruit. */
  juiceYieldLPerTonne: number
  brix: number
  /** Specific gravity (20/20 °C); from °Brix when the reading has none. */
  sg: number
  taGPerL: number | null
  tanninGPerL: number | null
  ph: number | null
  /** Fruit price plus haulage, minor units per tonne. */
  costPerTonneMinor: number
  varietyId: number | null
  juiceClass: JuiceClass | null
}

export interface ShareRule {
  varietyId?: number
  juiceClass?: JuiceClass
  /** Fractions of the blend's volume, 0–1. */
  min?: number
  max?: number
}

export interface SolverInput {
  target: BlendTargetRanges
  volumeL: number
  lots: SolverLot[]
  shares?: ShareRule[]
}

export interface BlendLine { key: string, kg: number, litres: number, share: number }

export interface BlendMiss { property: BlendProperty | 'volumeL', min: number, max: number, achieved: number }

export interface BindingRange {
  property: BlendProperty
  bound: 'min' | 'max'
  /** What moving the bound one unit outward saves (minor units per °Brix, per 0.001 SG, per g/L). */
  costPerUnit: number
}

export interface PredictedJuice {
  brix: number
  sg: number
  taGPerL: number | null
  tanninGPerL: number | null
  /** An estimate only: pH does not mix linearly. */
  phEstimate: number | null
}

export interface SolverResult {
  status: 'optimal' | 'nearest'
  lines: BlendLine[]
  predicted: PredictedJuice | null
  costMinor: number
  costPerLitreMinor: number
  misses: BlendMiss[]
  binding: BindingRange[]
  /** Lots left out of this solve because they lack a value a target range needs. */
  excluded?: ExcludedLot[]
}

export interface ExcludedLot { key: string, reason: string }

/** `POST /api/blends/solve`: a lot the maker may see, or a what-if lot typed in. */
export type BlendLotInput
  = | { lotId: number, juiceYieldLPerTonne?: number, haulagePerTonne?: number, pricePerTonne?: number }
    | { code: string, availableKg: number, brix: number, taGPerL: number, tanninGPerL: number, pricePerTonne: number, juiceYieldLPerTonne: number }

export interface BlendSolveRequest {
  target: BlendTargetRanges
  volumeL: number
  lots: BlendLotInput[]
  shares?: ShareRule[]
  /** How the predicted juice's potential alcohol is worked: a gravity method to a dry 1.000, or its sugar ÷ 16.83 g/L. */
  alcoholMethod?: PotentialAlcoholMethod
}

/** What a line of the answer shows of its lot beside the kg taken. */
interface LineLot { kg: number, litres: number, share: number, code: string, freeKg: number, pricePerTonne: number }

export interface BlendSolveResponse {
  status: 'optimal' | 'nearest'
  /** A real lot's line carries its lotId; a what-if lot's only its code. */
  lines: ((LineLot & { lotId: number }) | LineLot)[]
  predicted: { brix: number, sg: number, taGPerL: number | null, tanninGPerL: number | null, phEstimate: number | null, potentialAbv: number } | null
  cost: number
  costPerLitre: number
  currency: string
  misses: BlendMiss[]
  binding: BindingRange[]
  /** Lots left out of this solve, and why: under the reject floor, no reading, nothing free, pressed. */
  rejected: { lotId: number, code: string, reason: string }[]
}

/** A lot's latest juice reading as the planner uses it. */
export interface BlendLotReading {
  brix: number | null
  sg: number | null
  taGPerL: number | null
  tanninGPerL: number | null
  ph: number | null
  testedOn: string
}

/** `GET /api/blends/lots`: a lot the maker may blend, priced by its fruit contract's terms. */
export interface BlendCandidateLot {
  lotId: number
  code: string
  growerId: number
  growerName: string
  varietyId: number
  varietyName: string
  species: FruitSpecies
  /** The variety's published class, the class a lot is traded by. */
  juiceClass: JuiceClass
  state: Exclude<LotState, 'pressed'>
  harvestYear: number
  /** The grower's net kg until delivered, the weighed kg after, less what committed plans hold. */
  freeKg: number
  reading: BlendLotReading | null
  /** The fruit contract the lot is bought under (contracts are known by their number). */
  contractId: number
  /** The contract's base price adjusted for the reading's °Brix, minor units per tonne; null with no sugar reading. */
  pricePerTonne: number | null
  currency: string
  /** Under the contract's reject floor: left out of a solve unless a price is typed for it. */
  rejected: boolean
  rejectReason: string | null
  /** The maker's press yield from its settings; null when it has none set. */
  juiceYieldLPerTonne: number | null
}

export interface BlendTarget {
  id: number
  name: string
  ranges: BlendTargetRanges
  volumeL: number | null
  /** The pH the maker aims for, noted only. */
  phNote: string | null
  notes: string | null
  createdAt: string
  updatedAt: string
}
