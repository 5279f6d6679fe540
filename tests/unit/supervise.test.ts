import { describe, expect, it } from 'vitest'
import { nextRestart, RESTART_POLICY, restartPolicy } from '../../scripts/stack/supervise'

const MINUTE = 60_000

describe('restarting a service that stopped', () => {
  it('restarts at once-ish, waiting longer each time', () => {
    expect(nextRestart([], 0)).toEqual({ restart: true, attempt: 1, delayMs: 1000 })
    expect(nextRestart([0, 1], 2)).toEqual({ restart: true, attempt: 3, delayMs: 4000 })
  })

  it('gives up after five restarts within ten minutes', () => {
    const five = [0, 1, 2, 3, 4].map(i => i * MINUTE)
    expect(nextRestart(five.slice(0, 4), 5 * MINUTE)).toMatchObject({ restart: true, attempt: 5 })
    expect(nextRestart(five, 5 * MINUTE)).toEqual({ restart: false })
  })

  it('forgets restarts older than the window', () => {
    const five = [0, 1, 2, 3, 4].map(i => i * MINUTE)
    expect(nextRestart(five, 10 * MINUTE)).toEqual({ restart: true, attempt: 5, delayMs: 15_000 })
    expect(nextRestart(five, 20 * MINUTE)).toEqual({ restart: true, attempt: 1, delayMs: 1000 })
  })

  it('takes the limit from POMEWRIGHT_MAX_RESTARTS, where 0 means never', () => {
    expect(restartPolicy({})).toBe(RESTART_POLICY)
    const none = restartPolicy({ POMEWRIGHT_MAX_RESTARTS: '0' })
    expect(nextRestart([], 0, none)).toEqual({ restart: false })
    expect(() => restartPolicy({ POMEWRIGHT_MAX_RESTARTS: 'lots' })).toThrow(/whole number/)
  })
})
