import type { MessageState } from '../utils/messageStatus'

/** An in-app notice, as `GET /api/notices` lists it. */
export interface Notice {
  id: number
  kind: string
  subject: string
  body: string
  /** The path of the object it is about (`/blocks/3`), or null. */
  link: string | null
  readAt: string | null
  createdAt: string
}

export interface NoticeList { items: Notice[], total: number, unread: number }

/** One e-mail of the organisation's outbox, without its body. */
export interface OutboxMessage {
  id: number
  recipient: string
  kind: string
  subject: string
  link: string | null
  status: MessageState
  attempts: number
  /** The relay's answer to the last failed try. */
  error: string | null
  nextAttemptAt: string
  sentAt: string | null
  createdAt: string
}

export interface OutboxList { items: OutboxMessage[], total: number }
