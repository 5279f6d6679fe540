import { createSecretKey, hkdfSync, type KeyObject } from 'node:crypto'
import { jwtDecrypt } from 'jose'
import type { JWT, JWTDecodeParams } from 'next-auth/jwt'

// The session cookie is next-auth's JWE (alg "dir", enc "A256GCM") under a key derived from the
// secret with HKDF-SHA256, empty salt and this info string, as next-auth/jwt v4 derives it. next-auth
// derives the key again on every request; it depends on the secret alone, so it is derived once
// per secret here. Nothing about the person is kept: the token is decrypted on every request.
const KEY_INFO = 'NextAuth.js Generated Encryption Key'
const keys = new Map<string, KeyObject>()

function encryptionKey(secret: string): KeyObject {
  let key = keys.get(secret)
  if (!key) {
    key = createSecretKey(Buffer.from(hkdfSync('sha256', secret, '', KEY_INFO, 32)))
    keys.set(secret, key)
  }
  return key
}

/** next-auth's `decode`, with the derived key reused: the payload, or a throw for a bad token. */
export async function decodeSessionToken({ token, secret, salt }: JWTDecodeParams): Promise<JWT | null> {
  if (!token) return null
  // A salted token (not one the app issues) is not ours to speed up.
  if (salt) throw new Error('Salted session tokens are not used here.')
  const { payload } = await jwtDecrypt(token, encryptionKey(String(secret)), { clockTolerance: 15 })
  return payload as JWT
}
