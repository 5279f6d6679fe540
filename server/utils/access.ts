import type { OrgKind, Role, SessionUser } from '#shared/types/auth'

export interface AccessRule {
  /** Roles allowed; omitted means any signed-in role except the platform admin. */
  roles?: Role[]
  /** The organisation kind allowed; omitted means any. */
  orgKind?: OrgKind
  /** Only organisations that also run a nursery. */
  nursery?: boolean
}

export type AccessDecision = { ok: true } | { ok: false, statusCode: 401 | 403, message: string }

const TENANT_ROLES: Role[] = ['owner', 'member', 'viewer']

/** Pure decision used by requireUser: who may call a route. Tenant data is never the admin's by default. */
export function decideAccess(user: SessionUser | null, rule: AccessRule = {}): AccessDecision {
  if (!user) return { ok: false, statusCode: 401, message: 'Sign in to continue.' }
  const roles = rule.roles ?? TENANT_ROLES
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

/** Roles that may write an organisation's records. Viewers only read. */
export const WRITERS: Role[] = ['owner', 'member']
export const OWNERS: Role[] = ['owner']
export const READERS: Role[] = TENANT_ROLES
