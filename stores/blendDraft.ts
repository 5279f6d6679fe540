import { defineStore } from 'pinia'
import { ref, watch } from 'vue'
import { BLEND_PROPERTIES, type BlendProperty, type BlendSolveRequest, type BlendSolveResponse, type BlendTargetRanges } from '#shared/types/blend'
import type { JuiceClass } from '#shared/utils/juiceClass'
import type { PotentialAlcoholMethod } from '#shared/utils/alcohol'
import { rangeFromTyped } from '#shared/utils/blendDisplay'

// The blend the maker is working on: the target, the lots chosen with their overrides, what-if lots,
// share rules, the alcohol method and the last answer. It is kept in the browser's localStorage, so a
// reload (or coming back to the page later) finds it as it was; it belongs to the person who made it.

/** A range as typed: either side may be left empty. */
export interface TypedRange { min: number | null, max: number | null }

/** A lot the maker may see, chosen for the blend, with what the maker typed over its own figures. */
export interface DraftLot {
  lotId: number
  code: string
  /** The lot's facts when it was chosen, for the answer's composition and cross-check: never sent. */
  juiceClass: JuiceClass | null
  brix: number | null
  sg: number | null
  taGPerL: number | null
  /** L per tonne; null keeps the organisation's press yield. */
  juiceYieldLPerTonne: number | null
  /** Minor units per tonne; null for none. */
  haulagePerTonne: number | null
  /** Minor units per tonne: the only way a rejected lot is included. */
  pricePerTonne: number | null
}

export interface DraftWhatIf {
  code: string
  availableKg: number
  brix: number
  taGPerL: number
  tanninGPerL: number
  pricePerTonne: number
  juiceYieldLPerTonne: number
}

export interface DraftShare {
  varietyId: number | null
  juiceClass: JuiceClass | null
  /** Percent of the blend's volume, 0–100. */
  minPct: number | null
  maxPct: number | null
}

export interface BlendDraft {
  /** The saved target the ranges came from, if one was picked. */
  targetId: number | null
  ranges: Record<BlendProperty, TypedRange>
  volumeL: number | null
  lots: DraftLot[]
  whatIfs: DraftWhatIf[]
  shares: DraftShare[]
  alcoholMethod: PotentialAlcoholMethod
  /** The last solve: what was asked and what came back, shown until the next. */
  solved: { request: BlendSolveRequest, response: BlendSolveResponse, loosened?: BlendLoosening } | null
}

/** A solve that followed loosening a binding range: what the range was moved to, and what it was said to save. */
export interface BlendLoosening {
  property: BlendProperty
  bound: 'min' | 'max'
  to: number
  /** Minor units the one step was said to save, and the cost before it. */
  saidMinor: number
  costBefore: number
}

export const BLEND_DRAFT_STORAGE_KEY = 'pomewright.blend-draft.v1'

export function emptyDraft(): BlendDraft {
  return {
    targetId: null,
    ranges: Object.fromEntries(BLEND_PROPERTIES.map(p => [p, { min: null, max: null }])) as Record<BlendProperty, TypedRange>,
    volumeL: null,
    lots: [],
    whatIfs: [],
    shares: [],
    alcoholMethod: 'gravity-drop',
    solved: null,
  }
}

/** The typed ranges as the solver takes them (a side left empty stops at the property's widest). */
export function draftRanges(draft: Pick<BlendDraft, 'ranges'>): BlendTargetRanges {
  const ranges: BlendTargetRanges = {}
  for (const p of BLEND_PROPERTIES) {
    const range = rangeFromTyped(p, draft.ranges[p].min, draft.ranges[p].max)
    if (range) ranges[p] = range
  }
  return ranges
}

/** The request a draft asks: overrides only where typed, shares as fractions. */
export function draftRequest(draft: BlendDraft): BlendSolveRequest {
  // Only what was typed: a side or an override left empty is not sent.
  const defined = <T extends object>(o: T) => Object.fromEntries(Object.entries(o).filter(([, v]) => v !== null && v !== undefined)) as T
  return {
    target: draftRanges(draft),
    volumeL: draft.volumeL ?? 0,
    lots: [
      ...draft.lots.map(l => defined({ lotId: l.lotId, juiceYieldLPerTonne: l.juiceYieldLPerTonne ?? undefined, haulagePerTonne: l.haulagePerTonne ?? undefined, pricePerTonne: l.pricePerTonne ?? undefined })),
      ...draft.whatIfs.map(w => ({ ...w })),
    ],
    shares: draft.shares.length
      ? draft.shares.map(s => defined({
          varietyId: s.varietyId ?? undefined,
          juiceClass: s.juiceClass ?? undefined,
          min: s.minPct === null ? undefined : s.minPct / 100,
          max: s.maxPct === null ? undefined : s.maxPct / 100,
        }))
      : undefined,
    alcoholMethod: draft.alcoholMethod,
  }
}

interface Stored { owner: string, draft: BlendDraft }

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v)

/**
 * The draft kept for this person, or null: a draft of someone else signed in on the same browser,
 * or one damaged or of an older shape, is not restored. Missing parts are filled from an empty draft.
 */
export function readStoredDraft(raw: string | null, owner: string): BlendDraft | null {
  if (!raw) return null
  let stored: unknown
  try {
    stored = JSON.parse(raw)
  }
  catch {
    return null
  }
  if (!isObject(stored) || stored.owner !== owner || !isObject(stored.draft)) return null
  const d = stored.draft
  const empty = emptyDraft()
  if (!isObject(d.ranges) || !Array.isArray(d.lots) || !Array.isArray(d.whatIfs) || !Array.isArray(d.shares)) return null
  return {
    ...empty,
    ...d,
    ranges: { ...empty.ranges, ...(d.ranges as BlendDraft['ranges']) },
  } as BlendDraft
}

/** Where the draft is kept: the browser's localStorage, or nowhere (the server's render). */
function storage(): Storage | null {
  if (import.meta.server || typeof localStorage === 'undefined') return null
  return localStorage
}

export const useBlendDraftStore = defineStore('blendDraft', () => {
  const draft = ref<BlendDraft>(emptyDraft())
  /** Whose draft this is (their user id); nothing is kept until the page says who. */
  const owner = ref<string | null>(null)

  function persist() {
    const store = storage()
    if (!store || owner.value === null) return
    try {
      store.setItem(BLEND_DRAFT_STORAGE_KEY, JSON.stringify({ owner: owner.value, draft: draft.value } satisfies Stored))
    }
    catch {
      // A full or blocked storage leaves the draft in the page only; the blend still solves.
    }
  }

  /** Takes up the draft kept for this person, if any; from then on every change is kept. */
  function restore(forOwner: string) {
    owner.value = forOwner
    const kept = readStoredDraft(storage()?.getItem(BLEND_DRAFT_STORAGE_KEY) ?? null, forOwner)
    draft.value = kept ?? emptyDraft()
  }

  /** Starts again from an empty draft, and forgets the kept one. */
  function clear() {
    draft.value = emptyDraft()
    storage()?.removeItem(BLEND_DRAFT_STORAGE_KEY)
  }

  watch(draft, persist, { deep: true, flush: 'sync' })

  return { draft, owner, restore, clear }
})
