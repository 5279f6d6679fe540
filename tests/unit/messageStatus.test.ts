import { describe, expect, it } from 'vitest'
import { afterFailedTry, backoffDelayMs, MESSAGE_MOVES, MESSAGE_STATES, OUTBOX_SENDER } from '#shared/utils/messageStatus'
import { checkMove, movesFrom } from '#shared/utils/stateMachine'
import { OUTBOX_DEFAULTS, outboxSettings } from '../../server/utils/outboxSettings'

const person = { role: 'person' } as const

describe('outbox message states', () => {
  it('lets the sender deliver, retry or give up on a queued message, and nothing more', () => {
    expect(movesFrom(MESSAGE_MOVES, 'queued', OUTBOX_SENDER).map(m => [m.action, m.to])).toEqual([['deliver', 'sent'], ['retry', 'queued'], ['give-up', 'failed']])
    expect(movesFrom(MESSAGE_MOVES, 'sent', OUTBOX_SENDER)).toEqual([])
    expect(movesFrom(MESSAGE_MOVES, 'failed', OUTBOX_SENDER)).toEqual([])
  })

  it('gives people no moves: they only read the outbox', () => {
    for (const state of MESSAGE_STATES) expect(movesFrom(MESSAGE_MOVES, state, person)).toEqual([])
    expect(checkMove(MESSAGE_MOVES, 'deliver', 'queued', person)).toMatchObject({ ok: false, statusCode: 403 })
  })

  it('never sends a message twice: a sent or failed message cannot be delivered again', () => {
    expect(checkMove(MESSAGE_MOVES, 'deliver', 'queued', OUTBOX_SENDER)).toEqual({ ok: true, from: 'queued', to: 'sent' })
    expect(checkMove(MESSAGE_MOVES, 'deliver', 'sent', OUTBOX_SENDER)).toMatchObject({ ok: false, statusCode: 409, state: 'sent' })
    expect(checkMove(MESSAGE_MOVES, 'retry', 'failed', OUTBOX_SENDER)).toMatchObject({ ok: false, statusCode: 409, state: 'failed' })
  })
})

describe('the retry schedule', () => {
  const schedule = { maxAttempts: 5, backoffMs: 60_000, maxBackoffMs: 3_600_000 }

  it('doubles the wait after each failed try: 1, 2, 4 and 8 minutes, then gives up on the fifth', () => {
    expect([1, 2, 3, 4].map(n => afterFailedTry(n, schedule))).toEqual([
      { action: 'retry', delayMs: 60_000 },
      { action: 'retry', delayMs: 120_000 },
      { action: 'retry', delayMs: 240_000 },
      { action: 'retry', delayMs: 480_000 },
    ])
    expect(afterFailedTry(5, schedule)).toEqual({ action: 'give-up' })
    expect(afterFailedTry(6, schedule)).toEqual({ action: 'give-up' })
  })

  it('caps the wait, even after very many tries', () => {
    expect(backoffDelayMs(7, schedule)).toBe(3_600_000)
    expect(backoffDelayMs(1000, schedule)).toBe(3_600_000)
  })

  it('gives up at once when only one try is allowed', () => {
    expect(afterFailedTry(1, { ...schedule, maxAttempts: 1 })).toEqual({ action: 'give-up' })
  })
})

describe('the sender settings', () => {
  it('runs by default with the documented schedule', () => {
    expect(outboxSettings({})).toEqual(OUTBOX_DEFAULTS)
    expect(OUTBOX_DEFAULTS).toMatchObject({ enabled: true, maxAttempts: 5, backoffMs: 60_000 })
  })

  it('reads its settings from the environment, and can be switched off', () => {
    expect(outboxSettings({ POMEWRIGHT_OUTBOX_SENDER: 'off' }).enabled).toBe(false)
    expect(outboxSettings({ POMEWRIGHT_OUTBOX_INTERVAL_MS: '200', POMEWRIGHT_OUTBOX_MAX_ATTEMPTS: '3', POMEWRIGHT_OUTBOX_BACKOFF_MS: '100', POMEWRIGHT_OUTBOX_LEASE_MS: '5000' }))
      .toMatchObject({ enabled: true, intervalMs: 200, maxAttempts: 3, backoffMs: 100, leaseMs: 5000 })
  })

  it('names a setting that is not a whole number', () => {
    expect(() => outboxSettings({ POMEWRIGHT_OUTBOX_MAX_ATTEMPTS: 'five' })).toThrow(/POMEWRIGHT_OUTBOX_MAX_ATTEMPTS/)
    expect(() => outboxSettings({ POMEWRIGHT_OUTBOX_INTERVAL_MS: '0' })).toThrow(/at least 10/)
  })
})
