import { createHash, randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedIn } from '../support/api'
import { closeTestPool, count, testPool } from '../support/db'
import { BASE_URL, DEMO } from '../support/env'
import { waitForMail } from '../support/mail'

const anonymous = new ApiClient()
let dispatcher: Awaited<ReturnType<typeof signedIn>>
let mech: Awaited<ReturnType<typeof signedIn>>
let callId: string
let callNumber: number
let mechName: string
let truckAt: { lat: number, lon: number }
const PHONE = '612-555-0199'
const EMAIL = 'driver.kowalczyk@ironwood-freight.test'
// What must never reach the fleet's page: money, contact details, places, other calls.
const EMAIL_RE = /[\w.+-]+@[\w-]+\.[a-z]{2,}/i
const PHONE_RE = /\b\d{3}[\s.-]\d{4}\b/
const MONEY_RE = /\$\s?\d|cents/i

/** The token at the end of a status link. */
const tokenOf = (url: string) => url.split('/s/')[1]!
/** The 404 answer without the echoed address, which is the only part allowed to differ. */
const failure = async (token: string) => {
  const r = await anonymous.get(`/api/share/${encodeURIComponent(token)}`)
  // The request id names this request for the logs; everything else must be the same for every failure.
  const { url: _url, requestId, ...rest } = (r.body ?? {}) as Record<string, unknown>
  expect(requestId).toEqual(expect.any(String))
  return { status: r.status, body: rest }
}

beforeAll(async () => {
  dispatcher = await signedIn(DEMO.dispatcher)
  mech = await signedIn(DEMO.mech1)
  const db = testPool()
  const { rows: [c] } = await db.query(`SELECT id FROM customers WHERE name = 'Ironwood Freight Lines'`)
  const { rows: [m] } = await db.query(`UPDATE users SET last_position_at = now() - interval '1 minute' WHERE email = $1
    RETURNING id, name, last_lat AS lat, last_lon AS lon`, [DEMO.mech1])
  mechName = m.name
  truckAt = { lat: m.lat + 0.5, lon: m.lon }
  const unitId = randomUUID()
  await db.query(`INSERT INTO units (id, customer_id, unit_number, year_make_model) VALUES ($1, $2, $3, '2019 road tractor')`,
    [unitId, c.id, `SL-${unitId.slice(0, 6)}`])
  callId = randomUUID()
  const { rows: [call] } = await db.query(`INSERT INTO calls (id, status, customer_id, unit_id, location_text, lat, lon, complaint,
      mechanic_id, caller_name, caller_phone, po_number, auth_limit_cents, assigned_at, en_route_at)
    VALUES ($1, 'en_route', $2, $3, 'Route 8 at mile 12', $7, $8, $4, $5, 'Dale', $6, 'IFL-9911', 180000,
      now() - interval '20 minutes', now() - interval '10 minutes') RETURNING number`,
  [callId, c.id, unitId, `No power; call the driver at ${PHONE}`, m.id, PHONE, truckAt.lat, truckAt.lon])
  callNumber = call.number
  await db.query(`INSERT INTO part_lines (call_id, part_number, description, quantity, unit_price_cents)
    VALUES ($1, 'ALT-24', 'Alternator', 1, 41299)`, [callId])
  await db.query(`INSERT INTO notes (call_id, text) VALUES ($1, $2)`, [callId, `Fleet wants the bill at ${EMAIL}`])
})
afterAll(closeTestPool)

describe('the fleet status link', () => {
  it('is refused to a mechanic and without a session; bad ids and bad addresses are 4xx naming the field', async () => {
    expect((await mech.post(`/api/calls/${callId}/share`)).status).toBe(403)
    expect((await mech.request('DELETE', `/api/calls/${callId}/share`)).status).toBe(403)
    expect((await mech.get(`/api/calls/${callId}/share`)).status).toBe(403)
    expect((await anonymous.post(`/api/calls/${callId}/share`)).status).toBe(401)
    const bad = await dispatcher.post('/api/calls/not-a-uuid/share')
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields.id).toBeTruthy()
    expect((await dispatcher.post(`/api/calls/${randomUUID()}/share`)).status).toBe(404)
    const addr = await dispatcher.post(`/api/calls/${callId}/share`, { sendTo: 'not an address' })
    expect(addr.status).toBe(400)
    expect(addr.body.data.fields.sendTo).toMatch(/e-mail address/)
    expect(await count('links', 'subject_id = $1', [callId])).toBe(0)
  })

  it('opens without a session: status, first name and a rough arrival; no prices, contacts, places or other calls', async () => {
    const made = await dispatcher.post(`/api/calls/${callId}/share`)
    expect(made.status).toBe(200)
    expect(made.body.url).toMatch(new RegExp(`^${BASE_URL}/s/[\\w-]{43}$`))
    // 32 random bytes in base64url: 43 characters, 256 bits (at least 128 asked).
    const token = tokenOf(made.body.url)
    expect(Buffer.from(token, 'base64url')).toHaveLength(32)
    // The seeded rates keep the default lifetime of 14 days.
    const days = (new Date(made.body.expiresAt).getTime() - Date.now()) / 86_400_000
    expect(days).toBeGreaterThan(13.99)
    expect(days).toBeLessThan(14.01)
    // Only the SHA-256 of the token is stored (FIPS 180-4), never the token.
    const { rows } = await testPool().query(`SELECT token_hash, row_to_json(links)::text AS everything FROM links WHERE subject_id = $1`,
      [callId])
    expect(rows).toHaveLength(1)
    expect(rows[0].token_hash).toBe(createHash('sha256').update(token).digest('hex'))
    expect(rows[0].everything).not.toContain(token)

    const seen = await anonymous.get(`/api/share/${token}`)
    expect(seen.status).toBe(200)
    expect(seen.headers.get('cache-control')).toBe('no-store')
    const v = seen.body
    expect(v.callNumber).toBe(callNumber)
    expect(v.status).toBe('en_route')
    expect(v.statusWords).toBe('The mechanic is driving out')
    expect(v.unit.number).toMatch(/^SL-/)
    expect(v.mechanicFirstName).toBe(mechName.split(' ')[0])
    // 0.5° of latitude on a sphere of R = 6371 km is 55.597 km (haversine, REFERENCES.md); × the seeded road factor 1.30
    // = 72.28 km at the seeded 70 km/h = 61.95 min → 62, rounded up to the next 10 minutes: 70.
    expect(v.arrival).toMatchObject({ minutes: 70, words: 'about 1 hour 10 minutes' })
    expect(v.work).toBeNull()
    const json = JSON.stringify(v)
    for (const re of [EMAIL_RE, PHONE_RE, MONEY_RE]) expect(json).not.toMatch(re)
    const secrets = ['412.99', '41299', '1,800', '180000', 'IFL-9911', 'Route 8', String(truckAt.lat), String(truckAt.lon), 'Dale']
    secrets.push(mechName)
    for (const s of secrets) expect(json).not.toContain(s)
    expect(json).not.toMatch(/lat|lon|price|cents|email|phone|customer/i)

    // The page a person opens, rendered on the server, carries the same and nothing more.
    const page = await fetch(`${BASE_URL}/s/${token}`)
    expect(page.status).toBe(200)
    const html = await page.text()
    expect(html).toContain('The mechanic is driving out')
    expect(html).toContain(v.arrival.words)
    for (const re of [EMAIL_RE, PHONE_RE]) expect(html).not.toMatch(re)
    for (const s of [EMAIL, PHONE, '412.99', '1,800.00', 'IFL-9911', 'Route 8 at mile 12', mechName]) expect(html).not.toContain(s)
  })

  it('shows the work once completed, with contact details in the story removed', async () => {
    const db = testPool()
    await db.query(`UPDATE calls SET status = 'on_site', on_site_at = now() WHERE id = $1`, [callId])
    await db.query(`UPDATE calls SET status = 'completed', outcome = 'repaired', completed_at = now(), story_complaint = 'No power.',
      story_cause = $2, story_correction = 'Replaced the alternator; 14.1 V under load.', verification = $3 WHERE id = $1`,
    [callId, `Alternator output 12.2 V at 1500 rpm; told the driver (${PHONE}, ${EMAIL}).`,
      JSON.stringify({ codesCleared: true, lampsOff: true, passed: true, testDriveKm: 12, testDriveMinutes: 15 })])
    await db.query(`INSERT INTO fault_codes (call_id, code, state, cleared_at) VALUES ($1, 'P0118', 'stored', now())`, [callId])
    const token = tokenOf((await dispatcher.post(`/api/calls/${callId}/share`)).body.url)
    const v = (await anonymous.get(`/api/share/${token}`)).body
    expect(v.status).toBe('completed')
    expect(v.arrival).toBeNull()
    expect(v.work.outcome).toBe('Repaired at the roadside')
    expect(v.work.story.cause).toBe('Alternator output 12.2 V at 1500 rpm; told the driver ([removed], [removed]).')
    expect(v.work.story.correction).toContain('14.1 V')
    expect(v.work.faultCodes[0]).toMatchObject({ code: 'P0118', cleared: true })
    expect(v.work.faultCodes[0].meaning).toMatch(/coolant/i)
    expect(v.work.verification.passed).toBe(true)
    expect(v.steps.map((s: { status: string }) => s.status)).toEqual(['received', 'assigned', 'en_route', 'on_site', 'completed'])
    const json = JSON.stringify(v)
    for (const re of [EMAIL_RE, PHONE_RE, MONEY_RE]) expect(json).not.toMatch(re)
  })

  it('answers the same 404 when tampered, expired, revoked or the call is paid', async () => {
    const token = tokenOf((await dispatcher.post(`/api/calls/${callId}/share`)).body.url)
    expect((await anonymous.get(`/api/share/${token}`)).status).toBe(200)
    const unknown = await failure('A'.repeat(43))
    expect(unknown.status).toBe(404)
    // One character changed, at the start and at the end.
    const flip = (t: string, i: number) => t.slice(0, i) + (t[i] === 'A' ? 'B' : 'A') + t.slice(i + 1)
    expect(await failure(flip(token, 0))).toEqual(unknown)
    expect(await failure(flip(token, 42))).toEqual(unknown)
    expect(await failure(token.slice(0, 42))).toEqual(unknown)
    expect(await failure(`${token}x`)).toEqual(unknown)
    expect(await failure('../../calls')).toEqual(unknown)
    expect((await fetch(`${BASE_URL}/s/${flip(token, 5)}`)).status).toBe(404)

    // Expired: its expiry set in the past.
    await testPool().query(`UPDATE links SET expires_at = now() - interval '1 second' WHERE token_hash = $1`,
      [createHash('sha256').update(token).digest('hex')])
    expect(await failure(token)).toEqual(unknown)

    // Revoked: every live link of the call stops at once, and the timeline says so.
    const again = tokenOf((await dispatcher.post(`/api/calls/${callId}/share`)).body.url)
    expect((await anonymous.get(`/api/share/${again}`)).status).toBe(200)
    expect((await dispatcher.get(`/api/calls/${callId}/share`)).body.live).toBeTruthy()
    const off = await dispatcher.request('DELETE', `/api/calls/${callId}/share`)
    expect(off.status).toBe(200)
    expect(off.body.revoked).toBeGreaterThanOrEqual(1)
    expect(await failure(again)).toEqual(unknown)
    expect((await dispatcher.get(`/api/calls/${callId}/share`)).body.live).toBeNull()
    expect(await count('call_events', `call_id = $1 AND kind = 'status_link_revoked'`, [callId])).toBe(1)

    // Paid: the link closes with the call.
    const last = tokenOf((await dispatcher.post(`/api/calls/${callId}/share`)).body.url)
    await testPool().query(`UPDATE calls SET status = 'paid', paid_at = now() WHERE id = $1`, [callId])
    expect(await failure(last)).toEqual(unknown)
    const refused = await dispatcher.post(`/api/calls/${callId}/share`)
    expect(refused.status).toBe(422)
    expect(refused.body.data.fields.status).toBeTruthy()
    await testPool().query(`UPDATE calls SET status = 'completed', paid_at = null WHERE id = $1`, [callId])
  })

  it('e-mails the link to the fleet through the mail queue and notes it on the timeline', async () => {
    const to = `ops-${callNumber}@ironwood-freight.test`
    const r = await dispatcher.post(`/api/calls/${callId}/share`, { sendTo: to })
    expect(r.status).toBe(200)
    const [mail] = await waitForMail(m => m.to.includes(to), 10_000)
    expect(mail?.subject).toContain(`#${callNumber}`)
    expect(mail?.text).toContain(r.body.url)
    expect((await anonymous.get(`/api/share/${tokenOf(r.body.url)}`)).status).toBe(200)
    expect(await count('mail_log', `related_id = $1 AND kind = 'status_link'`, [callId])).toBe(1)
    expect(await count('call_events', `call_id = $1 AND kind = 'status_link_sent' AND note LIKE $2`, [callId, `%${to}%`])).toBe(1)
  })
})
