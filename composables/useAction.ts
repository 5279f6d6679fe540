/** The message a person should see for a failed request: the server's own, else the fallback. */
export function errorMessage(error: unknown, fallback = 'That did not work. Check your connection and try again.'): string {
  return (error as { data?: { message?: string } } | null)?.data?.message ?? fallback
}

/**
 * Runs a write with a visible pending state; on failure keeps the server's message (and hands the
 * error to `onError`, e.g. a form's field errors). Resolves true when the request succeeded.
 */
export function useAction(fallback?: string) {
  const pending = ref(false)
  const error = ref<string | null>(null)

  async function run(request: () => Promise<unknown>, onError?: (e: unknown) => void): Promise<boolean> {
    pending.value = true
    error.value = null
    try {
      await request()
      return true
    }
    catch (e) {
      error.value = errorMessage(e, fallback)
      onError?.(e)
      return false
    }
    finally {
      pending.value = false
    }
  }

  return { pending, error, run }
}
