import type { H3Event } from 'h3'
import type { z } from 'zod'

export interface FieldIssue { path: string, message: string }

/**
 * A refusal that names each field at fault in `data.issues`, the shape every form reads. A 400 by
 * default (409 for a name already taken); the message defaults to the first field and its issue.
 */
export function fieldError(issues: FieldIssue[], options: { statusCode?: number, message?: string } = {}) {
  const first = issues[0]!
  return createError({
    statusCode: options.statusCode ?? 400,
    message: options.message ?? (first.path ? `${first.path}: ${first.message}` : first.message),
    data: { issues },
  })
}

// These three helpers, not h3's readValidatedBody / getValidatedQuery: with a bare zod parse those
// answer zod's own error object, while every form and test here reads the documented shape,
// a 400 with `data.issues: [{ path, message }]`. Call them after requireUser, so a signed-out
// caller gets 401 before any body is read.

/** Parses with a shared zod schema; a miss is a 400 whose data.issues name each field at fault. */
export function validate<T extends z.ZodType>(schema: T, value: unknown): z.output<T> {
  const result = schema.safeParse(value)
  if (result.success) return result.data
  // An unknown key is named as its own field, so a form or a client sees which one to drop.
  throw fieldError(result.error.issues.flatMap(issue => (issue.code === 'unrecognized_keys'
    ? issue.keys.map(key => ({ path: [...issue.path, key].map(String).join('.'), message: issue.message }))
    : [{ path: issue.path.map(String).join('.'), message: issue.message }])))
}

export async function parseBody<T extends z.ZodType>(event: H3Event, schema: T): Promise<z.output<T>> {
  let body: unknown
  try {
    body = await readBody(event)
  }
  catch {
    throw fieldError([{ path: '', message: 'Send a JSON object' }], { message: 'The request body is not valid JSON.' })
  }
  return validate(schema, body ?? {})
}

export function parseQuery<T extends z.ZodType>(event: H3Event, schema: T): z.output<T> {
  return validate(schema, getQuery(event))
}

export function parseParams<T extends z.ZodType>(event: H3Event, schema: T): z.output<T> {
  return validate(schema, getRouterParams(event, { decode: true }))
}

export function notFound(what = 'That record'): never {
  throw createError({ statusCode: 404, message: `${what} was not found.` })
}

export function conflict(message: string): never {
  throw createError({ statusCode: 409, message })
}
