import { createHash, randomBytes } from 'node:crypto'

// One-time links carry a random token; only its SHA-256 is stored, so a database leak opens no account.
export function newToken(): { token: string, hash: string } {
  const token = randomBytes(32).toString('base64url')
  return { token, hash: hashToken(token) }
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}

export const TOKEN_LIFETIME_MS = {
  invitation: 7 * 24 * 3600_000,
  verifyEmail: 48 * 3600_000,
  resetPassword: 3600_000,
} as const

export function expiresAt(lifetimeMs: number, now = new Date()): Date {
  return new Date(now.getTime() + lifetimeMs)
}
