import type { BedKind, BedRecordKind, DugGrade, EventKind, LinerGrade } from '../schemas/nursery'
import type { RunCounts } from '../utils/runCounts'

// The nursery as its API answers: beds, liner stock, budwood lots, rows and runs with their events.

export interface NurseryBed {
  id: number
  name: string
  kind: BedKind
  rootstockId: number | null
  rootstockDesignation: string | null
  motherPlants: number | null
  yearEstablished: number | null
  seedSource: string | null
  notes: string | null
  createdAt: string
  updatedAt: string
}

export interface BedRecord {
  id: number
  bedId: number
  kind: BedRecordKind
  doneOn: string
  count: number | null
  grade: LinerGrade | null
  hormone: string | null
  hormoneStrength: string | null
  notes: string | null
  byUserId: number | null
  createdAt: string
}

/** What the nursery has to line out, per rootstock and grade. */
export interface LinerStockRow {
  rootstockId: number
  rootstockDesignation: string
  grade: LinerGrade
  lifted: number
  bought: number
  linedOut: number
  inStock: number
}

export interface LinerLot {
  id: number
  rootstockId: number
  rootstockDesignation: string
  grade: LinerGrade
  source: 'lifted' | 'bought'
  bedRecordId: number | null
  supplier: string | null
  certificate: string | null
  count: number
  receivedOn: string
  notes: string | null
}

export interface BudwoodLot {
  id: number
  label: string
  varietyId: number
  varietyName: string
  cutOn: string
  sourceKind: 'own-block' | 'own-tree' | 'bought'
  blockId: number | null
  blockName: string | null
  sourceNote: string | null
  supplier: string | null
  certificate: string | null
  sticks: number
  notes: string | null
  /** When disease is suspected in the wood; it stays on record when cleared. Null if never marked. */
  suspect: BudwoodSuspect | null
}

export interface BudwoodSuspect {
  /** YYYY-MM-DD, the day it was suspected. */
  on: string
  reason: string
  byName: string | null
  /** ISO time it was marked. */
  markedAt: string
  /** ISO time it was cleared; null while it is still suspect. */
  clearedAt: string | null
  clearedReason: string | null
}

/** A working event (budding, grafting, interstem budding) that puts a run on a lot's exposure list. */
export interface ExposureEvent {
  id: number
  kind: 'budded' | 'grafted' | 'interstem-budded'
  happenedOn: string
  byName: string
  dayOrder: number | null
  count: number | null
  budwoodLotId: number | null
  budwoodLabel: string | null
}

export interface ExposureItem {
  run: Pick<NurseryRun, 'id' | 'rowName' | 'fieldName' | 'fromPosition' | 'toPosition' | 'varietyName' | 'rootstockDesignation'> & {
    counts: Pick<RunCounts, 'standing' | 'worked' | 'dug'>
  }
  reason: 'budded-with-lot' | 'budded-after-lot'
  events: ExposureEvent[]
  contract: { id: number, buyerOrgName: string } | null
}

/** Every run a budwood lot may have carried disease to: worked with it, or after it that day by the same hands. */
export interface ExposureReport {
  lot: BudwoodLot
  items: ExposureItem[]
  totals: { runs: number, standing: number, contracts: number }
}

export interface NurseryRow {
  id: number
  fieldId: number
  fieldName: string
  name: string
  positions: number
  spacingCm: number | null
  notes: string | null
}

export type RunWarningCode = 'contract-variety' | 'contract-rootstock' | 'budded-variety' | 'stale-tag' | 'no-budwood-lot' | 'suspect-budwood'
export interface RunWarning { code: RunWarningCode, message: string }

export interface NurseryRun {
  id: number
  rowId: number
  rowName: string
  fieldName: string
  fromPosition: number
  toPosition: number
  rootstockId: number
  rootstockDesignation: string
  /** Dwarfing stocks need a stake or wire; taller ones stand alone. */
  rootstockNeedsSupport: boolean
  interstem: string | null
  linerGrade: LinerGrade | null
  linedOutOn: string
  linedOutCount: number
  varietyId: number
  varietyName: string
  treeContractId: number | null
  /** The contract it serves, as far as the run needs it. */
  contract: { id: number, buyerOrgName: string, varietyId: number, rootstockId: number, treeCount: number, takeRate: number, survivalRate: number, state: string } | null
  tagCode: string
  tagPrintedAt: string | null
  identityChangedAt: string
  notes: string | null
  counts: RunCounts
  expected: { trees: number, formula: string } | null
  warnings: RunWarning[]
  createdAt: string
  updatedAt: string
}

export interface PropagationEvent {
  id: number
  runId: number
  kind: EventKind
  happenedOn: string
  count: number | null
  cause: string | null
  method: string | null
  varietyId: number | null
  varietyName: string | null
  budwoodLotId: number | null
  budwoodLabel: string | null
  budHeightCm: number | null
  dayOrder: number | null
  passNo: number | null
  grades: DugGrade[] | null
  notes: string | null
  byUserId: number | null
  byName: string
  clientKey: string | null
  createdAt: string
}

export interface RunTag { code: string, url: string, qrSvg: string }
