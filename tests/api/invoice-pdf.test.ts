import { createHash, randomUUID } from 'node:crypto'
import { getDocument, OPS } from 'pdfjs-dist/legacy/build/pdf.mjs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/api'
import { closeTestPool, testPool } from '../support/db'
import { BASE_URL, DEMO } from '../support/env'
import { png } from '../support/png'

/** Each page's text, as pdf.js reads it back, and how many images each page paints. */
async function readPdf(bytes: Buffer) {
  const pdf = await getDocument({ data: new Uint8Array(bytes), isEvalSupported: false, useSystemFonts: false }).promise
  const pages: { text: string, images: number }[] = []
  for (let i = 1; i <= pdf.numPages; i++) {
    const page = await pdf.getPage(i)
    const content = await page.getTextContent()
    const ops = await page.getOperatorList()
    pages.push({
      text: content.items.map(it => ('str' in it ? it.str : '')).join(''),
      images: ops.fnArray.filter(f => f === OPS.paintImageXObject).length,
    })
  }
  return pages
}

let office: Awaited<ReturnType<typeof signedIn>>
beforeAll(async () => {
  office = await signedIn(DEMO.office)
})
afterAll(closeTestPool)

describe('the invoice PDF', () => {
  it('prints every character of the record, flows long invoices over pages with the header, and shows marked photos', async () => {
    const db = testPool()
    const { rows: [c] } = await db.query(`SELECT id FROM customers WHERE name = 'Ironwood Freight Lines'`)
    const { rows: [truck] } = await db.query(`SELECT id FROM service_trucks WHERE name = 'Truck 11'`)
    const { rows: [mech] } = await db.query(`SELECT id, name FROM users WHERE email = $1`, [DEMO.mech1])
    const unitId = randomUUID()
    await db.query(`INSERT INTO units (id, customer_id, unit_number, odometer, odometer_unit) VALUES ($1, $2, $3, 412345, 'km')`,
      [unitId, c.id, `PDF-${unitId.slice(0, 6)}`])
    const callId = randomUUID()
    const cause = 'Coolant sensor read 1.2 kΩ at 84 °C (spec 1.1 ± 0.1 kΩ); pulse 350 µs. Driver Łukasz Nováček, Gómez yard.'
    await db.query(`INSERT INTO calls (id, status, outcome, customer_id, unit_id, location_text, lat, lon, complaint, mechanic_id,
      service_truck_id, po_number,
      story_complaint, story_cause, story_correction, completed_at)
      VALUES ($1, 'completed', 'repaired', $2, $3, 'Route 8 at mile 12', 45.408, -93.012, 'Gauge reads cold', $4, $5, 'IFL-7781',
      'Gauge reads cold.', $6, 'Replaced the sensor; 84 °C at operating temperature.',
        '2026-03-10T17:00:00Z')`, [callId, c.id, unitId, mech.id, truck.id, cause])
    await db.query(`INSERT INTO clock_events (call_id, kind, device_at)
      VALUES ($1, 'work_start', '2026-03-10T15:00:00Z'), ($1, 'work_stop', '2026-03-10T16:30:00Z')`, [callId])
    for (let i = 0; i < 70; i++) {
      await db.query(`INSERT INTO part_lines (call_id, part_number, description, quantity, unit_price_cents)
        VALUES ($1, $2, 'Hose clamp, stainless', 1, 250)`, [callId, `HC-${i}`])
    }
    const photoId = randomUUID()
    await db.query(`INSERT INTO photos (id, call_id, caption) VALUES ($1, $2, 'Connector after cleaning')`, [photoId, callId])
    const bytes = png(64, 48, [230, 120, 20])
    const put = await office.request('PUT', `/api/photos/${photoId}`, {
      body: bytes, headers: { 'content-type': 'image/png', 'x-content-sha256': createHash('sha256').update(bytes).digest('hex') },
    })
    expect(put.status).toBe(200)
    const inv = (await office.post('/api/invoices', { callId })).body

    // Marking a photo for the customer: the office's; bad input named.
    expect((await (await signedIn(DEMO.mech1)).patch(`/api/photos/${photoId}`, { showCustomer: true })).status).toBe(403)
    expect((await office.patch(`/api/photos/${photoId}`, { showCustomer: 'yes' })).body.data.fields.showCustomer).toBeTruthy()
    expect((await office.patch(`/api/photos/${randomUUID()}`, { showCustomer: true })).status).toBe(404)
    expect((await office.patch(`/api/photos/${photoId}`, { showCustomer: true })).body).toEqual({ id: photoId, showCustomer: true })

    const res = await fetch(`${BASE_URL}/api/invoices/${inv.id}/pdf`, { headers: { cookie: office.cookie } })
    expect(res.headers.get('content-type')).toBe('application/pdf')
    const pages = await readPdf(Buffer.from(await res.arrayBuffer()))
    const all = pages.map(p => p.text).join('\n')
    // 70 part lines do not fit on one letter page: the lines flow on, each page with the header.
    expect(pages.length).toBeGreaterThanOrEqual(2)
    for (const [i, p] of pages.entries()) {
      expect(p.text, `page ${i + 1}`).toContain(`Invoice W-${inv.number}`)
      expect(p.text, `page ${i + 1}`).toContain('Two Rivers Road Service')
      expect(p.text, `page ${i + 1}`).toContain(`page ${i + 1} of ${pages.length}`)
    }
    expect(pages[1]!.text).toContain('Description')
    // The story as written, every character of it. The micro sign and Greek mu share one glyph, so
    // the text read back may name either: compare in Unicode's NFKC form (µ U+00B5 → μ U+03BC).
    const nfkc = all.normalize('NFKC')
    for (const s of ['1.2 kΩ at 84 °C', '1.1 ± 0.1 kΩ', '350 µs', 'Łukasz Nováček', 'Gómez']) expect(nfkc).toContain(s.normalize('NFKC'))
    // What a payables desk matches by; the business's phone and remit-to address (seeded rates).
    for (const s of ['Date of service: 2026-03-10', `Mechanic: ${mech.name}`, 'Odometer: 412,345 km', 'PO: IFL-7781',
      'Phone 555-0100', 'Remit to: Two Rivers Road Service, 14 Quarry Spur']) {
      expect(all).toContain(s)
    }
    for (let i = 0; i < 70; i++) expect(all).toContain(`HC-${i} Hose clamp`)
    // The marked photo is painted, with its caption.
    expect(pages.reduce((n, p) => n + p.images, 0)).toBe(1)
    expect(all).toContain('Connector after cleaning')
  })

  it('lists payments, refunds and credit notes under the totals, each with its date, and what is still due', async () => {
    const db = testPool()
    const { rows: [c] } = await db.query(`SELECT id FROM customers WHERE name = 'Ironwood Freight Lines'`)
    const { rows: [mech] } = await db.query(`SELECT id FROM users WHERE email = $1`, [DEMO.mech1])
    const callId = randomUUID()
    await db.query(`INSERT INTO calls (id, status, outcome, customer_id, location_text, lat, lon, complaint, mechanic_id, completed_at)
      VALUES ($1, 'completed', 'repaired', $2, 'Yard 3', 45.408, -93.012, 'Air leak', $3, '2026-03-10T17:00:00Z')`, [callId, c.id, mech.id])
    await db.query(`INSERT INTO clock_events (call_id, kind, device_at) VALUES ($1, 'work_start', '2026-03-10T15:00:00Z'),
      ($1, 'work_stop', '2026-03-10T16:00:00Z')`, [callId])
    const inv = (await office.post('/api/invoices', { callId })).body
    await db.query(`UPDATE invoices SET status = 'sent', sent_at = now() WHERE id = $1`, [inv.id])
    const key = () => ({ 'idempotency-key': randomUUID() })
    const check = await office.request('POST', `/api/invoices/${inv.id}/pay`, { json: { method: 'check', amountCents: 5000,
      reference: 'CK 2207', receivedOn: '2026-03-12' }, headers: key() })
    expect(check.status).toBe(200)
    const note = await office.request('POST', `/api/invoices/${inv.id}/credit-notes`, { json: { reason: 'Travel billed twice',
      lines: [{ description: 'Travel, second leg', amountCents: 1000, taxable: false }] }, headers: key() })
    expect(note.status).toBe(201)
    const refund = await office.request('POST', `/api/invoices/${inv.id}/refunds`, { json: { paymentId: check.body.payments[0].id,
      amountCents: 700, reason: 'Cash back at the counter' }, headers: key() })
    expect(refund.status).toBe(200)
    const cn = note.body.creditNotes[0]

    const res = await fetch(`${BASE_URL}/api/invoices/${inv.id}/pdf`, { headers: { cookie: office.cookie } })
    const all = (await readPdf(Buffer.from(await res.arrayBuffer()))).map(p => p.text).join('\n')
    expect(all).toContain('Payments and credits')
    expect(all).toContain('Paid by check CK 2207, 2026-03-12')
    expect(all).toContain(`Credit note CN-${cn.number}`)
    expect(all).toContain('Travel billed twice')
    expect(all).toContain('Cash back at the counter')
    // Worked by hand: total − 50.00 (check) − 10.00 (credit) + 7.00 (refunded) is what is still due.
    const due = inv.totalCents - 5000 - 1000 + 700
    const usd = (cents: number) => new Intl.NumberFormat('en-US', { style: 'currency', currency: 'USD' }).format(cents / 100)
    expect(all).toMatch(new RegExp(`Balance due\\s*${usd(due).replace(/[$.]/g, '\\$&')}`))
    expect(all).toContain(`-${usd(5000)}`)
  })
})
