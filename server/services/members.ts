import type { MemberRole } from '#shared/types/auth'
import { lockMember, lockOwnerCount, updateUser, type Member } from '../repositories/users'
import { recordAudit } from '../utils/audit'
import { useDb } from '../utils/db'
import { notFound } from '../utils/validation'

/**
 * Changes a member's role inside the caller's organisation, or removes them. The organisation must
 * keep an owner: the last owner can be neither demoted nor removed (409).
 */
export async function changeMember(orgId: number, actorId: number, memberId: number, change: { role: MemberRole } | { remove: true }): Promise<Member | null> {
  return useDb().transaction(async (trx) => {
    const member = await lockMember(trx, orgId, memberId)
    if (!member) notFound('That member')
    const losingOwner = member.role === 'owner' && ('remove' in change || change.role !== 'owner')
    if (losingOwner && await lockOwnerCount(trx, orgId) <= 1) {
      throw createError({ statusCode: 409, message: 'An organisation needs at least one owner. Make someone else an owner first.' })
    }
    if ('remove' in change) {
      // The address is freed for a new account; the row stays for the audit trail.
      await updateUser(trx, memberId, { active: false, email: `removed-${memberId}-${member.email}`.slice(0, 254) })
      await recordAudit(trx, { orgId, actorUserId: actorId, action: 'member.removed', objectType: 'user', objectId: memberId, detail: { email: member.email } })
      return null
    }
    await updateUser(trx, memberId, { role: change.role })
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'member.role_changed', objectType: 'user', objectId: memberId, detail: { from: member.role, to: change.role } })
    return { ...member, role: change.role }
  })
}
