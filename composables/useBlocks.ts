import type { BlockCreateInput } from '#shared/schemas/block'
import type { BlockList, OrchardBlockDetail, OrganisationForecast } from '#shared/types/block'
import type { JuiceClass } from '#shared/utils/juiceClass'

export interface VarietyOption { id: number, name: string, species: 'apple' | 'pear', juiceClass: JuiceClass }
export interface RootstockOption { id: number, designation: string, species: 'apple' | 'pear', vigour: string, inRowM: number | null, betweenRowM: number | null }

// The reads a block's save or delete changes.
const BLOCK_LIST_KEYS = ['blocks', 'blocks-forecast']

/** The organisation's blocks with their totals. */
export function useBlocks() {
  const { data, pending, error, refresh } = useFetch<BlockList>('/api/blocks', { key: 'blocks', query: { limit: 200 } })
  return {
    blocks: computed(() => data.value?.items),
    totals: computed(() => data.value?.totals),
    pending,
    error,
    refresh,
  }
}

/** The organisation's forecast crop by juice class. */
export function useBlocksForecast() {
  const { data: forecast, pending, error, refresh } = useFetch<OrganisationForecast>('/api/blocks/forecast', { key: 'blocks-forecast' })
  return { forecast, pending, error, refresh }
}

/** One block with its forecast, and deleting it. */
export function useBlock(id: MaybeRefOrGetter<number>) {
  const { data: block, pending, error, refresh } = useFetch<OrchardBlockDetail>(() => `/api/blocks/${toValue(id)}`, { key: () => `block-${toValue(id)}` })
  const { remove, removing, removeError } = useDelete(() => `/api/blocks/${toValue(id)}`, 'The block could not be deleted. Try again.', { refreshes: BLOCK_LIST_KEYS })
  return { block, pending, error, refresh, remove, removing, removeError }
}

/** Creates a block, or saves changes to one; a refusal is thrown for the form to show beside its fields. */
export function useBlockSave() {
  const { save, pending } = useSave<OrchardBlockDetail>('/api/blocks', { refreshes: BLOCK_LIST_KEYS })
  return { save: (body: BlockCreateInput, id?: number) => save(body, id), pending }
}

/** The catalogue's varieties and rootstocks, for the block form's choices. */
export function useBlockChoices() {
  const varieties = useFetch<{ items: VarietyOption[], total: number }>('/api/varieties', { key: 'block-choices-varieties', query: { limit: 200 } })
  const rootstocks = useFetch<{ items: RootstockOption[], total: number }>('/api/rootstocks', { key: 'block-choices-rootstocks', query: { limit: 200 } })
  const error = computed(() => (varieties.error.value || rootstocks.error.value) ? 'The catalogue could not be loaded. Reload the page to try again.' : null)
  return {
    varieties: computed(() => varieties.data.value?.items),
    rootstocks: computed(() => rootstocks.data.value?.items),
    pending: computed(() => varieties.pending.value || rootstocks.pending.value),
    error,
  }
}
