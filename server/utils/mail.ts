import nodemailer, { type Transporter } from 'nodemailer'

export interface OutgoingMail { to: string, subject: string, text: string }

/**
 * The relay the outbox sender delivers through (SMTP_URL). Its time limits stay well inside the
 * sender's lease, so a hung relay cannot keep a message claimed past it.
 */
export function createMailer(leaseMs: number): Transporter {
  const limit = Math.max(1_000, Math.floor(leaseMs / 4))
  return nodemailer.createTransport({
    url: process.env.SMTP_URL || 'smtp://127.0.0.1:2525',
    connectionTimeout: Math.min(limit, 10_000),
    greetingTimeout: Math.min(limit, 10_000),
    socketTimeout: Math.min(limit, 30_000),
  })
}

export async function deliver(mailer: Transporter, mail: OutgoingMail): Promise<void> {
  await mailer.sendMail({ from: process.env.MAIL_FROM || 'Pomewright <no-reply@pomewright.test>', to: mail.to, subject: mail.subject, text: mail.text })
}

export function appLink(path: string): string {
  const base = (process.env.APP_URL || 'http://127.0.0.1:3000').replace(/\/$/, '')
  return `${base}${path}`
}
