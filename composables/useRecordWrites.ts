/** Deleting the record at `path()`, with a pending state and the server's message on refusal. */
export function useDelete(path: () => string, fallback: string) {
  const { pending: removing, error: removeError, run } = useAction(fallback)
  const remove = () => run(() => $fetch(path(), { method: 'DELETE' }))
  return { remove, removing, removeError }
}

/** Creates a record (POST base) or saves changes (PATCH base/id); a refusal is thrown for the form to show beside its fields. */
export function useSave<T>(base: string) {
  const pending = ref(false)
  async function save(body: object, id?: number): Promise<T> {
    pending.value = true
    try {
      const url: string = id ? `${base}/${id}` : base
      return await $fetch<T>(url, { method: id ? 'PATCH' : 'POST', body: body as Record<string, unknown> })
    }
    finally {
      pending.value = false
    }
  }
  return { save, pending }
}
