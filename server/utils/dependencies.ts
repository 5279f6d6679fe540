// Errors that mean a service we depend on (the database, file storage) is down or unreachable,
// as opposed to a bug: the API answers these with 503 so clients know to try again later.
const DOWN_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENOTFOUND', 'PROTOCOL_CONNECTION_LOST', 'ER_CON_COUNT_ERROR'])

export function isDependencyDown(error: unknown): boolean {
  for (let e: unknown = error, depth = 0; e && typeof e === 'object' && depth < 5; e = (e as { cause?: unknown }).cause, depth++) {
    const { code, name } = e as { code?: unknown, name?: unknown }
    if (typeof code === 'string' && DOWN_CODES.has(code)) return true
    // Knex gives up waiting for a pooled connection with this error.
    if (name === 'KnexTimeoutError') return true
  }
  return false
}
