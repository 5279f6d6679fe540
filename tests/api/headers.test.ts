import { describe, expect, it } from 'vitest'
import { testEnv } from '../support/env'

// What every answer tells the browser: the Content Security Policy with this request's nonce on
// pages, the protections sent with everything, compression and caching of the built files, and
// the size limit on request bodies.
const get = (path: string, headers: Record<string, string> = {}) => fetch(`${testEnv.appUrl}${path}`, { headers, redirect: 'manual' })

function nonceOf(csp: string): string {
  const scriptSrc = csp.split(';').map(d => d.trim()).find(d => d.startsWith('script-src '))
  const nonce = scriptSrc?.match(/'nonce-([^']+)'/)?.[1]
  if (!nonce) throw new Error(`no nonce in script-src: ${csp}`)
  return nonce
}

function expectSentWithEverything(res: Response) {
  expect(res.headers.get('x-content-type-options')).toBe('nosniff')
  expect(res.headers.get('referrer-policy')).toBe('same-origin')
  expect(res.headers.get('x-frame-options')).toBe('DENY')
  expect(res.headers.has('x-powered-by')).toBe(false)
}

describe('security headers', () => {
  it('a page runs under a policy with a fresh nonce that its own scripts carry', async () => {
    const [first, second] = await Promise.all([get('/signin'), get('/signin')])
    expect(first.status).toBe(200)
    const csp = first.headers.get('content-security-policy') ?? ''
    expect(csp).toContain("frame-ancestors 'none'")
    expect(csp).toContain("object-src 'none'")
    expect(csp).toContain("base-uri 'none'")
    expect(csp).not.toMatch(/script-src[^;]*'unsafe-inline'/)
    expect(csp).not.toMatch(/'unsafe-eval'/)
    const nonce = nonceOf(csp)
    expect(nonce.length).toBeGreaterThanOrEqual(16)
    expect(nonceOf(second.headers.get('content-security-policy') ?? '')).not.toBe(nonce)

    const html = await first.text()
    const scripts = html.match(/<script\b[^>]*>/g) ?? []
    expect(scripts.length).toBeGreaterThan(0)
    for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`)
    expectSentWithEverything(first)
  })

  it('an API answer and static files carry the same protections', async () => {
    const health = await get('/api/health')
    expect(health.status).toBe(200)
    expectSentWithEverything(health)
    const icon = await get('/favicon.svg')
    expect(icon.status).toBe(200)
    expectSentWithEverything(icon)
  })

  it('claims HTTPS only on a request that came over HTTPS', async () => {
    expect((await get('/signin')).headers.has('strict-transport-security')).toBe(false)
    // The test stack trusts X-Forwarded-Proto as a proxy in front of the app would set it.
    const viaHttps = await get('/signin', { 'x-forwarded-proto': 'https' })
    expect(viaHttps.headers.get('strict-transport-security')).toMatch(/max-age=31536000/)
  })
})

describe('built files', () => {
  it('are served compressed and cached as immutable', async () => {
    const html = await (await get('/signin')).text()
    const script = html.match(/src="(\/_nuxt\/[^"]+\.js)"/)?.[1]
    expect(script, 'the page names its entry script').toBeTruthy()
    for (const encoding of ['br', 'gzip']) {
      const res = await get(script!, { 'accept-encoding': encoding })
      expect(res.status).toBe(200)
      expect(res.headers.get('content-encoding')).toBe(encoding)
      expect(res.headers.get('cache-control')).toBe('public, max-age=31536000, immutable')
      expect(res.headers.get('x-content-type-options')).toBe('nosniff')
      expect(res.headers.has('x-powered-by')).toBe(false)
    }
  })
})

describe('request bodies', () => {
  const MiB = 1024 * 1024
  const jsonOf = (bytes: number) => JSON.stringify({ email: 'someone@example.test', note: 'x'.repeat(bytes) })
  const send = (method: string, path: string, body: string, contentType = 'application/json') =>
    fetch(`${testEnv.appUrl}${path}`, { method, headers: { 'content-type': contentType }, body })

  it('refuses a JSON body over 1 MiB with 413, on every method that takes one', async () => {
    for (const [method, path] of [['POST', '/api/signup'], ['PUT', '/api/signup'], ['PATCH', '/api/me'], ['POST', '/api/auth/callback/credentials']] as const) {
      const res = await send(method, path, jsonOf(MiB + 10))
      expect(res.status, `${method} ${path}`).toBe(413)
    }
  })

  it('reads a body under the limit as usual', async () => {
    const res = await send('POST', '/api/signup', jsonOf(MiB - 1000))
    expect(res.status).toBe(400)
  })

  it('allows no large uploads outside the lab-sheet route', async () => {
    const form = `--b\r\nContent-Disposition: form-data; name="file"; filename="sheet.pdf"\r\n\r\n${'x'.repeat(2 * MiB)}\r\n--b--\r\n`
    const res = await send('POST', '/api/signup', form, 'multipart/form-data; boundary=b')
    expect(res.status).toBe(413)
  })
})
