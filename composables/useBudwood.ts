import type { BudwoodClearInput, BudwoodCreateInput, BudwoodSuspectInput } from '#shared/schemas/nursery'
import type { BudwoodLot, ExposureReport } from '#shared/types/nursery'

/** The nursery's budwood lots, the latest cut first. */
export function useBudwood() {
  const { data, pending, error, refresh } = useFetch<{ items: BudwoodLot[], total: number }>('/api/nursery/budwood', { key: 'nursery-budwood', query: { limit: 200 } })
  return { lots: computed(() => data.value?.items), total: computed(() => data.value?.total ?? 0), pending, error, refresh }
}

/** Records a lot of budwood; a refusal is thrown for the form to show beside its fields. */
export function useBudwoodSave() {
  const { save, pending } = useSave<BudwoodLot>('/api/nursery/budwood', { refreshes: ['nursery-budwood'] })
  return { save: (body: BudwoodCreateInput) => save(body), pending }
}

/** The varieties and the organisation's own blocks, for the budwood form's choices. */
export function useBudwoodChoices() {
  const varieties = useFetch<{ items: { id: number, name: string, species: 'apple' | 'pear' }[], total: number }>('/api/varieties', { key: 'budwood-varieties', query: { limit: 200 } })
  const blocks = useFetch<{ items: { id: number, name: string, varietyId: number, varietyName: string }[], total: number }>('/api/blocks', { key: 'budwood-blocks', query: { limit: 200 } })
  return {
    varieties: computed(() => varieties.data.value?.items),
    blocks: computed(() => blocks.data.value?.items),
    error: computed(() => (varieties.error.value || blocks.error.value ? 'The varieties or blocks could not be loaded. Reload the page to try again.' : null)),
  }
}

const lotKey = (id: number) => `nursery-budwood-${id}`
const exposureKey = (id: number) => `nursery-budwood-exposure-${id}`

/** One lot of budwood with its suspect state, and the runs it may have carried disease to. */
export function useBudwoodLot(id: MaybeRefOrGetter<number>) {
  const lot = useFetch<BudwoodLot>(() => `/api/nursery/budwood/${toValue(id)}`, { key: () => lotKey(toValue(id)) })
  const exposure = useFetch<ExposureReport>(() => `/api/nursery/budwood/${toValue(id)}/exposure`, { key: () => exposureKey(toValue(id)) })
  return {
    lot: lot.data,
    error: lot.error,
    exposure: exposure.data,
    exposureError: exposure.error,
  }
}

/** Marking a lot suspect and clearing it; a refusal is thrown for the form to show beside its fields. */
export function useBudwoodSuspectMoves(id: MaybeRefOrGetter<number>) {
  const pending = ref(false)
  async function move(action: 'suspect' | 'clear', body: BudwoodSuspectInput | BudwoodClearInput): Promise<BudwoodLot> {
    pending.value = true
    try {
      const lot = await $fetch<BudwoodLot>(`/api/nursery/budwood/${toValue(id)}/${action}`, { method: 'POST', body })
      await refreshNuxtData([lotKey(toValue(id)), exposureKey(toValue(id)), 'nursery-budwood'])
      return lot
    }
    finally {
      pending.value = false
    }
  }
  return {
    pending,
    markSuspect: (body: BudwoodSuspectInput) => move('suspect', body),
    clear: (body: BudwoodClearInput) => move('clear', body),
  }
}

/** Where a lot came from, in words: the block (and tree or row), the tree, or the supplier. */
export function budwoodSourceText(lot: BudwoodLot): string {
  if (lot.sourceKind === 'own-block') return [lot.blockName ?? 'A block since removed', lot.sourceNote].filter(Boolean).join(': ')
  if (lot.sourceKind === 'own-tree') return lot.sourceNote ?? ''
  return [lot.supplier, lot.sourceNote].filter(Boolean).join(': ')
}
