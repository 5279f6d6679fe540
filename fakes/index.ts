// Starts every local fake on loopback: S3 storage, the payments API and the SMTP sink.
import { startMailSink } from './mail'
import { startPayments } from './payments'
import { startS3 } from './s3'

const port = (name: string, fallback: number) => Number(process.env[name] || fallback)

async function main() {
  const s3 = await startS3(port('FAKE_S3_PORT', 4568), process.env.FAKE_S3_DIR || '.data/dev/s3', process.env.S3_BUCKET || 'pomewright-files')
  const payments = await startPayments({
    port: port('FAKE_PAYMENTS_PORT', 12111),
    dir: process.env.FAKE_PAYMENTS_DIR || '.data/dev/payments',
    webhookUrl: process.env.FAKE_WEBHOOK_URL || '',
    webhookSecret: process.env.STRIPE_WEBHOOK_SECRET || 'whsec_pomewright_local',
  })
  const mail = await startMailSink(port('FAKE_SMTP_PORT', 2525), port('FAKE_MAIL_API_PORT', 2526))
  console.log('fakes ready')
  const stop = async () => {
    await Promise.allSettled([s3.close(), new Promise(r => payments.close(r)), new Promise(r => mail.smtp.close(() => r(null))), new Promise(r => mail.api.close(r))])
    process.exit(0)
  }
  process.on('SIGTERM', stop)
  process.on('SIGINT', stop)
}

main().catch((error: Error) => {
  console.error(`A fake failed to start: ${error.message}`)
  process.exit(1)
})
