import type { z } from 'zod'

interface ApiErrorData { message?: string, data?: { issues?: { path: string, message: string }[] } }

/**
 * Field errors for a form: filled from the shared zod schema before sending, and from the
 * server's 4xx answer after. What the person typed is left as it is.
 */
export function useFormErrors() {
  const fields = ref<Record<string, string>>({})
  const message = ref<string | null>(null)

  function clear() {
    fields.value = {}
    message.value = null
  }

  function fromIssues(issues: { path: string, message: string }[]) {
    fields.value = Object.fromEntries(issues.map(i => [i.path, i.message]))
  }

  /** Validates locally; returns the parsed value or null with the errors shown. */
  function check<T extends z.ZodType>(schema: T, value: unknown): z.output<T> | null {
    clear()
    const result = schema.safeParse(value)
    if (result.success) return result.data
    fromIssues(result.error.issues.map(i => ({ path: i.path.map(String).join('.'), message: i.message })))
    message.value = 'Some fields need attention.'
    return null
  }

  function fromResponse(error: unknown) {
    const data = (error as { data?: ApiErrorData }).data
    if (data?.data?.issues) fromIssues(data.data.issues)
    message.value = data?.message ?? 'Something went wrong. Check your connection and try again.'
  }

  return { fields, message, clear, check, fromResponse }
}
