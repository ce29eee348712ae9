// Starts the local fakes until stopped; used by `npm start`, `npm run dev` and `npm test`. The
// object-store fake starts only when WAYSIDE_S3_PORT names its port (npm start with WAYSIDE_S3=1).
import { startMailCatcher } from './mail-catcher'
import { startPaymentFake } from './payment-fake'
import { startS3Fake } from './s3-fake'

const env = (k: string, d: string) => process.env[k] ?? d
const smtpPort = Number(env('WAYSIDE_SMTP_PORT', '2525'))
const mailHttpPort = Number(env('WAYSIDE_MAIL_HTTP_PORT', '2580'))
const payPort = Number(env('WAYSIDE_PAY_PORT', '12111'))

const mail = await startMailCatcher({ smtpPort, httpPort: mailHttpPort, dir: process.env.WAYSIDE_MAIL_DIR })
const pay = await startPaymentFake({
  port: payPort,
  webhookUrl: process.env.WAYSIDE_WEBHOOK_URL,
  webhookSecret: env('NUXT_STRIPE_WEBHOOK_SECRET', 'whsec_wayside_local'),
})
const s3Port = Number(env('WAYSIDE_S3_PORT', '0'))
const s3 = s3Port
  ? await startS3Fake({ port: s3Port, dir: env('WAYSIDE_S3_DIR', '.data/s3'), bucket: env('NUXT_UPLOADS_S3_BUCKET', 'wayside-photos') })
  : undefined
if (s3) console.log(`[fakes] object store ${s3.endpoint}, bucket ${s3.bucket}`)
console.log(`[fakes] SMTP catcher 127.0.0.1:${smtpPort} (read back at http://127.0.0.1:${mailHttpPort}/messages), payment fake 127.0.0.1:${payPort}`)

const stop = async () => {
  await Promise.allSettled([mail.close(), pay.close(), s3?.close()])
  process.exit(0)
}
process.on('SIGINT', stop)
process.on('SIGTERM', stop)
