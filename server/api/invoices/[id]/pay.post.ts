import Stripe from 'stripe'
import { invoicePaySchema } from '#shared/schemas/invoices'
import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const input = await readValidatedBody(event, validateWith(invoicePaySchema))
  const invoice = await getInvoice(id)
  if (!invoice) throw createError({ status: 404, statusText: 'No such invoice' })
  if (invoice.status === 'paid') ruleError('status', 'This invoice is already paid')
  if (invoice.status === 'void') ruleError('status', 'A void invoice cannot be paid')
  if (input.method === 'account' && invoice.customer.billingTerms !== 'account') ruleError('method', `${invoice.customer.name} has no account with us; take a card`)

  if (input.method === 'account') {
    await useDb().transaction(async (tx) => {
      await tx.insert(tables.accountEntries).values({ customerId: invoice.customer.id, invoiceId: id, amountCents: invoice.totalCents, memo: `Invoice W-${invoice.number}, call #${invoice.call.number}` })
      await settleInvoice(tx, id, { method: 'account', amountCents: invoice.totalCents, providerRef: null, byUserId: user.id })
    })
    return getInvoice(id)
  }

  let intent: Stripe.PaymentIntent
  try {
    intent = await useStripe().paymentIntents.create({
      amount: invoice.totalCents, currency: 'usd', confirm: true, payment_method: input.paymentMethod,
      description: `Invoice W-${invoice.number}`, metadata: { invoiceId: id, callId: invoice.call.id },
    }, { idempotencyKey: `invoice-${id}-${invoice.version}` })
  }
  catch (err) {
    if (err instanceof Stripe.errors.StripeCardError) ruleError('paymentMethod', err.message || 'The card was declined')
    throw createError({ status: 502, statusText: 'The payment service did not answer; nothing was charged' })
  }
  if (intent.status !== 'succeeded') ruleError('paymentMethod', `The payment is ${intent.status.replace(/_/g, ' ')}`)
  await useDb().transaction(tx => settleInvoice(tx, id, { method: 'card', amountCents: intent.amount, providerRef: intent.id, byUserId: user.id }))
  return getInvoice(id)
})
