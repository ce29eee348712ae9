// Fleet accounts: what each customer owes, by how long it has been past due. An invoice's open
// balance is its total less the money counted against it (payments less refunds, `paid_cents`) and
// its credit notes (`credited_cents`), both kept by server/utils/payments.ts; days past due are counted
// between local calendar days in the business's time zone (the rates in force), so an invoice due
// yesterday evening is one day late this morning, whatever the server's clock zone. The aging and
// the statements read the same open invoices (`openInvoices`).
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

export interface OpenInvoice {
  id: string
  customerId: string
  number: number
  callNumber: number
  po: string | null
  issuedOn: string
  dueOn: string
  /** Local days past due: 0 or less is not yet late. */
  daysLate: number
  totalCents: number
  paidCents: number
  creditedCents: number
  balanceCents: number
}

export async function businessZone() {
  return (await ratesInForce())?.timeZone ?? 'UTC'
}

/**
 * Invoices with money still open (or overpaid: a negative balance), for one customer or all. An
 * invoice with no due date is due the day it was sent. Drafts and void invoices owe nothing.
 */
function openInvoices(zone: string, customerId: string | null) {
  return sql`
    SELECT i.id, i.customer_id AS "customerId", i.number, ca.number AS "callNumber", ca.po_number AS po,
      to_char(i.sent_at AT TIME ZONE ${zone}, 'YYYY-MM-DD') AS "issuedOn",
      to_char(coalesce(i.due_at, i.sent_at) AT TIME ZONE ${zone}, 'YYYY-MM-DD') AS "dueOn",
      (now() AT TIME ZONE ${zone})::date - (coalesce(i.due_at, i.sent_at) AT TIME ZONE ${zone})::date AS "daysLate",
      i.total_cents AS "totalCents", i.paid_cents AS "paidCents", i.credited_cents AS "creditedCents",
      i.total_cents - i.paid_cents - i.credited_cents AS "balanceCents"
    FROM invoices i JOIN calls ca ON ca.id = i.call_id
    WHERE i.status IN ('sent', 'paid') AND i.sent_at IS NOT NULL
      AND i.total_cents - i.paid_cents - i.credited_cents <> 0
      AND (${customerId}::uuid IS NULL OR i.customer_id = ${customerId}::uuid)`
}

/** One customer's open invoices, oldest due first. */
export async function openInvoicesOf(customerId: string): Promise<OpenInvoice[]> {
  const res = await useDb().execute(sql`${openInvoices(await businessZone(), customerId)} ORDER BY "dueOn", number`)
  return res.rows as unknown as OpenInvoice[]
}

/**
 * One row per customer with an open balance, largest first. Buckets by days past due: current
 * (not yet due, or due today), 1–30, 31–60, 61–90, over 90. `customerId` narrows it to one
 * customer (their statement).
 */
export async function agingRows(only: { customerId?: string } = {}): Promise<AgingRow[]> {
  const open = openInvoices(await businessZone(), only.customerId ?? null)
  const res = await useDb().execute(sql`
    WITH open AS (${open})
    SELECT c.id AS "customerId", c.name,
      sum("balanceCents") FILTER (WHERE "daysLate" <= 0)::int AS "currentCents",
      sum("balanceCents") FILTER (WHERE "daysLate" BETWEEN 1 AND 30)::int AS "d1to30Cents",
      sum("balanceCents") FILTER (WHERE "daysLate" BETWEEN 31 AND 60)::int AS "d31to60Cents",
      sum("balanceCents") FILTER (WHERE "daysLate" BETWEEN 61 AND 90)::int AS "d61to90Cents",
      sum("balanceCents") FILTER (WHERE "daysLate" > 90)::int AS "d90PlusCents",
      sum("balanceCents")::int AS "totalCents"
    FROM open JOIN customers c ON c.id = open."customerId"
    GROUP BY c.id, c.name
    ORDER BY sum("balanceCents") DESC, c.name`)
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
