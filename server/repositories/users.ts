import type { SessionUser, UnitSystem } from '../../shared/types/auth'
import { useDb } from '../utils/db'

interface SessionRow {
  id: number, email: string, name: string, org_id: number | null, role: SessionUser['role'], units: UnitSystem
  kind: SessionUser['orgKind'], is_nursery: boolean | null
}

function toSessionUser(row: SessionRow): SessionUser {
  return { id: row.id, email: row.email, name: row.name, orgId: row.org_id, orgKind: row.kind ?? null, isNursery: Boolean(row.is_nursery), role: row.role, units: row.units }
}

/** An active, verified user of an active organisation (or the platform admin), else null. */
function activeUsers() {
  return useDb()('users as u')
    .leftJoin('organisations as o', 'o.id', 'u.org_id')
    .select('u.id', 'u.email', 'u.name', 'u.org_id', 'u.role', 'u.units', 'o.kind', 'o.is_nursery')
    .where('u.active', true)
    .whereNotNull('u.email_verified_at')
    .where(q => q.whereNull('u.org_id').orWhere('o.status', 'active'))
}

export async function findSessionUser(id: number): Promise<SessionUser | null> {
  const row = await activeUsers().where('u.id', id).first() as SessionRow | undefined
  return row ? toSessionUser(row) : null
}

export interface SignInCandidate { user: SessionUser | null, passwordHash: string | null, pendingVerification: boolean }

/** What sign-in needs to know about an e-mail address. */
export async function findForSignIn(email: string): Promise<SignInCandidate> {
  const row = await useDb()('users as u')
    .leftJoin('organisations as o', 'o.id', 'u.org_id')
    .select('u.id', 'u.password_hash', 'u.active', 'u.email_verified_at', 'o.status')
    .where('u.email', email).first() as { id: number, password_hash: string, active: boolean, email_verified_at: Date | null, status: string | null } | undefined
  if (!row || !row.active) return { user: null, passwordHash: null, pendingVerification: false }
  return {
    user: await findSessionUser(row.id),
    passwordHash: row.password_hash,
    pendingVerification: row.email_verified_at === null || row.status === 'pending',
  }
}

export async function updateProfile(id: number, patch: { name?: string, units?: UnitSystem }): Promise<SessionUser> {
  await useDb()('users').where({ id }).update({ ...patch, updated_at: useDb().fn.now(3) })
  return (await findSessionUser(id))!
}

export async function findProfile(user: SessionUser) {
  const org = user.orgId
    ? await useDb()('organisations').select('id', 'name', 'kind', 'is_nursery', 'region', 'currency').where({ id: user.orgId }).first()
    : null
  return {
    ...user,
    organisation: org ? { id: org.id, name: org.name, kind: org.kind, isNursery: org.is_nursery, region: org.region, currency: org.currency } : null,
  }
}
