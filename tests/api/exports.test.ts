import { randomUUID } from 'node:crypto'
import Papa from 'papaparse'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedIn } from '../support/api'
import { closeTestPool, testPool } from '../support/db'
import { DEMO } from '../support/env'
import { IDS } from '../support/sync'

// Names a spreadsheet would run as formulas (OWASP "CSV Injection"): each must come back as text.
const NASTY = ['=HYPERLINK("http://x")', '+1', '-2', '@SUM(A1:A9)', '\tTabbed', '\rReturned']
const made = { customers: [] as string[], calls: [] as string[], invoices: [] as string[] }

async function invoiceFor(name: string, sentAt: string, opts: { paidCents?: number, po?: string } = {}) {
  const db = testPool()
  const customerId = randomUUID(), callId = randomUUID(), invoiceId = randomUUID()
  made.customers.push(customerId)
  made.calls.push(callId)
  made.invoices.push(invoiceId)
  await db.query(`INSERT INTO customers (id, name, billing_terms, net_days) VALUES ($1, $2, 'account', 30)`, [customerId, name])
  await db.query(`INSERT INTO calls (id, status, customer_id, unit_id, location_text, complaint, po_number)
    VALUES ($1, 'invoiced', $2, $3, 'Export test yard', 'Export test', $4)`, [callId, customerId, IDS.unit, opts.po ?? null])
  const r = await db.query(`INSERT INTO invoices (id, call_id, customer_id, status, subtotal_cents, tax_cents, total_cents, sent_at, due_at)
    VALUES ($1, $2, $3, 'sent', 10000, 500, 10500, $4, $4::timestamptz + interval '30 days') RETURNING number`,
  [invoiceId, callId, customerId, sentAt])
  if (opts.paidCents) {
    await db.query(`INSERT INTO payments (invoice_id, method, amount_cents, status, provider_ref, created_at)
      VALUES ($1, 'card', $2, 'succeeded', $3, $4)`, [invoiceId, opts.paidCents, `=cmd|' /C calc'!A0 ${invoiceId}`, sentAt])
    // What server/utils/payments.ts keeps on the invoice when money comes in.
    await db.query('UPDATE invoices SET paid_cents = $2 WHERE id = $1', [invoiceId, opts.paidCents])
  }
  return r.rows[0].number as number
}

function parse(text: string) {
  const parsed = Papa.parse<string[]>(text, { skipEmptyLines: true })
  expect(parsed.errors).toEqual([])
  const [header, ...rows] = parsed.data
  return { header: header!, rows }
}

let office: ApiClient
beforeAll(async () => {
  office = await signedIn(DEMO.office)
  // The demo rates keep the business in Chicago: dates below are read there (UTC−6 in winter).
  const zone = await testPool().query('SELECT time_zone FROM rates ORDER BY effective_from DESC LIMIT 1')
  expect(zone.rows[0].time_zone).toBe('America/Chicago')
  for (const name of NASTY) await invoiceFor(name, '2025-02-10T18:00:00Z')
})

afterAll(async () => {
  const db = testPool()
  await db.query('DELETE FROM refunds WHERE invoice_id = ANY($1)', [made.invoices])
  await db.query('DELETE FROM payments WHERE invoice_id = ANY($1)', [made.invoices])
  await db.query('DELETE FROM invoices WHERE id = ANY($1)', [made.invoices])
  await db.query('DELETE FROM calls WHERE id = ANY($1)', [made.calls])
  await db.query('DELETE FROM customers WHERE id = ANY($1)', [made.customers])
  await closeTestPool()
})

describe('GET /api/exports/invoices', () => {
  it('answers CSV with the documented columns, every formula-like name neutralised and quoted', async () => {
    const r = await office.get('/api/exports/invoices?from=2025-02-01&to=2025-02-28')
    expect(r.status).toBe(200)
    expect(r.headers.get('content-type')).toMatch(/^text\/csv/)
    expect(r.headers.get('content-disposition')).toContain('invoices-2025-02-01-to-2025-02-28.csv')
    const { header, rows } = parse(r.body)
    expect(header).toEqual(['Invoice number', 'Issued', 'Due', 'Status', 'Customer', 'Unit', 'Call number', 'PO', 'Subtotal', 'Tax',
      'Total', 'Paid', 'Credited', 'Balance'])
    const customers = rows.map(x => x[4])
    for (const name of NASTY) expect(customers).toContain(`'${name}`)
    // Quoted in the file itself, so no spreadsheet reads the cell as the start of a formula.
    expect(r.body).toContain('"\'=HYPERLINK(""http://x"")"')
    expect(r.body).toContain('"\'+1"')
    expect(r.body).toContain('"\'-2"')
    expect(r.body).toContain('"\'@SUM(A1:A9)"')
    expect(r.body).toContain('"\'\tTabbed"')
    expect(r.body).toContain('"\'\rReturned"')
    const row = rows.find(x => x[4] === '\'+1')!
    // 10000 + 500 cents = $105.00, due 30 days after 10 February = 12 March.
    expect(row.slice(1, 4)).toEqual(['2025-02-10', '2025-03-12', 'Sent'])
    expect(row.slice(8)).toEqual(['100.00', '5.00', '105.00', '0.00', '0.00', '105.00'])
  })

  it('keeps a negative balance a number the spreadsheet adds up (overpaid: 105.00 − 120.00 = −15.00)', async () => {
    const number = await invoiceFor('Overpaid Haulage', '2025-02-12T18:00:00Z', { paidCents: 12000, po: '-PO-7' })
    const { rows } = parse((await office.get('/api/exports/invoices?from=2025-02-01&to=2025-02-28')).body)
    const row = rows.find(x => x[0] === String(number))!
    expect(row[7]).toBe('\'-PO-7')
    expect(row.slice(11)).toEqual(['120.00', '0.00', '-15.00'])
    expect(Number(row[13])).toBe(-15)
  })

  it('reads the issue date in the business\'s time zone', async () => {
    // 03:00 UTC on 1 March is 21:00 on 28 February in Chicago (UTC−6): February's.
    const late = await invoiceFor('Late Evening Freight', '2025-03-01T03:00:00Z')
    // 05:00 UTC on 1 February is 23:00 on 31 January in Chicago: January's.
    const early = await invoiceFor('Early Start Carriers', '2025-02-01T05:00:00Z')
    const feb = parse((await office.get('/api/exports/invoices?from=2025-02-01&to=2025-02-28')).body).rows.map(x => x[0])
    expect(feb).toContain(String(late))
    expect(feb).not.toContain(String(early))
    const jan = parse((await office.get('/api/exports/invoices?from=2025-01-01&to=2025-01-31')).body).rows
    expect(jan.find(x => x[0] === String(early))![1]).toBe('2025-01-31')
  })
})

describe('GET /api/exports/payments', () => {
  it('lists payments with the documented columns; a formula in a reference is neutralised', async () => {
    const number = await invoiceFor('Prompt Payer Lines', '2025-02-14T18:00:00Z', { paidCents: 10500 })
    const r = await office.get('/api/exports/payments?from=2025-02-01&to=2025-02-28')
    expect(r.status).toBe(200)
    expect(r.headers.get('content-type')).toMatch(/^text\/csv/)
    const { header, rows } = parse(r.body)
    expect(header).toEqual(['Received', 'Invoice number', 'Customer', 'Method', 'Reference', 'Status', 'Amount'])
    const row = rows.find(x => x[1] === String(number))!
    expect(row[0]).toBe('2025-02-14')
    expect(row[2]).toBe('Prompt Payer Lines')
    expect(row[3]).toBe('Card')
    expect(row[4]).toMatch(/^'=cmd\|/)
    expect(row[6]).toBe('105.00')
  })

  it('lists a refund as a row of its own with a negative amount the spreadsheet reads as a number', async () => {
    const number = await invoiceFor('Refunded Rigs', '2025-02-16T18:00:00Z', { paidCents: 10500 })
    const db = testPool()
    const payment = 'SELECT p.id, p.invoice_id FROM payments p JOIN invoices i ON i.id = p.invoice_id WHERE i.number = $1'
    const pay = await db.query(payment, [number])
    await db.query(`INSERT INTO refunds (payment_id, invoice_id, amount_cents, reason, created_at)
      VALUES ($1, $2, 2550, 'Core returned', '2025-02-20T18:00:00Z')`, [pay.rows[0].id, pay.rows[0].invoice_id])
    const r = await office.get('/api/exports/payments?from=2025-02-01&to=2025-02-28')
    const rows = parse(r.body).rows.filter(x => x[1] === String(number))
    // $105.00 in on the 16th, $25.50 of it back on the 20th.
    expect(rows.map(x => [x[0], x[5], x[6]])).toEqual([['2025-02-16', 'Paid by card', '105.00'], ['2025-02-20', 'Refunded', '-25.50']])
    expect(r.body).toContain(',-25.50')
    expect(Number(rows[1]![6])).toBe(-25.5)
  })
})

describe('exports: who and what', () => {
  it('keeps exports to the office and admin', async () => {
    for (const email of [DEMO.mech1, DEMO.dispatcher]) {
      const c = await signedIn(email)
      expect((await c.get('/api/exports/invoices')).status).toBe(403)
      expect((await c.get('/api/exports/payments')).status).toBe(403)
    }
    expect((await new ApiClient().get('/api/exports/invoices')).status).toBe(401)
    expect((await (await signedIn(DEMO.admin)).get('/api/exports/payments')).status).toBe(200)
  })

  it('answers 400 naming the field for a bad date or a range the wrong way round', async () => {
    const bad = await office.get('/api/exports/invoices?from=2025-13-01&to=28-02-2025')
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.data.fields).sort()).toEqual(['from', 'to'])
    const reversed = await office.get('/api/exports/payments?from=2025-03-01&to=2025-02-01')
    expect(reversed.status).toBe(400)
    expect(reversed.body.data.fields.from).toMatch(/on or before/)
  })
})
