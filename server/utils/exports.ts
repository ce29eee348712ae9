// The bookkeeper's exports: invoices issued and payments received in a date range, read in the
// business's time zone (the rates in force), as CSV with a column set that stays put (README).
import { sql } from 'drizzle-orm'
import type { ReportRange } from '#shared/schemas/reports'
import type { CsvColumn } from './csv'

const INVOICE_STATUS: Record<string, string> = { draft: 'Draft', sent: 'Sent', paid: 'Paid', void: 'Void' }
/** What the payments file says of each row: the stored status in words. */
const PAYMENT_STATUS: Record<string, string> = {
  succeeded: 'Paid by card', posted: 'Posted to account', recorded: 'Recorded by the office', held: 'Held, not counted',
  refunded: 'Refunded',
}
const METHOD: Record<string, string> = {
  card: 'Card', account: 'Fleet account', check: 'Check', bank_transfer: 'Bank transfer', cash: 'Cash',
}

interface InvoiceExportRow {
  number: number
  issuedOn: string
  dueOn: string | null
  status: string
  customer: string
  unit: string | null
  callNumber: number
  po: string | null
  subtotalCents: number
  taxCents: number
  totalCents: number
  paidCents: number
  creditedCents: number
  balanceCents: number
}

/** Invoices sent (issued) between `from` and `to`, inclusive, by their local issue date; drafts are not issued. */
export async function invoiceExportRows(range: ReportRange): Promise<InvoiceExportRow[]> {
  const zone = await businessZone()
  const res = await useDb().execute(sql`
    SELECT i.number, to_char(i.sent_at AT TIME ZONE ${zone}, 'YYYY-MM-DD') AS "issuedOn",
      to_char(i.due_at AT TIME ZONE ${zone}, 'YYYY-MM-DD') AS "dueOn", i.status::text AS status, c.name AS customer,
      u.unit_number AS unit, ca.number AS "callNumber", ca.po_number AS po, i.subtotal_cents AS "subtotalCents",
      i.tax_cents AS "taxCents", i.total_cents AS "totalCents", i.paid_cents AS "paidCents", i.credited_cents AS "creditedCents",
      CASE WHEN i.status = 'void' THEN 0 ELSE i.total_cents - i.paid_cents - i.credited_cents END AS "balanceCents"
    FROM invoices i
    JOIN customers c ON c.id = i.customer_id
    JOIN calls ca ON ca.id = i.call_id
    LEFT JOIN units u ON u.id = ca.unit_id
    WHERE i.sent_at IS NOT NULL
      AND (i.sent_at AT TIME ZONE ${zone})::date BETWEEN ${range.from}::date AND ${range.to}::date
    ORDER BY i.number`)
  return res.rows as unknown as InvoiceExportRow[]
}

interface PaymentExportRow {
  receivedOn: string
  invoiceNumber: number
  customer: string
  method: string
  reference: string | null
  status: string
  amountCents: number
}

/**
 * Money received between `from` and `to`, inclusive, by the day it came in (the day the office
 * entered for a check or transfer, else the local day it was recorded), and money given back as
 * refunds: rows of their own with a negative amount. `customerId` narrows it to one customer.
 */
export async function paymentExportRows(range: ReportRange, only: { customerId?: string } = {}): Promise<PaymentExportRow[]> {
  const zone = await businessZone()
  const res = await useDb().execute(sql`
    SELECT * FROM (
      SELECT to_char(coalesce(p.received_on, (p.created_at AT TIME ZONE ${zone})::date), 'YYYY-MM-DD') AS "receivedOn",
        i.number AS "invoiceNumber", c.name AS customer, p.method::text AS method, coalesce(p.reference, p.provider_ref) AS reference,
        p.status, p.amount_cents AS "amountCents", p.created_at AS at, c.id AS "customerId"
      FROM payments p JOIN invoices i ON i.id = p.invoice_id JOIN customers c ON c.id = i.customer_id
      UNION ALL
      SELECT to_char(r.created_at AT TIME ZONE ${zone}, 'YYYY-MM-DD'), i.number, c.name, p.method::text,
        coalesce(r.provider_ref, p.reference, p.provider_ref), 'refunded', -r.amount_cents, r.created_at, c.id
      FROM refunds r JOIN payments p ON p.id = r.payment_id JOIN invoices i ON i.id = r.invoice_id JOIN customers c ON c.id = i.customer_id
    ) m
    WHERE "receivedOn"::date BETWEEN ${range.from}::date AND ${range.to}::date
      AND (${only.customerId ?? null}::uuid IS NULL OR "customerId" = ${only.customerId ?? null}::uuid)
    ORDER BY "receivedOn", at`)
  return res.rows as unknown as PaymentExportRow[]
}

export const INVOICE_COLUMNS: CsvColumn<InvoiceExportRow>[] = [
  { header: 'Invoice number', kind: 'number', value: r => r.number },
  { header: 'Issued', kind: 'date', value: r => r.issuedOn },
  { header: 'Due', kind: 'date', value: r => r.dueOn },
  { header: 'Status', kind: 'text', value: r => INVOICE_STATUS[r.status] ?? r.status },
  { header: 'Customer', kind: 'text', value: r => r.customer },
  { header: 'Unit', kind: 'text', value: r => r.unit },
  { header: 'Call number', kind: 'number', value: r => r.callNumber },
  { header: 'PO', kind: 'text', value: r => r.po },
  { header: 'Subtotal', kind: 'money', value: r => r.subtotalCents },
  { header: 'Tax', kind: 'money', value: r => r.taxCents },
  { header: 'Total', kind: 'money', value: r => r.totalCents },
  { header: 'Paid', kind: 'money', value: r => r.paidCents },
  { header: 'Credited', kind: 'money', value: r => r.creditedCents },
  { header: 'Balance', kind: 'money', value: r => r.balanceCents },
]

export const PAYMENT_COLUMNS: CsvColumn<PaymentExportRow>[] = [
  { header: 'Received', kind: 'date', value: r => r.receivedOn },
  { header: 'Invoice number', kind: 'number', value: r => r.invoiceNumber },
  { header: 'Customer', kind: 'text', value: r => r.customer },
  { header: 'Method', kind: 'text', value: r => METHOD[r.method] ?? r.method },
  { header: 'Reference', kind: 'text', value: r => r.reference },
  { header: 'Status', kind: 'text', value: r => PAYMENT_STATUS[r.status] ?? r.status },
  { header: 'Amount', kind: 'money', value: r => r.amountCents },
]
