import { z } from 'zod'

// Field shapes every slice's schemas share: each refusal says one message a person can act on.

/** The `[id]` of a route: a positive whole number. */
export const idParamSchema = z.object({ id: z.coerce.number().int().positive({ message: 'Not a valid id' }) })

/** `limit`/`offset` paging of every list (`{ items, total }`): 50 a page unless asked, 200 at most. */
export const pageQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(50),
  offset: z.coerce.number().int().min(0).default(0),
})

/**
 * Tree spacing, in the row or between rows, that any real planting has: from 30 cm cordons to
 * 15 m standard trees. One range for a block and for a rootstock's typical spacing, which the
 * block form offers as a block's own.
 */
export const TREE_SPACING_M = { min: 0.3, max: 15 } as const

/** A number from `range.min` to `range.max`; missing, not a number, too small and too large all answer `message`. */
export function numberInRange(range: { min: number, max: number }, message: string) {
  return z.number({ message }).min(range.min, { message }).max(range.max, { message })
}

/** Text that must be given: "Enter <what>" when empty, a length message when longer than `max`. */
export function requiredText(what: string, max: number) {
  const message = `Enter ${what}`
  return z.string({ message }).trim().min(1, { message }).max(max, { message: `Use at most ${max} characters` })
}

/** Text that may be left out: empty (or only spaces) is stored as null. */
export function optionalText(notText: string, max: number) {
  return z.string({ message: notText }).trim().max(max, { message: `Use at most ${max} characters` })
    .nullable().transform(v => (v ? v : null))
}

/** A patch must change at least one field. */
export function somethingToChange(v: Record<string, unknown>): boolean {
  return Object.values(v).some(x => x !== undefined)
}

/** An empty box or query parameter means "not given". */
export function blankAsMissing(value: unknown): unknown {
  return typeof value === 'string' && value.trim() === '' ? undefined : value
}

/** Search text of a list query: at most `max` characters; empty is no search. */
export function searchText(max: number) {
  return z.preprocess(blankAsMissing, z.string({ message: 'Search with text' }).trim()
    .max(max, { message: `Search with at most ${max} characters` }).optional())
}
