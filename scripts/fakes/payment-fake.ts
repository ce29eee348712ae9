// A small local stand-in for the payment service, enough for the `stripe` SDK: checkout sessions
// with a hosted payment page served on loopback, refunds, and signed webhooks sent back to the app
// when the payer completes the page. Nothing here sees a card number: the page has a Pay button
// and a test choice between an approved and a declined card.
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http'
import { randomBytes } from 'node:crypto'
import Stripe from 'stripe'

type Obj = Record<string, unknown>
type Session = Obj & {
  id: string
  status: 'open' | 'complete' | 'expired'
  payment_status: 'unpaid' | 'paid'
  amount_total: number
  currency: string
  metadata: Record<string, string>
  url: string
  success_url: string
  cancel_url: string
  payment_intent: string | null
  expires_at: number
  description: string
}
type Intent = Obj & { id: string, amount: number, currency: string, status: string, metadata: Record<string, string>, refunded: number }

const newId = (prefix: string) => `${prefix}_${randomBytes(12).toString('hex')}`
const now = () => Math.floor(Date.now() / 1000)

function readForm(req: IncomingMessage): Promise<URLSearchParams> {
  return new Promise((resolve, reject) => {
    let body = ''
    req.on('data', (c) => {
      body += c
      if (body.length > 100_000) req.destroy()
    })
    req.on('end', () => resolve(new URLSearchParams(body)))
    req.on('error', reject)
  })
}

/** `metadata[invoiceId]=x` and `payment_intent_data[metadata][invoiceId]=x` as a flat map. */
function mapOf(form: URLSearchParams, prefix: string): Record<string, string> {
  const out: Record<string, string> = {}
  const re = new RegExp(`^${prefix.replace(/[[\]]/g, '\\$&')}\\[(.+?)\\]$`)
  for (const [k, v] of form) {
    const m = re.exec(k)
    if (m?.[1]) out[m[1]] = v
  }
  return out
}

const esc = (s: string) => s.replace(/[&<>"']/g, c => `&#${c.charCodeAt(0)};`)
const money = (cents: number, currency: string) => `${(cents / 100).toFixed(2)} ${currency.toUpperCase()}`

function page(res: ServerResponse, status: number, title: string, body: string) {
  res.statusCode = status
  res.setHeader('content-type', 'text/html; charset=utf-8')
  res.end(`<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(title)}</title><style>
body{font:17px/1.5 system-ui,sans-serif;background:#eef1f4;color:#15202b;margin:0;padding:24px}
main{max-width:420px;margin:0 auto;background:#fff;border:1px solid #c9d2da;border-radius:6px;padding:20px}
h1{font-size:20px;margin:0 0 4px} .amount{font-size:30px;font-weight:700;margin:12px 0} .muted{color:#55616c;font-size:14px}
button{width:100%;min-height:48px;font:inherit;font-weight:700;background:#1d4f7a;color:#fff;border:0;border-radius:4px;margin-top:16px}
fieldset{border:1px solid #c9d2da;border-radius:4px;margin-top:12px} label{display:block;padding:6px 0} .bad{color:#9b1c1c;font-weight:700}
</style></head><body><main>${body}
<p class="muted">Local test payment service: no card number is asked for and no money moves.</p></main></body></html>`)
}

export async function startPaymentFake(opts: { port: number, webhookUrl?: string, webhookSecret: string }) {
  const sessions = new Map<string, Session>()
  const intents = new Map<string, Intent>()
  const refunds = new Map<string, Obj>()
  const signer = new Stripe('sk_test_signer', { telemetry: false })
  const base = `http://127.0.0.1:${opts.port}`

  /** Signed like the real service; retried with backoff while the app does not answer 2xx. */
  async function sendWebhook(type: string, object: Obj) {
    if (!opts.webhookUrl) return
    const payload = JSON.stringify({ id: newId('evt'), object: 'event', type, data: { object }, created: now(),
      api_version: Stripe.API_VERSION })
    for (let attempt = 0; attempt < 6; attempt++) {
      const header = signer.webhooks.generateTestHeaderString({ payload, secret: opts.webhookSecret })
      const ok = await fetch(opts.webhookUrl, { method: 'POST', headers: { 'content-type': 'application/json',
        'stripe-signature': header }, body: payload })
        .then(r => r.ok, () => false)
      if (ok) return
      await new Promise(r => setTimeout(r, 500 * 2 ** attempt))
    }
  }

  function expireIfDue(s: Session) {
    if (s.status === 'open' && s.expires_at <= now()) s.status = 'expired'
    return s
  }

  function createSession(form: URLSearchParams): Session | string {
    let amount = 0
    let currency = ''
    const names: string[] = []
    for (let i = 0; form.has(`line_items[${i}][quantity]`); i++) {
      const unit = Number(form.get(`line_items[${i}][price_data][unit_amount]`))
      const qty = Number(form.get(`line_items[${i}][quantity]`))
      const whole = Number.isInteger(unit) && unit >= 0 && Number.isInteger(qty) && qty >= 1
      if (!whole) return `line_items[${i}] needs a whole unit_amount and quantity`
      amount += unit * qty
      currency = form.get(`line_items[${i}][price_data][currency]`) ?? currency
      names.push(form.get(`line_items[${i}][price_data][product_data][name]`) ?? 'Item')
    }
    if (amount < 50) return 'The amount must be at least 50 cents'
    if (!form.get('success_url')) return 'success_url is required'
    const id = newId('cs_test')
    const expires = Number(form.get('expires_at') ?? now() + 24 * 3600)
    const s: Session = {
      id, object: 'checkout.session', mode: 'payment', status: 'open', payment_status: 'unpaid', amount_total: amount,
      currency: currency || 'usd',
      metadata: mapOf(form,
        'metadata'), url: `${base}/checkout/${id}`, success_url: form.get('success_url')!, cancel_url: form.get('cancel_url') ?? '',
      payment_intent: null, expires_at: expires, created: now(), description: names.join(', '),
      client_reference_id: form.get('client_reference_id'), customer_email: form.get('customer_email'),
      intent_metadata: mapOf(form, 'payment_intent_data[metadata]'),
    }
    sessions.set(id, s)
    return s
  }

  /** The payer pressed Pay: the session completes once, however many presses arrive at once. */
  function complete(s: Session, outcome: string): 'paid' | 'declined' | 'closed' {
    if (expireIfDue(s).status !== 'open') return 'closed'
    if (outcome === 'decline') return 'declined'
    const pi: Intent = { id: newId('pi'), object: 'payment_intent', amount: s.amount_total, amount_received: s.amount_total,
      currency: s.currency, status: 'succeeded', metadata: s.intent_metadata as Record<string, string>, refunded: 0, created: now() }
    intents.set(pi.id, pi)
    Object.assign(s, { status: 'complete', payment_status: 'paid', payment_intent: pi.id })
    void sendWebhook('checkout.session.completed', s)
    return 'paid'
  }

  function hostedPage(res: ServerResponse, s: Session, note = '') {
    const head = `<h1>${esc(String(s.description || 'Payment'))}</h1><div class="amount">${money(s.amount_total, s.currency)}</div>`
    if (s.status === 'complete') return page(res, 200, 'Paid', `${head}<p>This payment is complete. Thank you.</p>`)
    if (s.status === 'expired') return page(res, 410, 'Closed', `${head}<p>This payment page has closed. Ask for a new link.</p>`)
    page(res, 200, 'Pay by card', `${head}${note}<form method="post">
<fieldset><legend>Test card</legend>
<label><input type="radio" name="outcome" value="approve" checked> A card that is approved</label>
<label><input type="radio" name="outcome" value="decline"> A card that is declined</label></fieldset>
<button type="submit">Pay ${money(s.amount_total, s.currency)}</button></form>
${s.cancel_url ? `<p><a href="${esc(s.cancel_url)}">Back without paying</a></p>` : ''}`)
  }

  const server = createServer(async (req, res) => {
    const send = (status: number, body: unknown) => {
      res.statusCode = status
      res.setHeader('content-type', 'application/json')
      res.end(JSON.stringify(body))
    }
    const fail = (status: number, message: string, param?: string) => send(status, { error: { type: 'invalid_request_error', message,
      param } })
    const url = new URL(req.url ?? '/', base)
    const path = url.pathname

    // The hosted page: opened by the payer's browser, no API key.
    const hosted = /^\/checkout\/(cs_test_\w+)$/.exec(path)
    if (hosted?.[1]) {
      const s = sessions.get(hosted[1])
      if (!s) return page(res, 404, 'Not found', '<h1>No such payment page</h1>')
      if (req.method === 'GET') return hostedPage(res, expireIfDue(s))
      if (req.method === 'POST') {
        const form = await readForm(req)
        const result = complete(s, form.get('outcome') ?? 'approve')
        if (result === 'declined') return hostedPage(res, s, '<p class="bad" role="alert">The card was declined. Try another card.</p>')
        if (result === 'paid') {
          res.statusCode = 303
          res.setHeader('location', s.success_url.replace('{CHECKOUT_SESSION_ID}', s.id))
          return res.end()
        }
        return hostedPage(res, s)
      }
    }

    if (!req.headers.authorization?.startsWith('Bearer sk_')) return send(401, { error: { type: 'invalid_request_error',
      message: 'No valid API key provided' } })

    if (req.method === 'POST' && path === '/v1/checkout/sessions') {
      const s = createSession(await readForm(req))
      return typeof s === 'string' ? fail(400, s) : send(200, s)
    }
    const sm = /^\/v1\/checkout\/sessions\/(cs_test_\w+)(\/expire)?$/.exec(path)
    if (sm?.[1]) {
      const s = sessions.get(sm[1])
      if (!s) return fail(404, `No such checkout.session: '${sm[1]}'`)
      if (req.method === 'GET' && !sm[2]) return send(200, expireIfDue(s))
      if (req.method === 'POST' && sm[2]) {
        if (expireIfDue(s).status === 'complete') return fail(400, 'Only open sessions can be expired')
        s.status = 'expired'
        return send(200, s)
      }
    }
    if (req.method === 'POST' && path === '/v1/refunds') {
      const form = await readForm(req)
      const pi = intents.get(form.get('payment_intent') ?? '')
      if (!pi) return fail(404, 'No such payment_intent', 'payment_intent')
      const amount = Number(form.get('amount') ?? pi.amount - pi.refunded)
      if (!Number.isInteger(amount) || amount < 1 || amount > pi.amount - pi.refunded) return fail(400,
        'Refund amount is more than what is left on the charge', 'amount')
      pi.refunded += amount
      const refund = { id: newId('re'), object: 'refund', amount, currency: pi.currency, payment_intent: pi.id, status: 'succeeded',
        created: now() }
      refunds.set(refund.id, refund)
      return send(200, refund)
    }
    const im = /^\/v1\/payment_intents\/(pi_\w+)$/.exec(path)
    if (req.method === 'GET' && im?.[1]) {
      const pi = intents.get(im[1])
      return pi ? send(200, pi) : fail(404, `No such payment_intent: '${im[1]}'`)
    }
    fail(404, `Unrecognized request URL (${req.method}: ${path})`)
  })
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject)
    server.listen(opts.port, '127.0.0.1', () => resolve())
  })
  return { sessions, intents, refunds, close: () => new Promise<void>(r => server.close(() => r())) }
}
