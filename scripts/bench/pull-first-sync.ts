// A busy mechanic's first sync: 20,000 past calls (each with notes, readings, clock events and a
// part line) on 400 units, then a new phone pulls page after page as the sync client does. Prints
// the bytes of the whole first sync, its pages and time. Target: under 2 MB.
import { randomUUID } from 'node:crypto'
import pg from 'pg'
import { seedId } from '../../server/db/seed/ids'
import { recordRow } from './support/rows'

const BASE = process.env.WAYSIDE_BENCH_URL ?? process.env.WAYSIDE_TEST_URL ?? 'http://127.0.0.1:3190'
const DB = process.env.NUXT_DATABASE_URL ?? 'postgres://wayside@127.0.0.1:54329/wayside_bench'
const PAST_CALLS = 20_000
const UNITS = 400
const TARGET_BYTES = 2 * 1024 * 1024
const MECH1 = seedId('user:mech1')

const pool = new pg.Pool({ connectionString: DB, max: 2 })

async function signIn() {
  const res = await fetch(`${BASE}/api/auth/login`, {
    method: 'POST', headers: { 'content-type': 'application/json', 'x-wayside': '1' },
    body: JSON.stringify({ email: 'mech1@wayside.test', password: 'wayside-demo' }),
  })
  if (!res.ok) throw new Error(`sign-in failed: ${res.status}`)
  return res.headers.getSetCookie().map(c => c.split(';')[0]).find(c => c.startsWith('nuxt-session='))!
}

/** The career, in bulk: calls spread over the last five years, most recent first per unit. */
async function seedCareer() {
  const unitIds = Array.from({ length: UNITS }, () => randomUUID())
  const customer = seedId('customer:prairie')
  await pool.query(`INSERT INTO units (id, customer_id, unit_number)
    SELECT id, $2, 'BENCH-' || i FROM unnest($1::uuid[]) WITH ORDINALITY AS t(id, i)`, [unitIds, customer])
  const callIds = Array.from({ length: PAST_CALLS }, () => randomUUID())
  await pool.query(`
    INSERT INTO calls (id, status, outcome, customer_id, unit_id, location_text, complaint, mechanic_id, received_at, assigned_at,
      story_complaint, story_cause, story_correction)
    SELECT id, 'paid', 'repaired', $2, ($3::uuid[])[1 + (i % ${UNITS})], 'Customer yard, bay ' || (i % 12),
      'Derate, low power on grade', $4,
      now() - make_interval(days => 40 + (i % 1800)::int), now() - make_interval(days => 40 + (i % 1800)::int),
      'Engine derated on a long grade', 'Coolant temperature sensor open circuit', 'Replaced the sensor, cleared codes, road tested'
    FROM unnest($1::uuid[]) WITH ORDINALITY AS t(id, i)`, [callIds, customer, unitIds, MECH1])
  await pool.query(`INSERT INTO notes (call_id, created_by, text)
    SELECT id, $2, 'Driver reports the lamp came on after the fuel stop; ' || n FROM unnest($1::uuid[]) AS id, generate_series(1, 2) AS n`,
  [callIds, MECH1])
  await pool.query(`INSERT INTO readings (call_id, created_by, label, quantity, value, unit, component, pins, conditions, spec, verdict)
    SELECT id, $2, 'Sensor resistance ' || n, 'resistance', 150 + n, 'ohm', 'Coolant temperature sensor', 'A–B', 'key off',
      '{"min": 100, "max": 160}'::jsonb, 'pass'
    FROM unnest($1::uuid[]) AS id, generate_series(1, 3) AS n`, [callIds, MECH1])
  await pool.query(`INSERT INTO clock_events (call_id, created_by, device_at, kind)
    SELECT c.id, $2, c.received_at + make_interval(mins => 20 * k.n), k.kind::clock_kind
    FROM calls c, (VALUES (1, 'travel_start'), (2, 'arrive'), (3, 'work_start'), (4, 'work_stop')) AS k(n, kind)
    WHERE c.id = ANY($1::uuid[])`, [callIds, MECH1])
  await pool.query(`INSERT INTO part_lines (call_id, created_by, part_number, description, quantity, unit_price_cents)
    SELECT id, $2, 'CTS-100', 'Coolant temperature sensor', 1, 4500 FROM unnest($1::uuid[]) AS id`, [callIds, MECH1])
}

/** A new phone's first sync: page after page while the server says `more`. */
async function firstSync(cookie: string) {
  const clientId = randomUUID()
  let cursor: string | undefined
  let bytes = 0
  let pages = 0
  let calls = 0
  const started = performance.now()
  for (;;) {
    const q = new URLSearchParams({ clientId, ...(cursor ? { cursor } : {}) })
    const res = await fetch(`${BASE}/api/sync/pull?${q}`, { headers: { 'x-wayside': '1', cookie, 'accept-encoding': 'identity' } })
    const text = await res.text()
    if (!res.ok) throw new Error(`pull failed: ${res.status} ${text.slice(0, 300)}`)
    const body = JSON.parse(text) as { cursor: string, more: boolean, changes: { calls: unknown[] } }
    bytes += Buffer.byteLength(text)
    pages++
    calls += body.changes.calls.length
    cursor = body.cursor
    if (!body.more) break
  }
  return { bytes, pages, calls, ms: performance.now() - started }
}

try {
  const seeding = performance.now()
  await seedCareer()
  const { rows: [mine] } = await pool.query('SELECT count(*)::int AS n FROM calls WHERE mechanic_id = $1', [MECH1])
  const secs = ((performance.now() - seeding) / 1000).toFixed(1)
  console.log(`seeded ${PAST_CALLS} past calls on ${UNITS} units in ${secs} s (the mechanic now holds ${mine.n})`)
  const cookie = await signIn()
  const r = await firstSync(cookie)
  const mb = r.bytes / 1024 / 1024
  console.log(`first sync: ${r.bytes} bytes (${mb.toFixed(2)} MB) in ${r.pages} pages, ${r.calls} calls, ${r.ms.toFixed(0)} ms`)
  recordRow({
    name: 'pull-first-sync', value: r.bytes / 1024, unit: 'KB', floor: null, target: `< ${TARGET_BYTES / 1024}`,
    note: `first sync of a mechanic with ${PAST_CALLS} past calls: ${r.pages} pages, ${r.calls} calls, ${r.ms.toFixed(0)} ms`,
  })
}
finally {
  await pool.end()
}
