import type { BudwoodCreateInput } from '#shared/schemas/nursery'
import type { BudwoodLot } from '#shared/types/nursery'

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
