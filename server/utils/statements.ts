// A customer's statement: every invoice still open with what was paid and credited against it, the
// money received (and given back) lately, and the balance by days past due: the same open
// invoices and buckets as the fleet aging, as of today in the business's time zone.
import { eq } from 'drizzle-orm'
import type { User } from '#auth-utils'

/** How far back the statement lists money received. */
export const STATEMENT_PAYMENT_DAYS = 90

export async function customerStatement(customerId: string) {
  const { customers } = tables
  const [customer] = await useDb().select({
    id: customers.id, name: customers.name, billingEmail: customers.billingEmail,
    billingTerms: customers.billingTerms, netDays: customers.netDays,
  }).from(customers).where(eq(customers.id, customerId))
  if (!customer) return null
  const rates = await ratesInForce()
  const zone = rates?.timeZone ?? 'UTC'
  const asOf = localDay(new Date(), zone)
  const since = localDay(new Date(Date.now() - (STATEMENT_PAYMENT_DAYS - 1) * 86_400_000), zone)
  const [invoices, payments, aging] = await Promise.all([
    openInvoicesOf(customerId),
    paymentExportRows({ from: since, to: asOf }, { customerId }),
    agingRows({ customerId }),
  ])
  const none = { currentCents: 0, d1to30Cents: 0, d31to60Cents: 0, d61to90Cents: 0, d90PlusCents: 0, totalCents: 0 }
  return {
    customer, asOf, since,
    business: {
      name: rates?.businessName || 'Road service', phone: rates?.businessPhone ?? '',
      email: rates?.businessEmail ?? '', remit: rates?.remitAddress ?? '',
    },
    invoices,
    // A payment held for being in another currency was never counted: it is refunded, not listed.
    payments: payments.filter(p => p.status !== 'held'),
    aging: aging[0] ?? { customerId, name: customer.name, ...none },
  }
}
export type CustomerStatement = NonNullable<Awaited<ReturnType<typeof customerStatement>>>

function localDay(d: Date, zone: string) {
  return new Intl.DateTimeFormat('en-CA', { timeZone: zone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(d)
}

/** Queues the statement e-mail; the job makes the PDF when it sends, so it is as of that moment. */
export async function queueStatementMail(s: CustomerStatement, to: string, user: User) {
  const b = s.business
  const text = [
    `Hello ${s.customer.name},`, '',
    `Attached is your statement of account as of ${s.asOf}: ${s.invoices.length} open invoice${s.invoices.length === 1 ? '' : 's'},`
    + ` ${formatCents(s.aging.totalCents)} in all, ${formatCents(s.aging.totalCents - s.aging.currentCents)} of it past due.`,
    ...(b.remit ? ['', `Remit to: ${b.remit}`] : []),
    '', 'Thank you,', b.name,
  ].join('\n')
  return queueMail({
    kind: 'statement', to, text, queuedBy: user, related: { type: 'customer', id: s.customer.id },
    subject: `Statement of account from ${b.name}, as of ${s.asOf}`,
    attachments: [{ make: 'statement-pdf', id: s.customer.id }],
  })
}

/** `statement-<customer>-<date>.pdf`: the name's accents dropped, then only ASCII letters, digits and dashes. */
export function statementFilename(s: CustomerStatement) {
  const plain = s.customer.name.normalize('NFKD').replace(/\p{M}/gu, '')
  const name = plain.replace(/[^a-z0-9]+/gi, '-').replace(/^-+|-+$/g, '').toLowerCase() || 'customer'
  return `statement-${name}-${s.asOf}.pdf`
}
