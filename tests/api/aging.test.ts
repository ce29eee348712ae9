import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedIn } from '../support/api'
import { closeTestPool, testPool } from '../support/db'
import { DEMO } from '../support/env'
import { IDS } from '../support/sync'

const customerId = randomUUID()
const made = { calls: [] as string[], invoices: [] as string[] }

/** An invoice of $100.00 due `daysAgo` local days ago at noon in the business's zone (negative: not yet due). */
async function invoice(daysAgo: number, opts: { status?: string, paidCents?: number } = {}) {
  const db = testPool()
  const callId = randomUUID(), invoiceId = randomUUID()
  made.calls.push(callId)
  made.invoices.push(invoiceId)
  await db.query(`INSERT INTO calls (id, status, customer_id, unit_id, location_text, complaint)
    VALUES ($1, 'invoiced', $2, $3, 'Aging test yard', 'Aging test')`, [callId, customerId, IDS.unit])
  await db.query(`INSERT INTO invoices (id, call_id, customer_id, status, subtotal_cents, tax_cents, total_cents, sent_at, due_at)
    VALUES ($1, $2, $3, $4::invoice_status, 10000, 0, 10000,
      CASE WHEN $4::invoice_status = 'draft' THEN NULL ELSE now() - interval '100 days' END,
      ((((now() AT TIME ZONE 'America/Chicago')::date - $5::int) + time '12:00') AT TIME ZONE 'America/Chicago'))`,
  [invoiceId, callId, customerId, opts.status ?? 'sent', daysAgo])
  if (opts.paidCents) {
    const pay = `INSERT INTO payments (invoice_id, method, amount_cents, status) VALUES ($1, 'account', $2, 'posted')`
    await db.query(pay, [invoiceId, opts.paidCents])
    // What server/utils/payments.ts keeps on the invoice when money comes in.
    await db.query('UPDATE invoices SET paid_cents = $2 WHERE id = $1', [invoiceId, opts.paidCents])
  }
}

let office: ApiClient
beforeAll(async () => {
  office = await signedIn(DEMO.office)
  // The demo rates keep the business in Chicago; due dates above are set in that zone.
  const zone = await testPool().query('SELECT time_zone FROM rates ORDER BY effective_from DESC LIMIT 1')
  expect(zone.rows[0].time_zone).toBe('America/Chicago')
  const customer = `INSERT INTO customers (id, name, billing_terms, net_days) VALUES ($1, 'Aging Test Transport', 'account', 30)`
  await testPool().query(customer, [customerId])
})

afterAll(async () => {
  const db = testPool()
  await db.query('DELETE FROM payments WHERE invoice_id = ANY($1)', [made.invoices])
  await db.query('DELETE FROM invoices WHERE id = ANY($1)', [made.invoices])
  await db.query('DELETE FROM calls WHERE id = ANY($1)', [made.calls])
  await db.query('DELETE FROM customers WHERE id = $1', [customerId])
  await closeTestPool()
})

describe('GET /api/billing/aging', () => {
  it('buckets open balances by days past due, worked out by hand', async () => {
    await invoice(-5) // due in 5 days: current
    await invoice(0) // due today: current (not yet late)
    await invoice(1) // 1 day late: 1–30
    await invoice(30) // 30 days late: 1–30
    await invoice(31) // 31: 31–60
    await invoice(45, { paidCents: 2500 }) // 45: 31–60, $25.00 paid of $100.00 → $75.00 open
    await invoice(60) // 60: 31–60
    await invoice(61) // 61: 61–90
    await invoice(90) // 90: 61–90
    await invoice(91) // 91: over 90
    await invoice(200, { status: 'paid', paidCents: 10000 }) // paid in full: owes nothing
    await invoice(200, { status: 'draft' }) // never sent: owes nothing
    await invoice(200, { status: 'void' }) // void: owes nothing
    const r = await office.get('/api/billing/aging')
    expect(r.status).toBe(200)
    const row = r.body.rows.find((x: { customerId: string }) => x.customerId === customerId)
    expect(row).toEqual({
      customerId,
      name: 'Aging Test Transport',
      currentCents: 20_000, // 100.00 + 100.00
      d1to30Cents: 20_000, // 100.00 + 100.00
      d31to60Cents: 27_500, // 100.00 + 75.00 + 100.00
      d61to90Cents: 20_000, // 100.00 + 100.00
      d90PlusCents: 10_000, // 100.00
      totalCents: 97_500, // 200.00 + 200.00 + 275.00 + 200.00 + 100.00
    })
    // Each row's buckets add up to its total.
    for (const x of r.body.rows) {
      expect(x.currentCents + x.d1to30Cents + x.d31to60Cents + x.d61to90Cents + x.d90PlusCents).toBe(x.totalCents)
    }
  })

  it('keeps the aging to the office and admin', async () => {
    for (const email of [DEMO.mech1, DEMO.dispatcher]) expect((await (await signedIn(email)).get('/api/billing/aging')).status).toBe(403)
    expect((await new ApiClient().get('/api/billing/aging')).status).toBe(401)
    expect((await (await signedIn(DEMO.admin)).get('/api/billing/aging')).status).toBe(200)
  })
})
