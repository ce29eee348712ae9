import { and, eq, inArray } from 'drizzle-orm'
import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const invoice = await getInvoice(id)
  if (!invoice) throw createError({ status: 404, statusText: 'No such invoice' })
  if (invoice.status === 'void') ruleError('status', 'A void invoice cannot be sent')
  const to = invoice.customer.billingEmail
  if (!to) ruleError('billingEmail', `${invoice.customer.name} has no billing e-mail; add one on the customer first`)

  const pdf = await renderInvoicePdf(invoice)
  const total = formatCents(invoice.totalCents)
  const due = invoice.money.balanceCents
  const payLine = due > 0 ? `Pay ${formatCents(due)} by card on our payment page: ${payUrl(await ensurePayToken(invoice.id))}` : null
  await sendMail({
    to, kind: 'invoice', relatedId: invoice.id,
    subject: `Invoice W-${invoice.number} from Two Rivers Road Service, call #${invoice.call.number}`,
    text: [
      `Hello ${invoice.customer.name},`, '',
      `Attached is invoice W-${invoice.number} for road call #${invoice.call.number}${invoice.call.poNumber ? ` (PO ${invoice.call.poNumber})` : ''}: ${invoice.call.locationText}.`,
      `Total ${total}${invoice.customer.billingTerms === 'account' ? `, due within ${invoice.customer.netDays ?? 30} days on your account.` : '.'}`,
      ...(payLine ? ['', payLine] : []),
      '', 'Thank you,', 'Two Rivers Road Service',
    ].join('\n'),
    attachments: [{ filename: `invoice-W-${invoice.number}.pdf`, content: pdf, contentType: 'application/pdf' }],
  })
  await useDb().update(tables.invoices).set({ status: 'sent', sentAt: new Date() })
    .where(and(eq(tables.invoices.id, id), inArray(tables.invoices.status, ['draft', 'sent'])))
  return getInvoice(id)
})
