import type { H3Event } from 'h3'
import type { z } from 'zod'

export interface FieldIssue { path: string, message: string }

/** Parses with a shared zod schema; a miss is a 400 whose data.issues name each field at fault. */
export function validate<T extends z.ZodType>(schema: T, value: unknown): z.output<T> {
  const result = schema.safeParse(value)
  if (result.success) return result.data
  const issues: FieldIssue[] = result.error.issues.map(issue => ({ path: issue.path.map(String).join('.'), message: issue.message }))
  const first = issues[0]!
  throw createError({
    statusCode: 400,
    statusMessage: 'Bad Request',
    message: first.path ? `${first.path}: ${first.message}` : first.message,
    data: { issues },
  })
}

export async function parseBody<T extends z.ZodType>(event: H3Event, schema: T): Promise<z.output<T>> {
  let body: unknown
  try {
    body = await readBody(event)
  }
  catch {
    throw createError({ statusCode: 400, message: 'The request body is not valid JSON.', data: { issues: [{ path: '', message: 'Send a JSON object' }] } })
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
