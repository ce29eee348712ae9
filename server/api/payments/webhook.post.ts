import type Stripe from 'stripe'

// Called by the payment service, not a browser: its signature is the check (the X-Wayside rule
// does not apply here). A forged or missing signature answers 400 and changes nothing; a delivery
// may repeat, and the money is recorded once, for what actually came in.
export default defineEventHandler(async (event) => {
  const signature = getRequestHeader(event, 'stripe-signature')
  const payload = await readRawBody(event, 'utf8')
  if (!signature || !payload) throw createError({ status: 400, statusText: 'Missing signature or body' })
  let evt: Stripe.Event
  try {
    evt = await useStripe().webhooks.constructEventAsync(payload, signature, useRuntimeConfig().stripeWebhookSecret)
  }
  catch {
    throw createError({ status: 400, statusText: 'Signature does not match' })
  }
  const completion = cardCompletionOf(evt)
  const outcome = completion ? await recordCardPayment(completion) : 'ignored'
  return { received: true, outcome }
})

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i

function cardCompletionOf(evt: Stripe.Event): CardCompletion | null {
  const invoiceIdOf = (m: Stripe.Metadata | null | undefined) => (m?.invoiceId && UUID.test(m.invoiceId) ? m.invoiceId : null)
  if (evt.type === 'checkout.session.completed' || evt.type === 'checkout.session.async_payment_succeeded') {
    const s = evt.data.object
    if (s.payment_status !== 'paid' || s.amount_total == null || !s.currency) return null
    const ref = typeof s.payment_intent === 'string' ? s.payment_intent : s.payment_intent?.id ?? s.id
    return { eventId: evt.id, eventType: evt.type, invoiceId: invoiceIdOf(s.metadata), amountCents: s.amount_total, currency: s.currency,
      providerRef: ref, sessionId: s.id }
  }
  return null
}
