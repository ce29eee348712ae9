// A credit note corrects an invoice already sent: its own number, negative lines, linked to the
// invoice. Its tax is taken at the rate the invoice was taxed at, so crediting every taxable cent
// gives back exactly the tax charged.
import { eq } from 'drizzle-orm'
import type { z } from 'zod'
import type { User } from '#auth-utils'
import type { creditNoteSchema } from '#shared/schemas/payments'

export async function issueCreditNote(invoiceId: string, input: z.output<typeof creditNoteSchema>, key: string, user: User) {
  return useDb().transaction(async (tx) => {
    const inv = await lockInvoice(tx, invoiceId)
    const [same] = await tx.select().from(tables.creditNotes).where(eq(tables.creditNotes.idempotencyKey, key))
    if (same) {
      if (same.invoiceId !== invoiceId) ruleError('idempotencyKey', 'This idempotency key was already used for another credit note')
      return { creditNoteId: same.id, replayed: true }
    }
    if (inv.status === 'draft') ruleError('status', 'Change the draft instead: a credit note corrects an invoice already sent')
    if (inv.status === 'void') ruleError('status', 'A void invoice takes no credit note')
    const lines = await tx.select().from(tables.invoiceLines).where(eq(tables.invoiceLines.invoiceId, inv.id))
    const taxedBase = lines.filter(l => l.taxable).reduce((s, l) => s + l.amountCents, 0)
    const credit = input.lines.reduce((s, l) => s + l.amountCents, 0)
    const creditTaxed = input.lines.filter(l => l.taxable).reduce((s, l) => s + l.amountCents, 0)
    const tax = taxedBase > 0 ? Math.round(creditTaxed * inv.taxCents / taxedBase) : 0
    const left = inv.totalCents - inv.creditedCents
    if (credit + tax > left) ruleError('lines', `More than is left on the invoice: at most ${formatCents(left)} can still be credited`)
    const [note] = await tx.insert(tables.creditNotes).values({
      invoiceId: inv.id, reason: input.reason, subtotalCents: -credit, taxCents: -tax, totalCents: -(credit + tax),
      idempotencyKey: key, byUserId: user.id,
    }).returning()
    await tx.insert(tables.creditNoteLines).values(input.lines.map((l, i) => ({ creditNoteId: note!.id, sort: i,
      description: l.description, amountCents: -l.amountCents, taxable: l.taxable })))
    await settleInvoiceMoney(tx, inv, user.id, `Credit note CN-${note!.number} on invoice W-${inv.number}: ${input.reason}`)
    return { creditNoteId: note!.id, replayed: false }
  })
}

export async function getCreditNote(id: string) {
  const note = await useDb().query.creditNotes.findFirst({
    where: eq(tables.creditNotes.id, id),
    with: { lines: { orderBy: (l, { asc }) => [asc(l.sort)] }, invoice: { with: { customer: true, call: true } } },
  })
  if (!note) return null
  const { invoice, ...rest } = note
  return {
    ...rest,
    invoice: { id: invoice.id, number: invoice.number, totalCents: invoice.totalCents, createdAt: invoice.createdAt,
      callNumber: invoice.call.number, poNumber: invoice.call.poNumber },
    customer: { name: invoice.customer.name, billingEmail: invoice.customer.billingEmail },
  }
}
export type CreditNoteDetail = NonNullable<Awaited<ReturnType<typeof getCreditNote>>>
