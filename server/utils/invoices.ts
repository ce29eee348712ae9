import { and, desc, eq, ne, sql, type SQL } from 'drizzle-orm'
import type { User } from '#auth-utils'
import type { z } from 'zod'
import type { invoiceListQuerySchema } from '#shared/schemas/invoices'

/** The rates in force: the newest row by effective date. */
export async function currentRates(db: Db | Tx = useDb()) {
  const [r] = await db.select().from(tables.rates).orderBy(desc(tables.rates.effectiveFrom)).limit(1)
  if (!r) throw createError({ status: 409, statusText: 'No rates are set; an admin sets them under Setup' })
  return r
}

/** Drafts the invoice from the synced record and closes the call to further field changes. */
export async function draftInvoice(callId: string, user: User) {
  return useDb().transaction(async (tx) => {
    const [call] = await tx.select().from(tables.calls).where(eq(tables.calls.id, callId)).for('update')
    if (!call) throw createError({ status: 404, statusText: 'No such call' })
    const [open] = await tx.select({ id: tables.invoices.id }).from(tables.invoices).where(and(eq(tables.invoices.callId, callId), ne(tables.invoices.status, 'void')))
    if (open) ruleError('callId', 'This call already has an invoice')
    if (call.status !== 'completed') ruleError('callId', `Only a call whose work is done can be billed (this one is ${STATUS_LABELS[call.status].toLowerCase()})`)
    const [customer] = await tx.select().from(tables.customers).where(eq(tables.customers.id, call.customerId))
    const rates = await currentRates(tx)
    const input = await pricingInputFor(tx, call, rates, customer?.taxExempt ?? false)
    const priced = priceOrRefuse(input, [], 'callId')
    const netDays = customer?.billingTerms === 'account' ? (customer.netDays ?? 30) : 0
    const [invoice] = await tx.insert(tables.invoices).values({
      callId, customerId: call.customerId, status: 'draft', ratesId: rates.id,
      pricingInput: input, dueAt: new Date(Date.now() + netDays * 86_400_000),
    }).returning()
    await writePriced(tx, invoice!.id, priced)
    await tx.update(tables.calls).set({ status: 'invoiced', invoicedAt: new Date(), statusChangedAt: new Date() }).where(eq(tables.calls.id, callId))
    await tx.insert(tables.callEvents).values({ callId, kind: 'status', fromStatus: 'completed', toStatus: 'invoiced', byUserId: user.id, note: `Invoice W-${invoice!.number} drafted` })
    return invoice!.id
  })
}

export async function getInvoice(id: string) {
  const inv = await useDb().query.invoices.findFirst({
    where: eq(tables.invoices.id, id),
    with: {
      lines: { orderBy: (l, { asc }) => [asc(l.sort)] },
      payments: { with: { refunds: true }, orderBy: (p, { asc }) => [asc(p.createdAt)] },
      creditNotes: { with: { lines: { orderBy: (l, { asc }) => [asc(l.sort)] } }, orderBy: (n, { asc }) => [asc(n.number)] },
      customer: true,
      call: { with: { unit: true } },
    },
  })
  if (!inv) return null
  const { changeXid: _x, call, customer, ...rest } = inv
  return {
    ...rest,
    money: invoiceMoney(rest),
    customer: { id: customer.id, name: customer.name, billingEmail: customer.billingEmail, billingTerms: customer.billingTerms, netDays: customer.netDays, taxExempt: customer.taxExempt },
    call: { id: call.id, number: call.number, status: call.status, outcome: call.outcome, locationText: call.locationText, complaint: call.complaint, poNumber: call.poNumber, authLimitCents: call.authLimitCents, storyComplaint: call.storyComplaint, storyCause: call.storyCause, storyCorrection: call.storyCorrection, completedAt: call.completedAt, unit: call.unit ? { unitNumber: call.unit.unitNumber, vin: call.unit.vin, yearMakeModel: call.unit.yearMakeModel } : null },
  }
}
export type InvoiceDetail = NonNullable<Awaited<ReturnType<typeof getInvoice>>>

export async function listInvoices(q: z.output<typeof invoiceListQuerySchema>) {
  const where: SQL[] = []
  if (q.status) where.push(eq(tables.invoices.status, q.status))
  if (q.customerId) where.push(eq(tables.invoices.customerId, q.customerId))
  const cond = where.length ? and(...where) : undefined
  const db = useDb()
  const [items, [n]] = await Promise.all([
    db.select({
      id: tables.invoices.id, number: tables.invoices.number, status: tables.invoices.status, callId: tables.invoices.callId,
      callNumber: tables.calls.number, customerName: tables.customers.name, billingTerms: tables.customers.billingTerms,
      totalCents: tables.invoices.totalCents, paidCents: tables.invoices.paidCents, creditedCents: tables.invoices.creditedCents,
      createdAt: tables.invoices.createdAt, sentAt: tables.invoices.sentAt, paidAt: tables.invoices.paidAt, dueAt: tables.invoices.dueAt,
    }).from(tables.invoices)
      .innerJoin(tables.calls, eq(tables.calls.id, tables.invoices.callId))
      .innerJoin(tables.customers, eq(tables.customers.id, tables.invoices.customerId))
      .where(cond).orderBy(desc(tables.invoices.number)).limit(q.pageSize).offset((q.page - 1) * q.pageSize),
    db.select({ n: sql<number>`count(*)::int` }).from(tables.invoices).where(cond),
  ])
  return { items, total: n?.n ?? 0 }
}
