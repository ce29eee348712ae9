// A small local stand-in for the card-payment API, enough for the `stripe` SDK: payment intents
// created and confirmed at once, a declining test card, and signed webhooks sent back to the app.
import { createServer, type IncomingMessage } from 'node:http'
import { randomBytes } from 'node:crypto'
import Stripe from 'stripe'

type Intent = Record<string, unknown> & { id: string, status: string, amount: number, metadata: Record<string, string> }

function readForm(req: IncomingMessage): Promise<URLSearchParams> {
  return new Promise((resolve, reject) => {
    let body = ''
    req.on('data', (c) => { body += c; if (body.length > 100_000) req.destroy() })
    req.on('end', () => resolve(new URLSearchParams(body)))
    req.on('error', reject)
  })
}

export async function startPaymentFake(opts: { port: number, webhookUrl?: string, webhookSecret: string }) {
  const intents = new Map<string, Intent>()
  const signer = new Stripe('sk_test_signer', { telemetry: false })

  async function sendWebhook(type: string, object: Intent) {
    if (!opts.webhookUrl) return
    const payload = JSON.stringify({ id: `evt_${randomBytes(8).toString('hex')}`, object: 'event', type, data: { object }, created: Math.floor(Date.now() / 1000) })
    const header = signer.webhooks.generateTestHeaderString({ payload, secret: opts.webhookSecret })
    await fetch(opts.webhookUrl, { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': header }, body: payload }).catch(() => {})
  }

  const server = createServer(async (req, res) => {
    const send = (status: number, body: unknown) => {
      res.statusCode = status
      res.setHeader('content-type', 'application/json')
      res.end(JSON.stringify(body))
    }
    const url = new URL(req.url ?? '/', 'http://127.0.0.1')
    if (!req.headers.authorization?.startsWith('Bearer sk_')) return send(401, { error: { type: 'invalid_request_error', message: 'No valid API key provided' } })

    if (req.method === 'POST' && url.pathname === '/v1/payment_intents') {
      const form = await readForm(req)
      const amount = Number(form.get('amount'))
      if (!Number.isInteger(amount) || amount < 50) return send(400, { error: { type: 'invalid_request_error', param: 'amount', message: 'Amount must be at least 50 cents' } })
      const metadata: Record<string, string> = {}
      for (const [k, v] of form) { const m = /^metadata\[(.+)\]$/.exec(k); if (m?.[1]) metadata[m[1]] = v }
      const pm = form.get('payment_method') ?? ''
      const intent: Intent = {
        id: `pi_${randomBytes(12).toString('hex')}`, object: 'payment_intent', amount,
        currency: form.get('currency') ?? 'usd', metadata, payment_method: pm, status: 'requires_payment_method',
        created: Math.floor(Date.now() / 1000),
      }
      if (form.get('confirm') === 'true') {
        if (pm === 'pm_card_chargeDeclined') {
          return send(402, { error: { type: 'card_error', code: 'card_declined', decline_code: 'generic_decline', message: 'Your card was declined.' } })
        }
        intent.status = 'succeeded'
      }
      intents.set(intent.id, intent)
      send(200, intent)
      if (intent.status === 'succeeded') void sendWebhook('payment_intent.succeeded', intent)
      return
    }
    const m = /^\/v1\/payment_intents\/([\w]+)$/.exec(url.pathname)
    if (req.method === 'GET' && m?.[1]) {
      const intent = intents.get(m[1])
      return intent ? send(200, intent) : send(404, { error: { type: 'invalid_request_error', message: `No such payment_intent: '${m[1]}'` } })
    }
    send(404, { error: { type: 'invalid_request_error', message: `Unrecognized request URL (${req.method}: ${url.pathname})` } })
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(opts.port, '127.0.0.1', () => resolve())
  })
  return { intents, close: () => new Promise<void>(r => server.close(() => r())) }
}
