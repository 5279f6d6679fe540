import type { DugGrade } from '../schemas/nursery'
import type { BackPlanStep, PropagationStep } from '../utils/backplan'
import type { RunCounts } from '../utils/runCounts'

// How a tree contract's trees are coming on, as both parties read it: the counts and dates of each
// step summed over the runs that serve the contract, what stands, the take, the trees expected
// against the trees contracted, and the next step the back-plan dates.

/** One event of a run, as far as the progress needs it (a PropagationEvent fits). */
export interface ProgressEvent {
  id: number
  kind: string
  happenedOn: string
  count: number | null
  cause?: string | null
  grades?: DugGrade[] | null
}

/** A run serving the contract, with its events. */
export interface ProgressRunInput {
  id: number
  rowName: string
  fieldName: string
  fromPosition: number
  toPosition: number
  linedOutOn: string
  linedOutCount: number
  events: ProgressEvent[]
}

/** The contract's own figures the progress is measured against. */
export interface ProgressContractInput {
  treeCount: number
  takeRate: number
  survivalRate: number
  state: string
  deliveredCount: number | null
  deliveredOn: string | null
  steps: BackPlanStep[]
}

/** A count and the days it was reached on, first and last (null while nothing is counted). */
export interface ProgressTally {
  count: number
  firstOn: string | null
  lastOn: string | null
}

/** Trees dug of one grade, summed over the runs. */
export interface ProgressDugGrade {
  caliperMm: number
  heightCm: number | null
  feathered: boolean
  count: number
}

export interface ProgressStages {
  /** Liners lined out, on the days the runs were lined out. */
  linedOut: ProgressTally
  /** Buds or grafts put on with the variety. */
  worked: ProgressTally
  /** What took, by each run's last take count, on the days takes were counted. */
  taken: ProgressTally & { runs: number }
  /** The trees standing on each run when it was headed back above the variety's bud. */
  headedBack: ProgressTally & { runs: number }
  /** What stands now, as of the last day anything was recorded. */
  standing: { count: number, asOf: string | null }
  dug: ProgressTally & { grades: ProgressDugGrade[] }
  delivered: ProgressTally
}

/** One step of the back-plan, as far as the runs have done it. */
export interface ProgressStep {
  step: PropagationStep
  /** The back-plan's latest date for it. */
  by: string
  /** Runs that have done it, of `runs`. */
  runsDone: number
  runs: number
  /** Every run has done it (for `delivered`: the delivery is recorded). */
  done: boolean
  /** The first and last day a run did it. */
  firstOn: string | null
  lastOn: string | null
  /** How many the step counted: liners, buds, trees headed back, dug or delivered. */
  count: number
}

export interface ProgressRun {
  id: number
  rowName: string
  fieldName: string
  fromPosition: number
  toPosition: number
  linedOutOn: string
  counts: RunCounts
  /** Finished trees expected from the run. */
  expected: number
}

export interface ContractProgress {
  stages: ProgressStages
  steps: ProgressStep[]
  /** Taken ÷ worked over the runs whose take is counted; null before any is. */
  takeRate: number | null
  expected: {
    /** Sum of each run's expected finished trees. */
    trees: number
    contracted: number
    /** How many fewer than contracted are expected; 0 when enough are. */
    shortfall: number
  }
  /** The first step of the back-plan not yet done, with its date; null once delivered (or ended). */
  nextStep: { step: PropagationStep, by: string, runsDone: number, runs: number, late: boolean } | null
  runs: ProgressRun[]
}
