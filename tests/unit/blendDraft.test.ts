import { createPinia, setActivePinia } from 'pinia'
import { afterEach, beforeEach, describe, expect, it } from 'vitest'
import { BLEND_DRAFT_STORAGE_KEY, draftRequest, emptyDraft, readStoredDraft, useBlendDraftStore } from '../../stores/blendDraft'

// The browser's localStorage, as a Map: node has none.
class MemoryStorage implements Storage {
  private items = new Map<string, string>()
  get length() { return this.items.size }
  clear() { this.items.clear() }
  getItem(key: string) { return this.items.get(key) ?? null }
  key(i: number) { return [...this.items.keys()][i] ?? null }
  removeItem(key: string) { this.items.delete(key) }
  setItem(key: string, value: string) { this.items.set(key, String(value)) }
}

const globals = globalThis as { localStorage?: Storage }

beforeEach(() => {
  globals.localStorage = new MemoryStorage()
  setActivePinia(createPinia())
})
afterEach(() => {
  delete globals.localStorage
})

/** A fresh page load: a new Pinia, the same browser storage. */
function reload() {
  setActivePinia(createPinia())
  return useBlendDraftStore()
}

describe('the blend draft kept in the browser', () => {
  it('comes back after a reload with the target, lots, overrides, what-ifs, shares and the last answer', () => {
    const store = useBlendDraftStore()
    store.restore('7')
    store.draft.targetId = 3
    store.draft.ranges.sg = { min: 1.05, max: 1.056 }
    store.draft.ranges.taGPerL = { min: 5, max: null }
    store.draft.volumeL = 8000
    store.draft.lots.push({ lotId: 11, code: 'HM-26-011', juiceClass: 'bittersweet', brix: 12.4, sg: 1.05, taGPerL: 3.2, juiceYieldLPerTonne: 700, haulagePerTonne: 1500, pricePerTonne: null })
    store.draft.whatIfs.push({ code: 'WHAT-IF-1', availableKg: 2000, brix: 12, taGPerL: 6, tanninGPerL: 2, pricePerTonne: 30000, juiceYieldLPerTonne: 720 })
    store.draft.shares.push({ varietyId: null, juiceClass: 'bittersharp', minPct: null, maxPct: 40 })
    store.draft.alcoholMethod = 'hall'

    const again = reload()
    expect(again.draft.targetId).toBeNull() // nothing is read until the page says whose draft it is
    again.restore('7')
    expect(again.draft.targetId).toBe(3)
    expect(again.draft.ranges.sg).toEqual({ min: 1.05, max: 1.056 })
    expect(again.draft.ranges.taGPerL).toEqual({ min: 5, max: null })
    expect(again.draft.ranges.brix).toEqual({ min: null, max: null })
    expect(again.draft.volumeL).toBe(8000)
    expect(again.draft.lots).toEqual([{ lotId: 11, code: 'HM-26-011', juiceClass: 'bittersweet', brix: 12.4, sg: 1.05, taGPerL: 3.2, juiceYieldLPerTonne: 700, haulagePerTonne: 1500, pricePerTonne: null }])
    expect(again.draft.whatIfs[0]!.code).toBe('WHAT-IF-1')
    expect(again.draft.shares).toEqual([{ varietyId: null, juiceClass: 'bittersharp', minPct: null, maxPct: 40 }])
    expect(again.draft.alcoholMethod).toBe('hall')
  })

  it('is not restored for another person signed in on the same browser', () => {
    const store = useBlendDraftStore()
    store.restore('7')
    store.draft.volumeL = 8000
    const other = reload()
    other.restore('8')
    expect(other.draft).toEqual(emptyDraft())
  })

  it('starts again empty once cleared, and stays empty after a reload', () => {
    const store = useBlendDraftStore()
    store.restore('7')
    store.draft.volumeL = 8000
    store.draft.lots.push({ lotId: 11, code: 'HM-26-011', juiceClass: 'bittersweet', brix: 12.4, sg: 1.05, taGPerL: 3.2, juiceYieldLPerTonne: null, haulagePerTonne: null, pricePerTonne: null })
    store.clear()
    expect(store.draft).toEqual(emptyDraft())
    expect(localStorage.getItem(BLEND_DRAFT_STORAGE_KEY)).toBeNull()
    const again = reload()
    again.restore('7')
    expect(again.draft).toEqual(emptyDraft())
  })

  it('ignores a damaged or foreign entry instead of failing the page', () => {
    expect(readStoredDraft('{not json', '7')).toBeNull()
    expect(readStoredDraft(JSON.stringify({ owner: '7', draft: { lots: 'x' } }), '7')).toBeNull()
    expect(readStoredDraft(JSON.stringify([1, 2]), '7')).toBeNull()
    expect(readStoredDraft(null, '7')).toBeNull()
  })
})

describe('the request a draft asks', () => {
  it('sends only the overrides typed, what-if lots as typed, shares as fractions and open sides at the property\'s widest', () => {
    const draft = emptyDraft()
    draft.ranges.sg = { min: 1.05, max: 1.056 }
    draft.ranges.tanninGPerL = { min: null, max: 2.4 }
    draft.volumeL = 8000
    draft.lots = [
      { lotId: 11, code: 'HM-26-011', juiceClass: 'bittersweet', brix: 12.4, sg: 1.05, taGPerL: 3.2, juiceYieldLPerTonne: null, haulagePerTonne: 1500, pricePerTonne: null },
      { lotId: 12, code: 'TR-26-004', juiceClass: 'bittersharp', brix: 9.3, sg: null, taGPerL: 7, juiceYieldLPerTonne: null, haulagePerTonne: null, pricePerTonne: 9000 },
    ]
    draft.whatIfs = [{ code: 'WHAT-IF-1', availableKg: 2000, brix: 12, taGPerL: 6, tanninGPerL: 2, pricePerTonne: 30000, juiceYieldLPerTonne: 720 }]
    draft.shares = [{ varietyId: 4, juiceClass: null, minPct: 10, maxPct: null }]
    expect(draftRequest(draft)).toEqual({
      // tannin 0 g/L is the open side's floor (shared/utils/blendDisplay.ts).
      target: { sg: { min: 1.05, max: 1.056 }, tanninGPerL: { min: 0, max: 2.4 } },
      volumeL: 8000,
      lots: [
        { lotId: 11, haulagePerTonne: 1500 },
        { lotId: 12, pricePerTonne: 9000 },
        { code: 'WHAT-IF-1', availableKg: 2000, brix: 12, taGPerL: 6, tanninGPerL: 2, pricePerTonne: 30000, juiceYieldLPerTonne: 720 },
      ],
      shares: [{ varietyId: 4, min: 0.1 }],
      alcoholMethod: 'gravity-drop',
    })
  })
})
