import type { MemberRole } from '../../shared/types/auth'
import { recordAudit } from '../utils/audit'
import { useDb } from '../utils/db'
import { notFound } from '../utils/validation'

export interface Member { id: number, email: string, name: string, role: MemberRole, createdAt: string }

export async function listMembers(orgId: number, page: { limit: number, offset: number }): Promise<{ items: Member[], total: number }> {
  const base = useDb()('users').where({ org_id: orgId, active: true })
  const [rows, [{ total }]] = await Promise.all([
    base.clone().select('id', 'email', 'name', 'role', 'created_at').orderBy('name').limit(page.limit).offset(page.offset),
    base.clone().count({ total: '*' }) as unknown as Promise<[{ total: number }]>,
  ])
  return { items: rows.map(r => ({ id: r.id, email: r.email, name: r.name, role: r.role, createdAt: r.created_at })), total: Number(total) }
}

/**
 * Changes a member's role inside the caller's organisation. The organisation must keep an owner:
 * the last owner can be neither demoted nor removed (409).
 */
export async function changeMember(orgId: number, actorId: number, memberId: number, change: { role: MemberRole } | { remove: true }): Promise<Member | null> {
  return useDb().transaction(async (trx) => {
    const member = await trx('users').where({ id: memberId, org_id: orgId, active: true }).forUpdate().first()
    if (!member) notFound('That member')
    const losingOwner = member.role === 'owner' && ('remove' in change || change.role !== 'owner')
    if (losingOwner) {
      const [{ owners }] = await trx('users').where({ org_id: orgId, role: 'owner', active: true }).forUpdate().count({ owners: '*' }) as [{ owners: number }]
      if (Number(owners) <= 1) throw createError({ statusCode: 409, message: 'An organisation needs at least one owner. Make someone else an owner first.' })
    }
    if ('remove' in change) {
      await trx('users').where({ id: memberId }).update({ active: false, email: `removed-${memberId}-${member.email}`.slice(0, 254), updated_at: trx.fn.now(3) })
      await recordAudit(trx, { orgId, actorUserId: actorId, action: 'member.removed', objectType: 'user', objectId: memberId, detail: { email: member.email } })
      return null
    }
    await trx('users').where({ id: memberId }).update({ role: change.role, updated_at: trx.fn.now(3) })
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'member.role_changed', objectType: 'user', objectId: memberId, detail: { from: member.role, to: change.role } })
    return { id: member.id, email: member.email, name: member.name, role: change.role, createdAt: member.created_at }
  })
}
