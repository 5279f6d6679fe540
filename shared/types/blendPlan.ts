import type { BlendSolveRequest, BlendSolveResponse } from './blend'

// Blend plans, their pressings and the trace of fruit through them, as the API answers them: kg and
// litres, money in integer minor units of the maker's currency, dates as YYYY-MM-DD, times ISO UTC.

export const BLEND_PLAN_STATES = ['draft', 'committed', 'pressed', 'released'] as const
export type BlendPlanState = typeof BLEND_PLAN_STATES[number]
export type BlendPlanAction = 'edit' | 'delete' | 'commit' | 'release' | 'press'

/** A plan in a list: what it makes and what it costs, without its question and answer in full. */
export interface BlendPlanSummary {
  id: number
  name: string
  state: BlendPlanState
  status: BlendSolveResponse['status']
  volumeL: number
  cost: number
  currency: string
  lotCount: number
  version: number
  committedAt: string | null
  pressedAt: string | null
  createdAt: string
  updatedAt: string
}

/** The kilograms a plan holds (while committed) or held of one lot. */
export interface BlendPlanLot {
  lotId: number
  code: string
  growerName: string
  kg: number
  litres: number
  bins: number | null
  lotState: 'available' | 'delivered' | 'pressed'
}

export interface BlendPlanEvent {
  action: string
  fromState: BlendPlanState | null
  toState: BlendPlanState
  version: number
  byName: string | null
  at: string
}

export interface PressingLot {
  lotId: number
  code: string
  kg: number
  position: number
}

export interface Pressing {
  id: number
  planId: number
  planName: string
  pressedOn: string
  litresPressed: number
  vessel: string
  notes: string | null
  recordedByName: string | null
  lots: PressingLot[]
  createdAt: string
}

export interface BlendPlan extends BlendPlanSummary {
  request: BlendSolveRequest
  result: BlendSolveResponse
  notes: string | null
  /** The kg of each lot the commit reserved; empty for a draft. */
  lots: BlendPlanLot[]
  pressing: Pressing | null
  /** The moves the reader may make now, by the plan's move table. */
  moves: BlendPlanAction[]
  history: BlendPlanEvent[]
}

export interface BlendPlanList { items: BlendPlanSummary[], total: number }

/** `GET /api/pressings/{id}/trace`: where the fruit of a pressing came from, lot by lot. */
export interface PressingTrace {
  pressing: Pressing
  lots: {
    lotId: number
    code: string
    kg: number
    position: number
    pickedOn: string
    harvestYear: number
    variety: { id: number, name: string }
    grower: { id: number, name: string }
    block: { id: number, name: string } | null
    deliveries: { id: number, deliveredOn: string, ticketNo: string | null, netKg: number }[]
    labSheets: { id: number, name: string }[]
  }[]
}

/** `GET /api/lots/{id}/trace`: the plans and pressings a lot went into, as far as the reader may see. */
export interface LotTrace {
  lotId: number
  code: string
  /** `grower`: the lot's own grower, who sees only who pressed it and when. */
  view: 'maker' | 'grower'
  /** Each plan that held or took some of the lot, with the kg its commit held (0 when it held none). */
  plans: { id: number, name: string, state: BlendPlanState, kg: number }[]
  pressings: { id: number | null, planId: number | null, makerName: string, pressedOn: string, kg: number, vessel: string | null, litresPressed: number | null }[]
}
