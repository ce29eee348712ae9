// The office's changes to a draft invoice: each one is logged (who, when, why, the line before and
// after) and the whole draft is repriced from what it was drafted from plus every change in order,
// so the lines nobody touched stay traceable to their clock events, part lines and rates.
import { randomUUID } from 'node:crypto'
import { asc, eq, inArray } from 'drizzle-orm'
import type { User } from '#auth-utils'
import type { InvoiceAdjustmentInput } from '#shared/schemas/invoices'
import type { PriceAdjustment, PricedInvoice, PricingInput } from '#shared/utils/billing'

type InvoiceRow = typeof tables.invoices.$inferSelect

/** What a draft was priced from; a draft made before the snapshot existed is rebuilt from its closed call. */
export async function draftPricingInput(tx: Db | Tx, inv: InvoiceRow): Promise<PricingInput> {
  if (inv.pricingInput) return inv.pricingInput as unknown as PricingInput
  const [call] = await tx.select().from(tables.calls).where(eq(tables.calls.id, inv.callId))
  const [customer] = await tx.select().from(tables.customers).where(eq(tables.customers.id, inv.customerId))
  const [rates] = inv.ratesId ? await tx.select().from(tables.rates).where(eq(tables.rates.id, inv.ratesId)) : []
  return pricingInputFor(tx, call!, rates ?? await currentRates(tx), customer?.taxExempt ?? false)
}

async function adjustmentRows(tx: Db | Tx, invoiceId: string) {
  const { invoiceAdjustments: a } = tables
  return tx.select().from(a).where(eq(a.invoiceId, invoiceId)).orderBy(asc(a.at), asc(a.id))
}

const lineView = (p: PricedInvoice, key: string | null) => {
  const l = key ? p.lines.find(x => x.key === key) : undefined
  if (!l) return null
  return { description: l.description, quantity: l.quantity, unitCents: l.unitCents, amountCents: l.amountCents, taxable: l.taxable }
}

function toAdjustment(input: InvoiceAdjustmentInput): PriceAdjustment {
  if (input.action === 'add') return { action: 'add', key: `office:${randomUUID()}`, line: input.line }
  if (input.action === 'change') return { action: 'change', key: input.key, changes: input.changes }
  if (input.action === 'remove') return { action: 'remove', key: input.key }
  return { action: 'road', distance: input.distance }
}

/** Applies one change to a draft, logs it and reprices the draft, in one transaction. */
export async function adjustDraft(invoiceId: string, input: InvoiceAdjustmentInput, user: User) {
  await useDb().transaction(async (tx) => {
    const [inv] = await tx.select().from(tables.invoices).where(eq(tables.invoices.id, invoiceId)).for('update')
    if (!inv) throw createError({ status: 404, statusText: 'No such invoice' })
    if (inv.status !== 'draft') ruleError('status', `Only a draft can be changed; this invoice is ${inv.status}`)
    const pricing = await draftPricingInput(tx, inv)
    if (input.action === 'road' && pricing.rates.travelBasis !== 'distance') {
      ruleError('distance', 'Travel on this invoice is billed by time, not distance')
    }
    const earlier = (await adjustmentRows(tx, invoiceId)).map(r => r.change as unknown as PriceAdjustment)
    const change = toAdjustment(input)
    const before = priceOrRefuse(pricing, earlier)
    const after = priceOrRefuse(pricing, [...earlier, change], input.action === 'add' ? 'line' : 'changes')
    if (after.unapplied.includes(change)) ruleError('key', 'There is no such line on this draft')
    const key = change.action === 'road' ? 'travel' : change.key
    await tx.insert(tables.invoiceAdjustments).values({
      invoiceId, action: change.action, lineKey: key, change, reason: input.reason, byUserId: user.id,
      before: lineView(before, key), after: lineView(after, key),
    })
    await writePriced(tx, invoiceId, after)
    if (!inv.pricingInput) await tx.update(tables.invoices).set({ pricingInput: pricing }).where(eq(tables.invoices.id, invoiceId))
  })
}

/** The draft's change log with names, and the clock times its pricing left out. */
export async function draftHistory(inv: InvoiceRow) {
  const db = useDb()
  const rows = await adjustmentRows(db, inv.id)
  const ids = [...new Set(rows.map(r => r.byUserId))]
  const { users } = tables
  const people = ids.length ? await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, ids)) : []
  const pricing = await draftPricingInput(db, inv)
  const priced = priceCall({ ...pricing, adjustments: rows.map(r => r.change as unknown as PriceAdjustment) })
  return {
    adjustments: rows.map(r => ({
      id: r.id, action: r.action as PriceAdjustment['action'], lineKey: r.lineKey, reason: r.reason, at: r.at,
      by: people.find(p => p.id === r.byUserId) ?? null,
      before: r.before as ReturnType<typeof lineView>, after: r.after as ReturnType<typeof lineView>,
    })),
    excludedClock: priced.excludedClock,
    travelBasis: pricing.rates.travelBasis,
    travelUnit: pricing.rates.travelUnit,
  }
}

/** The invoice as the office's invoice page reads it: the invoice, its change log and its flags. */
export async function invoiceView(id: string) {
  const invoice = await getInvoice(id)
  if (!invoice) return null
  const db = useDb()
  const [row] = await db.select().from(tables.invoices).where(eq(tables.invoices.id, id))
  const { photos: p } = tables
  const photos = await db
    .select({ id: p.id, caption: p.caption, contentType: p.contentType, uploadedAt: p.uploadedAt, showCustomer: p.showCustomer })
    .from(p).where(eq(p.callId, invoice.callId)).orderBy(asc(p.createdAt))
  return {
    ...invoice, ...(await draftHistory(row!)), flags: await invoiceFlags(invoice.callId, invoice.totalCents),
    approvals: await invoiceApprovals({ ...invoice, ratesId: row!.ratesId }),
    signedEstimates: await signedEstimatesOf(invoice.callId),
    signOff: await signOffOf(invoice.callId),
    photos: photos.map(x => ({
      ...x, url: `/api/photos/${x.id}`, pending: !x.uploadedAt, printable: x.contentType === 'image/jpeg' || x.contentType === 'image/png',
    })),
  }
}
