// Disease exposure from a suspect budwood lot. Fire blight has spread through a nursery on budwood
// that looked healthy, and to rootstocks budded after the infected wood the same day (Smith 2002,
// Acta Horticulturae 590:109): the knife carries it. So the runs exposed are every run budded or
// grafted with the lot, and every run the same person worked after it on the same day.

export interface WorkingEvent {
  id: number
  runId: number
  /** YYYY-MM-DD */
  happenedOn: string
  byUserId: number | null
  budwoodLotId: number | null
  /** The order the person worked runs that day, when recorded; else the order of recording. */
  dayOrder?: number | null
}

export interface Exposure {
  runId: number
  /** Worked with the suspect lot itself, or after it that day by the same hands. */
  reason: 'budded-with-lot' | 'budded-after-lot'
  /** The working events that expose it. */
  eventIds: number[]
}

const order = (e: WorkingEvent) => [e.dayOrder ?? Number.MAX_SAFE_INTEGER, e.id] as const

function later(a: WorkingEvent, b: WorkingEvent): boolean {
  const [ao, aid] = order(a)
  const [bo, bid] = order(b)
  if (a.dayOrder != null && b.dayOrder != null) return ao > bo
  return aid > bid
}

/** The runs exposed to `lotId`, each once, with the strongest reason (the lot itself before "after it"). */
export function exposedRuns(lotId: number, events: readonly WorkingEvent[]): Exposure[] {
  const withLot = events.filter(e => e.budwoodLotId === lotId)
  const found = new Map<number, Exposure>()
  const add = (e: WorkingEvent, reason: Exposure['reason']) => {
    const current = found.get(e.runId)
    if (!current) found.set(e.runId, { runId: e.runId, reason, eventIds: [e.id] })
    else {
      if (!current.eventIds.includes(e.id)) current.eventIds.push(e.id)
      if (reason === 'budded-with-lot') current.reason = reason
    }
  }
  for (const e of withLot) add(e, 'budded-with-lot')
  for (const suspect of withLot) {
    if (suspect.byUserId === null) continue
    for (const e of events) {
      if (e.id === suspect.id || e.happenedOn !== suspect.happenedOn || e.byUserId !== suspect.byUserId) continue
      if (later(e, suspect)) add(e, 'budded-after-lot')
    }
  }
  return [...found.values()].map(e => ({ ...e, eventIds: [...e.eventIds].sort((a, b) => a - b) })).sort((a, b) => a.runId - b.runId)
}
