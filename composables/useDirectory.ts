import type { DirectoryEntry, DirectoryList } from '#shared/types/organisation'
import type { ForecastClass } from '#shared/utils/forecast'

/** What the directory filters hold: name, region, a variety (name or catalogue id), a juice class. */
export interface DirectoryFilterValues { q: string, region: string, variety: string, juiceClass: ForecastClass | '' }

export const DIRECTORY_PAGE_SIZE = 25

// How long a search waits after the last key before asking the server.
const SEARCH_PAUSE_MS = 250

/** A text filter that follows what was typed after a pause, so each key does not ask the server. */
function paused(source: () => string): Ref<string> {
  const value = ref(source())
  let timer: ReturnType<typeof setTimeout> | undefined
  watch(source, (text) => {
    clearTimeout(timer)
    timer = setTimeout(() => {
      value.value = text
    }, SEARCH_PAUSE_MS)
  })
  return value
}

/** One page of the listed organisations, fetched again when a filter or the page changes; a new filter goes back to the first page. */
export function useDirectory(filters: Ref<DirectoryFilterValues>) {
  const offset = ref(0)
  const q = paused(() => filters.value.q)
  const region = paused(() => filters.value.region)
  const variety = paused(() => filters.value.variety)
  watch(() => [q.value, region.value, variety.value, filters.value.juiceClass], () => {
    offset.value = 0
  })
  const query = computed(() => ({
    limit: DIRECTORY_PAGE_SIZE,
    offset: offset.value,
    q: q.value.trim() || undefined,
    region: region.value.trim() || undefined,
    variety: variety.value.trim() || undefined,
    juiceClass: filters.value.juiceClass || undefined,
  }))
  const { data, pending, error } = useFetch<DirectoryList>('/api/organisations', { query, key: 'directory' })
  return {
    items: computed(() => data.value?.items),
    total: computed(() => data.value?.total ?? 0),
    offset,
    pending,
    error,
  }
}

/** One organisation's directory entry. */
export function useDirectoryEntry(id: MaybeRefOrGetter<number>) {
  const { data: entry, pending, error } = useFetch<DirectoryEntry>(() => `/api/organisations/${toValue(id)}`, { key: () => `directory-${toValue(id)}` })
  return { entry, pending, error }
}
