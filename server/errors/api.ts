import { STATUS_CODES } from 'node:http'
import type { H3Event } from 'h3'
import { isDependencyDown } from '../utils/dependencies'

// First of the app's error handlers, for API calls. An outage of the database or storage answers
// 503 in the usual error shape; any other error gets the standard reason phrase for its status
// (h3 would say "Server Error" for a 404) and goes on to Nuxt's handler.
export default function apiErrorHandler(error: unknown, event: H3Event) {
  if (!event.path.startsWith('/api/')) return
  if (isDependencyDown(error)) {
    setResponseStatus(event, 503, 'Service Unavailable')
    setResponseHeader(event, 'content-type', 'application/json')
    setResponseHeader(event, 'retry-after', 30)
    return send(event, JSON.stringify({ error: true, statusCode: 503, statusMessage: 'Service Unavailable', message: 'A service Pomewright depends on is not answering. Try again in a minute.' }))
  }
  const e = error as { statusCode?: number, statusMessage?: string }
  if (e.statusCode && !e.statusMessage) e.statusMessage = STATUS_CODES[e.statusCode]
}
