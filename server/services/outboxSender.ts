import { randomUUID } from 'node:crypto'
import { hostname } from 'node:os'
import { afterFailedTry, MESSAGE_MOVES, OUTBOX_SENDER, type MessageAction } from '#shared/utils/messageStatus'
import { checkMove } from '#shared/utils/stateMachine'
import { claimDue, markFailed, markRetry, markSent, renewClaim, type ClaimedMessage } from '../repositories/outbox'
import { createMailer, deliver } from '../utils/mail'
import type { OutboxSettings } from '../utils/outboxSettings'

// The background sender: every instance may run one. Each round claims due messages in a short
// transaction (FOR UPDATE SKIP LOCKED, then a lease), sends them outside it, and writes each
// outcome only while its claim holds, so no message is sent by two instances. A sender that dies
// mid-send leaves its rows leased; once the lease ends another takes them up again.

export interface OutboxSender {
  /** Stops looking for work and waits for the round in hand to finish. */
  stop: () => Promise<void>
  /** Runs a round now (and drains what is due). */
  runOnce: () => Promise<number>
}

const instance = `${hostname()}:${process.pid}`

function errorText(error: unknown): string {
  const e = error as { message?: string, code?: string, response?: string }
  return [e.code, e.response ?? e.message].filter(Boolean).join(': ') || String(error)
}

export function startOutboxSender(settings: OutboxSettings): OutboxSender {
  const mailer = createMailer(settings.leaseMs)
  let stopped = false
  let timer: ReturnType<typeof setTimeout> | undefined
  let round: Promise<unknown> | null = null
  let reportedDown = false

  async function move(action: MessageAction, message: ClaimedMessage, write: () => Promise<boolean>) {
    // A claimed message is queued; the table says whether the sender may make this move from there.
    const check = checkMove(MESSAGE_MOVES, action, 'queued', OUTBOX_SENDER, 'The message')
    if (!check.ok) throw new Error(check.message)
    if (!await write()) console.warn(`Outbox: message ${message.id} was claimed by another sender before its outcome was written (the lease is shorter than a send).`)
  }

  async function sendOne(message: ClaimedMessage, claim: string) {
    if (!await renewClaim(message.id, claim, settings.leaseMs)) return
    try {
      await deliver(mailer, { to: message.recipient, subject: message.subject, text: message.body })
    }
    catch (error) {
      const next = afterFailedTry(message.attempts, settings)
      if (next.action === 'give-up') return move('give-up', message, () => markFailed(message.id, claim, errorText(error)))
      return move('retry', message, () => markRetry(message.id, claim, errorText(error), next.delayMs))
    }
    await move('deliver', message, () => markSent(message.id, claim))
  }

  /** Claims and sends batch after batch until nothing is due; the number of messages tried. */
  async function runOnce(): Promise<number> {
    let tried = 0
    while (!stopped) {
      const claim = `${instance}:${randomUUID().slice(0, 8)}`
      const batch = await claimDue(claim, settings.batchSize, settings.leaseMs)
      for (const message of batch) await sendOne(message, claim)
      tried += batch.length
      if (batch.length < settings.batchSize) break
    }
    return tried
  }

  function schedule() {
    if (stopped) return
    timer = setTimeout(tick, settings.intervalMs)
    // The loop alone never keeps a process alive.
    timer.unref()
  }

  function tick() {
    round = runOnce().then(() => {
      if (reportedDown) console.warn('Outbox: the database answers again; sending resumed.')
      reportedDown = false
    }, (error: unknown) => {
      // Said once per outage, not every interval; the messages wait in the outbox meanwhile.
      if (!reportedDown) console.warn(`Outbox: could not look for due messages (${errorText(error)}); trying again every ${settings.intervalMs} ms.`)
      reportedDown = true
    }).finally(() => {
      round = null
      schedule()
    })
  }

  schedule()
  return {
    runOnce,
    async stop() {
      stopped = true
      clearTimeout(timer)
      await round
      mailer.close()
    },
  }
}
