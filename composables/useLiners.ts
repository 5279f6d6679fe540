import type { LinerLotCreateInput } from '#shared/schemas/nursery'
import type { LinerLot, LinerStockRow } from '#shared/types/nursery'

/** Liner stock per rootstock and grade, and the lots behind it (the latest 200). */
export function useLiners() {
  const { data, pending, error, refresh } = useFetch<{ items: LinerStockRow[], total: number, lots: LinerLot[], lotsTotal: number }>('/api/nursery/liners', { key: 'nursery-liners', query: { limit: 200 } })
  return {
    stock: computed(() => data.value?.items),
    lots: computed(() => data.value?.lots),
    lotsTotal: computed(() => data.value?.lotsTotal ?? 0),
    pending,
    error,
    refresh,
  }
}

/** Records a lot bought in; a refusal is thrown for the form to show beside its fields. */
export function useLinerLotSave() {
  const { save, pending } = useSave<LinerLot>('/api/nursery/liners', { refreshes: ['nursery-liners'] })
  return { save: (body: LinerLotCreateInput) => save(body), pending }
}
