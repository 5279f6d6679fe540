import type { z } from 'zod'

/**
 * One public calculator: checks what was typed with the route's own schema, asks the route, and keeps
 * the answer or the errors to show beside each field. A calculation runs when the person asks for it,
 * not when the page loads, so it is a $fetch on submit rather than a useFetch.
 */
export function useCalculator<Result>(url: string, schema: z.ZodType) {
  const result = shallowRef<Result | null>(null)
  const { pending, run } = useAction()
  const errors = useFormErrors()

  async function calculate(query: Record<string, string>) {
    result.value = null
    if (!errors.check(schema, query)) return
    // Send what was typed (empty boxes left out); the route parses it with the same schema.
    const given = Object.fromEntries(Object.entries(query).filter(([, value]) => value.trim() !== ''))
    await run(async () => {
      result.value = await $fetch<Result>(url, { query: given })
    }, errors.fromResponse)
  }

  return { result, pending, errors, calculate }
}

/** A number rounded for display only (the routes answer unrounded): SG to 4 places, % and g/L to 2. */
export function formatFixed(value: number, places: number): string {
  return value.toLocaleString('en-GB', { minimumFractionDigits: places, maximumFractionDigits: places })
}
