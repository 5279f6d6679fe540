// The state of each service the app depends on, and what the health report answers. Pure: the
// checks themselves are passed in (server/utils/serviceChecks.ts), so a unit test can run this.

export const SERVICE_NAMES = ['database', 'storage', 'mail', 'payments'] as const
export type ServiceName = typeof SERVICE_NAMES[number]

export interface ServiceState {
  name: ServiceName
  state: 'up' | 'down'
  responseMs: number
  /** Why it is down; shown only to the platform admin. */
  error?: string
}

/** Succeeds when the service answers; given a signal that aborts when time is up. */
export type ServiceCheck = (signal: AbortSignal) => Promise<void>

export const CHECK_TIMEOUT_MS = 2000

/** Runs one check with a time limit, so a service that hangs is reported down instead of hanging the report. */
export async function timedCheck(name: ServiceName, check: ServiceCheck, timeoutMs = CHECK_TIMEOUT_MS): Promise<ServiceState> {
  const started = performance.now()
  const controller = new AbortController()
  let timer: ReturnType<typeof setTimeout> | undefined
  const timeout = new Promise<never>((_, reject) => {
    timer = setTimeout(() => {
      controller.abort()
      reject(new Error(`no answer within ${timeoutMs / 1000} s`))
    }, timeoutMs)
  })
  try {
    await Promise.race([check(controller.signal), timeout])
    return { name, state: 'up', responseMs: Math.round(performance.now() - started) }
  }
  catch (error) {
    const message = error instanceof Error ? error.message || error.name : String(error)
    return { name, state: 'down', responseMs: Math.round(performance.now() - started), error: message }
  }
  finally {
    clearTimeout(timer)
  }
}

/** Every service checked at once; the slowest takes at most the timeout. */
export function checkAll(checks: Record<ServiceName, ServiceCheck>, timeoutMs = CHECK_TIMEOUT_MS): Promise<ServiceState[]> {
  return Promise.all(SERVICE_NAMES.map(name => timedCheck(name, checks[name], timeoutMs)))
}

/** The app can serve while its database answers. */
export function databaseUp(services: ServiceState[]): boolean {
  return services.some(s => s.name === 'database' && s.state === 'up')
}

export interface ServiceReport {
  statusCode: 200 | 503
  body: { ok: boolean, services: ServiceState[] }
}

/**
 * 200 while the database answers (the app can serve, perhaps without files, mail or payments),
 * 503 when it does not; every service is listed either way. Error texts only `withErrors`.
 */
export function serviceReport(services: ServiceState[], options: { withErrors: boolean }): ServiceReport {
  const ok = databaseUp(services)
  const shown = options.withErrors ? services : services.map(({ error: _hidden, ...rest }) => rest)
  return { statusCode: ok ? 200 : 503, body: { ok, services: shown } }
}
