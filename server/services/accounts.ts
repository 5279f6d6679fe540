import type { Knex } from 'knex'
import type { InviteInput, SignUpInput } from '../../shared/schemas/account'
import type { SessionUser } from '../../shared/types/auth'
import { recordAudit } from '../utils/audit'
import { ER_DUP_ENTRY, isDbError, useDb } from '../utils/db'
import { appLink, sendMail } from '../utils/mail'
import { hashPassword } from '../utils/passwords'
import { expiresAt, hashToken, newToken, TOKEN_LIFETIME_MS } from '../utils/tokens'
import { fieldError, notFound } from '../utils/validation'

const emailTaken = () => fieldError([{ path: 'email', message: 'Already registered' }], { statusCode: 409, message: 'An account with this e-mail already exists. Sign in, or reset the password.' })
const linkInvalid = (what: string) => fieldError([{ path: 'token', message: 'Expired or already used' }], { message: `This ${what} link is not valid any more: it has expired or was already used. Ask for a new one.` })

function sendConfirmation(to: string, name: string, orgName: string, token: string) {
  return sendMail({
    to,
    subject: 'Confirm your e-mail to open your Pomewright account',
    text: `Hello ${name},\n\nConfirm your e-mail address to open ${orgName} on Pomewright:\n\n${appLink(`/verify?token=${token}`)}\n\nThe link works once and expires in 48 hours. If you did not sign up, ignore this message.\n`,
  })
}

/**
 * A new organisation and its owner; both stay pending until the owner follows the e-mailed link.
 * Signing up again with an address still waiting for confirmation sends a fresh link (the first
 * mail may have been lost) and changes nothing else.
 */
export async function signUp(input: SignUpInput): Promise<void> {
  const pending = await useDb()('users as u').join('organisations as o', 'o.id', 'u.org_id')
    .where('u.email', input.email).whereNull('u.email_verified_at').first('u.id', 'u.name', 'o.name as org_name')
  if (pending) {
    const { token, hash } = newToken()
    await useDb()('user_tokens').insert({ user_id: pending.id, purpose: 'verify_email', token_hash: hash, expires_at: expiresAt(TOKEN_LIFETIME_MS.verifyEmail) })
    return sendConfirmation(input.email, pending.name, pending.org_name, token)
  }
  const passwordHash = await hashPassword(input.password)
  const { token, hash } = newToken()
  try {
    await useDb().transaction(async (trx) => {
      const [orgId] = await trx('organisations').insert({
        name: input.orgName, kind: input.orgKind, is_nursery: input.orgKind === 'grower' && input.isNursery,
        region: input.region || null, contact_email: input.email, status: 'pending',
      })
      const [userId] = await trx('users').insert({ org_id: orgId, email: input.email, name: input.name, password_hash: passwordHash, role: 'owner' })
      await trx('user_tokens').insert({ user_id: userId, purpose: 'verify_email', token_hash: hash, expires_at: expiresAt(TOKEN_LIFETIME_MS.verifyEmail) })
      await recordAudit(trx, { orgId: orgId!, actorUserId: userId!, action: 'organisation.signed_up', objectType: 'organisation', objectId: orgId })
    })
  }
  catch (error) {
    if (isDbError(error, ER_DUP_ENTRY)) throw emailTaken()
    throw error
  }
  await sendConfirmation(input.email, input.name, input.orgName, token)
}

/** Takes a one-time token of the given purpose, or throws 400 when it is unknown, used or expired. */
async function takeToken(trx: Knex.Transaction, token: string, purpose: 'verify_email' | 'reset_password') {
  const row = await trx('user_tokens').where({ token_hash: hashToken(token), purpose }).forUpdate().first()
  if (!row || row.used_at || new Date(row.expires_at) <= new Date()) throw linkInvalid(purpose === 'verify_email' ? 'confirmation' : 'password reset')
  await trx('user_tokens').where({ id: row.id }).update({ used_at: trx.fn.now(3) })
  return row as { id: number, user_id: number }
}

export async function verifyEmail(token: string): Promise<void> {
  await useDb().transaction(async (trx) => {
    const { user_id: userId } = await takeToken(trx, token, 'verify_email')
    const user = await trx('users').where({ id: userId }).first()
    await trx('users').where({ id: userId }).update({ email_verified_at: trx.fn.now(3) })
    await trx('organisations').where({ id: user.org_id, status: 'pending' }).update({ status: 'active' })
    await recordAudit(trx, { orgId: user.org_id, actorUserId: userId, action: 'user.email_verified', objectType: 'user', objectId: userId })
  })
}

/** Always answers the same way, whether or not the address has an account. */
export async function requestPasswordReset(email: string): Promise<void> {
  const user = await useDb()('users').where({ email, active: true }).first()
  if (!user) return
  const { token, hash } = newToken()
  await useDb()('user_tokens').insert({ user_id: user.id, purpose: 'reset_password', token_hash: hash, expires_at: expiresAt(TOKEN_LIFETIME_MS.resetPassword) })
  await sendMail({
    orgId: user.org_id,
    to: email,
    subject: 'Reset your Pomewright password',
    text: `Hello ${user.name},\n\nSomeone asked to reset the password of this account. To choose a new one, open:\n\n${appLink(`/reset-password?token=${token}`)}\n\nThe link works once and expires in one hour. If it was not you, ignore this message: your password is unchanged.\n`,
  })
}

export async function resetPassword(token: string, password: string): Promise<void> {
  const passwordHash = await hashPassword(password)
  await useDb().transaction(async (trx) => {
    const { user_id: userId } = await takeToken(trx, token, 'reset_password')
    await trx('users').where({ id: userId }).update({ password_hash: passwordHash, updated_at: trx.fn.now(3) })
    // Other outstanding reset links die with this one.
    await trx('user_tokens').where({ user_id: userId, purpose: 'reset_password' }).whereNull('used_at').update({ used_at: trx.fn.now(3) })
    const user = await trx('users').where({ id: userId }).first()
    await recordAudit(trx, { orgId: user.org_id, actorUserId: userId, action: 'user.password_reset', objectType: 'user', objectId: userId })
  })
}

export async function invite(owner: SessionUser & { orgId: number }, input: InviteInput): Promise<{ id: number, email: string, role: string, expiresAt: string }> {
  const existing = await useDb()('users').where({ email: input.email }).first()
  if (existing) throw fieldError([{ path: 'email', message: 'Already has an account' }], { statusCode: 409, message: 'This person already has a Pomewright account.' })
  const { token, hash } = newToken()
  const expires = expiresAt(TOKEN_LIFETIME_MS.invitation)
  const id = await useDb().transaction(async (trx) => {
    // A new invitation to the same address replaces any earlier one.
    await trx('invitations').where({ org_id: owner.orgId, email: input.email }).whereNull('accepted_at').whereNull('revoked_at').update({ revoked_at: trx.fn.now(3) })
    const [id] = await trx('invitations').insert({ org_id: owner.orgId, email: input.email, role: input.role, token_hash: hash, invited_by: owner.id, expires_at: expires })
    await recordAudit(trx, { orgId: owner.orgId, actorUserId: owner.id, action: 'member.invited', objectType: 'invitation', objectId: id, detail: { email: input.email, role: input.role } })
    return id!
  })
  const org = await useDb()('organisations').where({ id: owner.orgId }).first()
  await sendMail({
    orgId: owner.orgId,
    to: input.email,
    subject: `${owner.name} invites you to ${org.name} on Pomewright`,
    text: `Hello,\n\n${owner.name} has invited you to join ${org.name} on Pomewright as ${input.role === 'viewer' ? 'a viewer' : `${input.role === 'owner' ? 'an' : 'a'} ${input.role}`}.\nTo accept and choose your password, open:\n\n${appLink(`/invite?token=${token}`)}\n\nThe link works once and expires in 7 days.\n`,
  })
  return { id, email: input.email, role: input.role, expiresAt: expires.toISOString() }
}

async function openInvitation(db: Knex | Knex.Transaction, token: string, lock = false) {
  const query = db('invitations as i').join('organisations as o', 'o.id', 'i.org_id')
    .select('i.*', 'o.name as org_name').where('i.token_hash', hashToken(token))
  const row = await (lock ? query.forUpdate() : query).first()
  if (!row || row.accepted_at || row.revoked_at || new Date(row.expires_at) <= new Date()) throw linkInvalid('invitation')
  return row
}

export async function lookupInvitation(token: string) {
  const row = await openInvitation(useDb(), token)
  return { email: row.email as string, role: row.role as string, organisationName: row.org_name as string }
}

export async function acceptInvitation(input: { token: string, name: string, password: string }): Promise<{ email: string }> {
  const passwordHash = await hashPassword(input.password)
  try {
    return await useDb().transaction(async (trx) => {
      const inv = await openInvitation(trx, input.token, true)
      const [userId] = await trx('users').insert({ org_id: inv.org_id, email: inv.email, name: input.name, password_hash: passwordHash, role: inv.role, email_verified_at: trx.fn.now(3) })
      await trx('invitations').where({ id: inv.id }).update({ accepted_at: trx.fn.now(3) })
      await recordAudit(trx, { orgId: inv.org_id, actorUserId: userId!, action: 'member.joined', objectType: 'user', objectId: userId, detail: { role: inv.role } })
      return { email: inv.email as string }
    })
  }
  catch (error) {
    if (isDbError(error, ER_DUP_ENTRY)) throw emailTaken()
    throw error
  }
}

export async function listInvitations(orgId: number) {
  const rows = await useDb()('invitations').where({ org_id: orgId }).whereNull('accepted_at').whereNull('revoked_at')
    .where('expires_at', '>', new Date()).orderBy('created_at', 'desc')
  return { items: rows.map(r => ({ id: r.id, email: r.email, role: r.role, expiresAt: new Date(r.expires_at).toISOString() })), total: rows.length }
}

export async function revokeInvitation(owner: SessionUser & { orgId: number }, id: number): Promise<void> {
  const changed = await useDb()('invitations').where({ id, org_id: owner.orgId }).whereNull('accepted_at').whereNull('revoked_at').update({ revoked_at: useDb().fn.now(3) })
  if (!changed) notFound('That invitation')
  await recordAudit(useDb(), { orgId: owner.orgId, actorUserId: owner.id, action: 'member.invitation_revoked', objectType: 'invitation', objectId: id })
}
