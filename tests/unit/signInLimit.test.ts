import { describe, expect, it } from 'vitest'
import { isLimited, limitPolicy, windowStart } from '../../server/utils/signInLimit'

describe('sign-in rate limit', () => {
  it('defaults to 10 failures in 15 minutes', () => {
    expect(limitPolicy({})).toEqual({ maxFailures: 10, windowMinutes: 15 })
  })

  it('takes its numbers from the environment, ignoring nonsense', () => {
    expect(limitPolicy({ SIGNIN_MAX_FAILURES: '5', SIGNIN_WINDOW_MINUTES: '30' })).toEqual({ maxFailures: 5, windowMinutes: 30 })
    expect(limitPolicy({ SIGNIN_MAX_FAILURES: 'lots', SIGNIN_WINDOW_MINUTES: '-1' })).toEqual({ maxFailures: 10, windowMinutes: 15 })
  })

  it('limits once the account or the address reaches the maximum, not before', () => {
    const policy = { maxFailures: 10, windowMinutes: 15 }
    expect(isLimited({ account: 9, address: 9 }, policy)).toBe(false)
    expect(isLimited({ account: 10, address: 0 }, policy)).toBe(true)
    expect(isLimited({ account: 0, address: 10 }, policy)).toBe(true)
  })

  it('counts only failures inside the window', () => {
    const now = new Date('2026-10-01T12:00:00Z')
    expect(windowStart(now, { maxFailures: 10, windowMinutes: 15 }).toISOString()).toBe('2026-10-01T11:45:00.000Z')
  })
})
