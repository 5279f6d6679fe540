import type { MoveTable } from './stateMachine'

// An outbox message is `queued` until the background sender delivers it (`sent`) or gives up
// after its last try (`failed`, with the relay's error kept). Only the sender moves a message;
// a try that fails short of the limit leaves it queued for a later try.
export const MESSAGE_STATES = ['queued', 'sent', 'failed'] as const
export type MessageState = typeof MESSAGE_STATES[number]
export type MessageAction = 'deliver' | 'retry' | 'give-up'

/** Who moves a message: the outbox sender. People only read the outbox. */
export interface MessageActor { role: 'sender' | 'person' }

export const OUTBOX_SENDER: MessageActor = { role: 'sender' }

const isSender = (a: MessageActor) => a.role === 'sender'

export const MESSAGE_MOVES: MoveTable<MessageState, MessageAction, MessageActor> = [
  { action: 'deliver', from: ['queued'], to: 'sent', label: 'Sent', allowed: isSender },
  { action: 'retry', from: ['queued'], to: 'queued', label: 'Try again later', allowed: isSender },
  { action: 'give-up', from: ['queued'], to: 'failed', label: 'Failed', allowed: isSender },
]

/** How the sender spaces its tries of one message. */
export interface RetrySchedule {
  /** Tries in all, the first included, before a message is failed. */
  maxAttempts: number
  /** The wait after the first failed try; each later wait doubles. */
  backoffMs: number
  /** No wait is longer than this. */
  maxBackoffMs: number
}

/** The wait before the next try after `attempts` failed tries (1 → backoffMs, 2 → twice that, …), capped. */
export function backoffDelayMs(attempts: number, schedule: RetrySchedule): number {
  const doublings = Math.max(0, attempts - 1)
  return Math.min(schedule.maxBackoffMs, schedule.backoffMs * 2 ** Math.min(doublings, 30))
}

/** What follows a failed try: another one after a wait, or giving up once every try is spent. */
export function afterFailedTry(attempts: number, schedule: RetrySchedule): { action: 'retry', delayMs: number } | { action: 'give-up' } {
  if (attempts >= schedule.maxAttempts) return { action: 'give-up' }
  return { action: 'retry', delayMs: backoffDelayMs(attempts, schedule) }
}
