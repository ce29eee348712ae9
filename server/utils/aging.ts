// Fleet accounts: what each customer owes, by how long it has been past due. An invoice's open
// balance is its total less the money counted against it (payments less refunds, `paid_cents`) and
// its credit notes (`credited_cents`), both kept by server/utils/payments.ts; days past due are counted between
// local calendar days in the business's time zone (the rates in force), so an invoice due
// yesterday evening is one day late this morning, whatever the server's clock zone.
import { sql } from 'drizzle-orm'

export interface AgingRow {
  customerId: string
  name: string
  currentCents: number
  d1to30Cents: number
  d31to60Cents: number
  d61to90Cents: number
  d90PlusCents: number
  totalCents: number
}

/**
 * One row per customer with an open balance, largest first. Buckets by days past due: current
 * (not yet due, or due today), 1–30, 31–60, 61–90, over 90. An invoice with no due date is due
 * the day it was sent. Drafts and void invoices owe nothing.
 */
export async function agingRows(): Promise<AgingRow[]> {
  const zone = (await ratesInForce())?.timeZone ?? 'UTC'
  const res = await useDb().execute(sql`
    WITH open AS (
      SELECT i.customer_id, i.total_cents - i.paid_cents - i.credited_cents AS balance,
        (now() AT TIME ZONE ${zone})::date - (coalesce(i.due_at, i.sent_at) AT TIME ZONE ${zone})::date AS late
      FROM invoices i
      WHERE i.status IN ('sent', 'paid') AND i.sent_at IS NOT NULL
    )
    SELECT c.id AS "customerId", c.name,
      sum(balance) FILTER (WHERE late <= 0)::int AS "currentCents",
      sum(balance) FILTER (WHERE late BETWEEN 1 AND 30)::int AS "d1to30Cents",
      sum(balance) FILTER (WHERE late BETWEEN 31 AND 60)::int AS "d31to60Cents",
      sum(balance) FILTER (WHERE late BETWEEN 61 AND 90)::int AS "d61to90Cents",
      sum(balance) FILTER (WHERE late > 90)::int AS "d90PlusCents",
      sum(balance)::int AS "totalCents"
    FROM open JOIN customers c ON c.id = open.customer_id
    WHERE balance <> 0
    GROUP BY c.id, c.name
    ORDER BY sum(balance) DESC, c.name`)
  return (res.rows as Record<string, unknown>[]).map(r => ({
    customerId: r.customerId as string,
    name: r.name as string,
    currentCents: Number(r.currentCents ?? 0),
    d1to30Cents: Number(r.d1to30Cents ?? 0),
    d31to60Cents: Number(r.d31to60Cents ?? 0),
    d61to90Cents: Number(r.d61to90Cents ?? 0),
    d90PlusCents: Number(r.d90PlusCents ?? 0),
    totalCents: Number(r.totalCents ?? 0),
  }))
}
