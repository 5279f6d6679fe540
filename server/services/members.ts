import type { MemberRole } from '#shared/types/auth'
import { lockMember, lockOwnerCount, updateUser, type Member } from '../repositories/users'
import { lockOrganisation } from '../repositories/organisations'
import { recordAudit } from '../utils/audit'
import { useDb } from '../utils/db'
import { notFound } from '../utils/validation'
import { queueNotice } from './notices'

const ROLE_MEANS: Record<MemberRole, string> = {
  owner: 'Owners manage members, sign contracts, pay and are paid.',
  member: 'Members record data, upload sheets and run blends.',
  viewer: 'Viewers read the organisation\'s records.',
}

/**
 * Changes a member's role inside the caller's organisation, or removes them. The organisation must
 * keep an owner: the last owner can be neither demoted nor removed (409).
 */
export async function changeMember(orgId: number, actorId: number, memberId: number, change: { role: MemberRole } | { remove: true }): Promise<Member | null> {
  return useDb().transaction(async (trx) => {
    // The organisation's row first: two owners changing each other queue here instead of each
    // holding one member row and waiting for the other's.
    const orgName = (await lockOrganisation(trx, orgId))!.name
    const member = await lockMember(trx, orgId, memberId)
    if (!member) notFound('That member')
    const losingOwner = member.role === 'owner' && ('remove' in change || change.role !== 'owner')
    if (losingOwner && await lockOwnerCount(trx, orgId) <= 1) {
      throw createError({ statusCode: 409, message: 'An organisation needs at least one owner. Make someone else an owner first.' })
    }
    if ('remove' in change) {
      // Told at the address they had: they can no longer sign in to read a notice.
      await queueNotice(trx, {
        orgId, recipients: [member.email], kind: 'member.removed',
        subject: `You were removed from ${orgName} on Pomewright`,
        body: `Hello ${member.name},\n\nAn owner of ${orgName} removed you from the organisation on Pomewright. You can no longer sign in to its records.`,
      })
      // The address is freed for a new account; the row stays for the audit trail.
      await updateUser(trx, memberId, { active: false, email: `removed-${memberId}-${member.email}`.slice(0, 254) })
      await recordAudit(trx, { orgId, actorUserId: actorId, action: 'member.removed', objectType: 'user', objectId: memberId, detail: { email: member.email } })
      return null
    }
    if (change.role === member.role) return member
    await updateUser(trx, memberId, { role: change.role })
    await queueNotice(trx, {
      orgId, recipients: [memberId], kind: 'member.role_changed', link: '/members',
      subject: `Your role in ${orgName} is now ${change.role}`,
      body: `An owner of ${orgName} changed your role from ${member.role} to ${change.role}. ${ROLE_MEANS[change.role]}`,
    })
    await recordAudit(trx, { orgId, actorUserId: actorId, action: 'member.role_changed', objectType: 'user', objectId: memberId, detail: { from: member.role, to: change.role } })
    return { ...member, role: change.role }
  })
}
