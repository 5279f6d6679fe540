import type { H3Event } from 'h3'
import { isDependencyDown } from '../utils/dependencies'

// First of the app's error handlers: an API call that failed because the database or storage is
// unreachable answers 503 in the usual error shape; everything else goes on to Nuxt's handler.
export default function dependencyErrorHandler(error: unknown, event: H3Event) {
  if (!event.path.startsWith('/api/') || !isDependencyDown(error)) return
  setResponseStatus(event, 503, 'Service Unavailable')
  setResponseHeader(event, 'content-type', 'application/json')
  setResponseHeader(event, 'retry-after', 30)
  return send(event, JSON.stringify({ error: true, statusCode: 503, statusMessage: 'Service Unavailable', message: 'A service Pomewright depends on is not answering. Try again in a minute.' }))
}
