import type { Knex } from 'knex'
import { insertMessages, type QueuedMail } from '../repositories/outbox'
import { insertNotices, markNoticeRead, ownerIds, recipientsByIds, type NewNotice } from '../repositories/notices'
import { appLink } from '../utils/mail'
import { notFound } from '../utils/validation'

// The one way to tell people something. Called inside the action's own transaction, it writes the
// in-app notices and the e-mails to the outbox, so they commit with the change they tell of (or
// not at all); the background sender delivers the e-mails later. An action never waits for the
// relay and never fails because it is down.

export interface NoticeInput {
  orgId: number | null
  /** Users by id (an in-app notice and an e-mail each), or an address of someone without an account yet (e-mail only). */
  recipients: (number | string)[]
  subject: string
  body: string
  /** The path of the object it is about (`/blocks/3`); the e-mail links to it. */
  link?: string | null
  /** What happened, e.g. `member.role_changed`. */
  kind: string
}

const SUBJECT_MAX = 200

export async function queueNotice(trx: Knex.Transaction, input: NoticeInput): Promise<void> {
  const ids = [...new Set(input.recipients.filter((r): r is number => typeof r === 'number'))]
  const addresses = [...new Set(input.recipients.filter((r): r is string => typeof r === 'string'))]
  const people = await recipientsByIds(trx, ids)
  const link = input.link ?? null
  const text = link ? `${input.body}\n\nOpen it in Pomewright: ${appLink(link)}\n` : input.body
  // Subjects are built from names (up to 160 characters each); the column holds 200.
  const subject = input.subject.length > SUBJECT_MAX ? `${input.subject.slice(0, SUBJECT_MAX - 1)}…` : input.subject
  const common = { orgId: input.orgId, kind: input.kind, subject }
  await insertNotices(trx, people.map((p): NewNotice => ({ ...common, userId: p.id, body: input.body, link })))
  await insertMessages(trx, [
    ...people.map((p): QueuedMail => ({ ...common, userId: p.id, recipient: p.email, body: text, link })),
    ...addresses.map((a): QueuedMail => ({ ...common, userId: null, recipient: a, body: text, link })),
  ])
}

/** Tells the organisation's owners (but not `except`, the one who did it), inside the caller's transaction. */
export async function queueNoticeToOwners(trx: Knex.Transaction, orgId: number, notice: Omit<NoticeInput, 'recipients' | 'orgId'>, except?: number): Promise<void> {
  const owners = (await ownerIds(trx, orgId)).filter(id => id !== except)
  await queueNotice(trx, { ...notice, orgId, recipients: owners })
}

export async function readNotice(userId: number, id: number) {
  const notice = await markNoticeRead(userId, id)
  if (!notice) notFound('That notice')
  return notice
}
