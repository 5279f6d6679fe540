import { encode } from 'next-auth/jwt'
import { describe, expect, it } from 'vitest'
import { decodeSessionToken } from '../../server/utils/sessionToken'

// The session cookie as next-auth issues it must read back the same through our decoder, which
// derives the key once instead of on every request.
const secret = 'a-test-secret-of-reasonable-length'
const claims = { id: 7, orgId: 3, orgKind: 'grower', isNursery: true, role: 'owner' }

describe('session token decoding', () => {
  it('reads a token next-auth issued', async () => {
    const token = await encode({ token: claims, secret })
    expect(await decodeSessionToken({ token, secret })).toMatchObject(claims)
    // The second read uses the remembered key and gives the same answer.
    expect(await decodeSessionToken({ token, secret })).toMatchObject(claims)
  })

  it('refuses a token made with another secret, or altered', async () => {
    const token = await encode({ token: claims, secret: 'another-secret' })
    await expect(decodeSessionToken({ token, secret })).rejects.toThrow()
    const good = await encode({ token: claims, secret })
    const parts = good.split('.')
    parts[3] = parts[3]!.slice(0, -2) + (parts[3]!.endsWith('AA') ? 'BB' : 'AA')
    await expect(decodeSessionToken({ token: parts.join('.'), secret })).rejects.toThrow()
  })

  it('refuses an expired token', async () => {
    const token = await encode({ token: claims, secret, maxAge: -60 })
    await expect(decodeSessionToken({ token, secret })).rejects.toThrow()
  })

  it('has nothing to read without a token', async () => {
    expect(await decodeSessionToken({ token: undefined, secret })).toBeNull()
  })
})
