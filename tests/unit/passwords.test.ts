import { describe, expect, it } from 'vitest'
import { hashPassword, UNUSABLE_HASH, verifyPassword } from '../../server/utils/passwords'

describe('password hashing', () => {
  it('stores a bcrypt hash, never the password', async () => {
    const hash = await hashPassword('orchard-ladder-42')
    expect(hash).not.toContain('orchard-ladder-42')
    expect(hash).toMatch(/^\$2[aby]\$10\$[./A-Za-z0-9]{53}$/)
  })

  it('salts each hash, so the same password hashes differently', async () => {
    const [a, b] = await Promise.all([hashPassword('same-password-1'), hashPassword('same-password-1')])
    expect(a).not.toBe(b)
    expect(await verifyPassword('same-password-1', a)).toBe(true)
    expect(await verifyPassword('same-password-1', b)).toBe(true)
  })

  it('accepts the right password and refuses a wrong one', async () => {
    const hash = await hashPassword('bittersweet-blend')
    expect(await verifyPassword('bittersweet-blend', hash)).toBe(true)
    expect(await verifyPassword('bittersweet-blenD', hash)).toBe(false)
    expect(await verifyPassword('', hash)).toBe(false)
  })

  it('has a placeholder hash that no ordinary password matches', async () => {
    for (const guess of ['', 'password', 'pomewright-demo']) expect(await verifyPassword(guess, UNUSABLE_HASH)).toBe(false)
  })
})
