import { randomUUID } from 'node:crypto'
import Stripe from 'stripe'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedIn } from '../support/api'
import { count, closeTestPool, testPool } from '../support/db'
import { BASE_URL, DEMO } from '../support/env'
import { caughtMail, clearMail, waitForMail } from '../support/mail'

// Each test bills a call of its own making, so no other test's seeded calls are touched.
type CallOpts = { laborMin: number, workFrom?: number, parts?: { pn: string, qty: number, price: number, core: number }[] }
async function finishedCall(customerName: string, opts: CallOpts) {
  const db = testPool()
  const { rows: [c] } = await db.query('SELECT id FROM customers WHERE name = $1', [customerName])
  const { rows: [truck] } = await db.query(`SELECT id FROM service_trucks WHERE name = 'Truck 11'`)
  const { rows: [mech] } = await db.query(`SELECT id FROM users WHERE email = $1`, [DEMO.mech1])
  const id = randomUUID()
  // 45.498, -93.012 is the north yard; this point is about 10 km due south of it.
  await db.query(`INSERT INTO calls (id, status, outcome, customer_id, location_text, lat, lon, complaint, mechanic_id, service_truck_id, completed_at)
    VALUES ($1, 'completed', 'repaired', $2, 'Test location', 45.408, -93.012, 'Test complaint', $3, $4, now())`, [id, c.id, mech.id, truck.id])
  // Tuesday 2026-03-10 10:00 in Chicago (CDT, UTC−5): inside the seeded hours, 07:00–18:00 Monday to Friday.
  const t0 = opts.workFrom ?? Date.parse('2026-03-10T15:00:00Z')
  await db.query(`INSERT INTO clock_events (call_id, kind, device_at) VALUES ($1, 'work_start', $2), ($1, 'work_stop', $3)`,
    [id, new Date(t0), new Date(t0 + opts.laborMin * 60_000)])
  for (const p of opts.parts ?? []) {
    await db.query(`INSERT INTO part_lines (call_id, part_number, description, quantity, unit_price_cents, core_charge_cents) VALUES ($1, $2, 'Test part', $3, $4, $5)`, [id, p.pn, p.qty, p.price, p.core])
  }
  return id
}

let office: Awaited<ReturnType<typeof signedIn>>
beforeAll(async () => { office = await signedIn(DEMO.office) })
afterAll(closeTestPool)

describe('invoices', () => {
  it('drafts an invoice priced from the synced record and closes the call', async () => {
    const callId = await finishedCall('Prairie Cold Haul', { laborMin: 83, parts: [{ pn: 'TR-ALT-24', qty: 1, price: 38900, core: 7500 }] })
    const r = await office.post('/api/invoices', { callId })
    expect(r.status).toBe(201)
    const inv = r.body
    const amount = (key: string) => inv.lines.find((l: any) => l.key === key)?.amountCents
    // Seeded rates: $145/h, tenths rounded up; 83 min inside hours → 1.4 h = $203.00 (common practice: 0.1 h = 6 min)
    expect(amount('labor')).toBe(20300)
    expect(amount('labor:after')).toBeUndefined()
    // Travel: 0.09° of latitude out and back = 2 × 10.0 km (haversine, R = 6371 km), times the road factor 1.3
    // the admin set (common practice) = 26.0 km at $2.25/km = $58.50
    const travel = inv.lines.find((l: any) => l.kind === 'travel')
    expect(travel.quantity).toBeCloseTo(26.0, 1)
    expect(travel.amountCents).toBe(5850)
    // Part $389.00 + 25 % markup = $486.25; core untaxed; environmental fee $6.50; shop supplies 5 % of $203.00 = $10.15
    expect(amount(inv.lines.find((l: any) => l.kind === 'part').key)).toBe(48625)
    expect(amount('env-fee')).toBe(650)
    expect(amount('supplies')).toBe(1015)
    // Tax 7.25 % on parts and fees: (486.25 + 6.50 + 10.15) × 0.0725 = $36.46025 → $36.46
    expect(inv.taxCents).toBe(3646)
    expect(inv.totalCents).toBe(inv.subtotalCents + inv.taxCents)
    expect(inv.subtotalCents).toBe(inv.lines.reduce((s: number, l: any) => s + l.amountCents, 0))
    // Each line names its source: the labor its clock events, the part its part line.
    expect(inv.lines.find((l: any) => l.key === 'labor').source.clockEventIds).toHaveLength(2)
    const { rows: [partLine] } = await testPool().query('SELECT id FROM part_lines WHERE call_id = $1', [callId])
    expect(inv.lines.find((l: any) => l.kind === 'part').source.partLineId).toBe(partLine.id)
    const call = (await testPool().query('SELECT status FROM calls WHERE id = $1', [callId])).rows[0]
    expect(call.status).toBe('invoiced')

    const again = await office.post('/api/invoices', { callId })
    expect(again.status).toBe(422)
    expect(again.body.data.fields.callId).toMatch(/already/)
  })

  it('refuses a call that is not finished, and bad ids, naming the field', async () => {
    const { rows: [open] } = await testPool().query(`SELECT id FROM calls WHERE status = 'received' LIMIT 1`)
    const before = await count('invoices')
    const r = await office.post('/api/invoices', { callId: open.id })
    expect(r.status).toBe(422)
    expect(r.body.data.fields.callId).toBeTruthy()
    const bad = await office.post('/api/invoices', { callId: 'nope' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields.callId).toBeTruthy()
    expect(await count('invoices')).toBe(before)
  })

  it('is the office\'s and the admin\'s alone', async () => {
    for (const email of [DEMO.mech1, DEMO.dispatcher]) {
      const c = await signedIn(email)
      expect((await c.get('/api/invoices')).status, email).toBe(403)
      expect((await c.post('/api/invoices', { callId: randomUUID() })).status, email).toBe(403)
    }
    expect((await new ApiClient().get('/api/invoices')).status).toBe(401)
  })

  it('renders a PDF and e-mails it to the customer\'s billing address', async () => {
    const callId = await finishedCall('Ironwood Freight Lines', { laborMin: 30 })
    const inv = (await office.post('/api/invoices', { callId })).body
    const pdf = await fetch(`${BASE_URL}/api/invoices/${inv.id}/pdf`, { headers: { cookie: office.cookie } })
    expect(pdf.headers.get('content-type')).toBe('application/pdf')
    const bytes = Buffer.from(await pdf.arrayBuffer())
    expect(bytes.subarray(0, 5).toString()).toBe('%PDF-')

    await clearMail()
    const sent = await office.post(`/api/invoices/${inv.id}/send`)
    expect(sent.status).toBe(200)
    expect(sent.body.status).toBe('sent')
    const mail = await waitForMail(m => m.subject.includes(`W-${inv.number}`))
    expect(mail).toHaveLength(1)
    expect(mail[0]!.to).toEqual(['payables@ironwood-freight.test'])
    expect(mail[0]!.attachments).toEqual([expect.objectContaining({ contentType: 'application/pdf', filename: `invoice-W-${inv.number}.pdf` })])
    expect((await caughtMail()).length).toBe(1)
  })
})

describe('after hours', () => {
  it('bills the part of the work after closing time at the after-hours rate', async () => {
    // 17:30–18:30 CDT on Tuesday 2026-03-10: half an hour before the 18:00 close, half after.
    // 0.5 h × $145.00 = $72.50 and 0.5 h × ($145.00 × 150 % = $217.50) = $108.75
    const callId = await finishedCall('Prairie Cold Haul', { laborMin: 60, workFrom: Date.parse('2026-03-10T22:30:00Z') })
    const inv = (await office.post('/api/invoices', { callId })).body
    const labor = inv.lines.filter((l: any) => l.kind === 'labor').map((l: any) => [l.key, l.quantity, l.unitCents, l.amountCents])
    expect(labor).toEqual([['labor', 0.5, 14500, 7250], ['labor:after', 0.5, 21750, 10875]])
  })
})

describe('the office adjusts a draft', () => {
  it('changes a line with a reason, logs who, when, before and after, and reprices what depends on it', async () => {
    const callId = await finishedCall('Prairie Cold Haul', { laborMin: 83 })
    const inv = (await office.post('/api/invoices', { callId })).body
    const noReason = await office.post(`/api/invoices/${inv.id}/adjustments`, { action: 'change', key: 'labor', changes: { quantity: 1.2 } })
    expect(noReason.status).toBe(400)
    expect(noReason.body.data.fields.reason).toBeTruthy()
    const r = await office.post(`/api/invoices/${inv.id}/adjustments`, { action: 'change', key: 'labor', changes: { quantity: 1.2 }, reason: 'Waited 12 min for the yard gate' })
    expect(r.status).toBe(200)
    const line = (key: string) => r.body.lines.find((l: any) => l.key === key)
    // 1.2 h × $145.00 = $174.00; shop supplies follow: 5 % of $174.00 = $8.70
    expect(line('labor').amountCents).toBe(17400)
    expect(line('supplies').amountCents).toBe(870)
    expect(r.body.subtotalCents).toBe(r.body.lines.reduce((s: number, l: any) => s + l.amountCents, 0))
    expect(r.body.adjustments).toHaveLength(1)
    expect(r.body.adjustments[0]).toMatchObject({
      action: 'change', lineKey: 'labor', reason: 'Waited 12 min for the yard gate', by: { name: expect.any(String) },
      before: { quantity: 1.4, amountCents: 20300 }, after: { quantity: 1.2, amountCents: 17400 },
    })
    expect(Date.parse(r.body.adjustments[0].at)).toBeGreaterThan(Date.now() - 60_000)
    // The lines nobody touched keep their sources.
    expect(line('travel').source.rate).toBe('travelCentsPerUnit')

    const added = await office.post(`/api/invoices/${inv.id}/adjustments`, {
      action: 'add', reason: 'Two steer tires disposed of', line: { kind: 'fee', description: 'Tire disposal', quantity: 2, unitCents: 400, taxable: true },
    })
    const tire = added.body.lines.find((l: any) => l.description === 'Tire disposal')
    expect(tire).toMatchObject({ amountCents: 800, source: { office: true } })
    const road = await office.post(`/api/invoices/${inv.id}/adjustments`, { action: 'road', distance: 31.5, reason: 'Trip meter, out and back' })
    // 31.5 km by road × $2.25 = $70.875 → $70.88
    expect(road.body.lines.find((l: any) => l.key === 'travel')).toMatchObject({ quantity: 31.5, amountCents: 7088, description: expect.stringMatching(/by road/) })
    const removed = await office.post(`/api/invoices/${inv.id}/adjustments`, { action: 'remove', key: 'env-fee', reason: 'No fluids on this call' })
    expect(removed.body.lines.some((l: any) => l.key === 'env-fee')).toBe(false)
    expect(removed.body.adjustments.map((a: any) => a.action)).toEqual(['change', 'add', 'road', 'remove'])
    expect(await count('invoice_adjustments', 'invoice_id = $1', [inv.id])).toBe(4)

    const missing = await office.post(`/api/invoices/${inv.id}/adjustments`, { action: 'remove', key: 'env-fee', reason: 'Again' })
    expect(missing.status).toBe(422)
    expect(missing.body.data.fields.key).toBeTruthy()
    const dispatcher = await signedIn(DEMO.dispatcher)
    expect((await dispatcher.post(`/api/invoices/${inv.id}/adjustments`, { action: 'remove', key: 'labor', reason: 'x x x' })).status).toBe(403)
    // Once sent, the invoice is no longer the office's to change.
    await office.post(`/api/invoices/${inv.id}/send`)
    const late = await office.post(`/api/invoices/${inv.id}/adjustments`, { action: 'remove', key: 'labor', reason: 'Too late' })
    expect(late.status).toBe(422)
    expect(late.body.data.fields.status).toBeTruthy()
    expect(await count('invoice_adjustments', 'invoice_id = $1', [inv.id])).toBe(4)
  })
})

// The server flags clock events a phone's clock could not be trusted on (clock_events.flag).
const { rowCount: flagColumn } = await testPool().query(`SELECT 1 FROM information_schema.columns WHERE table_name = 'clock_events' AND column_name = 'flag'`)

describe('clock times the phone could not be trusted on', () => {
  it.skipIf(!flagColumn)('are neither billed nor a 500: the draft leaves them out and says so', async () => {
    const callId = await finishedCall('Prairie Cold Haul', { laborMin: 60 })
    // A second work span the server flagged as being in the future: five hours that must not be billed.
    await testPool().query(`INSERT INTO clock_events (call_id, kind, device_at, flag) VALUES ($1, 'work_start', '2026-03-10T17:00:00Z', 'future'),
      ($1, 'work_stop', '2026-03-10T22:00:00Z', 'future')`, [callId])
    const r = await office.post('/api/invoices', { callId })
    expect(r.status).toBe(201)
    // Only the trusted hour: 1.0 h × $145.00
    expect(r.body.lines.filter((l: any) => l.kind === 'labor').map((l: any) => l.amountCents)).toEqual([14500])
    expect(r.body.excludedClock).toHaveLength(2)
    expect(r.body.flags.map((f: any) => f.code)).toContain('untrusted_clock')
  })
})

describe('the billing desk', () => {
  it('flags what a clerk must see first', async () => {
    const callId = await finishedCall('Ironwood Freight Lines', { laborMin: 60 })
    await testPool().query('UPDATE calls SET auth_limit_cents = 5000 WHERE id = $1', [callId])
    const desk = await office.get('/api/billing/desk')
    expect(desk.status).toBe(200)
    const item = desk.body.items.find((i: any) => i.callId === callId)
    expect(item.estimated).toBe(true)
    expect(item.flags.map((f: any) => f.code).sort()).toEqual(['no_po', 'no_sign_off', 'no_story', 'over_limit'])
    expect(item.flags.find((f: any) => f.code === 'over_limit').text).toMatch(/\$50\.00/)
    await testPool().query(`UPDATE calls SET po_number = 'IFL-1', story_cause = 'Worn belt', story_correction = 'New belt', auth_limit_cents = NULL WHERE id = $1`, [callId])
    await testPool().query(`INSERT INTO sign_offs (call_id, driver_name, signature) VALUES ($1, 'Test Driver', 'data:image/png;base64,AAAA')`, [callId])
    const again = (await office.get('/api/billing/desk')).body.items.find((i: any) => i.callId === callId)
    expect(again.flags).toEqual([])
    expect((await (await signedIn(DEMO.dispatcher)).get('/api/billing/desk')).status).toBe(403)
  })
})

describe('rates', () => {
  it('refuses a tax rate over 30 % and a zone nobody knows, naming the field and saving nothing', async () => {
    const admin = await signedIn(DEMO.admin)
    const { body: { rates } } = await admin.get('/api/rates')
    expect(rates).toMatchObject({ timeZone: 'America/Chicago', roadFactorPct: 130, partsTaxable: true, businessName: 'Two Rivers Road Service' })
    const { id: _i, version: _v, createdAt: _c, updatedAt: _u, effectiveFrom: _e, ...values } = rates
    const before = await count('rates')
    const high = await admin.post('/api/rates', { ...values, taxRateBasisPoints: 3001 })
    expect(high.status).toBe(400)
    expect(high.body.data.fields.taxRateBasisPoints).toMatch(/30 %/)
    const zone = await admin.post('/api/rates', { ...values, timeZone: 'Mars/Olympus_Mons' })
    expect(zone.status).toBe(400)
    expect(zone.body.data.fields.timeZone).toBeTruthy()
    const hours = await admin.post('/api/rates', { ...values, openMinute: 600, closeMinute: 540 })
    expect(hours.body.data.fields.closeMinute).toBeTruthy()
    expect(await count('rates')).toBe(before)
  })
})

describe('payments', () => {
  it('posts an account customer\'s invoice to their account and marks it paid', async () => {
    const callId = await finishedCall('Lakeline Municipal Fleet', { laborMin: 60 })
    const inv = (await office.post('/api/invoices', { callId })).body
    expect(inv.taxCents).toBe(0) // Lakeline is tax-exempt in the seed
    const r = await office.post(`/api/invoices/${inv.id}/pay`, { method: 'account' })
    expect(r.status).toBe(200)
    expect(r.body.status).toBe('paid')
    expect(await count('account_entries', 'invoice_id = $1', [inv.id])).toBe(1)
    expect((await testPool().query('SELECT status FROM calls WHERE id = $1', [callId])).rows[0].status).toBe('paid')
    expect((await office.post(`/api/invoices/${inv.id}/pay`, { method: 'account' })).status).toBe(422)
  })

  it('charges a card through the payment SDK; a declined card says so; the webhook marks paid only once', async () => {
    const callId = await finishedCall('Bluestem Aggregate Co.', { laborMin: 45 })
    const inv = (await office.post('/api/invoices', { callId })).body
    expect((await office.post(`/api/invoices/${inv.id}/pay`, { method: 'account' })).status).toBe(422)
    const missing = await office.post(`/api/invoices/${inv.id}/pay`, { method: 'card' })
    expect(missing.status).toBe(400)
    expect(missing.body.data.fields.paymentMethod).toBeTruthy()
    const declined = await office.post(`/api/invoices/${inv.id}/pay`, { method: 'card', paymentMethod: 'pm_card_chargeDeclined' })
    expect(declined.status).toBe(422)
    expect(declined.body.data.fields.paymentMethod).toMatch(/declined/i)
    expect(await count('payments', 'invoice_id = $1', [inv.id])).toBe(0)

    const ok = await office.post(`/api/invoices/${inv.id}/pay`, { method: 'card', paymentMethod: 'pm_card_visa' })
    expect(ok.status).toBe(200)
    expect(ok.body.status).toBe('paid')
    const ref = ok.body.payments[0].providerRef as string
    // The fake also delivers payment_intent.succeeded to the webhook; replay it twice more, signed.
    const payload = JSON.stringify({ id: 'evt_test', object: 'event', type: 'payment_intent.succeeded', data: { object: { id: ref, object: 'payment_intent', amount: inv.totalCents, metadata: { invoiceId: inv.id } } } })
    const stripe = new Stripe('sk_test_x')
    const secret = process.env.NUXT_STRIPE_WEBHOOK_SECRET ?? 'whsec_wayside_local'
    for (let i = 0; i < 2; i++) {
      const header = stripe.webhooks.generateTestHeaderString({ payload, secret })
      const res = await fetch(`${BASE_URL}/api/payments/webhook`, { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': header }, body: payload })
      expect(res.status).toBe(200)
    }
    await new Promise(r => setTimeout(r, 300))
    expect(await count('payments', 'invoice_id = $1', [inv.id])).toBe(1)
  })

  it('refuses a webhook whose signature does not match', async () => {
    const res = await fetch(`${BASE_URL}/api/payments/webhook`, { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': 't=1,v1=bad' }, body: '{"type":"payment_intent.succeeded"}' })
    expect(res.status).toBe(400)
  })
})
