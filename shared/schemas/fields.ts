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

/** An id in a list query (a filter): a positive whole number; empty is no filter. */
export function positiveIdQuery(what: string) {
  const message = `Choose a ${what}`
  return z.preprocess(blankAsMissing, z.coerce.number({ message }).int({ message }).positive({ message }).optional())
}

/** Search text of a list query: at most `max` characters; empty is no search. */
export function searchText(max: number) {
  return z.preprocess(blankAsMissing, z.string({ message: 'Search with text' }).trim()
    .max(max, { message: `Search with at most ${max} characters` }).optional())
}

/** A number given to at most `places` decimals (a price to the cent, a rate to 0.1 %). */
export function withDecimals(schema: z.ZodNumber, places: number, message: string) {
  const factor = 10 ** places
  return schema.refine(v => Math.abs(v * factor - Math.round(v * factor)) < 1e-6, { message })
}

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/

/** A calendar date as YYYY-MM-DD that exists (no 31 June). */
export function isoDate(message = 'Enter a date as YYYY-MM-DD') {
  return z.string({ message }).regex(ISO_DATE, { message }).refine((v) => {
    const d = new Date(`${v}T00:00:00Z`)
    return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === v
  }, { message })
}

/** A whole number of minor units (pence, cents) from 0 to `max`. */
export function minorUnits(what: string, max: number) {
  const message = `Enter ${what} as a whole number of minor units (pence, cents) from 0 to ${max.toLocaleString('en-GB')}`
  return z.number({ message }).int({ message }).min(0, { message }).max(max, { message })
}

/**
 * A body that refuses keys it does not know (naming each) but lets through, and drops, the
 * read-only keys a client may send back from what it read (`id`, `state`, computed figures).
 */
export function writableObject<T extends z.ZodRawShape>(shape: T, readOnly: readonly string[]) {
  return z.preprocess(
    value => (value && typeof value === 'object' && !Array.isArray(value)
      ? Object.fromEntries(Object.entries(value).filter(([key]) => !readOnly.includes(key)))
      : value),
    z.strictObject(shape, { error: issue => (issue.code === 'unrecognized_keys' ? 'Unknown field' : undefined) }),
  )
}
