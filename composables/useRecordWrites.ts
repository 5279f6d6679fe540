/** What a write changes: the `useFetch` keys to read again once it succeeds. */
interface WriteOptions { refreshes?: string[] }

async function refreshReads(keys: string[] | undefined) {
  if (keys?.length) await refreshNuxtData(keys)
}

/** Deleting the record at `path()`, with a pending state and the server's message on refusal. */
export function useDelete(path: () => string, fallback: string, options: WriteOptions = {}) {
  const { pending: removing, error: removeError, run } = useAction(fallback)
  async function remove(): Promise<boolean> {
    const done = await run(() => $fetch<null>(path(), { method: 'DELETE' }))
    if (done) await refreshReads(options.refreshes)
    return done
  }
  return { remove, removing, removeError }
}

/** Creates a record (POST base) or saves changes (PATCH base/id); a refusal is thrown for the form to show beside its fields. */
export function useSave<T>(base: string, options: WriteOptions = {}) {
  const pending = ref(false)
  async function save(body: object, id?: number): Promise<T> {
    pending.value = true
    try {
      const url: string = id ? `${base}/${id}` : base
      const saved = await $fetch<T>(url, { method: id ? 'PATCH' : 'POST', body: body as Record<string, unknown> })
      await refreshReads(options.refreshes)
      return saved
    }
    finally {
      pending.value = false
    }
  }
  return { save, pending }
}
