import type { JWT } from 'next-auth/jwt'
import type { SessionUser } from '#shared/types/auth'
import { recordSignIn } from '../repositories/signInAttempts'
import { findForSignIn } from '../repositories/users'
import { UNUSABLE_HASH, verifyPassword } from '../utils/passwords'

/**
 * Checks an e-mail and password and counts the attempt for the sign-in limit. Answers the person
 * signed in, or null for a wrong password or an unknown or removed account; throws
 * `EmailNotVerified` for the right password on an account still waiting for its e-mail check.
 */
export async function authenticate(emailTyped: unknown, passwordTyped: unknown, address: string): Promise<SessionUser | null> {
  const email = String(emailTyped ?? '').trim().toLowerCase()
  const password = String(passwordTyped ?? '')
  const candidate = email && password ? await findForSignIn(email) : { user: null, passwordHash: null, pendingVerification: false }
  // Compare against a dummy hash when there is no account, so timing does not reveal which e-mails exist.
  const matches = await verifyPassword(password, candidate.passwordHash ?? UNUSABLE_HASH)
  await recordSignIn(email, address, matches && candidate.user !== null)
  if (matches && candidate.pendingVerification) throw new Error('EmailNotVerified')
  return matches ? candidate.user : null
}

/** What the session token carries of the person signed in. */
export function tokenClaims(user: SessionUser): Partial<JWT> {
  return { id: user.id, orgId: user.orgId, orgKind: user.orgKind, isNursery: user.isNursery, role: user.role, units: user.units, name: user.name }
}

/** The session the pages read, from the token's claims. */
export function sessionUserOf(token: JWT): SessionUser {
  const t = token as unknown as SessionUser
  return { id: t.id, email: token.email ?? '', name: t.name, orgId: t.orgId, orgKind: t.orgKind, isNursery: t.isNursery, role: t.role, units: t.units }
}
