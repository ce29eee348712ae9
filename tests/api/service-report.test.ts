import { execFileSync } from 'node:child_process'
import { createHash, randomUUID } from 'node:crypto'
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedIn } from '../support/api'
import { closeTestPool, count, testPool } from '../support/db'
import { BASE_URL, DEMO } from '../support/env'
import { waitForMail } from '../support/mail'
import { png } from '../support/png'

/**
 * The text of a PDF as poppler's pdftotext reads it (the extractor the billing browser test uses), in
 * Unicode's NFKC form (Ω OHM SIGN U+2126 and GREEK CAPITAL OMEGA U+03A9 compare equal) with each run of
 * white space (the formatter's no-break spaces, the layout's line breaks) as one space.
 */
function pdfText(bytes: Buffer) {
  const file = join(mkdtempSync(join(tmpdir(), 'wayside-report-')), 'report.pdf')
  writeFileSync(file, bytes)
  return execFileSync('pdftotext', ['-layout', file, '-']).toString().normalize('NFKC').replace(/\s+/g, ' ')
}
/** Whether `text` carries `want`, read the same way. */
const has = (text: string, want: string) => text.includes(want.normalize('NFKC').replace(/\s+/g, ' '))

let office: Awaited<ReturnType<typeof signedIn>>
let dispatcher: Awaited<ReturnType<typeof signedIn>>
let callId: string
let callNumber: number
const CAUSE = 'Coolant sensor read 118 Ω at 12 °C (spec 209.4 Ω ± 2 %); connector pins green.'

beforeAll(async () => {
  office = await signedIn(DEMO.office)
  dispatcher = await signedIn(DEMO.dispatcher)
  const db = testPool()
  const { rows: [c] } = await db.query(`SELECT id FROM customers WHERE name = 'Ironwood Freight Lines'`)
  const { rows: [mech] } = await db.query(`SELECT id FROM users WHERE email = $1`, [DEMO.mech1])
  const { rows: [card] } = await db.query(`SELECT id, title, current_version FROM test_cards ORDER BY slug LIMIT 1`)
  const unitId = randomUUID()
  await db.query(`INSERT INTO units (id, customer_id, unit_number, vin, odometer, odometer_unit) VALUES ($1, $2, $3, NULL, 512300, 'km')`,
    [unitId, c.id, `SR-${unitId.slice(0, 6)}`])
  callId = randomUUID()
  const verification = JSON.stringify({ codesCleared: true, lampsOff: true, passed: true, testDriveKm: 12, testDriveMinutes: 15 })
  const { rows: [call] } = await db.query(`INSERT INTO calls (id, status, outcome, customer_id, unit_id, location_text, complaint,
      mechanic_id, story_complaint, story_cause, story_correction, verification, assigned_at, en_route_at, on_site_at, completed_at)
    VALUES ($1, 'completed', 'repaired', $2, $3, 'Route 8 at mile 12', 'Gauge reads cold', $4,
      'Gauge reads cold, check-engine lamp on.', $5,
      'Replaced the coolant temperature sensor; reads 84 °C warm.', $6, now() - interval '3 hours', now() - interval '170 minutes',
      now() - interval '2 hours', now() - interval '1 hour') RETURNING number`,
  [callId, c.id, unitId, mech.id, CAUSE, verification])
  callNumber = call.number
  await db.query(`INSERT INTO fault_codes (call_id, code, state, cleared_at) VALUES ($1, 'P0118', 'stored', now())`, [callId])
  const runId = randomUUID()
  await db.query(`INSERT INTO test_runs (id, call_id, card_id, card_version, conclusion, finished_at)
    VALUES ($1, $2, $3, $4, 'Replace the sensor', now())`,
  [runId, callId, card.id, card.current_version])
  // IEC 60751 scaled to 200 Ω: a Pt200 at 12 °C reads 209.363 Ω; ± 2 % is 205.18–213.55 Ω, so 118 Ω is low.
  await db.query(`INSERT INTO readings (call_id, test_run_id, label, quantity, value, unit, component, spec, verdict) VALUES
    ($1, $2, 'Sensor resistance', 'resistance', 118, 'ohm', 'Coolant temperature sensor', $3, 'low'),
    ($1, NULL, 'Battery at rest', 'voltage', 12.66, 'V', 'Batteries', $4, 'pass')`,
  [callId, runId, JSON.stringify({ nominal: 209.363, tolerancePct: 2 }), JSON.stringify({ min: 12.4, max: 12.9 })])
  await db.query(`INSERT INTO part_lines (call_id, part_number, description, quantity, unit_price_cents)
    VALUES ($1, 'CTS-9', 'Sensor', 1, 41299)`,
  [callId])
  // The seed's kind of drawn signature: an SVG path.
  const svg = Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 200 60"><path d="M10 40c20-30 40 30 60 0" stroke="#000"/></svg>')
  await db.query(`INSERT INTO sign_offs (call_id, driver_name, signature) VALUES ($1, 'Łukasz Nováček', $2)`,
    [callId, `data:image/svg+xml;base64,${svg.toString('base64')}`])
  const photoId = randomUUID()
  await db.query(`INSERT INTO photos (id, call_id, caption) VALUES ($1, $2, 'Green pins on the old sensor')`, [photoId, callId])
  const bytes = png(64, 48, [40, 160, 60])
  const put = await office.request('PUT', `/api/photos/${photoId}`, {
    body: bytes, headers: { 'content-type': 'image/png', 'x-content-sha256': createHash('sha256').update(bytes).digest('hex') },
  })
  expect(put.status).toBe(200)
  expect((await office.patch(`/api/photos/${photoId}`, { showCustomer: true })).status).toBe(200)
})
afterAll(closeTestPool)

describe('the service report', () => {
  it('prints the story, codes with meanings, readings with spec and verdict, tests, checks, photo and sign-off; no prices', async () => {
    const res = await fetch(`${BASE_URL}/api/calls/${callId}/report.pdf`, { headers: { cookie: dispatcher.cookie } })
    expect(res.status).toBe(200)
    expect(res.headers.get('content-type')).toBe('application/pdf')
    const flat = pdfText(Buffer.from(await res.arrayBuffer()))
    expect(has(flat, `road call #${callNumber}`), `road call #${callNumber}`).toBe(true)
    expect(has(flat, CAUSE), CAUSE).toBe(true)
    expect(has(flat, '118 Ω'), '118 Ω').toBe(true)
    expect(has(flat, 'reads 84 °C warm'), 'reads 84 °C warm').toBe(true)
    expect(has(flat, 'P0118'), 'P0118').toBe(true)
    expect(has(flat, 'Coolant temperature sensor circuit high'), 'Coolant temperature sensor circuit high').toBe(true)
    // The readings formatter's words for the verdicts (shared/utils/readingFormat.ts).
    expect(flat.normalize('NFKC')).toMatch(/Sensor resistance: 118 Ω — Low/u)
    expect(flat).toMatch(/Battery at rest: 12\.66 V — In spec/)
    expect(has(flat, 'spec 209.4 Ω ± 2 %'), 'spec 209.4 Ω ± 2 %').toBe(true)
    expect(has(flat, 'Replace the sensor'), 'Replace the sensor').toBe(true)
    expect(has(flat, 'Fault codes cleared and not back'), 'Fault codes cleared and not back').toBe(true)
    expect(has(flat, 'Test drive: 12 km, 15 min'), 'Test drive: 12 km, 15 min').toBe(true)
    expect(has(flat, 'Green pins on the old sensor'), 'Green pins on the old sensor').toBe(true)
    expect(has(flat, 'Signed by Łukasz Nováček'), 'Signed by Łukasz Nováček').toBe(true)
    expect(has(flat, 'Odometer: 512,300 km'), 'Odometer: 512,300 km').toBe(true)
    expect(flat).not.toMatch(/\$|412\.99|41299/)
  })

  it('is refused to a mechanic; bad and unknown ids are 4xx', async () => {
    const mech = await signedIn(DEMO.mech1)
    expect((await mech.get(`/api/calls/${callId}/report.pdf`)).status).toBe(403)
    expect((await new ApiClient().get(`/api/calls/${callId}/report.pdf`)).status).toBe(401)
    const bad = await office.get('/api/calls/nope/report.pdf')
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields.id).toBeTruthy()
    expect((await office.get(`/api/calls/${randomUUID()}/report.pdf`)).status).toBe(404)
  })

  it('is sent by the office through the mail queue, with the PDF, and noted on the timeline; refused before the work is done', async () => {
    expect((await dispatcher.post(`/api/calls/${callId}/report`, { to: 'ops@ironwood-freight.test' })).status).toBe(403)
    const bad = await office.post(`/api/calls/${callId}/report`, { to: 'ops at ironwood' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields.to).toMatch(/e-mail address/)
    const { rows: [open] } = await testPool().query(`SELECT id FROM calls WHERE status = 'on_site' LIMIT 1`)
    const early = await office.post(`/api/calls/${open.id}/report`, { to: 'ops@ironwood-freight.test' })
    expect(early.status).toBe(422)
    expect(early.body.data.fields.status).toMatch(/finished/)
    expect(await count('mail_log', `kind = 'service_report' AND related_id = $1`, [open.id])).toBe(0)

    const to = `reports-${callNumber}@ironwood-freight.test`
    const sent = await office.post(`/api/calls/${callId}/report`, { to })
    expect(sent.status).toBe(200)
    const [mail] = await waitForMail(m => m.to.includes(to), 15_000)
    expect(mail?.subject).toContain(`Road call #${callNumber}: service report for unit SR-`)
    const pdf = { filename: `service-report-call-${callNumber}.pdf`, contentType: 'application/pdf' }
    expect(mail?.attachments).toEqual([expect.objectContaining(pdf)])
    expect(await count('call_events', `call_id = $1 AND kind = 'report_sent' AND note LIKE $2`, [callId, `%${to}%`])).toBe(1)
  })

  it('opens through the status link once the work is done, and not before', async () => {
    const anon = new ApiClient()
    const token = (await dispatcher.post(`/api/calls/${callId}/share`)).body.url.split('/s/')[1]
    const view = (await anon.get(`/api/share/${token}`)).body
    expect(view.reportUrl).toBe(`/api/share/${token}/report.pdf`)
    const res = await fetch(`${BASE_URL}${view.reportUrl}`)
    expect(res.status).toBe(200)
    expect(has(pdfText(Buffer.from(await res.arrayBuffer())), CAUSE)).toBe(true)

    const { rows: [open] } = await testPool().query(`SELECT id FROM calls WHERE status = 'on_site' LIMIT 1`)
    const early = (await dispatcher.post(`/api/calls/${open.id}/share`)).body.url.split('/s/')[1]
    expect((await anon.get(`/api/share/${early}`)).body.reportUrl).toBeNull()
    expect((await fetch(`${BASE_URL}/api/share/${early}/report.pdf`)).status).toBe(404)
    const tampered = token.slice(0, -1) + (token.endsWith('A') ? 'B' : 'A')
    expect((await fetch(`${BASE_URL}/api/share/${tampered}/report.pdf`)).status).toBe(404)
  })
})
