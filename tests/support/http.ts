import { randomInt } from 'node:crypto'
import { DEMO_PASSWORD, testEnv } from './env'

// A test reads answers of every shape and each assertion says what it expects of the body, so a body
// left untyped is the one `any` kept here on purpose.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type AnyBody = any

export interface ApiResponse<T = AnyBody> { status: number, body: T, headers: Headers }

/** A documentation-range address per client, sent as X-Forwarded-For, so sign-in limits per address stay apart. */
export function randomAddress(): string {
  return `198.51.${randomInt(0, 255)}.${randomInt(1, 254)}`
}

/** A minimal HTTP client with its own cookie jar, like one browser. */
export class ApiClient {
  cookies = new Map<string, string>()
  /** `baseUrl` points the client at another app instance than the test stack's. */
  constructor(public address: string = randomAddress(), public baseUrl?: string) {}

  private cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
  }

  private keepCookies(headers: Headers) {
    for (const line of headers.getSetCookie()) {
      const [pair] = line.split(';')
      const eq = pair!.indexOf('=')
      const name = pair!.slice(0, eq).trim()
      const value = pair!.slice(eq + 1)
      if (/expires=Thu, 01 Jan 1970/i.test(line) || value === '') this.cookies.delete(name)
      else this.cookies.set(name, value)
    }
  }

  async request<T = AnyBody>(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<ApiResponse<T>> {
    const isForm = body instanceof URLSearchParams
    const res = await fetch(`${this.baseUrl ?? testEnv.appUrl}${path}`, {
      method,
      redirect: 'manual',
      headers: {
        'x-forwarded-for': this.address,
        ...(body === undefined ? {} : { 'content-type': isForm ? 'application/x-www-form-urlencoded' : 'application/json' }),
        ...(this.cookies.size ? { cookie: this.cookieHeader() } : {}),
        ...headers,
      },
      body: body === undefined ? undefined : isForm ? body.toString() : typeof body === 'string' ? body : JSON.stringify(body),
    })
    this.keepCookies(res.headers)
    const text = await res.text()
    let parsed: unknown = text
    try {
      parsed = text ? JSON.parse(text) : null
    }
    catch { /* not JSON: keep the text */ }
    return { status: res.status, body: parsed as T, headers: res.headers }
  }

  get<T = AnyBody>(path: string) { return this.request<T>('GET', path) }
  post<T = AnyBody>(path: string, body?: unknown) { return this.request<T>('POST', path, body ?? {}) }
  patch<T = AnyBody>(path: string, body?: unknown) { return this.request<T>('PATCH', path, body ?? {}) }
  put<T = AnyBody>(path: string, body?: unknown) { return this.request<T>('PUT', path, body ?? {}) }
  delete<T = AnyBody>(path: string) { return this.request<T>('DELETE', path) }

  /** Posts the credentials form as the sign-in page does; returns the raw answer. */
  async signIn(email: string, password: string): Promise<ApiResponse<{ url?: string, message?: string }>> {
    const csrf = await this.get<{ csrfToken: string }>('/api/auth/csrf')
    return this.post('/api/auth/callback/credentials', new URLSearchParams({ email, password, csrfToken: csrf.body.csrfToken, callbackUrl: this.baseUrl ?? testEnv.appUrl, json: 'true' }))
  }

  hasSession(): boolean {
    return [...this.cookies.keys()].some(name => name.endsWith('next-auth.session-token'))
  }
}

export const DEMO_USERS = {
  growerOwner: 'grower@demo.test',
  growerMember: 'grower-member@demo.test',
  grower2Owner: 'grower2@demo.test',
  makerOwner: 'maker@demo.test',
  makerViewer: 'viewer@demo.test',
  maker2Owner: 'maker2@demo.test',
  admin: 'admin@demo.test',
} as const
export type DemoUser = keyof typeof DEMO_USERS
export type Caller = DemoUser | 'anonymous'
export const CALLERS: Caller[] = ['anonymous', ...Object.keys(DEMO_USERS) as DemoUser[]]

const signedIn = new Map<Caller, ApiClient>()

/** A client signed in as one of the demo people (or signed out), shared within a test file. */
export async function as(caller: Caller): Promise<ApiClient> {
  const cached = signedIn.get(caller)
  if (cached) return cached
  const client = new ApiClient()
  if (caller !== 'anonymous') {
    await client.signIn(DEMO_USERS[caller], DEMO_PASSWORD)
    if (!client.hasSession()) throw new Error(`Demo sign-in failed for ${caller}`)
  }
  signedIn.set(caller, client)
  return client
}
