import { idParamsSchema } from '#shared/schemas/users'

// Queues the invoice e-mail and answers at once; the job sends it (PDF attached) with retries,
// and the invoice page shows how it went.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const invoice = await getInvoice(id)
  if (!invoice) throw createError({ status: 404, statusText: 'No such invoice' })
  if (invoice.status === 'void') ruleError('status', 'A void invoice cannot be sent')
  const to = invoice.customer.billingEmail
  if (!to) ruleError('billingEmail', `${invoice.customer.name} has no billing e-mail; add one on the customer first`)
  const mail = await queueInvoiceMail(invoice, to, user)
  return { ...(await getInvoice(id))!, mail }
})
