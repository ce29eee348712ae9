// 10,000 queued readings pushed through POST /api/sync/push in batches of 500 (what a phone does
// after a long day offline), beside the same 10,000 rows in one plain multi-row INSERT through pg.
// Target: the push takes at most 2× the plain insert.
import { randomUUID } from 'node:crypto'
import pg from 'pg'
import { seedId } from '../../server/db/seed/ids'
import { recordRow } from './support/rows'

const BASE = process.env.WAYSIDE_BENCH_URL ?? process.env.WAYSIDE_TEST_URL ?? 'http://127.0.0.1:3190'
const DB = process.env.NUXT_DATABASE_URL ?? 'postgres://wayside@127.0.0.1:54329/wayside_bench'
const TOTAL = 10_000
const BATCH = 500
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

async function newCall() {
  const id = randomUUID()
  await pool.query(
    `INSERT INTO calls (id, status, customer_id, unit_id, location_text, complaint, mechanic_id, assigned_at)
     VALUES ($1, 'on_site', $2, $3, 'Benchmark lot', 'Benchmark: many readings', $4, now())`,
    [id, seedId('customer:prairie'), seedId('unit:7'), MECH1],
  )
  return id
}

const reading = (callId: string, i: number) => ({
  callId, label: `Sensor sweep ${i}`, quantity: 'resistance', value: 100 + (i % 500) / 10, unit: 'ohm',
  component: 'Coolant temperature sensor', pins: 'A–B', conditions: 'key off', spec: { min: 100, max: 160 },
})

async function pushAll(cookie: string, callId: string, n: number) {
  const clientId = randomUUID()
  const at = new Date().toISOString()
  const ops = Array.from({ length: n }, (_, i) => ({
    opId: randomUUID(), clientId, seq: i + 1, at, schemaVersion: 1,
    entity: 'reading', entityId: randomUUID(), action: 'create', changes: reading(callId, i),
  }))
  const started = performance.now()
  for (let i = 0; i < ops.length; i += BATCH) {
    const res = await fetch(`${BASE}/api/sync/push`, {
      method: 'POST', headers: { 'content-type': 'application/json', 'x-wayside': '1', cookie },
      body: JSON.stringify({ clientId, ops: ops.slice(i, i + BATCH) }),
    })
    const body = await res.json() as { results: { status: string }[] }
    if (!res.ok || body.results.some(r => r.status !== 'applied')) {
      throw new Error(`push failed: ${res.status} ${JSON.stringify(body).slice(0, 300)}`)
    }
  }
  return performance.now() - started
}

async function insertAll(callId: string, n: number) {
  const client = await pool.connect()
  try {
    const at = new Date().toISOString()
    const lit = (v: unknown) => client.escapeLiteral(typeof v === 'string' ? v : JSON.stringify(v))
    const values = Array.from({ length: n }, (_, i) => {
      const r = reading(callId, i)
      return `(${lit(randomUUID())}, ${lit(callId)}, ${lit(MECH1)}, ${lit(at)}, ${lit(r.label)}, ${lit(r.quantity)}, ${r.value}, `
        + `${lit(r.unit)}, ${lit(r.component)}, ${lit(r.pins)}, ${lit(r.conditions)}, ${lit(r.spec)}, 'pass')`
    }).join(',\n')
    const started = performance.now()
    await client.query('INSERT INTO readings (id, call_id, created_by, device_at, label, quantity, value, unit, component, pins, '
      + `conditions, spec, verdict) VALUES ${values}`)
    return performance.now() - started
  }
  finally { client.release() }
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!
const ROUNDS = Number(process.env.WAYSIDE_BENCH_ROUNDS ?? 3)

try {
  const cookie = await signIn()
  // Warm both paths once (JIT, connections, plan caches) before measuring.
  await pushAll(cookie, await newCall(), BATCH)
  await insertAll(await newCall(), BATCH)

  // Rounds alternate the two, so a busy moment on a shared machine hits both alike; medians printed.
  const pushes: number[] = []
  const inserts: number[] = []
  for (let r = 0; r < ROUNDS; r++) {
    pushes.push(await pushAll(cookie, await newCall(), TOTAL))
    inserts.push(await insertAll(await newCall(), TOTAL))
  }
  const pushMs = median(pushes)
  const insertMs = median(inserts)
  const ratio = pushMs / insertMs
  const f = (ms: number) => `${ms.toFixed(0)} ms (${Math.round(TOTAL / (ms / 1000))} rows/s)`
  const all = (xs: number[]) => xs.map(x => x.toFixed(0)).join(', ')
  console.log(`sync push, ${TOTAL} readings in batches of ${BATCH}: ${f(pushMs)}  [rounds: ${all(pushes)} ms]`)
  console.log(`plain multi-row INSERT of ${TOTAL} readings:       ${f(insertMs)}  [rounds: ${all(inserts)} ms]`)
  console.log(`ratio push / insert (medians of ${ROUNDS}): ${ratio.toFixed(2)}×`)
  recordRow({
    name: 'sync-push', value: pushMs, unit: 'ms', floor: insertMs, target: 'ratio ≤ 2',
    note: `${TOTAL} readings pushed in batches of ${BATCH} vs one multi-row INSERT, medians of ${ROUNDS}`,
  })
}
finally {
  await pool.end()
}
