import { testEnv } from './env'

export interface CapturedMessage { id: number, to: string[], subject: string, text: string }

export async function messagesTo(address: string): Promise<CapturedMessage[]> {
  const res = await fetch(`${testEnv.mailApiUrl}/messages?to=${encodeURIComponent(address)}`)
  return ((await res.json()) as { items: CapturedMessage[] }).items
}

/** Waits for the newest message to an address whose subject matches, as the SMTP sink captured it. */
export async function waitForMail(address: string, subject: RegExp, timeoutMs = 10_000): Promise<CapturedMessage> {
  const deadline = Date.now() + timeoutMs
  while (Date.now() < deadline) {
    const found = (await messagesTo(address)).filter(m => subject.test(m.subject)).at(-1)
    if (found) return found
    await new Promise(r => setTimeout(r, 200))
  }
  throw new Error(`No e-mail to ${address} matching ${subject} arrived within ${timeoutMs} ms`)
}

/** The one-time token from the link to `path` in a message. */
export function tokenFrom(message: CapturedMessage, path: string): string {
  const match = message.text.match(new RegExp(`${path.replace('/', '\\/')}\\?token=([A-Za-z0-9_-]+)`))
  if (!match) throw new Error(`No ${path} link in: ${message.text}`)
  return match[1]!
}
