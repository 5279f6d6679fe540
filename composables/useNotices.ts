import type { Notice, NoticeList } from '#shared/types/notice'

// The reads that marking notices read changes: the list and the bell's count.
const NOTICE_KEYS = ['notices', 'notice-count']

/** How many of the person's notices are unread, read again whenever the page changes. */
export function useUnreadNotices() {
  const route = useRoute()
  const { data, refresh } = useFetch<NoticeList>('/api/notices', { key: 'notice-count', query: { limit: 1 } })
  watch(() => route.fullPath, () => refresh())
  return { unread: computed(() => data.value?.unread ?? 0) }
}

/** One page of the person's notices, and marking them read. */
export function useNotices(offset: Ref<number>, limit = 20) {
  const { data, pending, error } = useFetch<NoticeList>('/api/notices', { key: 'notices', query: { limit, offset } })
  const { pending: marking, error: markError, run } = useAction('The notice could not be marked read. Try again.')

  async function mark(request: () => Promise<unknown>) {
    if (await run(request)) await refreshNuxtData(NOTICE_KEYS)
  }

  // A plain string: the typed-route inference of $fetch is too deep for this template path.
  const readPath = (id: number): string => `/api/notices/${id}/read`

  return {
    notices: computed<Notice[] | undefined>(() => data.value?.items),
    total: computed(() => data.value?.total ?? 0),
    unread: computed(() => data.value?.unread ?? 0),
    limit,
    pending,
    error,
    marking,
    markError,
    markRead: (id: number) => mark(() => $fetch<null>(readPath(id), { method: 'POST' })),
    markAllRead: () => mark(() => $fetch<null>('/api/notices/read-all', { method: 'POST' })),
  }
}
