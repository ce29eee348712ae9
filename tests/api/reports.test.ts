import { randomUUID } from 'node:crypto'
import Papa from 'papaparse'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/api'
import { signedIn } from '../support/api'
import { closeTestPool, testPool } from '../support/db'
import { DEMO } from '../support/env'

// Every record made here, removed after.
const made = { customers: [] as string[], units: [] as string[], calls: [] as string[], invoices: [] as string[] }
const DAY = 86_400_000

async function customerWithUnit(name: string) {
  const db = testPool()
  const customerId = randomUUID(), unitId = randomUUID()
  made.customers.push(customerId)
  made.units.push(unitId)
  await db.query(`INSERT INTO customers (id, name, billing_terms, net_days) VALUES ($1, $2, 'account', 30)`, [customerId, name])
  await db.query(`INSERT INTO units (id, customer_id, unit_number) VALUES ($1, $2, $3)`, [unitId, customerId, `RPT-${unitId.slice(0, 6)}`])
  return { customerId, unitId, unitNumber: `RPT-${unitId.slice(0, 6)}` }
}

type CallOpts = {
  receivedAt: string
  codes?: ({ code: string } | { spn: number, fmi: number })[]
  mechanicId?: string
  outcome?: string
  /** When the timeline says it was finished; the call's own column is set a day later, to show which is read. */
  completedAt?: string
}
async function call(customerId: string, unitId: string, o: CallOpts) {
  const db = testPool()
  const id = randomUUID()
  made.calls.push(id)
  const columnCompleted = o.completedAt ? new Date(Date.parse(o.completedAt) + DAY).toISOString() : null
  const r = await db.query(`INSERT INTO calls (id, status, outcome, customer_id, unit_id, location_text, complaint, mechanic_id,
    received_at, completed_at) VALUES ($1, $2, $3, $4, $5, 'Report test yard', 'Report test', $6, $7, $8) RETURNING number`,
  [id, o.outcome ? 'invoiced' : 'received', o.outcome ?? null, customerId, unitId, o.mechanicId ?? null, o.receivedAt, columnCompleted])
  for (const c of o.codes ?? []) {
    await db.query('INSERT INTO fault_codes (call_id, code, spn, fmi) VALUES ($1, $2, $3, $4)',
      [id, 'code' in c ? c.code : null, 'spn' in c ? c.spn : null, 'fmi' in c ? c.fmi : null])
  }
  if (o.completedAt) {
    await db.query(`INSERT INTO call_events (call_id, kind, from_status, to_status, at) VALUES ($1, 'status', 'on_site', 'completed', $2)`,
      [id, o.completedAt])
  }
  return { id, number: r.rows[0].number as number }
}

async function invoice(callId: string, customerId: string, status: string, subtotalCents: number) {
  const id = randomUUID()
  made.invoices.push(id)
  await testPool().query(`INSERT INTO invoices (id, call_id, customer_id, status, subtotal_cents, tax_cents, total_cents, sent_at)
    VALUES ($1, $2, $3, $4::invoice_status, $5, 0, $5, CASE WHEN $4::invoice_status = 'draft' THEN NULL ELSE now() END)`,
  [id, callId, customerId, status, subtotalCents])
}

async function clock(callId: string, spans: [string, string, string?][]) {
  for (const [start, stop, flag] of spans) {
    await testPool().query(`INSERT INTO clock_events (call_id, kind, device_at, flag)
      VALUES ($1, 'work_start', $2, $4), ($1, 'work_stop', $3, $4)`, [callId, start, stop, flag ?? null])
  }
}

function csvRows(text: string) {
  const parsed = Papa.parse<string[]>(text, { skipEmptyLines: true })
  expect(parsed.errors).toEqual([])
  return parsed.data
}

let office: ApiClient
beforeAll(async () => {
  office = await signedIn(DEMO.office)
  const zone = await testPool().query('SELECT time_zone FROM rates ORDER BY effective_from DESC LIMIT 1')
  expect(zone.rows[0].time_zone).toBe('America/Chicago')
})

afterAll(async () => {
  const db = testPool()
  await db.query('DELETE FROM invoices WHERE id = ANY($1)', [made.invoices])
  for (const t of ['fault_codes', 'call_events', 'clock_events', 'part_lines']) {
    await db.query(`DELETE FROM ${t} WHERE call_id = ANY($1)`, [made.calls])
  }
  await db.query('DELETE FROM calls WHERE id = ANY($1)', [made.calls])
  await db.query('DELETE FROM units WHERE id = ANY($1)', [made.units])
  await db.query('DELETE FROM customers WHERE id = ANY($1)', [made.customers])
  await closeTestPool()
})

describe('one comeback rule for the unit history and the reports', () => {
  it('finds the same comebacks on the unit page and in the comebacks report, worked out by hand', async () => {
    const { customerId, unitId, unitNumber } = await customerWithUnit('Comeback Rule Carriers')
    const now = Date.now()
    const at = (daysAgo: number) => new Date(now - daysAgo * DAY).toISOString()
    // A: P0117 and SPN 110 FMI 4. B, 12 days later: 'p0117 ' as typed (the same code). C, 20 days after A: SPN 110 FMI 4 again.
    // D, 33 days after B: P0117 (past the 30-day window from B). E then F exactly 30 days later: P0420 (the limit counts as within).
    const a = await call(customerId, unitId, { receivedAt: at(85), codes: [{ code: 'P0117' }, { spn: 110, fmi: 4 }] })
    const b = await call(customerId, unitId, { receivedAt: at(73), codes: [{ code: 'p0117 ' }] })
    const c = await call(customerId, unitId, { receivedAt: at(65), codes: [{ spn: 110, fmi: 4 }, { spn: 110, fmi: 3 }] })
    await call(customerId, unitId, { receivedAt: at(40), codes: [{ code: 'P0117' }] })
    const e = await call(customerId, unitId, { receivedAt: at(31), codes: [{ code: 'P0420' }] })
    const f = await call(customerId, unitId, { receivedAt: at(1), codes: [{ code: 'P0420' }] })
    const expected = [
      `${b.number}<${a.number} P0117`, `${c.number}<${a.number} SPN 110 FMI 4`, `${f.number}<${e.number} P0420`,
    ].sort()

    const unit = await office.get(`/api/units/${unitId}`)
    expect(unit.status).toBe(200)
    const onUnitPage = (unit.body.calls as { number: number, comebacks: { code: string, earlierNumber: number }[] }[])
      .flatMap(x => x.comebacks.map(cb => `${x.number}<${cb.earlierNumber} ${cb.code}`)).sort()
    expect(onUnitPage).toEqual(expected)

    const day = (ms: number) => new Date(ms).toISOString().slice(0, 10)
    const report = await office.get(`/api/reports/comebacks?from=${day(now - 100 * DAY)}&to=${day(now + DAY)}`)
    expect(report.status).toBe(200)
    const inReport = (report.body.rows as { unitNumber: string, code: string, firstCall: number, repeatCall: number }[])
      .filter(r => r.unitNumber === unitNumber).map(r => `${r.repeatCall}<${r.firstCall} ${r.code}`).sort()
    expect(inReport).toEqual(expected)
  })
})

describe('mechanics by week', () => {
  it('counts first-visit fixes, invoiced and hours per mechanic per local week, from the timeline, worked out by hand', async () => {
    const { rows: [mech] } = await testPool().query('SELECT id, name FROM users WHERE email = $1', [DEMO.mech2])
    const { customerId, unitId } = await customerWithUnit('Weekly Figures Freight')
    const m = mech.id as string
    // Week of Monday 2 June 2025 in Chicago (UTC−5 in summer).
    // 1: repaired Tue 3 June, but the unit came back with P0300 ten days later: not a first-visit fix. $300.00, 1.5 h.
    const c1 = await call(customerId, unitId, { receivedAt: '2025-06-03T14:00:00Z', mechanicId: m, outcome: 'repaired',
      completedAt: '2025-06-03T20:00:00Z', codes: [{ code: 'P0300' }] })
    await invoice(c1.id, customerId, 'sent', 30_000)
    await clock(c1.id, [['2025-06-03T18:00:00Z', '2025-06-03T19:30:00Z']])
    // 3: towed Thu 5 June: finished, not fixed. $120.00, 1 h; a 5 h span the server flagged is left out, as billing leaves it out.
    const c3 = await call(customerId, unitId, { receivedAt: '2025-06-05T14:00:00Z', mechanicId: m, outcome: 'towed',
      completedAt: '2025-06-05T18:00:00Z' })
    await invoice(c3.id, customerId, 'paid', 12_000)
    await clock(c3.id, [['2025-06-05T15:00:00Z', '2025-06-05T16:00:00Z'], ['2025-06-05T19:00:00Z', '2025-06-06T00:00:00Z', 'future']])
    // 4: repaired Sunday 8 June 22:00 in Chicago (Monday 03:00 UTC: still the week of 2 June locally). Draft invoice: not invoiced.
    // 0.5 h. Its own completed_at column says a day later (the next week): the timeline's time is the one read.
    const c4 = await call(customerId, unitId, { receivedAt: '2025-06-08T20:00:00Z', mechanicId: m, outcome: 'repaired',
      completedAt: '2025-06-09T03:00:00Z' })
    await invoice(c4.id, customerId, 'draft', 9_999)
    await clock(c4.id, [['2025-06-09T01:00:00Z', '2025-06-09T01:30:00Z']])
    // 2: the comeback, Fri 13 June (week of 9 June): repaired, no comeback after it: a first-visit fix.
    await call(customerId, unitId, { receivedAt: '2025-06-13T14:00:00Z', mechanicId: m, outcome: 'repaired',
      completedAt: '2025-06-13T17:00:00Z', codes: [{ code: 'P0300' }] })

    const r = await office.get('/api/reports/mechanic-weeks?from=2025-06-02&to=2025-06-15')
    expect(r.status).toBe(200)
    const mine = r.body.rows.filter((x: { mechanic: string }) => x.mechanic === mech.name)
    expect(mine).toEqual([
      // 3 finished (1, 3, 4); 1 fix (4); 1 / 3 = 33.3 %; $300.00 + $120.00; 1.5 + 1 + 0.5 = 3.0 h.
      { week: '2025-06-02', mechanic: mech.name, finished: 3, firstVisitFixes: 1, firstVisitFixPct: 33.3, revenueCents: 42_000,
        laborHours: 3 },
      // 1 finished (2), fixed: 100 %.
      { week: '2025-06-09', mechanic: mech.name, finished: 1, firstVisitFixes: 1, firstVisitFixPct: 100, revenueCents: 0, laborHours: 0 },
    ])

    // The same in CSV, under the page's headings.
    const csv = await office.get('/api/reports/mechanic-weeks/csv?from=2025-06-02&to=2025-06-15')
    expect(csv.status).toBe(200)
    expect(csv.headers.get('content-type')).toMatch(/^text\/csv/)
    const [header, ...rows] = csvRows(csv.body)
    expect(header).toEqual(['Week of', 'Mechanic', 'Calls finished', 'Fixed on the first visit', 'First-visit fix rate (%)',
      'Invoiced before tax ($)', 'Hours worked (h)'])
    expect(rows.filter(x => x[1] === mech.name)).toEqual([
      ['2025-06-02', mech.name, '3', '1', '33.3', '420.00', '3'],
      ['2025-06-09', mech.name, '1', '1', '100', '0.00', '0'],
    ])
  })
})

describe('reports people can read', () => {
  it('answers outcomes in words and response times from the timeline', async () => {
    const { customerId, unitId } = await customerWithUnit('Plain Words Logistics')
    // Received 14:00 UTC on 20 July 2025; the timeline says assigned 10 min later and at the truck 70 min later; the
    // call's own columns say otherwise (50 and 200 min), and are not read.
    const c = await call(customerId, unitId, { receivedAt: '2025-07-20T14:00:00Z', outcome: 'no_fault_found',
      completedAt: '2025-07-20T17:00:00Z' })
    await testPool().query(`UPDATE calls SET assigned_at = '2025-07-20T14:50:00Z', on_site_at = '2025-07-20T17:20:00Z'
      WHERE id = $1`, [c.id])
    await testPool().query(`INSERT INTO call_events (call_id, kind, to_status, at)
      VALUES ($1, 'status', 'assigned', '2025-07-20T14:10:00Z'), ($1, 'status', 'on_site', '2025-07-20T15:10:00Z')`, [c.id])
    const times = await office.get('/api/reports/response-times?from=2025-07-20&to=2025-07-20')
    expect(times.body.rows).toEqual([{ day: '2025-07-20', calls: 1, medianToAssignMin: 10, medianToArriveMin: 70 }])

    const csv = await office.get('/api/reports/fix-rate/csv?from=2025-07-20&to=2025-07-20')
    const [header, ...rows] = csvRows(csv.body)
    expect(header).toEqual(['Outcome', 'Calls', 'Share (%)'])
    expect(rows).toEqual([['No fault found', '1', '100']])
    expect(csv.body).not.toContain('no_fault_found')
  })

  it('neutralises formula-like text in a report\'s CSV', async () => {
    const { customerId, unitId } = await customerWithUnit('Formula Parts Co')
    const c = await call(customerId, unitId, { receivedAt: '2025-08-04T14:00:00Z' })
    await testPool().query(`INSERT INTO part_lines (call_id, part_number, description, quantity, unit_price_cents)
      VALUES ($1, '+1-PN', '=HYPERLINK("http://x")', 2, 100), ($1, '@SUM', '-2 washers', 1, 100)`, [c.id])
    const csv = await office.get('/api/reports/parts/csv?from=2025-08-04&to=2025-08-04')
    const [, ...rows] = csvRows(csv.body)
    expect(rows).toEqual([['\'+1-PN', '\'=HYPERLINK("http://x")', '2', '1'], ['\'@SUM', '\'-2 washers', '1', '1']])
  })

  it('keeps reports from mechanics, and names the field for a bad report name or date', async () => {
    const mech = await signedIn(DEMO.mech1)
    expect((await mech.get('/api/reports/fix-rate')).status).toBe(403)
    expect((await mech.get('/api/reports/fix-rate/csv')).status).toBe(403)
    const unknown = await office.get('/api/reports/nonsense')
    expect(unknown.status).toBe(400)
    expect(Object.keys(unknown.body.data.fields)).toEqual(['name'])
    const bad = await office.get('/api/reports/mechanic-weeks/csv?from=2025-02-30&to=tomorrow')
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.data.fields).sort()).toEqual(['from', 'to'])
  })
})

// The demo data's reports, each checked against the raw rows counted here in plain JavaScript, by local day in Chicago.
describe('reports over the demo data', () => {
  const day = (d: Date) => d.toISOString().slice(0, 10)
  const to = day(new Date())
  const from = day(new Date(Date.now() - 60 * DAY))
  const local = (col: string) => `(${col} AT TIME ZONE 'America/Chicago')::date BETWEEN $1::date AND $2::date`

  it('counts calls per day, one row per day of the range', async () => {
    const r = await office.get(`/api/reports/calls-per-day?from=${from}&to=${to}`)
    expect(r.status).toBe(200)
    expect(r.body.rows).toHaveLength(61)
    const { rows } = await testPool().query(`SELECT received_at FROM calls WHERE ${local('received_at')}`, [from, to])
    expect(r.body.rows.reduce((s: number, x: { received: number }) => s + x.received, 0)).toBe(rows.length)
  })

  it('gives the outcome shares of finished calls', async () => {
    const r = await office.get(`/api/reports/fix-rate?from=${from}&to=${to}`)
    const finished = `SELECT c.outcome FROM calls c WHERE c.outcome IS NOT NULL AND ${local(`coalesce(
      (SELECT min(e.at) FROM call_events e WHERE e.call_id = c.id AND e.to_status = 'completed'), c.completed_at)`)}`
    const { rows } = await testPool().query(finished, [from, to])
    const byOutcome = new Map<string, number>()
    for (const x of rows) byOutcome.set(x.outcome, (byOutcome.get(x.outcome) ?? 0) + 1)
    for (const row of r.body.rows) {
      expect(row.calls).toBe(byOutcome.get(row.outcome))
      expect(row.pct).toBeCloseTo(100 * row.calls / rows.length, 1)
    }
    expect(r.body.rows.reduce((s: number, x: { calls: number }) => s + x.calls, 0)).toBe(rows.length)
  })

  it('finds the seeded comeback: the same SPN/FMI on the same unit within 30 days', async () => {
    const r = await office.get(`/api/reports/comebacks?from=${from}&to=${to}`)
    const seeded = expect.objectContaining({ code: 'SPN 3516 FMI 18', firstCall: 10, repeatCall: 11 })
    expect(r.body.rows).toEqual(expect.arrayContaining([seeded]))
    for (const row of r.body.rows) expect(row.days).toBeLessThanOrEqual(30)
  })

  it('sums parts and what was invoiced', async () => {
    const parts = await office.get(`/api/reports/parts?from=${from}&to=${to}`)
    const def = parts.body.rows.find((p: { partNumber: string }) => p.partNumber === 'TR-DEF-10')
    expect(def).toMatchObject({ quantity: 3, calls: 1 })
    const rev = await office.get(`/api/reports/revenue?from=${from}&to=${to}`)
    const sent = `SELECT total_cents, paid_cents FROM invoices
      WHERE status IN ('sent', 'paid') AND sent_at IS NOT NULL AND ${local('sent_at')}`
    const { rows } = await testPool().query(sent, [from, to])
    type Day = { totalCents: number, paidCents: number }
    const sum = (xs: Day[], k: keyof Day) => xs.reduce((s, x) => s + x[k], 0)
    expect(sum(rev.body.rows, 'totalCents')).toBe(rows.reduce((s, x) => s + x.total_cents, 0))
    expect(sum(rev.body.rows, 'paidCents')).toBe(rows.reduce((s, x) => s + x.paid_cents, 0))
  })

  it('refuses a bad or backwards range naming the field', async () => {
    const bad = await office.get('/api/reports/revenue?from=2026-13-45')
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields.from).toBeTruthy()
    const backwards = await office.get('/api/reports/revenue?from=2026-05-02&to=2026-05-01')
    expect(backwards.status).toBe(400)
    expect(backwards.body.data.fields.from).toMatch(/before/)
  })
})
