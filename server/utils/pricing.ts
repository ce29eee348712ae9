// The bridge between the database and the pricing in shared/utils/billing.ts: what a call is priced
// from, and writing a priced draft's lines and totals back.
import { asc, eq } from 'drizzle-orm'
import type { PriceAdjustment, PricedInvoice, PricingInput } from '#shared/utils/billing'
import type { EstimateRecord } from '#shared/utils/estimate'

type RatesRow = Parameters<typeof billingRatesOf>[0]
type CallRow = typeof tables.calls.$inferSelect

/** The service truck's yard, where travel is measured from; null when the call has no truck or the yard no position. */
async function yardOf(tx: Db | Tx, call: CallRow) {
  if (!call.serviceTruckId) return null
  const [yard] = await tx.select({ lat: tables.yards.lat, lon: tables.yards.lon }).from(tables.serviceTrucks)
    .innerJoin(tables.yards, eq(tables.yards.id, tables.serviceTrucks.yardId)).where(eq(tables.serviceTrucks.id, call.serviceTruckId))
  return yard && yard.lat != null && yard.lon != null ? { lat: yard.lat, lon: yard.lon } : null
}

/** The record a call is priced from (shared/utils/estimate.ts): clock (flagged events too; pricing leaves them out), parts, yard. */
export async function estimateRecordFor(
  tx: Db | Tx, call: CallRow, rates: RatesRow, taxExempt: boolean, until?: Date,
): Promise<EstimateRecord> {
  const { clockEvents, partLines } = tables
  const clock = await tx.select().from(clockEvents).where(eq(clockEvents.callId, call.id)).orderBy(asc(clockEvents.createdAt))
  const parts = await tx.select().from(partLines).where(eq(partLines.callId, call.id)).orderBy(asc(partLines.createdAt))
  // `flag` is the server's verdict on the phone's clock for that event (null or absent: trusted).
  return estimateRecordOfRows({
    rates: billingRatesOf(rates), clock, parts, yard: await yardOf(tx, call), site: { lat: call.lat, lon: call.lon }, taxExempt,
    until: until ?? call.completedAt ?? new Date(),
  })
}

/** Everything a call is priced from, through the same builder as the phone's estimate. */
export async function pricingInputFor(tx: Db | Tx, call: CallRow, rates: RatesRow, taxExempt: boolean): Promise<PricingInput> {
  return pricingInputOf(await estimateRecordFor(tx, call, rates, taxExempt))
}

/** Prices input with the office's changes; a rule the pricing refuses is the office's 422, not a 500. */
export function priceOrRefuse(input: PricingInput, adjustments: PriceAdjustment[] = [], field = 'lines'): PricedInvoice {
  try {
    return priceCall({ ...input, adjustments })
  }
  catch (err) {
    if (err instanceof RangeError) ruleError(field, err.message)
    throw err
  }
}

/** Replaces a draft's lines and totals with a priced result. */
export async function writePriced(tx: Tx, invoiceId: string, priced: PricedInvoice) {
  await tx.delete(tables.invoiceLines).where(eq(tables.invoiceLines.invoiceId, invoiceId))
  if (priced.lines.length) {
    await tx.insert(tables.invoiceLines).values(priced.lines.map((l, i) => ({
      invoiceId, sort: i, kind: l.kind, description: l.description, quantity: l.quantity, unitCents: l.unitCents,
      amountCents: l.amountCents, taxable: l.taxable, key: l.key, source: l.source,
    })))
  }
  await tx.update(tables.invoices).set({ subtotalCents: priced.subtotalCents, taxCents: priced.taxCents, totalCents: priced.totalCents })
    .where(eq(tables.invoices.id, invoiceId))
}
