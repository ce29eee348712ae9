// Invoices for the demo calls that are already billed (c7) and paid (c8), priced by the same
// billing code the office uses, so the seeded history reads like real work.
import { eq } from 'drizzle-orm'
import type { NodePgDatabase } from 'drizzle-orm/node-postgres'
import * as t from '../schema'
import { billingRatesOf, priceCall } from '../../../shared/utils/billing'
import { seedId } from './ids'

type Db = NodePgDatabase<typeof t>

export async function seedBilling(db: Db) {
  const [rates] = await db.select().from(t.rates).where(eq(t.rates.id, seedId('rates:2026')))
  if (!rates) return
  for (const [key, status] of [['c7', 'sent'], ['c8', 'paid'], ['c11', 'paid'], ['c12', 'paid'], ['c13', 'paid']] as const) {
    const invoiceId = seedId(`invoice:${key}`)
    const [existing] = await db.select({ id: t.invoices.id }).from(t.invoices).where(eq(t.invoices.id, invoiceId))
    if (existing) continue
    const callId = seedId(`call:${key}`)
    const [call] = await db.select().from(t.calls).where(eq(t.calls.id, callId))
    const [customer] = call ? await db.select().from(t.customers).where(eq(t.customers.id, call.customerId)) : []
    if (!call || !customer) continue
    const clock = await db.select().from(t.clockEvents).where(eq(t.clockEvents.callId, callId))
    const parts = await db.select().from(t.partLines).where(eq(t.partLines.callId, callId))
    const priced = priceCall({
      rates: billingRatesOf(rates),
      clock: clock.map(c => ({ id: c.id, kind: c.kind, at: c.deviceAt ?? c.createdAt })), clockUntil: call.completedAt ?? new Date(),
      distance: { straightKm: null, roadKm: 24 }, parts, taxExempt: customer.taxExempt,
    })
    await db.insert(t.invoices).values({
      id: invoiceId, callId, customerId: customer.id, status, ratesId: rates.id,
      subtotalCents: priced.subtotalCents, taxCents: priced.taxCents, totalCents: priced.totalCents,
      dueAt: call.invoicedAt, sentAt: call.invoicedAt, paidAt: status === 'paid' ? call.paidAt : null,
      paidCents: status === 'paid' ? priced.totalCents : 0,
    })
    const lines = priced.lines.map(({ adjusted: _a, ...l }, i) => ({ ...l, id: seedId(`invoice-line:${key}:${i}`), invoiceId, sort: i }))
    await db.insert(t.invoiceLines).values(lines)
    if (status === 'paid') {
      await db.insert(t.payments).values({ id: seedId(`payment:${key}`), invoiceId, method: 'card', amountCents: priced.totalCents,
        providerRef: `pi_seed_${key}`, status: 'succeeded' })
    }
  }
}
