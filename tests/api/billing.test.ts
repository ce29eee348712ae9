import { randomUUID } from 'node:crypto'
import Stripe from 'stripe'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedIn } from '../support/api'
import { count, closeTestPool, testPool } from '../support/db'
import { BASE_URL, DEMO } from '../support/env'
import { caughtMail, clearMail, recoverMail, stallMail, waitForMail } from '../support/mail'

// Each test bills a call of its own making, so no other test's seeded calls are touched.
type TestPart = { pn: string, qty: number, price: number, core: number }
type CallOpts = { laborMin: number, workFrom?: number, parts?: TestPart[] }
async function finishedCall(customerName: string, opts: CallOpts) {
  const db = testPool()
  const { rows: [c] } = await db.query('SELECT id FROM customers WHERE name = $1', [customerName])
  const { rows: [truck] } = await db.query(`SELECT id FROM service_trucks WHERE name = 'Truck 11'`)
  const { rows: [mech] } = await db.query(`SELECT id FROM users WHERE email = $1`, [DEMO.mech1])
  const id = randomUUID()
  // 45.498, -93.012 is the north yard; this point is about 10 km due south of it.
  await db.query(`INSERT INTO calls (id, status, outcome, customer_id, location_text, lat, lon, complaint, `
    + `mechanic_id, service_truck_id, completed_at)
    VALUES ($1, 'completed', 'repaired', $2, 'Test location', 45.408, -93.012, 'Test complaint', $3, $4,
      now())`, [id, c.id, mech.id, truck.id])
  // Tuesday 2026-03-10 10:00 in Chicago (CDT, UTC−5): inside the seeded hours, 07:00–18:00 Monday to Friday.
  const t0 = opts.workFrom ?? Date.parse('2026-03-10T15:00:00Z')
  await db.query(`INSERT INTO clock_events (call_id, kind, device_at) VALUES ($1, 'work_start', $2), ($1, 'work_stop', $3)`,
    [id, new Date(t0), new Date(t0 + opts.laborMin * 60_000)])
  for (const p of opts.parts ?? []) {
    await db.query(
      `INSERT INTO part_lines (call_id, part_number, description, quantity, unit_price_cents, core_charge_cents) `
      + `VALUES ($1, $2, 'Test part', $3, $4, $5)`,
      [id, p.pn, p.qty, p.price, p.core],
    )
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
    expect(mail[0]!.attachments).toEqual([expect.objectContaining({ contentType: 'application/pdf',
      filename: `invoice-W-${inv.number}.pdf` })])
    expect((await caughtMail()).length).toBe(1)
    const link = (await office.get(`/api/invoices/${inv.id}/pay-link`)).body.url as string
    expect(mail[0]!.text).toContain(`by card on our payment page: ${link}`)
  })
})

const SECRET = process.env.NUXT_STRIPE_WEBHOOK_SECRET ?? 'whsec_wayside_local'
const signer = new Stripe('sk_test_x')
/** Delivers a payment-service event to the webhook, signed with `secret`. */
async function deliver(event: object, secret = SECRET) {
  const payload = JSON.stringify(event)
  const header = signer.webhooks.generateTestHeaderString({ payload, secret })
  const res = await fetch(`${BASE_URL}/api/payments/webhook`, { method: 'POST', headers: { 'content-type': 'application/json',
    'stripe-signature': header }, body: payload })
  return { status: res.status, body: await res.json().catch(() => null) }
}
function sessionCompleted(invoiceId: string, amount: number, opts: { currency?: string, pi?: string, evt?: string } = {}) {
  const pi = opts.pi ?? `pi_${randomUUID().replace(/-/g, '')}`
  return {
    id: opts.evt ?? `evt_${randomUUID().replace(/-/g, '')}`, object: 'event', type: 'checkout.session.completed',
    created: Math.floor(Date.now() / 1000),
    data: { object: { id: `cs_${pi.slice(3)}`, object: 'checkout.session', amount_total: amount, currency: opts.currency ?? 'usd',
      payment_status: 'paid', status: 'complete', payment_intent: pi, metadata: { invoiceId } } },
  }
}
async function sentInvoice(customer: string, laborMin = 60) {
  const callId = await finishedCall(customer, { laborMin })
  const inv = (await office.post('/api/invoices', { callId })).body
  await testPool().query(`UPDATE invoices SET status = 'sent', sent_at = now() WHERE id = $1`, [inv.id])
  return { ...inv, callId }
}
const payWith = (id: string, body: object, key: string) => office.request('POST', `/api/invoices/${id}/pay`, { json: body,
  headers: { 'idempotency-key': key } })

describe('one payment per intent', () => {
  it('twenty parallel "Post to account" clicks with their own keys post once; the others hear it is paid', async () => {
    const inv = await sentInvoice('Lakeline Municipal Fleet')
    const answers = await Promise.all(Array.from({ length: 20 }, () => payWith(inv.id, { method: 'account' }, randomUUID())))
    const ok = answers.filter(a => a.status === 200)
    expect(ok).toHaveLength(1)
    const refused = answers.filter(a => a.status === 409)
    expect(refused).toHaveLength(19)
    for (const r of refused) expect(r.body.message).toMatch(new RegExp(`W-${inv.number} is already paid`))
    expect(await count('payments', 'invoice_id = $1', [inv.id])).toBe(1)
    expect(await count('account_entries', 'invoice_id = $1', [inv.id])).toBe(1)
    expect(ok[0]!.body).toMatchObject({ status: 'paid', paidCents: inv.totalCents, money: { state: 'paid', balanceCents: 0 } })
    expect(await count('call_events', 'call_id = $1 AND to_status = \'paid\'', [inv.callId])).toBe(1)
  })

  it('the same key twenty times at once answers twenty times with the one payment', async () => {
    const inv = await sentInvoice('Lakeline Municipal Fleet')
    const key = randomUUID()
    const answers = await Promise.all(Array.from({ length: 20 }, () => payWith(inv.id, { method: 'account' }, key)))
    expect(answers.map(a => a.status)).toEqual(Array(20).fill(200))
    expect(new Set(answers.map(a => a.body.payment.paymentId)).size).toBe(1)
    expect(answers.filter(a => !a.body.payment.replayed)).toHaveLength(1)
    expect(await count('payments', 'invoice_id = $1', [inv.id])).toBe(1)
    // The same key for another request is refused, naming the key.
    const other = await sentInvoice('Lakeline Municipal Fleet')
    const misuse = await payWith(other.id, { method: 'account' }, key)
    expect(misuse.status).toBe(422)
    expect(misuse.body.data.fields.idempotencyKey).toMatch(/already used/)
    expect(await count('payments', 'invoice_id = $1', [other.id])).toBe(0)
  })

  it('asks for the key, and records checks in part, once per check number, never past the balance', async () => {
    const inv = await sentInvoice('Ironwood Freight Lines')
    const noKey = await office.post(`/api/invoices/${inv.id}/pay`, { method: 'check', amountCents: 1000, reference: '1001' })
    expect(noKey.status).toBe(400)
    expect(noKey.body.data.fields.idempotencyKey).toBeTruthy()
    const noRef = await payWith(inv.id, { method: 'check', amountCents: 1000 }, randomUUID())
    expect(noRef.status).toBe(400)
    expect(noRef.body.data.fields.reference).toMatch(/check number/)
    const tooMuch = await payWith(inv.id, { method: 'cash', amountCents: inv.totalCents + 1 }, randomUUID())
    expect(tooMuch.status).toBe(422)
    expect(tooMuch.body.data.fields.amountCents).toMatch(/balance/)

    const part = await payWith(inv.id, { method: 'check', amountCents: 5000, reference: 'CK 1001', receivedOn: '2026-03-02' }, randomUUID())
    expect(part.status).toBe(200)
    expect(part.body).toMatchObject({ status: 'sent', paidCents: 5000, money: { state: 'partly_paid', word: 'Partly paid',
      balanceCents: inv.totalCents - 5000 } })
    const again = await payWith(inv.id, { method: 'check', amountCents: 5000, reference: 'ck 1001' }, randomUUID())
    expect(again.status).toBe(409)
    expect(again.body.data.fields.reference).toMatch(/already recorded/)
    const rest = await payWith(inv.id, { method: 'bank_transfer', amountCents: inv.totalCents - 5000, reference: 'ACH 88-213' },
      randomUUID())
    expect(rest.body).toMatchObject({ status: 'paid', money: { state: 'paid', balanceCents: 0 } })
    expect(await count('payments', 'invoice_id = $1', [inv.id])).toBe(2)
    // An account post on a card customer's invoice is refused by rule.
    const card = await sentInvoice('Bluestem Aggregate Co.')
    expect((await payWith(card.id, { method: 'account' }, randomUUID())).status).toBe(422)
  })
})

describe('the payment service\'s webhook', () => {
  it('a short payment is partly paid with its balance, never paid; the rest settles it', async () => {
    const inv = await sentInvoice('Bluestem Aggregate Co.')
    const short = await deliver(sessionCompleted(inv.id, 50))
    expect(short).toMatchObject({ status: 200, body: { outcome: 'partly paid' } })
    const after = (await office.get(`/api/invoices/${inv.id}`)).body
    expect(after).toMatchObject({ status: 'sent', paidCents: 50, money: { state: 'partly_paid', balanceCents: inv.totalCents - 50 } })
    expect((await testPool().query('SELECT status FROM calls WHERE id = $1', [inv.callId])).rows[0].status).toBe('invoiced')
    const rest = await deliver(sessionCompleted(inv.id, inv.totalCents - 50))
    expect(rest.body.outcome).toBe('paid')
    expect((await office.get(`/api/invoices/${inv.id}`)).body).toMatchObject({ status: 'paid', money: { state: 'paid', balanceCents: 0 } })
  })

  it('parallel and repeated deliveries of one card completion record one payment', async () => {
    const inv = await sentInvoice('Bluestem Aggregate Co.')
    const event = sessionCompleted(inv.id, inv.totalCents)
    // The same event delivered ten times at once, and the same payment under other event ids.
    const sameEvent = Array.from({ length: 10 }, () => deliver(event))
    const sameMoney = Array.from({ length: 5 }, () => deliver(sessionCompleted(inv.id, inv.totalCents,
      { pi: event.data.object.payment_intent })))
    const answers = await Promise.all([...sameEvent, ...sameMoney])
    expect(answers.every(a => a.status === 200)).toBe(true)
    expect(answers.filter(a => a.body.outcome === 'paid')).toHaveLength(1)
    expect(await count('payments', 'invoice_id = $1', [inv.id])).toBe(1)
    expect(await count('call_events', 'call_id = $1 AND to_status = \'paid\'', [inv.callId])).toBe(1)
  })

  it('a forged signature answers 400 and changes nothing', async () => {
    const inv = await sentInvoice('Bluestem Aggregate Co.')
    const before = (await office.get(`/api/invoices/${inv.id}`)).body
    const forged = await deliver(sessionCompleted(inv.id, inv.totalCents), 'whsec_not_ours')
    expect(forged.status).toBe(400)
    const bare = await fetch(`${BASE_URL}/api/payments/webhook`, { method: 'POST', headers: { 'content-type': 'application/json',
      'stripe-signature': 't=1,v1=bad' }, body: JSON.stringify(sessionCompleted(inv.id, inv.totalCents)) })
    expect(bare.status).toBe(400)
    expect(await count('payments', 'invoice_id = $1', [inv.id])).toBe(0)
    expect(await count('payment_events', 'invoice_id = $1', [inv.id])).toBe(0)
    const after = (await office.get(`/api/invoices/${inv.id}`)).body
    expect(after).toMatchObject({ status: before.status, version: before.version, paidCents: 0 })
  })

  it('a payment in another currency is held, not counted', async () => {
    const inv = await sentInvoice('Bluestem Aggregate Co.')
    const r = await deliver(sessionCompleted(inv.id, inv.totalCents, { currency: 'eur' }))
    expect(r.body.outcome).toBe('held: wrong currency')
    const after = (await office.get(`/api/invoices/${inv.id}`)).body
    expect(after).toMatchObject({ status: 'sent', paidCents: 0, money: { state: 'unpaid' } })
    expect(after.payments[0]).toMatchObject({ status: 'held', currency: 'eur' })
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
    const noReason = await office.post(`/api/invoices/${inv.id}/adjustments`, { action: 'change', key: 'labor',
      changes: { quantity: 1.2 } })
    expect(noReason.status).toBe(400)
    expect(noReason.body.data.fields.reason).toBeTruthy()
    const r = await office.post(`/api/invoices/${inv.id}/adjustments`, { action: 'change', key: 'labor', changes: { quantity: 1.2 },
      reason: 'Waited 12 min for the yard gate' })
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
      action: 'add', reason: 'Two steer tires disposed of', line: { kind: 'fee', description: 'Tire disposal', quantity: 2,
        unitCents: 400, taxable: true },
    })
    const tire = added.body.lines.find((l: any) => l.description === 'Tire disposal')
    expect(tire).toMatchObject({ amountCents: 800, source: { office: true } })
    const road = await office.post(`/api/invoices/${inv.id}/adjustments`, { action: 'road', distance: 31.5,
      reason: 'Trip meter, out and back' })
    // 31.5 km by road × $2.25 = $70.875 → $70.88
    expect(road.body.lines.find((l: any) => l.key === 'travel')).toMatchObject({ quantity: 31.5, amountCents: 7088,
      description: expect.stringMatching(/by road/) })
    const removed = await office.post(`/api/invoices/${inv.id}/adjustments`, { action: 'remove', key: 'env-fee',
      reason: 'No fluids on this call' })
    expect(removed.body.lines.some((l: any) => l.key === 'env-fee')).toBe(false)
    expect(removed.body.adjustments.map((a: any) => a.action)).toEqual(['change', 'add', 'road', 'remove'])
    expect(await count('invoice_adjustments', 'invoice_id = $1', [inv.id])).toBe(4)

    const missing = await office.post(`/api/invoices/${inv.id}/adjustments`, { action: 'remove', key: 'env-fee', reason: 'Again' })
    expect(missing.status).toBe(422)
    expect(missing.body.data.fields.key).toBeTruthy()
    const dispatcher = await signedIn(DEMO.dispatcher)
    expect((await dispatcher.post(`/api/invoices/${inv.id}/adjustments`, { action: 'remove', key: 'labor',
      reason: 'x x x' })).status).toBe(403)
    // Once sent, the invoice is no longer the office's to change.
    await office.post(`/api/invoices/${inv.id}/send`)
    const late = await office.post(`/api/invoices/${inv.id}/adjustments`, { action: 'remove', key: 'labor', reason: 'Too late' })
    expect(late.status).toBe(422)
    expect(late.body.data.fields.status).toBeTruthy()
    expect(await count('invoice_adjustments', 'invoice_id = $1', [inv.id])).toBe(4)
  })
})

// The server flags clock events a phone's clock could not be trusted on (clock_events.flag).
describe('clock times the phone could not be trusted on', () => {
  it('are neither billed nor a 500: the draft leaves them out and says so', async () => {
    const callId = await finishedCall('Prairie Cold Haul', { laborMin: 60 })
    // A second work span the server flagged as being in the future: five hours that must not be billed.
    await testPool().query(`INSERT INTO clock_events (call_id, kind, device_at, flag)
      VALUES ($1, 'work_start', '2026-03-10T17:00:00Z', 'future'),
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
    await testPool().query(`UPDATE calls SET po_number = 'IFL-1', story_cause = 'Worn belt', story_correction = 'New belt',
      auth_limit_cents = NULL WHERE id = $1`, [callId])
    await testPool().query(`INSERT INTO sign_offs (call_id, driver_name, signature)
      VALUES ($1, 'Test Driver', 'data:image/png;base64,AAAA')`, [callId])
    const again = (await office.get('/api/billing/desk')).body.items.find((i: any) => i.callId === callId)
    expect(again.flags).toEqual([])
    expect((await (await signedIn(DEMO.dispatcher)).get('/api/billing/desk')).status).toBe(403)
  })
})

describe('rates', () => {
  it('refuses a tax rate over 30 % and a zone nobody knows, naming the field and saving nothing', async () => {
    const admin = await signedIn(DEMO.admin)
    const { body: { rates } } = await admin.get('/api/rates')
    expect(rates).toMatchObject({ timeZone: 'America/Chicago', roadFactorPct: 130, partsTaxable: true,
      businessName: 'Two Rivers Road Service' })
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
    const r = await payWith(inv.id, { method: 'account' }, randomUUID())
    expect(r.status).toBe(200)
    expect(r.body.status).toBe('paid')
    expect(await count('account_entries', 'invoice_id = $1', [inv.id])).toBe(1)
    expect((await testPool().query('SELECT status FROM calls WHERE id = $1', [callId])).rows[0].status).toBe('paid')
    expect((await payWith(inv.id, { method: 'account' }, randomUUID())).status).toBe(409)
  })

  it('refuses a webhook whose signature does not match', async () => {
    const res = await fetch(`${BASE_URL}/api/payments/webhook`, { method: 'POST', headers: { 'content-type': 'application/json',
      'stripe-signature': 't=1,v1=bad' }, body: '{"type":"payment_intent.succeeded"}' })
    expect(res.status).toBe(400)
  })
})

describe('the hosted payment page', () => {
  const anon = new ApiClient()
  const tokenOf = (url: string) => url.split('/pay/')[1]!

  it('the payer pays on the payment service\'s page; its webhook marks the invoice paid once', async () => {
    const inv = await sentInvoice('Bluestem Aggregate Co.')
    const mech1 = await signedIn(DEMO.mech1)
    const roadside = (await mech1.get(`/api/payments/link?callId=${inv.callId}`)).body
    expect(roadside).toMatchObject({ state: 'due', invoiceNumber: inv.number, amountDueCents: inv.totalCents })
    expect(Object.keys(roadside).sort()).toEqual(['amountDueCents', 'invoiceNumber', 'state', 'url'])
    expect((await (await signedIn(DEMO.mech2)).get(`/api/payments/link?callId=${inv.callId}`)).status).toBe(404)
    const url = roadside.url as string
    expect(url).toBe((await office.get(`/api/invoices/${inv.id}/pay-link`)).body.url)

    const page = await anon.get(`/api/payments/public/${tokenOf(url)}`)
    expect(page.body).toMatchObject({ invoiceNumber: inv.number, balanceCents: inv.totalCents, payable: true, state: 'unpaid' })
    const first = await anon.post(`/api/payments/public/${tokenOf(url)}/checkout`)
    expect(first.status).toBe(200)
    const hosted = first.body.url as string
    expect(hosted).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/checkout\/cs_test_/)
    // Asked again, the same open page comes back: one page at a time takes money for an invoice.
    expect((await anon.post(`/api/payments/public/${tokenOf(url)}/checkout`)).body.url).toBe(hosted)
    const html = await (await fetch(hosted)).text()
    expect(html).toContain(`Pay ${(inv.totalCents / 100).toFixed(2)} USD`)
    // No field asks for a card: the only choice is the fake's approve or decline.
    expect(html.match(/<input[^>]*>/g)?.every(i => i.includes('name="outcome"'))).toBe(true)

    const declined = await fetch(hosted, { method: 'POST', body: new URLSearchParams({ outcome: 'decline' }), redirect: 'manual' })
    expect(await declined.text()).toContain('declined')
    expect(await count('payments', 'invoice_id = $1', [inv.id])).toBe(0)

    // The payer presses Pay ten times at once: one completion, one webhook, one payment.
    const presses = await Promise.all(Array.from({ length: 10 }, () => fetch(hosted, { method: 'POST',
      body: new URLSearchParams({ outcome: 'approve' }), redirect: 'manual' })))
    const redirects = presses.filter(r => r.status === 303)
    expect(redirects).toHaveLength(1)
    expect(redirects[0]!.headers.get('location')).toBe(`${url}?done=1`)
    const end = Date.now() + 10_000
    while (Date.now() < end && (await office.get(`/api/invoices/${inv.id}`)).body.status !== 'paid') await new Promise(r => setTimeout(r,
      200))
    const paid = (await office.get(`/api/invoices/${inv.id}`)).body
    expect(paid).toMatchObject({ status: 'paid', paidCents: inv.totalCents, money: { state: 'paid' } })
    expect(paid.payments).toHaveLength(1)
    expect(paid.payments[0]).toMatchObject({ method: 'card', status: 'succeeded', amountCents: inv.totalCents })
    expect(await count('checkout_sessions', 'invoice_id = $1 AND status = \'complete\'', [inv.id])).toBe(1)
    expect((await anon.get(`/api/payments/public/${tokenOf(url)}`)).body).toMatchObject({ state: 'paid', payable: false })
    expect((await anon.post(`/api/payments/public/${tokenOf(url)}/checkout`)).status).toBe(409)
    expect((await mech1.get(`/api/payments/link?callId=${inv.callId}`)).body).toEqual({ state: 'paid', invoiceNumber: inv.number })
  })

  it('has no link for a draft, tells account customers apart, and knows no made-up token', async () => {
    const callId = await finishedCall('Bluestem Aggregate Co.', { laborMin: 30 })
    await office.post('/api/invoices', { callId })
    const mech1 = await signedIn(DEMO.mech1)
    expect((await mech1.get(`/api/payments/link?callId=${callId}`)).body).toEqual({ state: 'not_ready' })
    const acct = await sentInvoice('Ironwood Freight Lines')
    expect((await mech1.get(`/api/payments/link?callId=${acct.callId}`)).body).toEqual({ state: 'account' })
    expect((await mech1.get('/api/payments/link?callId=nope')).status).toBe(400)
    expect((await anon.get('/api/payments/public/AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA')).status).toBe(404)
    expect((await anon.get('/api/payments/public/x')).status).toBe(400)
  })
})

/** Pays the whole balance as a payer would: the link, the hosted page, Pay; waits for the webhook. */
async function payOnHostedPage(invoiceId: string) {
  const url = (await office.get(`/api/invoices/${invoiceId}/pay-link`)).body.url as string
  const hosted = (await new ApiClient().post(`/api/payments/public/${url.split('/pay/')[1]}/checkout`)).body.url as string
  await fetch(hosted, { method: 'POST', body: new URLSearchParams({ outcome: 'approve' }), redirect: 'manual' })
  const end = Date.now() + 10_000
  while (Date.now() < end && (await office.get(`/api/invoices/${invoiceId}`)).body.status !== 'paid') await new Promise(r => setTimeout(r,
    200))
}

describe('refunds and credit notes', () => {
  it('a credit note corrects a sent invoice with its own number and negative lines; the overpayment goes back to the card', async () => {
    const inv = await sentInvoice('Bluestem Aggregate Co.')
    await payOnHostedPage(inv.id)
    const paid = (await office.get(`/api/invoices/${inv.id}`)).body
    expect(paid.status).toBe('paid')
    const note = { reason: 'Travel billed twice', lines: [{ description: 'Travel, second leg', amountCents: 2000, taxable: false }] }
    const key = randomUUID()
    const r = await office.request('POST', `/api/invoices/${inv.id}/credit-notes`, { json: note, headers: { 'idempotency-key': key } })
    expect(r.status).toBe(201)
    const cn = r.body.creditNotes[0]
    expect(cn).toMatchObject({ reason: 'Travel billed twice', subtotalCents: -2000, taxCents: 0, totalCents: -2000 })
    expect(cn.lines[0]).toMatchObject({ amountCents: -2000, taxable: false })
    expect(r.body).toMatchObject({ creditedCents: 2000, money: { state: 'overpaid', balanceCents: -2000 } })
    // The same click again makes no second note.
    expect((await office.request('POST', `/api/invoices/${inv.id}/credit-notes`, { json: note,
      headers: { 'idempotency-key': key } })).status).toBe(200)
    expect(await count('credit_notes', 'invoice_id = $1', [inv.id])).toBe(1)
    const pdf = await fetch(`${BASE_URL}/api/credit-notes/${cn.id}/pdf`, { headers: { cookie: office.cookie } })
    expect(pdf.headers.get('content-type')).toBe('application/pdf')
    expect(Buffer.from(await pdf.arrayBuffer()).subarray(0, 5).toString()).toBe('%PDF-')

    const payment = r.body.payments[0]
    const tooMuch = await office.request('POST', `/api/invoices/${inv.id}/refunds`, { json: { paymentId: payment.id,
      amountCents: inv.totalCents + 1, reason: 'Overcharged' }, headers: { 'idempotency-key': randomUUID() } })
    expect(tooMuch.status).toBe(422)
    expect(tooMuch.body.data.fields.amountCents).toBeTruthy()
    const refund = await office.request('POST', `/api/invoices/${inv.id}/refunds`, { json: { paymentId: payment.id, amountCents: 2000,
      reason: 'Travel billed twice' }, headers: { 'idempotency-key': randomUUID() } })
    expect(refund.status).toBe(200)
    expect(refund.body).toMatchObject({ status: 'paid', paidCents: inv.totalCents - 2000, money: { state: 'paid', balanceCents: 0 } })
    expect(refund.body.payments[0].refunds[0]).toMatchObject({ amountCents: 2000, providerRef: expect.stringMatching(/^re_/) })
  })

  it('refuses a credit note on a draft, or for more than the invoice, naming the field', async () => {
    const callId = await finishedCall('Bluestem Aggregate Co.', { laborMin: 30 })
    const draft = (await office.post('/api/invoices', { callId })).body
    const note = { reason: 'Wrong price', lines: [{ description: 'Labor', amountCents: 100, taxable: false }] }
    const onDraft = await office.request('POST', `/api/invoices/${draft.id}/credit-notes`, { json: note,
      headers: { 'idempotency-key': randomUUID() } })
    expect(onDraft.status).toBe(422)
    expect(onDraft.body.data.fields.status).toMatch(/draft/)
    const inv = await sentInvoice('Bluestem Aggregate Co.')
    const big = { reason: 'Wrong price', lines: [{ description: 'Everything', amountCents: inv.totalCents + 100, taxable: false }] }
    const over = await office.request('POST', `/api/invoices/${inv.id}/credit-notes`, { json: big,
      headers: { 'idempotency-key': randomUUID() } })
    expect(over.status).toBe(422)
    expect(over.body.data.fields.lines).toMatch(/at most/)
    const bad = await office.request('POST', `/api/invoices/${inv.id}/credit-notes`, { json: { reason: 'x', lines: [] },
      headers: { 'idempotency-key': randomUUID() } })
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.data.fields).sort()).toEqual(['lines', 'reason'])
    expect(await count('credit_notes', 'invoice_id = ANY($1)', [[draft.id, inv.id]])).toBe(0)
  })
})

describe('mail as durable jobs', () => {
  async function mailRow(relatedId: string) {
    return (await testPool().query('SELECT * FROM mail_log WHERE related_id = $1 ORDER BY queued_at DESC LIMIT 1', [relatedId])).rows[0]
  }
  async function until<T>(read: () => Promise<T>, ok: (v: T) => boolean, ms = 60_000) {
    const end = Date.now() + ms
    let v = await read()
    while (!ok(v) && Date.now() < end) {
      await new Promise(r => setTimeout(r, 250))
      v = await read()
    }
    return v
  }

  it('a stalled mail server never holds a request; the message shows why it waits and goes once, when the server recovers', async () => {
    const callId = await finishedCall('Ironwood Freight Lines', { laborMin: 30 })
    const inv = (await office.post('/api/invoices', { callId })).body
    await clearMail()
    await stallMail()
    try {
      const sent = await office.post(`/api/invoices/${inv.id}/send`)
      // Answered while the mail server still says nothing: the request never waited on it.
      expect(sent.status).toBe(200)
      expect(sent.body).toMatchObject({ status: 'sent', mail: { id: expect.any(String) } })
      expect((await mailRow(inv.id)).status).not.toBe('sent')
      const waiting = await until(() => mailRow(inv.id), m => m.status === 'retrying')
      expect(waiting.status).toBe('retrying')
      expect(waiting.error).toMatch(/did not answer in time/)
      const shown = (await office.get(`/api/mail?relatedId=${inv.id}`)).body.items[0]
      expect(shown).toMatchObject({ kind: 'invoice', status: 'retrying', canSendAgain: true, error: expect.stringMatching(/in time/) })
      // Send again while retries wait, three times at once: still one message in the end.
      const again = await Promise.all([1, 2, 3].map(() => office.post(`/api/mail/${shown.id}/send-again`)))
      expect(again.every(a => a.status === 200 || a.status === 422)).toBe(true)
    }
    finally {
      await recoverMail()
    }
    const got = await waitForMail(m => m.subject.includes(`W-${inv.number}`), 60_000)
    expect(got).toHaveLength(1)
    expect(got[0]!.attachments).toEqual([expect.objectContaining({ contentType: 'application/pdf' })])
    const done = await until(() => mailRow(inv.id), m => m.status === 'sent')
    expect(done).toMatchObject({ status: 'sent', error: null })
    expect(done.attempts).toBeGreaterThanOrEqual(2)
    // Jobs still waiting for that message find it sent and send nothing more.
    await new Promise(r => setTimeout(r, 4000))
    expect((await caughtMail()).filter(m => m.subject.includes(`W-${inv.number}`))).toHaveLength(1)
    expect((await office.post(`/api/mail/${done.id}/send-again`)).status).toBe(422)
  })

  it('a dispatcher\'s assignment answers at once while the mail server hangs, and the mechanic gets one e-mail after', async () => {
    const dispatcher = await signedIn(DEMO.dispatcher)
    const { rows: [c] } = await testPool().query(`SELECT id FROM customers WHERE name = 'Bluestem Aggregate Co.'`)
    const { rows: [mech2] } = await testPool().query('SELECT id FROM users WHERE email = $1', [DEMO.mech2])
    const call = (await dispatcher.post('/api/calls', { customerId: c.id, locationText: 'Quarry road, mile 3',
      complaint: 'Air leak at the trailer' })).body
    expect(call.number).toBeTruthy()
    await clearMail()
    await stallMail()
    try {
      const r = await dispatcher.post(`/api/calls/${call.id}/assign`, { mechanicId: mech2.id })
      expect(r.status).toBe(200)
      expect(r.body.mail).toEqual({ queued: true })
      expect((await dispatcher.get(`/api/mail?relatedId=${call.id}`)).body.items[0]).toMatchObject({ kind: 'call_assigned' })
      expect((await dispatcher.get(`/api/mail?relatedId=${call.id}`)).body.items[0].status).not.toBe('sent')
    }
    finally {
      await recoverMail()
    }
    expect(await waitForMail(m => m.subject.includes(`#${call.number}`), 60_000)).toHaveLength(1)
  })

  it('shows invoice mail to the office only, and refuses bad ids', async () => {
    const dispatcher = await signedIn(DEMO.dispatcher)
    const { rows: [m] } = await testPool().query(`SELECT related_id FROM mail_log WHERE related_type = 'invoice' LIMIT 1`)
    expect((await dispatcher.get(`/api/mail?relatedId=${m.related_id}`)).status).toBe(403)
    expect((await (await signedIn(DEMO.mech1)).get(`/api/mail?relatedId=${m.related_id}`)).status).toBe(403)
    expect((await office.get('/api/mail?relatedId=nope')).status).toBe(400)
    expect((await office.post('/api/mail/nope/send-again')).status).toBe(400)
  })
})
