import type Stripe from 'stripe'

// Called by the payment service, not a browser: its signature is the check (the X-Wayside rule
// does not apply here). A delivery may repeat; the invoice is marked paid once.
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
  if (evt.type === 'payment_intent.succeeded') {
    const intent = evt.data.object as Stripe.PaymentIntent
    const invoiceId = intent.metadata?.invoiceId
    const known = invoiceId && /^[0-9a-f-]{36}$/i.test(invoiceId) && await useDb().query.invoices.findFirst({ where: (i, { eq }) => eq(i.id, invoiceId) })
    if (known) await useDb().transaction(tx => settleInvoice(tx, invoiceId, { method: 'card', amountCents: intent.amount, providerRef: intent.id }))
  }
  return { received: true }
})
