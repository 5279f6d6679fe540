// Failed sign-ins are counted per account and per client address in the database, so that every
// app instance agrees. Defaults: 10 failures within 15 minutes (SIGNIN_MAX_FAILURES, SIGNIN_WINDOW_MINUTES).
export interface LimitPolicy { maxFailures: number, windowMinutes: number }

export function limitPolicy(env: Record<string, string | undefined> = process.env): LimitPolicy {
  const max = Number(env.SIGNIN_MAX_FAILURES || 10)
  const window = Number(env.SIGNIN_WINDOW_MINUTES || 15)
  return {
    maxFailures: Number.isInteger(max) && max > 0 ? max : 10,
    windowMinutes: Number.isFinite(window) && window > 0 ? window : 15,
  }
}

export interface FailureCounts { account: number, address: number }

/** Limited once either the account or the address has had maxFailures failures inside the window. */
export function isLimited(counts: FailureCounts, policy: LimitPolicy): boolean {
  return counts.account >= policy.maxFailures || counts.address >= policy.maxFailures
}

export function windowStart(now: Date, policy: LimitPolicy): Date {
  return new Date(now.getTime() - policy.windowMinutes * 60_000)
}

/** The header the sign-in middleware sets (overwriting anything a client sent) so authorize() sees the address. */
export const CLIENT_ADDRESS_HEADER = 'x-pomewright-client-address'
