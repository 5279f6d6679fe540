/**
 * One page of a list route that answers `{ items, total }`, fetched again whenever the query
 * changes (its `limit`/`offset` included), under a key a write can refresh.
 */
export function usePagedList<T>(url: string, query: Ref<Record<string, unknown>>, key: string) {
  const { data, pending, error, refresh } = useFetch<{ items: T[], total: number }>(url, { query, key })
  return {
    items: computed(() => data.value?.items),
    total: computed(() => data.value?.total ?? 0),
    pending,
    error,
    refresh,
  }
}

// How long a search waits after the last key before asking the server.
const SEARCH_PAUSE_MS = 250

/** Text that follows what was typed after a pause, so that each key does not ask the server. */
export function usePausedText(source: () => string): Ref<string> {
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
