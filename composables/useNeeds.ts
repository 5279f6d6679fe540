import type { NeedsPutInput } from '#shared/schemas/contract'
import type { MakerSupplyReport, NeedsTable } from '#shared/types/coverage'

// What saving the needs table changes.
const NEEDS_KEYS = ['needs', 'needs-supply']

/** The maker's needs table, and saving it whole; a refusal is thrown for the table to show beside its cells. */
export function useNeeds() {
  const { data: needs, pending, error, refresh } = useFetch<NeedsTable>('/api/needs', { key: 'needs' })
  const saving = ref(false)

  async function save(body: NeedsPutInput): Promise<NeedsTable> {
    saving.value = true
    try {
      const saved = await $fetch<NeedsTable>('/api/needs', { method: 'PUT', body })
      needs.value = saved
      await refreshNuxtData(NEEDS_KEYS.filter(k => k !== 'needs'))
      return saved
    }
    finally {
      saving.value = false
    }
  }

  return { needs, pending, error, refresh, save, saving }
}

/** The maker's need per juice class and year against its contracted fruit and trees. */
export function useNeedsSupply(span: MaybeRefOrGetter<{ startYear?: number, years?: number }> = {}) {
  const { data: supply, pending, error, refresh } = useFetch<MakerSupplyReport>('/api/needs/supply', { key: 'needs-supply', query: computed(() => toValue(span)) })
  return { supply, pending, error, refresh }
}
