import { useDb } from '../utils/db'
import { isLimited, limitPolicy, windowStart, type FailureCounts } from '../utils/signInLimit'

async function failureCounts(email: string, address: string, now = new Date()): Promise<FailureCounts> {
  const since = windowStart(now, limitPolicy())
  const count = async (column: 'email' | 'ip', value: string) => {
    const [row] = await useDb()('signInAttempts').where(column, value).where('succeeded', false).where('createdAt', '>=', since).count({ n: '*' }) as { n: number }[]
    return row?.n ?? 0
  }
  return { account: email ? await count('email', email) : 0, address: await count('ip', address) }
}

export async function signInLimited(email: string, address: string): Promise<boolean> {
  return isLimited(await failureCounts(email, address), limitPolicy())
}

export async function recordSignIn(email: string, address: string, succeeded: boolean): Promise<void> {
  await useDb()('signInAttempts').insert({ email: email.slice(0, 254), ip: address.slice(0, 64), succeeded })
}
