import type { LotCreateInput, ReadingCreateInput } from '#shared/schemas/lot'
import type { HarvestLot, JuiceReading } from '#shared/types/lot'
import type { JuiceClass } from '#shared/utils/juiceClass'

export interface LotList { items: HarvestLot[], total: number, totals: { lots: number, netKg: number } }
export interface LotFilters { varietyId: string, juiceClass: string, blockId: string, state: string, harvestYear: string, q: string }
export interface LotVarietyOption { id: number, name: string, species: 'apple' | 'pear', juiceClass: JuiceClass }
export interface LotBlockOption { id: number, name: string, varietyId: number, varietyName: string }

// The reads a lot's save, delete or new reading changes.
const LOT_LIST_KEYS = ['lots']

/** The lots the organisation may see, by the filters given (blank filters are left out). */
export function useLots(filters: MaybeRefOrGetter<LotFilters>) {
  const query = computed(() => ({ limit: 200, ...Object.fromEntries(Object.entries(toValue(filters)).filter(([, v]) => v !== '')) }))
  const { data, pending, error, refresh } = useFetch<LotList>('/api/lots', { key: 'lots', query })
  return { lots: computed(() => data.value?.items), totals: computed(() => data.value?.totals), pending, error, refresh }
}

/** One lot with its latest reading, and deleting it. */
export function useLot(id: MaybeRefOrGetter<number>) {
  const { data: lot, pending, error, refresh } = useFetch<HarvestLot>(() => `/api/lots/${toValue(id)}`, { key: () => `lot-${toValue(id)}` })
  const { remove, removing, removeError } = useDelete(() => `/api/lots/${toValue(id)}`, 'The lot could not be deleted. Try again.', { refreshes: LOT_LIST_KEYS })
  return { lot, pending, error, refresh, remove, removing, removeError }
}

/** A lot's readings, newest first. */
export function useLotReadings(id: MaybeRefOrGetter<number>) {
  const { data, pending, error, refresh } = useFetch<{ items: JuiceReading[], total: number }>(() => `/api/lots/${toValue(id)}/readings`, { key: () => `lot-readings-${toValue(id)}`, query: { limit: 200 } })
  return { readings: computed(() => data.value?.items), pending, error, refresh }
}

/** Records a lot, or saves changes to one; a refusal is thrown for the form to show beside its fields. */
export function useLotSave() {
  const { save, pending } = useSave<HarvestLot>('/api/lots', { refreshes: LOT_LIST_KEYS })
  return { save: (body: Partial<LotCreateInput>, id?: number) => save(body, id), pending }
}

/** Adds a reading typed by hand to a lot; a refusal is thrown for the form to show. */
export function useLotReadingAdd(lotId: MaybeRefOrGetter<number>) {
  const pending = ref(false)
  async function add(body: ReadingCreateInput): Promise<JuiceReading> {
    pending.value = true
    try {
      const reading = await $fetch<JuiceReading>(`/api/lots/${toValue(lotId)}/readings`, { method: 'POST', body })
      await refreshNuxtData([`lot-${toValue(lotId)}`, `lot-readings-${toValue(lotId)}`, ...LOT_LIST_KEYS])
      return reading
    }
    finally {
      pending.value = false
    }
  }
  return { add, pending }
}

/** The catalogue's varieties, and the organisation's blocks when it has any (a maker has none). */
export function useLotChoices(withBlocks: MaybeRefOrGetter<boolean>) {
  const varieties = useFetch<{ items: LotVarietyOption[] }>('/api/varieties', { key: 'lot-choices-varieties', query: { limit: 200 } })
  const blocks = useFetch<{ items: LotBlockOption[] }>('/api/blocks', { key: 'lot-choices-blocks', query: { limit: 200 }, immediate: toValue(withBlocks) })
  return {
    varieties: computed(() => varieties.data.value?.items ?? []),
    blocks: computed(() => (toValue(withBlocks) ? blocks.data.value?.items ?? [] : [])),
    error: computed(() => varieties.error.value ? 'The catalogue could not be loaded. Reload the page to try again.' : null),
  }
}
