import type { Knex } from 'knex'
import type { MessageState } from '#shared/utils/messageStatus'
import type { OutboxMessage } from '#shared/types/notice'
import { useDb, type Db } from '../utils/db'

// The e-mail outbox (`notifications`). Writes come from queueNotice inside an action's own
// transaction and from the sender; the organisation's owners read what went out in its name.
// Times are the database's own (NOW(3)), so instances whose clocks differ agree on what is due.

export interface QueuedMail { orgId: number | null, userId: number | null, recipient: string, kind: string, subject: string, body: string, link: string | null }

export interface ClaimedMessage { id: number, recipient: string, subject: string, body: string, attempts: number }

export async function insertMessages(trx: Knex.Transaction, rows: QueuedMail[]): Promise<void> {
  if (rows.length) await trx('notifications').insert(rows)
}

const inMs = (db: Db, ms: number) => db.raw('NOW(3) + INTERVAL ? MICROSECOND', [Math.round(ms) * 1000])

/**
 * Claims up to `limit` due messages for `claim`: the rows are locked with FOR UPDATE SKIP LOCKED,
 * so a sender never waits for, nor takes, a row another has in hand; each claimed row counts one
 * more try and is leased until `leaseMs` from now.
 */
export function claimDue(claim: string, limit: number, leaseMs: number): Promise<ClaimedMessage[]> {
  return useDb().transaction(async (trx) => {
    const rows = await trx('notifications')
      .where('status', 'queued')
      .where('nextAttemptAt', '<=', trx.raw('NOW(3)'))
      .where(q => q.whereNull('lockedUntil').orWhere('lockedUntil', '<=', trx.raw('NOW(3)')))
      .orderBy([{ column: 'nextAttemptAt' }, { column: 'id' }])
      .limit(limit)
      .forUpdate()
      .skipLocked()
      .select('id', 'recipient', 'subject', 'body', 'attempts') as ClaimedMessage[]
    if (!rows.length) return []
    await trx('notifications').whereIn('id', rows.map(r => r.id))
      .update({ claimedBy: claim, lockedUntil: inMs(trx, leaseMs), attempts: trx.raw('attempts + 1') })
    return rows.map(r => ({ ...r, attempts: r.attempts + 1 }))
  })
}

/**
 * Renews this sender's lease on one message just before it is sent, so a batch that sends slowly
 * never hands its later messages to another sender mid-batch. False when the claim has lapsed (the
 * message is then left alone: another sender may have it).
 */
export async function renewClaim(id: number, claim: string, leaseMs: number): Promise<boolean> {
  const db = useDb()
  const changed = await db('notifications').where({ id, claimedBy: claim, status: 'queued' }).where('lockedUntil', '>', db.raw('NOW(3)'))
    .update({ lockedUntil: inMs(db, leaseMs) })
  return changed === 1
}

/**
 * Writes the outcome of one try, only while the claim is still this sender's. True when it was.
 * The claim stays on the row: it names the instance that last tried it.
 */
async function settle(id: number, claim: string, changes: Record<string, unknown>): Promise<boolean> {
  const changed = await useDb()('notifications').where({ id, claimedBy: claim, status: 'queued' })
    .update({ ...changes, lockedUntil: null })
  return changed === 1
}

export function markSent(id: number, claim: string): Promise<boolean> {
  return settle(id, claim, { status: 'sent' satisfies MessageState, sentAt: useDb().raw('NOW(3)'), error: null })
}

export function markRetry(id: number, claim: string, error: string, delayMs: number): Promise<boolean> {
  return settle(id, claim, { error: error.slice(0, 500), nextAttemptAt: inMs(useDb(), delayMs) })
}

export function markFailed(id: number, claim: string, error: string): Promise<boolean> {
  return settle(id, claim, { status: 'failed' satisfies MessageState, error: error.slice(0, 500) })
}

const OUTBOX_COLUMNS = ['id', 'recipient', 'kind', 'subject', 'link', 'status', 'attempts', 'error', 'nextAttemptAt', 'sentAt', 'createdAt']

/** What went out in the organisation's name, newest first; the bodies (which may carry one-time links) stay out. */
export async function listOrganisationOutbox(orgId: number, query: { limit: number, offset: number, status?: MessageState }): Promise<{ items: OutboxMessage[], total: number }> {
  const base = useDb()('notifications').where({ orgId })
  if (query.status) base.andWhere('status', query.status)
  const [items, [{ total }]] = await Promise.all([
    base.clone().select(OUTBOX_COLUMNS).orderBy([{ column: 'createdAt', order: 'desc' }, { column: 'id', order: 'desc' }]).limit(query.limit).offset(query.offset) as Promise<OutboxMessage[]>,
    base.clone().count({ total: '*' }) as unknown as Promise<[{ total: number }]>,
  ])
  return { items, total }
}
