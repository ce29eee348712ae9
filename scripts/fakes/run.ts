// Starts both local fakes until stopped; used by `npm start`, `npm run dev` and `npm test`.
import { startMailCatcher } from './mail-catcher'
import { startPaymentFake } from './payment-fake'

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
console.log(`[fakes] SMTP catcher 127.0.0.1:${smtpPort} (read back at http://127.0.0.1:${mailHttpPort}/messages), payment fake 127.0.0.1:${payPort}`)

const stop = async () => {
  await Promise.allSettled([mail.close(), pay.close()])
  process.exit(0)
}
process.on('SIGINT', stop)
process.on('SIGTERM', stop)
