// The server under load (autocannon, 50 connections, 20 s each): a trivial route (GET /api/health:
// the middleware, one `SELECT 1` and a stat on the photo store) as the floor; the dispatcher's
// calls list; small sync pushes from 50 devices, each with its own clientId and seq. Records the
// p99 of each beside the floor's, every non-2xx answer and error across the three loads, and the
// server process's peak resident memory while they ran. Prints; asserts nothing.
import { randomUUID } from 'node:crypto'
import autocannon from 'autocannon'
import pg from 'pg'
import { seedId } from '../../server/db/seed/ids'
import { recordRow } from './support/rows'
import { BASE, rssMb, sessionCookie } from './support/session'

const CONNECTIONS = 50
const SECONDS = Number(process.env.WAYSIDE_BENCH_LOAD_SECONDS ?? 20)
const DB = process.env.NUXT_DATABASE_URL ?? 'postgres://wayside@127.0.0.1:54329/wayside_bench'
const MECH1 = seedId('user:mech1')

/** The bench server's process: set by scripts/bench.sh; without it, memory is not measured. */
const serverPid = Number(process.env.WAYSIDE_BENCH_SERVER_PID ?? 0)

type Load = { name: string, p99: number, p50: number, requests: number, non2xx: number, errors: number, timeouts: number }

async function load(name: string, opts: Partial<autocannon.Options>): Promise<Load> {
  const r = await autocannon({ url: BASE, connections: CONNECTIONS, duration: SECONDS, timeout: 10, ...opts })
  const out = {
    name, p99: r.latency.p99, p50: r.latency.p50, requests: r.requests.total,
    non2xx: r.non2xx, errors: r.errors, timeouts: r.timeouts,
  }
  console.log(`${name}: ${out.requests} requests, p50 ${out.p50} ms, p99 ${out.p99} ms, `
    + `non-2xx ${out.non2xx}, errors ${out.errors}, timeouts ${out.timeouts}`)
  return out
}

/** One call per device, assigned to mech1, so each device pushes onto a call it may write to. */
async function deviceCalls(pool: pg.Pool, n: number): Promise<string[]> {
  const ids = Array.from({ length: n }, () => randomUUID())
  await pool.query(
    `INSERT INTO calls (id, status, customer_id, unit_id, location_text, complaint, mechanic_id, assigned_at)
     SELECT id, 'on_site', $2, $3, 'Benchmark lot', 'Benchmark: pushes under load', $4, now() FROM unnest($1::uuid[]) AS id`,
    [ids, seedId('customer:prairie'), seedId('unit:7'), MECH1],
  )
  return ids
}

const pool = new pg.Pool({ connectionString: DB, max: 2 })
let peakMb = 0
const sampler = serverPid
  ? setInterval(() => {
      try {
        peakMb = Math.max(peakMb, rssMb(serverPid).now)
      }
      catch { /* the server is gone: the loads will say so */ }
    }, 100)
  : undefined

try {
  const [dispatcher, mechanic] = [await sessionCookie('dispatch@wayside.test'), await sessionCookie('mech1@wayside.test')]
  const startMb = serverPid ? rssMb(serverPid).now : Number.NaN
  const calls = await deviceCalls(pool, CONNECTIONS)

  const trivial = await load('GET /api/health (floor)', { requests: [{ method: 'GET', path: '/api/health' }] })
  const list = await load('GET /api/calls as a dispatcher', {
    requests: [{ method: 'GET', path: '/api/calls', headers: { 'cookie': dispatcher, 'accept-encoding': 'gzip, br' } }],
  })
  let devices = 0
  const push = await load(`POST /api/sync/push, ${CONNECTIONS} devices`, {
    requests: [{
      method: 'POST', path: '/api/sync/push',
      headers: { 'cookie': mechanic, 'content-type': 'application/json', 'x-wayside': '1' },
      // The context lives as long as the connection: one device each, its seq counting up.
      setupRequest: (req, context: Record<string, unknown>) => {
        context.clientId ??= randomUUID()
        context.callId ??= calls[devices++ % calls.length]
        const seq = (context.seq = Number(context.seq ?? 0) + 1)
        const op = {
          opId: randomUUID(), clientId: context.clientId, seq, at: new Date().toISOString(), schemaVersion: 1,
          entity: 'reading', entityId: randomUUID(), action: 'create',
          changes: {
            callId: context.callId, label: `Load reading ${seq}`, quantity: 'voltage', value: 12.4 + (seq % 10) / 10, unit: 'V',
            component: 'Battery', pins: '+ to −', conditions: 'key off',
          },
        }
        return { ...req, body: JSON.stringify({ clientId: context.clientId, ops: [op] }) }
      },
    }],
  })

  if (sampler) clearInterval(sampler)
  // Each answered push should have stored its reading: a 200 that applied nothing would flatter the figure.
  const { rows: [stored] } = await pool.query('SELECT count(*)::int AS n FROM readings WHERE call_id = ANY($1)', [calls])
  console.log(`readings stored by the pushes: ${stored.n} (pushes answered 2xx: ${push.requests - push.non2xx})`)
  const loads = [trivial, list, push]
  const bad = loads.reduce((n, l) => n + l.non2xx + l.errors + l.timeouts, 0)
  recordRow({
    name: 'calls-list-load-p99', value: list.p99, unit: 'ms', floor: trivial.p99, target: 'ratio ≤ 3',
    note: `GET /api/calls as a dispatcher vs GET /api/health, ${CONNECTIONS} connections, ${SECONDS} s each `
      + `(p50 ${list.p50} vs ${trivial.p50} ms)`,
  })
  recordRow({
    name: 'push-load-p99', value: push.p99, unit: 'ms', floor: trivial.p99, target: 'ratio ≤ 5',
    note: `one-reading pushes from ${CONNECTIONS} devices vs GET /api/health, ${SECONDS} s `
      + `(${push.requests} pushes, ${stored.n} readings stored, p50 ${push.p50} ms)`,
  })
  recordRow({
    name: 'load-errors', value: bad, unit: 'answers', floor: null, target: '0',
    note: loads.map(l => `${l.name}: ${l.non2xx} non-2xx, ${l.errors} errors, ${l.timeouts} timeouts`).join('; '),
  })
  if (serverPid) {
    recordRow({
      name: 'server-rss-peak', value: peakMb, unit: 'MB', floor: null, target: '≤ 250',
      note: `VmRSS of the bench server sampled every 100 ms during the loads (${startMb.toFixed(0)} MB before; `
        + `VmHWM since start ${rssMb(serverPid).peak.toFixed(0)} MB)`,
    })
  }
  else console.log('server-rss-peak: not measured (WAYSIDE_BENCH_SERVER_PID is not set; run through npm run bench)')
}
finally {
  if (sampler) clearInterval(sampler)
  await pool.end()
}
