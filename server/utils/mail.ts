import nodemailer, { type Transporter } from 'nodemailer'
import { useDb } from './db'

let transport: Transporter | undefined

function mailer(): Transporter {
  transport ??= nodemailer.createTransport(process.env.SMTP_URL || 'smtp://127.0.0.1:2525')
  return transport
}

export interface OutgoingMail { orgId?: number | null, to: string, subject: string, text: string }

/**
 * Every e-mail goes through the notifications outbox: the row records what was sent and whether
 * it went. A relay that is down answers 503 so the person can try again.
 */
export async function sendMail(mail: OutgoingMail): Promise<void> {
  const db = useDb()
  const [id] = await db('notifications').insert({ orgId: mail.orgId ?? null, recipient: mail.to, subject: mail.subject, body: mail.text })
  try {
    await mailer().sendMail({ from: process.env.MAIL_FROM || 'Pomewright <no-reply@pomewright.test>', to: mail.to, subject: mail.subject, text: mail.text })
    await db('notifications').where({ id }).update({ status: 'sent', sentAt: db.fn.now(3) })
  }
  catch (error) {
    await db('notifications').where({ id }).update({ status: 'failed', error: String((error as Error).message).slice(0, 500) })
    throw createError({ statusCode: 503, message: 'The e-mail could not be sent just now. Try again in a few minutes.' })
  }
}

export function appLink(path: string): string {
  const base = (process.env.APP_URL || 'http://127.0.0.1:3000').replace(/\/$/, '')
  return `${base}${path}`
}
