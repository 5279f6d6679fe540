import { signInLimited } from '../repositories/signInAttempts'
import { CLIENT_ADDRESS_HEADER, limitPolicy } from '../utils/signInLimit'

// In front of the credentials sign-in: refuses with 429 while the account or the address has had
// too many recent failures, and hands the client address to authorize() in a header of our own.
export default defineEventHandler(async (event) => {
  if (event.method !== 'POST' || !event.path.startsWith('/api/auth/callback/credentials')) return
  const address = getRequestIP(event, { xForwardedFor: process.env.TRUST_PROXY === '1' }) ?? 'unknown'
  event.node.req.headers[CLIENT_ADDRESS_HEADER] = address
  const body = await readBody<{ email?: string } | undefined>(event)
  const email = String(body?.email ?? '').trim().toLowerCase()
  if (await signInLimited(email, address)) {
    const { windowMinutes } = limitPolicy()
    setResponseHeader(event, 'Retry-After', windowMinutes * 60)
    throw createError({ statusCode: 429, message: `Too many failed sign-ins. Wait ${windowMinutes} minutes, or reset your password.` })
  }
})
