import { HeadBucketCommand } from '@aws-sdk/client-s3'
import nodemailer, { type Transporter } from 'nodemailer'
import { useDb } from './db'
import { useS3 } from './s3'
import { CHECK_TIMEOUT_MS, type ServiceCheck, type ServiceName } from './serviceHealth'

let mailProbe: Transporter | undefined

/** A transport of its own for the check, with short time limits (sending mail may wait longer). */
function mailTransport(): Transporter {
  mailProbe ??= nodemailer.createTransport({
    url: process.env.SMTP_URL || 'smtp://127.0.0.1:2525',
    connectionTimeout: CHECK_TIMEOUT_MS,
    greetingTimeout: CHECK_TIMEOUT_MS,
    socketTimeout: CHECK_TIMEOUT_MS,
  })
  return mailProbe
}

/** The cheapest call that proves each service answers. */
export const SERVICE_CHECKS: Record<ServiceName, ServiceCheck> = {
  // Through the app's own pool, as every request does.
  async database() {
    await useDb().raw('SELECT 1')
  },
  async storage(signal) {
    const { client, bucket } = useS3()
    try {
      await client.send(new HeadBucketCommand({ Bucket: bucket }), { abortSignal: signal })
    }
    catch (error) {
      // A missing bucket or refused key comes back without a message of its own.
      const status = (error as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode
      throw new Error(status ? `bucket ${bucket} answered HTTP ${status}` : (error as Error).message, { cause: error })
    }
  },
  // Connects, greets and signs in (when SMTP_URL has credentials) without sending anything.
  async mail() {
    await mailTransport().verify()
  },
  async payments(signal) {
    const base = (process.env.PAYMENTS_API_URL || 'http://127.0.0.1:12111').replace(/\/$/, '')
    const res = await fetch(`${base}/health`, { signal })
    if (!res.ok) throw new Error(`the payments API answered HTTP ${res.status}`)
  },
}
