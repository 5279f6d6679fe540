import bcrypt from 'bcryptjs'

// bcrypt with a cost of 10 by default (about 2^10 rounds); BCRYPT_COST raises it on faster hosts.
const cost = () => Number(process.env.BCRYPT_COST || 10)

export function hashPassword(plain: string): Promise<string> {
  return bcrypt.hash(plain, cost())
}

export function verifyPassword(plain: string, hash: string): Promise<boolean> {
  return bcrypt.compare(plain, hash)
}

/** A hash of nothing anyone can type, compared against when the account does not exist so both paths take as long. */
export const UNUSABLE_HASH = '$2b$10$CwTycUXWue0Thq9StjUM0uJ8.1lzGnBPdSuPhjdZ9cyUlhMiQy8pq'
