import type { OrgKind, Role, SessionUser } from '../types/auth'

// Who may do what, decided once for the server and the pages alike.

export interface AccessRule {
  /** Roles allowed; omitted means any signed-in role except the platform admin. */
  roles?: Role[]
  /** The organisation kind allowed; omitted means any. */
  orgKind?: OrgKind
  /** Only organisations that also run a nursery. */
  nursery?: boolean
}

export type AccessDecision = { ok: true } | { ok: false, statusCode: 401 | 403, message: string }

/** What a decision needs to know about the person; the session user carries it. */
export type AccessSubject = Pick<SessionUser, 'role' | 'orgKind' | 'isNursery'>

/** Every role inside an organisation: they may read its records. */
export const READERS: Role[] = ['owner', 'member', 'viewer']
/** Roles that may write an organisation's records. Viewers only read. */
export const WRITERS: Role[] = ['owner', 'member']
export const OWNERS: Role[] = ['owner']

/** Pure decision used by requireUser: who may call a route. Tenant data is never the admin's by default. */
export function decideAccess(user: AccessSubject | null, rule: AccessRule = {}): AccessDecision {
  if (!user) return { ok: false, statusCode: 401, message: 'Sign in to continue.' }
  const roles = rule.roles ?? READERS
  if (!roles.includes(user.role)) {
    return { ok: false, statusCode: 403, message: `Your role (${user.role}) cannot do this.` }
  }
  if (rule.orgKind && user.orgKind !== rule.orgKind) {
    return { ok: false, statusCode: 403, message: `Only ${rule.orgKind} organisations can do this.` }
  }
  if (rule.nursery && !user.isNursery) {
    return { ok: false, statusCode: 403, message: 'Only organisations that run a nursery can do this.' }
  }
  return { ok: true }
}
