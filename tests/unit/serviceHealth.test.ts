import { describe, expect, it } from 'vitest'
import { checkAll, serviceReport, timedCheck, type ServiceState } from '../../server/utils/serviceHealth'

const up = (name: ServiceState['name']): ServiceState => ({ name, state: 'up', responseMs: 3 })
const down = (name: ServiceState['name'], error = 'connect ECONNREFUSED 10.0.0.5:3306'): ServiceState => ({ name, state: 'down', responseMs: 1, error })

describe('the service health report', () => {
  it('answers 503 when the database is down, still listing every service', () => {
    const report = serviceReport([down('database'), up('storage'), up('mail'), up('payments')], { withErrors: false })
    expect(report.statusCode).toBe(503)
    expect(report.body.ok).toBe(false)
    expect(report.body.services.map(s => [s.name, s.state])).toEqual([['database', 'down'], ['storage', 'up'], ['mail', 'up'], ['payments', 'up']])
  })

  it('answers 200 while the database is up, with the other services that are down marked down', () => {
    const report = serviceReport([up('database'), down('storage'), down('mail'), down('payments')], { withErrors: false })
    expect(report.statusCode).toBe(200)
    expect(report.body.ok).toBe(true)
    expect(report.body.services.filter(s => s.state === 'down').map(s => s.name)).toEqual(['storage', 'mail', 'payments'])
  })

  it('shows why a service is down only when asked to', () => {
    const services = [up('database'), down('mail', 'Greeting never received')]
    expect(serviceReport(services, { withErrors: false }).body.services[1]).toEqual({ name: 'mail', state: 'down', responseMs: 1 })
    expect(serviceReport(services, { withErrors: true }).body.services[1]).toMatchObject({ error: 'Greeting never received' })
  })
})

describe('checking one service', () => {
  it('is up when the check succeeds, and times it', async () => {
    const state = await timedCheck('payments', () => new Promise(r => setTimeout(r, 20)))
    expect(state).toEqual({ name: 'payments', state: 'up', responseMs: expect.any(Number) })
    expect(state.responseMs).toBeGreaterThanOrEqual(15)
  })

  it('is down with the error when the check fails', async () => {
    const failing = async () => {
      throw new Error('bucket pomewright-files answered HTTP 404')
    }
    expect(await timedCheck('storage', failing))
      .toMatchObject({ state: 'down', error: 'bucket pomewright-files answered HTTP 404' })
  })

  it('gives up on a check that hangs, and tells it to stop', async () => {
    let aborted = false
    const hung = (signal: AbortSignal) => new Promise<void>(() => {
      signal.addEventListener('abort', () => {
        aborted = true
      })
    })
    const started = Date.now()
    const [database, , mail] = await checkAll({ database: async () => {}, storage: async () => {}, mail: hung, payments: async () => {} }, 100)
    expect(Date.now() - started).toBeLessThan(1000)
    expect(database!.state).toBe('up')
    expect(mail).toMatchObject({ name: 'mail', state: 'down', error: 'no answer within 0.1 s' })
    expect(aborted).toBe(true)
  })
})
