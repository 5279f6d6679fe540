import type { RetrySchedule } from '#shared/utils/messageStatus'

/** How the background sender runs, from the environment (see .env.example). */
export interface OutboxSettings extends RetrySchedule {
  enabled: boolean
  /** The pause between looks for due messages. */
  intervalMs: number
  /** How long a claimed message stays the claimant's; after it, another sender may try it. */
  leaseMs: number
  /** Messages claimed at once. */
  batchSize: number
}

export const OUTBOX_DEFAULTS: OutboxSettings = {
  enabled: true,
  intervalMs: 5_000,
  leaseMs: 120_000,
  batchSize: 20,
  maxAttempts: 5,
  // 1, 2, 4 and 8 minutes between the five tries: a relay down for a quarter of an hour loses nothing.
  backoffMs: 60_000,
  maxBackoffMs: 3_600_000,
}

function whole(env: Record<string, string | undefined>, name: string, fallback: number, min: number): number {
  const raw = env[name]
  if (raw === undefined || raw === '') return fallback
  const n = Number(raw)
  if (!Number.isInteger(n) || n < min) throw new Error(`${name} must be a whole number of at least ${min}, got "${raw}"`)
  return n
}

/** Reads POMEWRIGHT_OUTBOX_*; a value that is not a sensible number stops the start with its name. */
export function outboxSettings(env: Record<string, string | undefined> = process.env): OutboxSettings {
  const d = OUTBOX_DEFAULTS
  return {
    enabled: !['off', '0', 'false', 'no'].includes((env.POMEWRIGHT_OUTBOX_SENDER ?? 'on').toLowerCase()),
    intervalMs: whole(env, 'POMEWRIGHT_OUTBOX_INTERVAL_MS', d.intervalMs, 10),
    leaseMs: whole(env, 'POMEWRIGHT_OUTBOX_LEASE_MS', d.leaseMs, 1_000),
    batchSize: whole(env, 'POMEWRIGHT_OUTBOX_BATCH', d.batchSize, 1),
    maxAttempts: whole(env, 'POMEWRIGHT_OUTBOX_MAX_ATTEMPTS', d.maxAttempts, 1),
    backoffMs: whole(env, 'POMEWRIGHT_OUTBOX_BACKOFF_MS', d.backoffMs, 0),
    maxBackoffMs: whole(env, 'POMEWRIGHT_OUTBOX_BACKOFF_MAX_MS', d.maxBackoffMs, 0),
  }
}
