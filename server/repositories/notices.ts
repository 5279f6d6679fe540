import type { Knex } from 'knex'
import type { Notice, NoticeList } from '#shared/types/notice'
import { useDb } from '../utils/db'

// In-app notices: each belongs to one person, so every query names the user (another person's
// notice is simply not there).

export interface NewNotice { userId: number, orgId: number | null, kind: string, subject: string, body: string, link: string | null }

export async function insertNotices(trx: Knex.Transaction, rows: NewNotice[]): Promise<void> {
  if (rows.length) await trx('notices').insert(rows)
}

const COLUMNS = ['id', 'kind', 'subject', 'body', 'link', 'readAt', 'createdAt']

export async function listNotices(userId: number, page: { limit: number, offset: number }): Promise<NoticeList> {
  const db = useDb()
  const [items, [counts]] = await Promise.all([
    db('notices').where({ userId }).select(COLUMNS).orderBy([{ column: 'createdAt', order: 'desc' }, { column: 'id', order: 'desc' }]).limit(page.limit).offset(page.offset) as Promise<Notice[]>,
    db('notices').where({ userId }).select(db.raw('COUNT(*) AS total'), db.raw('COALESCE(SUM(read_at IS NULL), 0) AS unread')) as unknown as Promise<[{ total: number, unread: number }]>,
  ])
  return { items, total: counts.total, unread: Number(counts.unread) }
}

/** Marks one notice read (a notice already read keeps its first time); false when it is not this person's. */
export async function markNoticeRead(userId: number, id: number): Promise<Notice | undefined> {
  const db = useDb()
  await db('notices').where({ id, userId }).whereNull('readAt').update({ readAt: db.fn.now(3) })
  return db('notices').where({ id, userId }).first(COLUMNS)
}

export async function markAllNoticesRead(userId: number): Promise<number> {
  const db = useDb()
  return db('notices').where({ userId }).whereNull('readAt').update({ readAt: db.fn.now(3) })
}

/** The active people of the given ids, with the address their e-mail goes to. */
export function recipientsByIds(trx: Knex.Transaction, ids: number[]): Promise<{ id: number, email: string, orgId: number | null }[]> {
  if (!ids.length) return Promise.resolve([])
  return trx('users').whereIn('id', ids).where({ active: true }).select('id', 'email', 'orgId')
}

/** The active owners of an organisation. */
export async function ownerIds(trx: Knex.Transaction, orgId: number): Promise<number[]> {
  const rows = await trx('users').where({ orgId, role: 'owner', active: true }).select('id') as { id: number }[]
  return rows.map(r => r.id)
}
