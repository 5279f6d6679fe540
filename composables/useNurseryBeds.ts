import type { BedCreateInput, BedPatchInput, BedRecordCreateInput } from '#shared/schemas/nursery'
import type { BedRecord, LinerLot, NurseryBed } from '#shared/types/nursery'

/** A rootstock as the nursery forms offer it. */
export interface NurseryRootstockOption { id: number, designation: string, species: 'apple' | 'pear', vigour: string }

// The reads a bed's save changes; a record of liners lifted changes the liner stock too.
const BED_LIST_KEYS = ['nursery-beds']
const LINER_KEYS = ['nursery-liners']

/** The organisation's beds. */
export function useNurseryBeds() {
  const { data, pending, error, refresh } = useFetch<{ items: NurseryBed[], total: number }>('/api/nursery/beds', { key: 'nursery-beds', query: { limit: 200 } })
  return { beds: computed(() => data.value?.items), total: computed(() => data.value?.total ?? 0), pending, error, refresh }
}

/** One bed. */
export function useNurseryBed(id: MaybeRefOrGetter<number>) {
  const { data: bed, pending, error, refresh } = useFetch<NurseryBed>(() => `/api/nursery/beds/${toValue(id)}`, { key: () => `nursery-bed-${toValue(id)}` })
  return { bed, pending, error, refresh }
}

/** A bed's yearly records, the latest first. */
export function useBedRecords(id: MaybeRefOrGetter<number>) {
  const key = () => `nursery-bed-records-${toValue(id)}`
  const { data, pending, error, refresh } = useFetch<{ items: BedRecord[], total: number }>(() => `/api/nursery/beds/${toValue(id)}/records`, { key, query: { limit: 200 } })
  return { records: computed(() => data.value?.items), pending, error, refresh }
}

/** Creates a bed or saves changes to one; a refusal is thrown for the form to show beside its fields. */
export function useBedSave() {
  const { save, pending } = useSave<NurseryBed>('/api/nursery/beds', { refreshes: BED_LIST_KEYS })
  return { save: (body: BedCreateInput | BedPatchInput, id?: number) => save(body, id), pending }
}

/** Adds a yearly record to a bed; liners lifted also come into the liner stock. */
export function useBedRecordSave(bedId: MaybeRefOrGetter<number>) {
  const pending = ref(false)
  async function save(body: BedRecordCreateInput): Promise<BedRecord & { linerLot: LinerLot | null }> {
    pending.value = true
    try {
      const saved = await $fetch<BedRecord & { linerLot: LinerLot | null }>(`/api/nursery/beds/${toValue(bedId)}/records`, { method: 'POST', body })
      await refreshNuxtData([`nursery-bed-records-${toValue(bedId)}`, ...LINER_KEYS])
      return saved
    }
    finally {
      pending.value = false
    }
  }
  return { save, pending }
}

/** The catalogue's rootstocks, for the nursery's forms. */
export function useNurseryRootstocks() {
  const { data, error } = useFetch<{ items: NurseryRootstockOption[], total: number }>('/api/rootstocks', { key: 'nursery-rootstocks', query: { limit: 200 } })
  return {
    rootstocks: computed(() => data.value?.items),
    error: computed(() => (error.value ? 'The rootstocks could not be loaded. Reload the page to try again.' : null)),
  }
}
