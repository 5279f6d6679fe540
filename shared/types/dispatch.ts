import type { TreeContractState } from '../utils/contractStatus'
import type { LabelGrade, PassportFields, PassportSpecies } from '../utils/plantPassport'

/** One bundle's label: what the trees are, where they grew, who they go to, and their passport. */
export interface DispatchLabel {
  /** The bundle's traceability code (the passport's C), unique to the bundle. */
  code: string
  /** The bundle's number within its run. */
  bundleNo: number
  runId: number
  fieldName: string
  rowName: string
  fromPosition: number
  toPosition: number
  /** The variety the trees were budded or grafted with (the run's own where none is recorded). */
  varietyName: string
  species: PassportSpecies
  rootstockDesignation: string
  interstem: string | null
  /** Trees in the bundle. */
  count: number
  grade: LabelGrade
  gradeWords: string
  /** Thinner than the contract's least caliper. */
  underCaliper: boolean
  dugOn: string
  contractId: number
  buyerName: string
  /** "spring 2027" */
  delivery: string
  /** Null where the nursery has no plant-health registration (see the sheet's passportNote). */
  passport: PassportFields | null
}

export interface DispatchGradeTotal { gradeWords: string, underCaliper: boolean, trees: number, bundles: number }

export interface DispatchLabelSheet {
  contract: {
    id: number
    state: TreeContractState
    buyerName: string
    nurseryName: string
    varietyName: string
    rootstockDesignation: string
    interstem: string | null
    treeCount: number
    minCaliperMm: number | null
    delivery: string
  }
  bundleSize: number
  /** The one run asked for, or null for all the contract's runs. */
  runId: number | null
  /** The contract's runs, for choosing one. */
  runs: { id: number, fieldName: string, rowName: string, fromPosition: number, toPosition: number }[]
  /** Why the labels carry no plant passport; null when they do. */
  passportNote: string | null
  /** Things the nursery should know before tying the labels on. */
  warnings: string[]
  labels: DispatchLabel[]
  totals: { trees: number, bundles: number, grades: DispatchGradeTotal[] }
}
