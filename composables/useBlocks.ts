import type { BlockCreateInput } from '#shared/schemas/block'
import type { BlockList, OrchardBlockDetail, OrganisationForecast } from '#shared/types/block'
import type { JuiceClass } from '#shared/utils/juiceClass'

export interface VarietyOption { id: number, name: string, species: 'apple' | 'pear', juiceClass: JuiceClass }
export interface RootstockOption { id: number, designation: string, species: 'apple' | 'pear', vigour: string, inRowM: number | null, betweenRowM: number | null }

/** The organisation's blocks with their totals, and its forecast by juice class. */
export function useBlocks() {
  const list = useFetch<BlockList>('/api/blocks', { query: { limit: 200 } })
  const forecast = useFetch<OrganisationForecast>('/api/blocks/forecast')
  return { list, forecast }
}

/** One block with its forecast, and deleting it. */
export function useBlock(id: MaybeRefOrGetter<number>) {
  const block = useFetch<OrchardBlockDetail>(() => `/api/blocks/${toValue(id)}`)
  return { block, ...useDelete(() => `/api/blocks/${toValue(id)}`, 'The block could not be deleted. Try again.') }
}

/** Creates a block, or saves changes to one; a refusal is thrown for the form to show beside its fields. */
export function useBlockSave() {
  const { save, pending } = useSave<OrchardBlockDetail>('/api/blocks')
  return { save: (body: BlockCreateInput, id?: number) => save(body, id), pending }
}

/** The catalogue's varieties and rootstocks, for the block form's choices. */
export function useBlockChoices() {
  const varieties = useFetch<{ items: VarietyOption[], total: number }>('/api/varieties', { query: { limit: 200 } })
  const rootstocks = useFetch<{ items: RootstockOption[], total: number }>('/api/rootstocks', { query: { limit: 200 } })
  const error = computed(() => (varieties.error.value || rootstocks.error.value) ? 'The catalogue could not be loaded. Reload the page to try again.' : null)
  return { varieties, rootstocks, error }
}
