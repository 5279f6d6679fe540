import type { H3Event } from 'h3'
import { getToken } from '#auth'
import type { SessionUser } from '#shared/types/auth'
import { decideAccess, type AccessRule } from '#shared/utils/access'
import { findSessionUser } from '../repositories/users'
import { decodeSessionToken } from './sessionToken'

/**
 * The first line of every protected route: 401 when signed out (before any body is read),
 * 403 for the wrong role or organisation kind. The user is re-read from the database so that a
 * removed member or a changed role takes effect at once, on every instance (one primary-key
 * lookup; nothing about users is kept in memory).
 */
export async function requireUser(event: H3Event, rule: AccessRule = {}): Promise<SessionUser> {
  const user = await currentUser(event)
  const decision = decideAccess(user, rule)
  if (!decision.ok) throw createError({ statusCode: decision.statusCode, message: decision.message })
  event.context.user = user
  return user!
}

/** Who is calling, re-read from the database; null when signed out. For routes open to everyone. */
export async function currentUser(event: H3Event): Promise<SessionUser | null> {
  const token = await getToken({ event, secret: useRuntimeConfig().authSecret, decode: decodeSessionToken })
  const id = Number(token?.id)
  return Number.isInteger(id) && id > 0 ? await findSessionUser(id) : null
}

/** For routes that every tenant member may call: narrows the organisation id to a number. */
export async function requireMember(event: H3Event, rule: AccessRule = {}): Promise<SessionUser & { orgId: number }> {
  const user = await requireUser(event, rule)
  if (user.orgId === null) throw createError({ statusCode: 403, message: 'This needs an organisation account.' })
  return user as SessionUser & { orgId: number }
}
