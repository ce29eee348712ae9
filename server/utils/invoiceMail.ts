// The invoice e-mail: what it says, the PDF made when it goes, and the payer's link while money is due.
import type { User } from '#auth-utils'
import { and, eq, inArray } from 'drizzle-orm'

export async function queueInvoiceMail(invoice: InvoiceDetail, to: string, user: User) {
  const due = invoice.money.balanceCents
  const link = due > 0 ? payUrl(await ensurePayToken(invoice.id)) : null
  const po = invoice.call.poNumber ? ` (PO ${invoice.call.poNumber})` : ''
  const terms = invoice.customer.billingTerms === 'account' ? `, due within ${invoice.customer.netDays ?? 30} days on your account.` : '.'
  const text = [
    `Hello ${invoice.customer.name},`, '',
    `Attached is invoice W-${invoice.number} for road call #${invoice.call.number}${po}: ${invoice.call.locationText}.`,
    `Total ${formatCents(invoice.totalCents)}${terms}`,
    ...(link ? ['', `Pay ${formatCents(due)} by card on our payment page: ${link}`] : []),
    '', 'Thank you,', 'Two Rivers Road Service',
  ].join('\n')
  return useDb().transaction(async (tx) => {
    const mail = await queueMail({
      kind: 'invoice', to, text, queuedBy: user, related: { type: 'invoice', id: invoice.id },
      subject: `Invoice W-${invoice.number} from Two Rivers Road Service, call #${invoice.call.number}`,
      attachments: [{ make: 'invoice-pdf', id: invoice.id }],
    }, tx)
    await tx.update(tables.invoices).set({ status: 'sent', sentAt: new Date() })
      .where(and(eq(tables.invoices.id, invoice.id), inArray(tables.invoices.status, ['draft', 'sent'])))
    return mail
  })
}
