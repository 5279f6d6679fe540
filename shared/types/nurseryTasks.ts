import type { PropagationStep, TreeType } from '../utils/backplan'

// The nursery's season calendar as its API answers: what must be done by when, from each tree
// contract's back-plan and the events recorded on its runs.

/** A back-plan step, or one of the run's jobs between them. */
export type TaskStep = PropagationStep | 'takeCounted' | 'shootsRemoved' | 'staked'

export interface NurseryTaskRun {
  id: number
  rowName: string
  fieldName: string
  fromPosition: number
  toPosition: number
}

export interface NurseryTaskContract {
  id: number
  buyerOrgName: string
  varietyName: string
  treeType: TreeType
}

export interface NurseryTask {
  /** Stable across reads: the contract or run and the step. */
  key: string
  step: TaskStep
  title: string
  /** YYYY-MM-DD, the day it must be done by. */
  due: string
  /** Done only by the matching event on the run (or, for delivery, the contract's delivery). */
  done: boolean
  /** YYYY-MM-DD, the day the event that did it happened; null while open. */
  doneOn: string | null
  /** Open and due before today. */
  overdue: boolean
  /** The run it is done on; null for the contract's own tasks (lining out, delivery). */
  run: NurseryTaskRun | null
  contract: NurseryTaskContract
}

export interface NurseryTaskList {
  items: NurseryTask[]
  total: number
}
