import type { DirectoryEntry } from '#shared/types/organisation'
import type { ForecastClass } from '#shared/utils/forecast'

/** What the directory filters hold: name, region, a variety (name or catalogue id), a juice class. */
export interface DirectoryFilterValues { q: string, region: string, variety: string, juiceClass: ForecastClass | '' }

export const DIRECTORY_PAGE_SIZE = 25

/** One page of the listed organisations, fetched again when a filter or the page changes; a new filter goes back to the first page. */
export function useDirectory(filters: Ref<DirectoryFilterValues>) {
  const offset = ref(0)
  const q = usePausedText(() => filters.value.q)
  const region = usePausedText(() => filters.value.region)
  const variety = usePausedText(() => filters.value.variety)
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
  return { ...usePagedList<DirectoryEntry>('/api/organisations', query, 'directory'), offset }
}

/** One organisation's directory entry. */
export function useDirectoryEntry(id: MaybeRefOrGetter<number>) {
  const { data: entry, pending, error } = useFetch<DirectoryEntry>(() => `/api/organisations/${toValue(id)}`, { key: () => `directory-${toValue(id)}` })
  return { entry, pending, error }
}
