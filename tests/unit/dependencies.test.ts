import { describe, expect, it } from 'vitest'
import { isDependencyDown } from '../../server/utils/dependencies'

describe('telling an outage from a bug', () => {
  it('sees a refused or lost database connection, also when wrapped', () => {
    expect(isDependencyDown(Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:3307'), { code: 'ECONNREFUSED' }))).toBe(true)
    expect(isDependencyDown(new Error('query failed', { cause: Object.assign(new Error('gone'), { code: 'PROTOCOL_CONNECTION_LOST' }) }))).toBe(true)
    expect(isDependencyDown(Object.assign(new Error('Knex: Timeout acquiring a connection'), { name: 'KnexTimeoutError' }))).toBe(true)
  })

  it('does not mistake other errors for an outage', () => {
    expect(isDependencyDown(new TypeError('x is undefined'))).toBe(false)
    expect(isDependencyDown(Object.assign(new Error('Duplicate entry'), { code: 'ER_DUP_ENTRY', errno: 1062 }))).toBe(false)
    expect(isDependencyDown(null)).toBe(false)
  })
})
