import { randomUUID } from 'node:crypto'
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedIn } from '../support/api'
import { closeTestPool, testPool } from '../support/db'
import { BASE_URL, DEMO } from '../support/env'
import { clearMail, waitForMail } from '../support/mail'
import { IDS } from '../support/sync'

// Accents and a ligature-prone name: the bundled font must print them as written.
const NAME = 'Évora Frête & Søn Haulage'
const customerId = randomUUID()
const otherId = randomUUID()
const made = { calls: [] as string[], invoices: [] as string[] }

/** An invoice due `daysAgo` local days ago (negative: not yet due), in the business's zone. */
async function invoice(customer: string, totalCents: number, daysAgo: number, paid?: { cents: number, method: string, ref: string }) {
  const db = testPool()
  const callId = randomUUID(), invoiceId = randomUUID()
  made.calls.push(callId)
  made.invoices.push(invoiceId)
  await db.query(`INSERT INTO calls (id, status, customer_id, unit_id, location_text, complaint, po_number)
    VALUES ($1, 'invoiced', $2, $3, 'Statement test yard', 'Statement test', 'PO-4471')`, [callId, customer, IDS.unit])
  const r = await db.query(`INSERT INTO invoices (id, call_id, customer_id, status, subtotal_cents, tax_cents, total_cents, sent_at, due_at)
    VALUES ($1, $2, $3, 'sent', $4, 0, $4, now() - interval '60 days',
      ((((now() AT TIME ZONE 'America/Chicago')::date - $5::int) + time '12:00') AT TIME ZONE 'America/Chicago'))
    RETURNING number`, [invoiceId, callId, customer, totalCents, daysAgo])
  if (paid) {
    await db.query(`INSERT INTO payments (invoice_id, method, amount_cents, status, reference, received_on)
      VALUES ($1, $2, $3, 'recorded', $4, (now() AT TIME ZONE 'America/Chicago')::date - 3)`,
    [invoiceId, paid.method, paid.cents, paid.ref])
    // What server/utils/payments.ts keeps on the invoice when money comes in.
    const status = paid.cents >= totalCents ? 'paid' : 'sent'
    await db.query('UPDATE invoices SET paid_cents = $2, status = $3 WHERE id = $1', [invoiceId, paid.cents, status])
  }
  return r.rows[0].number as number
}

async function pdfText(bytes: Buffer) {
  const pdf = await getDocument({ data: new Uint8Array(bytes), isEvalSupported: false, useSystemFonts: false }).promise
  const pages: string[] = []
  for (let i = 1; i <= pdf.numPages; i++) {
    const content = await (await pdf.getPage(i)).getTextContent()
    pages.push(content.items.map(it => ('str' in it ? it.str : '')).join(''))
  }
  return pages.join('\n')
}

let office: ApiClient
const numbers: Record<string, number> = {}
beforeAll(async () => {
  office = await signedIn(DEMO.office)
  const db = testPool()
  const zone = await db.query('SELECT time_zone FROM rates ORDER BY effective_from DESC LIMIT 1')
  expect(zone.rows[0].time_zone).toBe('America/Chicago')
  await db.query(`INSERT INTO customers (id, name, billing_terms, net_days, billing_email)
    VALUES ($1, $2, 'account', 30, 'ap@evora-frete.example'), ($3, 'Other Fleet Statement Co', 'account', 30, NULL)`,
  [customerId, NAME, otherId])
  numbers.late = await invoice(customerId, 10_000, 40, { cents: 3_000, method: 'check', ref: 'CHK 5521' })
  numbers.notDue = await invoice(customerId, 25_000, -5)
  numbers.paid = await invoice(customerId, 5_000, 10, { cents: 5_000, method: 'bank_transfer', ref: 'TRF-889' })
  numbers.other = await invoice(otherId, 7_700, 3)
})

afterAll(async () => {
  const db = testPool()
  await db.query('DELETE FROM payments WHERE invoice_id = ANY($1)', [made.invoices])
  await db.query('DELETE FROM invoices WHERE id = ANY($1)', [made.invoices])
  await db.query('DELETE FROM calls WHERE id = ANY($1)', [made.calls])
  await db.query('DELETE FROM mail_log WHERE related_id = ANY($1)', [[customerId, otherId]])
  await db.query('DELETE FROM customers WHERE id = ANY($1)', [[customerId, otherId]])
  await closeTestPool()
})

describe('the statement PDF', () => {
  it('lists the customer\'s open invoices, their payments and the balance by days past due', async () => {
    const r = await fetch(`${BASE_URL}/api/billing/statements/${customerId}/pdf`, { headers: { cookie: office.cookie } })
    expect(r.status).toBe(200)
    expect(r.headers.get('content-type')).toBe('application/pdf')
    expect(r.headers.get('content-disposition')).toMatch(/statement-evora-frete-s-n-haulage-\d{4}-\d{2}-\d{2}\.pdf/)
    const text = await pdfText(Buffer.from(await r.arrayBuffer()))
    expect(text).toContain('Statement of account')
    expect(text).toContain(NAME)
    expect(text).toContain('ap@evora-frete.example')
    expect(text).toContain('net 30 days')
    // Open: W-late ($100.00 less $30.00 by check = $70.00, 40 days late) and W-notDue ($250.00, not yet due).
    expect(text).toContain(`W-${numbers.late}`)
    expect(text).toContain(`W-${numbers.notDue}`)
    expect(text).toMatch(/ 40\s*\$100\.00\s*\$30\.00\s*\$70\.00/)
    // Paid in full, and another customer's: not on this statement as open invoices.
    expect(text).not.toContain(`W-${numbers.other}`)
    // Balance owed: 70.00 + 250.00 = 320.00; buckets: 250.00 not yet due, 70.00 in 31–60 days.
    expect(text).toMatch(/Balance owed\s*\$320\.00/)
    expect(text).toMatch(/Owed in all\s*\$250\.00\s*\$0\.00\s*\$70\.00\s*\$0\.00\s*\$0\.00\s*\$320\.00/)
    expect(text).toMatch(/Days late\s*Total\s*Paid, credited\s*Balance/)
    // Money received lately: the check against W-late and the transfer that paid W-paid.
    expect(text).toContain('CHK 5521')
    expect(text).toContain('TRF-889')
    expect(text).toContain(`W-${numbers.paid}`)
    expect(text).toContain('$30.00')
    expect(text).toContain('$50.00')
  })

  it('answers 404 for an unknown customer, 400 naming the id for a bad one, 403 to mechanics and dispatchers', async () => {
    expect((await office.request('GET', `/api/billing/statements/${randomUUID()}/pdf`)).status).toBe(404)
    const bad = await office.get('/api/billing/statements/not-an-id/pdf')
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.data.fields)).toEqual(['id'])
    for (const email of [DEMO.mech1, DEMO.dispatcher]) {
      const c = await signedIn(email)
      expect((await c.request('GET', `/api/billing/statements/${customerId}/pdf`)).status).toBe(403)
      expect((await c.post(`/api/billing/statements/${customerId}/send`, {})).status).toBe(403)
    }
    expect((await new ApiClient().request('GET', `/api/billing/statements/${customerId}/pdf`)).status).toBe(401)
  })
})

describe('sending the statement', () => {
  it('queues the e-mail and answers at once; the job sends it once with the PDF attached', async () => {
    await clearMail()
    const r = await office.post(`/api/billing/statements/${customerId}/send`, {})
    expect(r.status).toBe(202)
    expect(r.body.to).toBe('ap@evora-frete.example')
    const got = await waitForMail(m => m.to.includes('ap@evora-frete.example'), 15_000)
    expect(got).toHaveLength(1)
    expect(got[0]!.subject).toMatch(/^Statement of account from .+, as of \d{4}-\d{2}-\d{2}$/)
    expect(got[0]!.text).toContain('2 open invoices')
    expect(got[0]!.text).toContain('$320.00 in all, $70.00 of it past due')
    expect(got[0]!.attachments.map(a => [a.contentType, a.filename.startsWith('statement-evora-frete-s-n-haulage-')]))
      .toEqual([['application/pdf', true]])
    // The catcher has the message a moment before the job writes down that it went.
    const logged = async () => (await testPool().query(
      `SELECT kind, status, related_type FROM mail_log WHERE related_id = $1`, [customerId])).rows
    await expect.poll(logged, { timeout: 10_000 }).toEqual([{ kind: 'statement', status: 'sent', related_type: 'customer' }])
  })

  it('sends to another address when given one, and names the field when there is none (422) or it is bad (400)', async () => {
    // No address at all: a rule of the record (422), named like a field.
    const none = await office.post(`/api/billing/statements/${otherId}/send`, {})
    expect(none.status).toBe(422)
    expect(none.body.data.fields.to).toMatch(/no billing e-mail/)
    const bad = await office.post(`/api/billing/statements/${otherId}/send`, { to: 'not an address' })
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.data.fields)).toEqual(['to'])
    const extra = await office.post(`/api/billing/statements/${otherId}/send`, { to: 'ap@other.example', cc: 'x@y.example' })
    expect(extra.status).toBe(400)
    const ok = await office.post(`/api/billing/statements/${otherId}/send`, { to: 'ap@other.example' })
    expect(ok.status).toBe(202)
    expect(await waitForMail(m => m.to.includes('ap@other.example'), 15_000)).toHaveLength(1)
  })
})
