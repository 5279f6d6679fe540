import type { Knex } from 'knex'
import type { MemberRole, SessionUser, UnitSystem } from '#shared/types/auth'
import { useDb } from '../utils/db'

/** An active, verified user of an active organisation (or the platform admin), as the session carries them. */
function activeUsers() {
  return useDb()('users as u')
    .leftJoin('organisations as o', 'o.id', 'u.orgId')
    .select('u.id', 'u.email', 'u.name', 'u.orgId', 'u.role', 'u.units', 'o.kind as orgKind', 'o.isNursery')
    .where('u.active', true)
    .whereNotNull('u.emailVerifiedAt')
    .where(q => q.whereNull('u.orgId').orWhere('o.status', 'active'))
}

export async function findSessionUser(id: number): Promise<SessionUser | null> {
  const row = await activeUsers().where('u.id', id).first() as (Omit<SessionUser, 'isNursery'> & { isNursery: boolean | null }) | undefined
  // The platform admin has no organisation, so the joined columns are null.
  return row ? { ...row, orgKind: row.orgKind ?? null, isNursery: Boolean(row.isNursery) } : null
}

export interface SignInCandidate { user: SessionUser | null, passwordHash: string | null, pendingVerification: boolean }

/** What sign-in needs to know about an e-mail address. */
export async function findForSignIn(email: string): Promise<SignInCandidate> {
  const row = await useDb()('users as u')
    .leftJoin('organisations as o', 'o.id', 'u.orgId')
    .select('u.id', 'u.passwordHash', 'u.active', 'u.emailVerifiedAt', 'o.status')
    .where('u.email', email).first() as { id: number, passwordHash: string, active: boolean, emailVerifiedAt: Date | null, status: string | null } | undefined
  if (!row || !row.active) return { user: null, passwordHash: null, pendingVerification: false }
  return {
    user: await findSessionUser(row.id),
    passwordHash: row.passwordHash,
    pendingVerification: row.emailVerifiedAt === null || row.status === 'pending',
  }
}

export async function updateProfile(id: number, patch: { name?: string, units?: UnitSystem }): Promise<SessionUser> {
  await useDb()('users').where({ id }).update({ ...patch, updatedAt: useDb().fn.now(3) })
  return (await findSessionUser(id))!
}

export async function findProfile(user: SessionUser) {
  const organisation = user.orgId
    ? await useDb()('organisations').select('id', 'name', 'kind', 'isNursery', 'region', 'currency').where({ id: user.orgId }).first()
    : null
  return { ...user, organisation: organisation ?? null }
}

export interface Member { id: number, email: string, name: string, role: MemberRole, createdAt: string }

export async function listMembers(orgId: number, page: { limit: number, offset: number }): Promise<{ items: Member[], total: number }> {
  const base = useDb()('users').where({ orgId, active: true })
  const [items, [{ total }]] = await Promise.all([
    base.clone().select('id', 'email', 'name', 'role', 'createdAt').orderBy([{ column: 'name' }, { column: 'id' }]).limit(page.limit).offset(page.offset) as Promise<Member[]>,
    base.clone().count({ total: '*' }) as unknown as Promise<[{ total: number }]>,
  ])
  return { items, total }
}

/** A member of the organisation, locked until the transaction ends, or undefined. */
export function lockMember(trx: Knex.Transaction, orgId: number, id: number): Promise<Member | undefined> {
  return trx('users').where({ id, orgId, active: true }).forUpdate().first('id', 'email', 'name', 'role', 'createdAt')
}

/** How many active owners the organisation has, locking them so that two demotions cannot both pass. */
export async function lockOwnerCount(trx: Knex.Transaction, orgId: number): Promise<number> {
  const [{ owners }] = await trx('users').where({ orgId, role: 'owner', active: true }).forUpdate().count({ owners: '*' }) as [{ owners: number }]
  return owners
}

export async function updateUser(trx: Knex.Transaction, id: number, values: { role?: MemberRole, active?: boolean, email?: string }): Promise<void> {
  await trx('users').where({ id }).update({ ...values, updatedAt: trx.fn.now(3) })
}
