import type { Knex } from 'knex'
import type { InviteInput, SignUpInput } from '#shared/schemas/account'
import type { MemberRole, SessionUser } from '#shared/types/auth'
import { recordAudit } from '../utils/audit'
import { useDb, withDbRefusals } from '../utils/db'
import { appLink } from '../utils/mail'
import { hashPassword } from '../utils/passwords'
import { expiresAt, hashToken, newToken, TOKEN_LIFETIME_MS } from '../utils/tokens'
import { fieldError, notFound } from '../utils/validation'
import { queueNotice, queueNoticeToOwners } from './notices'
import { moveOrganisationIn } from './organisations'

const EMAIL_TAKEN = { duplicate: { field: 'email', issue: 'Already registered', message: 'An account with this e-mail already exists. Sign in, or reset the password.' } }
const linkInvalid = (what: string) => fieldError([{ path: 'token', message: 'Expired or already used' }], { message: `This ${what} link is not valid any more: it has expired or was already used. Ask for a new one.` })

/** Queues the confirmation link inside the transaction that stores its token. */
function queueConfirmation(trx: Knex.Transaction, to: { orgId: number, email: string, name: string, orgName: string }, token: string) {
  return queueNotice(trx, {
    orgId: to.orgId,
    recipients: [to.email],
    kind: 'account.confirm_email',
    subject: 'Confirm your e-mail to open your Pomewright account',
    body: `Hello ${to.name},\n\nConfirm your e-mail address to open ${to.orgName} on Pomewright:\n\n${appLink(`/verify?token=${token}`)}\n\nThe link works once and expires in 48 hours. If you did not sign up, ignore this message.\n`,
  })
}

/**
 * A new organisation and its owner; both stay pending until the owner follows the e-mailed link.
 * Signing up again with an address still waiting for confirmation sends a fresh link (the first
 * mail may have been lost) and changes nothing else.
 */
export async function signUp(input: SignUpInput): Promise<void> {
  const pending = await useDb()('users as u').join('organisations as o', 'o.id', 'u.orgId')
    .where('u.email', input.email).whereNull('u.emailVerifiedAt').first('u.id', 'u.name', 'u.orgId', 'o.name as orgName')
  if (pending) {
    const { token, hash } = newToken()
    await useDb().transaction(async (trx) => {
      await trx('userTokens').insert({ userId: pending.id, purpose: 'verify_email', tokenHash: hash, expiresAt: expiresAt(TOKEN_LIFETIME_MS.verifyEmail) })
      await queueConfirmation(trx, { orgId: pending.orgId, email: input.email, name: pending.name, orgName: pending.orgName }, token)
    })
    return
  }
  const passwordHash = await hashPassword(input.password)
  const { token, hash } = newToken()
  await withDbRefusals(EMAIL_TAKEN, () => useDb().transaction(async (trx) => {
    const [orgId] = await trx('organisations').insert({
      name: input.orgName, kind: input.orgKind, isNursery: input.orgKind === 'grower' && input.isNursery,
      region: input.region || null, contactEmail: input.email, status: 'pending',
    })
    const [userId] = await trx('users').insert({ orgId, email: input.email, name: input.name, passwordHash, role: 'owner' })
    await trx('userTokens').insert({ userId, purpose: 'verify_email', tokenHash: hash, expiresAt: expiresAt(TOKEN_LIFETIME_MS.verifyEmail) })
    await recordAudit(trx, { orgId: orgId!, actorUserId: userId!, action: 'organisation.signed_up', objectType: 'organisation', objectId: orgId })
    await queueConfirmation(trx, { orgId: orgId!, email: input.email, name: input.name, orgName: input.orgName }, token)
  }))
}

/** Takes a one-time token of the given purpose, or throws 400 when it is unknown, used or expired. */
async function takeToken(trx: Knex.Transaction, token: string, purpose: 'verify_email' | 'reset_password') {
  const row = await trx('userTokens').where({ tokenHash: hashToken(token), purpose }).forUpdate().first() as { id: number, userId: number, usedAt: Date | null, expiresAt: Date } | undefined
  if (!row || row.usedAt || row.expiresAt <= new Date()) throw linkInvalid(purpose === 'verify_email' ? 'confirmation' : 'password reset')
  await trx('userTokens').where({ id: row.id }).update({ usedAt: trx.fn.now(3) })
  return row
}

export async function verifyEmail(token: string): Promise<void> {
  await useDb().transaction(async (trx) => {
    const { userId } = await takeToken(trx, token, 'verify_email')
    const user = await trx('users as u').join('organisations as o', 'o.id', 'u.orgId').where('u.id', userId).first('u.orgId', 'o.status') as { orgId: number, status: string }
    await trx('users').where({ id: userId }).update({ emailVerifiedAt: trx.fn.now(3) })
    await recordAudit(trx, { orgId: user.orgId, actorUserId: userId, action: 'user.email_verified', objectType: 'user', objectId: userId })
    // The owner's confirmation opens a new organisation; a later link of the same person changes nothing.
    if (user.status === 'pending') await moveOrganisationIn(trx, { role: 'confirming-owner', userId }, user.orgId, 'confirm')
  })
}

/** Always answers the same way, whether or not the address has an account. */
export async function requestPasswordReset(email: string): Promise<void> {
  const user = await useDb()('users').where({ email, active: true }).first()
  if (!user) return
  const { token, hash } = newToken()
  await useDb().transaction(async (trx) => {
    await trx('userTokens').insert({ userId: user.id, purpose: 'reset_password', tokenHash: hash, expiresAt: expiresAt(TOKEN_LIFETIME_MS.resetPassword) })
    await queueNotice(trx, {
      orgId: user.orgId,
      recipients: [email],
      kind: 'account.reset_password',
      subject: 'Reset your Pomewright password',
      body: `Hello ${user.name},\n\nSomeone asked to reset the password of this account. To choose a new one, open:\n\n${appLink(`/reset-password?token=${token}`)}\n\nThe link works once and expires in one hour. If it was not you, ignore this message: your password is unchanged.\n`,
    })
  })
}

export async function resetPassword(token: string, password: string): Promise<void> {
  const passwordHash = await hashPassword(password)
  await useDb().transaction(async (trx) => {
    const { userId } = await takeToken(trx, token, 'reset_password')
    await trx('users').where({ id: userId }).update({ passwordHash, updatedAt: trx.fn.now(3) })
    // Other outstanding reset links die with this one.
    await trx('userTokens').where({ userId, purpose: 'reset_password' }).whereNull('usedAt').update({ usedAt: trx.fn.now(3) })
    const user = await trx('users').where({ id: userId }).first('orgId')
    await recordAudit(trx, { orgId: user.orgId, actorUserId: userId, action: 'user.password_reset', objectType: 'user', objectId: userId })
  })
}

export async function invite(owner: SessionUser & { orgId: number }, input: InviteInput): Promise<{ id: number, email: string, role: string, expiresAt: string }> {
  const existing = await useDb()('users').where({ email: input.email }).first()
  if (existing) throw fieldError([{ path: 'email', message: 'Already has an account' }], { statusCode: 409, message: 'This person already has a Pomewright account.' })
  const { token, hash } = newToken()
  const expires = expiresAt(TOKEN_LIFETIME_MS.invitation)
  const id = await useDb().transaction(async (trx) => {
    // A new invitation to the same address replaces any earlier one.
    await trx('invitations').where({ orgId: owner.orgId, email: input.email }).whereNull('acceptedAt').whereNull('revokedAt').update({ revokedAt: trx.fn.now(3) })
    const [id] = await trx('invitations').insert({ orgId: owner.orgId, email: input.email, role: input.role, tokenHash: hash, invitedBy: owner.id, expiresAt: expires })
    await recordAudit(trx, { orgId: owner.orgId, actorUserId: owner.id, action: 'member.invited', objectType: 'invitation', objectId: id, detail: { email: input.email, role: input.role } })
    const org = await trx('organisations').where({ id: owner.orgId }).first('name')
    await queueNotice(trx, {
      orgId: owner.orgId,
      recipients: [input.email],
      kind: 'member.invited',
      subject: `${owner.name} invites you to ${org.name} on Pomewright`,
      body: `Hello,\n\n${owner.name} has invited you to join ${org.name} on Pomewright as ${input.role === 'viewer' ? 'a viewer' : `${input.role === 'owner' ? 'an' : 'a'} ${input.role}`}.\nTo accept and choose your password, open:\n\n${appLink(`/invite?token=${token}`)}\n\nThe link works once and expires in 7 days.\n`,
    })
    return id!
  })
  return { id, email: input.email, role: input.role, expiresAt: expires.toISOString() }
}

interface OpenInvitation { id: number, orgId: number, email: string, role: MemberRole, acceptedAt: Date | null, revokedAt: Date | null, expiresAt: Date, orgName: string }

async function openInvitation(db: Knex | Knex.Transaction, token: string, lock = false) {
  const query = db('invitations as i').join('organisations as o', 'o.id', 'i.orgId')
    .select('i.id', 'i.orgId', 'i.email', 'i.role', 'i.acceptedAt', 'i.revokedAt', 'i.expiresAt', 'o.name as orgName').where('i.tokenHash', hashToken(token))
  const row = await (lock ? query.forUpdate() : query).first() as OpenInvitation | undefined
  if (!row || row.acceptedAt || row.revokedAt || row.expiresAt <= new Date()) throw linkInvalid('invitation')
  return row
}

export async function lookupInvitation(token: string) {
  const row = await openInvitation(useDb(), token)
  return { email: row.email, role: row.role, organisationName: row.orgName }
}

export async function acceptInvitation(input: { token: string, name: string, password: string }): Promise<{ email: string }> {
  const passwordHash = await hashPassword(input.password)
  return withDbRefusals(EMAIL_TAKEN, () => useDb().transaction(async (trx) => {
    const inv = await openInvitation(trx, input.token, true)
    const [userId] = await trx('users').insert({ orgId: inv.orgId, email: inv.email, name: input.name, passwordHash, role: inv.role, emailVerifiedAt: trx.fn.now(3) })
    await trx('invitations').where({ id: inv.id }).update({ acceptedAt: trx.fn.now(3) })
    await recordAudit(trx, { orgId: inv.orgId, actorUserId: userId!, action: 'member.joined', objectType: 'user', objectId: userId, detail: { role: inv.role } })
    await queueNoticeToOwners(trx, inv.orgId, {
      kind: 'member.joined',
      subject: `${input.name} accepted the invitation to ${inv.orgName}`,
      body: `${input.name} (${inv.email}) accepted the invitation and joined ${inv.orgName} as ${inv.role}.`,
      link: '/members',
    }, userId)
    return { email: inv.email }
  }))
}

export async function listInvitations(orgId: number) {
  const items = await useDb()('invitations').where({ orgId }).whereNull('acceptedAt').whereNull('revokedAt')
    .where('expiresAt', '>', new Date()).orderBy('createdAt', 'desc').select('id', 'email', 'role', 'expiresAt')
  return { items, total: items.length }
}

export async function revokeInvitation(owner: SessionUser & { orgId: number }, id: number): Promise<void> {
  await useDb().transaction(async (trx) => {
    const changed = await trx('invitations').where({ id, orgId: owner.orgId }).whereNull('acceptedAt').whereNull('revokedAt').update({ revokedAt: trx.fn.now(3) })
    if (!changed) notFound('That invitation')
    await recordAudit(trx, { orgId: owner.orgId, actorUserId: owner.id, action: 'member.invitation_revoked', objectType: 'invitation', objectId: id })
  })
}
