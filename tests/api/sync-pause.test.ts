import { randomUUID } from 'node:crypto'
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { isPausedCall } from '../../shared/utils/boardUrgency'
import { signedIn } from '../support/api'
import { closeTestPool, testPool } from '../support/db'
import { BASE_URL, DEMO } from '../support/env'
import { callRow, cleanupSyncData, Device, IDS, makeCall, type TestOp } from '../support/sync'

// One active call per mechanic (a `pause` clock event and a move back to assigned on the call left)
// and the odometer and engine hours read at the truck. The minutes are plain arithmetic on the clock
// times the phone sent; the rates are set to bill travel by time for this file and put back after.
const MIN = 60_000
let mech: Awaited<ReturnType<typeof signedIn>>
let office: Awaited<ReturnType<typeof signedIn>>
let dispatcher: Awaited<ReturnType<typeof signedIn>>
let ratesId: string | undefined
const units: string[] = []

beforeAll(async () => {
  ;[mech, office, dispatcher] = await Promise.all([signedIn(DEMO.mech1), signedIn(DEMO.office), signedIn(DEMO.dispatcher)])
  const admin = await signedIn(DEMO.admin)
  const { body: { rates } } = await admin.get('/api/rates')
  const { id: _i, version: _v, createdAt: _c, updatedAt: _u, effectiveFrom: _e, ...values } = rates
  // Time-based travel, open every minute of every day, so each stretch is one plain line of tenths.
  const r = await admin.post('/api/rates', {
    ...values, travelBasis: 'time', travelCentsPerHour: 9500, openMinute: 0, closeMinute: 1440, openDays: [1, 2, 3, 4, 5, 6, 7],
    minimumLaborTenths: 0,
  })
  expect(r.status, JSON.stringify(r.body)).toBeLessThan(300)
  ratesId = (await testPool().query('SELECT id FROM rates ORDER BY effective_from DESC LIMIT 1')).rows[0].id
})

afterAll(async () => {
  await cleanupSyncData()
  if (ratesId) await testPool().query('DELETE FROM rates WHERE id = $1', [ratesId])
  if (units.length) await testPool().query('DELETE FROM units WHERE id = ANY($1)', [units])
  await closeTestPool()
})

/** A call of ours taken three hours ago, so clock times of the last two hours are trusted. */
async function callTakenEarlier(unitId?: string) {
  const id = await makeCall()
  await testPool().query(`UPDATE calls SET received_at = now() - interval '3 hours', assigned_at = now() - interval '3 hours',
    status_changed_at = now() - interval '3 hours', unit_id = coalesce($2, unit_id) WHERE id = $1`, [id, unitId ?? null])
  return id
}

/** The ops the phone's buttons write, each at its own clock time. */
function phone(d: Device) {
  const at = (t: number) => ({ at: new Date(t).toISOString() })
  const move = (callId: string, t: number, status: string, from: string, also: Record<string, unknown> = {}) =>
    d.update('call', callId, { status, ...also }, { status: from, ...Object.fromEntries(Object.keys(also).map(k => [k, null])) })
  return {
    clock: (callId: string, kind: string, t: number) => d.op('clockEvent', { callId, kind }, at(t)),
    move: (callId: string, t: number, status: string, from: string, also?: Record<string, unknown>) =>
      Object.assign(move(callId, t, status, from, also), at(t)),
  }
}

async function pushAll(d: Device, ops: TestOp[]) {
  const r = await d.push(ops)
  expect(r.status).toBe(200)
  const results = r.body.results as { status: string, reason?: string }[]
  expect(results.map(x => `${x.status}${x.reason ? ` ${x.reason}` : ''}`)).toEqual(ops.map(() => 'applied'))
}

async function travelHours(callId: string) {
  const inv = await office.post('/api/invoices', { callId })
  expect(inv.status, JSON.stringify(inv.body)).toBe(201)
  return (inv.body.lines as { kind: string, quantity: number }[]).filter(l => l.kind === 'travel').reduce((n, l) => n + l.quantity, 0)
}

describe('one active call per mechanic', () => {
  it('starting to drive to a second call pauses the first: travel billed once per stretch, the board shows it paused', async () => {
    const [a, b] = [await callTakenEarlier(), await callTakenEarlier()]
    const d = new Device(mech)
    const p = phone(d)
    const t0 = Date.now() - 2 * 60 * MIN
    const t = (m: number) => t0 + m * MIN

    // Driving to A at 0; at 36 the mechanic is sent to B: "Pause #A and start driving".
    await pushAll(d, [p.move(a, t(0), 'en_route', 'assigned'), p.clock(a, 'travel_start', t(0))])
    await pushAll(d, [
      p.move(a, t(36), 'assigned', 'en_route'), p.clock(a, 'pause', t(36)),
      p.move(b, t(36), 'en_route', 'assigned'), p.clock(b, 'travel_start', t(36)),
    ])
    const paused = await callRow(a)
    expect(paused.status).toBe('assigned')
    expect(paused.en_route_at).not.toBeNull() // kept: when A was first driven out to
    expect(isPausedCall({ ...paused, status: paused.status, enRouteAt: paused.en_route_at })).toBe(true)
    // The board reads the same row through the calls route.
    const board = (await dispatcher.get(`/api/calls/${a}`)).body
    expect(isPausedCall({ status: board.status, enRouteAt: board.enRouteAt, derate: 'none', receivedAt: board.receivedAt })).toBe(true)
    const timeline = await testPool().query(
      `SELECT from_status, to_status FROM call_events WHERE call_id = $1 AND kind = 'status' ORDER BY at`, [a])
    expect(timeline.rows).toEqual([{ from_status: 'assigned', to_status: 'en_route' }, { from_status: 'en_route', to_status: 'assigned' }])

    // B: arrive at 60, work 60 to 72, done. Then back to A: drive 72 to 96, work 96 to 108, done.
    await pushAll(d, [
      p.move(b, t(60), 'on_site', 'en_route'), p.clock(b, 'arrive', t(60)), p.clock(b, 'work_start', t(60)),
      p.clock(b, 'work_stop', t(72)), p.move(b, t(72), 'completed', 'on_site', { outcome: 'repaired' }), p.clock(b, 'depart', t(72)),
      p.move(a, t(72), 'en_route', 'assigned'), p.clock(a, 'travel_start', t(72)),
      p.move(a, t(96), 'on_site', 'en_route'), p.clock(a, 'arrive', t(96)), p.clock(a, 'work_start', t(96)),
      p.clock(a, 'work_stop', t(108)), p.move(a, t(108), 'completed', 'on_site', { outcome: 'repaired' }), p.clock(a, 'depart', t(108)),
    ])
    expect((await callRow(a)).status).toBe('completed')

    // A: 36 min (0 → 36, ended by the pause) + 24 min (72 → 96) = 60 min = 1.0 h. Without the
    // pause its travel would run 0 → 96 = 1.6 h, overlapping B's drive.
    expect(await travelHours(a)).toBe(1)
    // B: 36 → 60 = 24 min = 0.4 h. Together 1.4 h = 84 min, the time the mechanic drove (0 → 60, 72 → 96).
    expect(await travelHours(b)).toBe(0.4)
  })

  it('a pause is the only move back to assigned sync takes: a done call keeps its status', async () => {
    const c = await callTakenEarlier()
    await testPool().query(`UPDATE calls SET status = 'completed', outcome = 'repaired', completed_at = now() WHERE id = $1`, [c])
    const d = new Device(mech)
    const r = await d.push([d.update('call', c, { status: 'assigned' }, { status: 'on_site' })])
    expect(r.body.results[0]).toMatchObject({ status: 'applied', reason: expect.stringMatching(/never moves a status back/) })
    expect((await callRow(c)).status).toBe('completed')
  })
})

describe('odometer and engine hours read at the truck', () => {
  async function pdfText(invoiceId: string) {
    const res = await fetch(`${BASE_URL}/api/invoices/${invoiceId}/pdf`, { headers: { cookie: office.cookie } })
    const pdf = await getDocument({ data: new Uint8Array(await res.arrayBuffer()), isEvalSupported: false, useSystemFonts: false }).promise
    const page = await pdf.getPage(1)
    return (await page.getTextContent()).items.map(it => ('str' in it ? it.str : '')).join('')
  }

  it('keeps the reading on the call, raises the unit, never lowers it, and names a bad value', async () => {
    const unitId = randomUUID()
    units.push(unitId)
    await testPool().query(`INSERT INTO units (id, customer_id, unit_number, odometer, odometer_unit, engine_hours)
      VALUES ($1, $2, $3, 400000, 'mi', 12000)`, [unitId, IDS.customer, `ODO-${unitId.slice(0, 6)}`])
    const c = await callTakenEarlier(unitId)
    const d = new Device(mech)
    const unit = async () => (await testPool().query('SELECT odometer, engine_hours FROM units WHERE id = $1', [unitId])).rows[0]

    await pushAll(d, [d.update('call', c, { odometerReading: 412300, engineHoursReading: 12480.5 },
      { odometerReading: null, engineHoursReading: null })])
    expect(await callRow(c)).toMatchObject({ odometer_reading: 412300, engine_hours_reading: 12480.5 })
    expect(await unit()).toEqual({ odometer: 412300, engine_hours: 12480.5 })

    // A lower reading (a slip corrected on the phone) is the call's; the unit keeps its higher figure.
    await pushAll(d, [d.update('call', c, { odometerReading: 405000, engineHoursReading: 12100 },
      { odometerReading: 412300, engineHoursReading: 12480.5 })])
    expect(await callRow(c)).toMatchObject({ odometer_reading: 405000, engine_hours_reading: 12100 })
    expect(await unit()).toEqual({ odometer: 412300, engine_hours: 12480.5 })

    const bad = await d.push([
      d.update('call', c, { odometerReading: -5 }, { odometerReading: 405000 }),
      d.update('call', c, { engineHoursReading: 'lots' }, { engineHoursReading: 12100 }),
      d.update('call', c, { odometerReading: 10_000_000 }, { odometerReading: 405000 }),
    ])
    expect((bad.body.results as { status: string, reason?: string }[]).map(x => [x.status, x.reason])).toEqual([
      ['rejected', expect.stringMatching(/^odometerReading: Odometer cannot be below 0/)],
      ['rejected', expect.stringMatching(/^engineHoursReading: Engine hours must be a number/)],
      ['rejected', expect.stringMatching(/^odometerReading: Odometer cannot be above 9999999/)],
    ])
    expect(await callRow(c)).toMatchObject({ odometer_reading: 405000, engine_hours_reading: 12100 })

    // The invoice prints the call's own reading (405,000 mi), not the unit's later figure (412,300 mi).
    await testPool().query(`UPDATE calls SET status = 'completed', outcome = 'repaired', completed_at = now() WHERE id = $1`, [c])
    const inv = await office.post('/api/invoices', { callId: c })
    expect(inv.status).toBe(201)
    const text = await pdfText(inv.body.id)
    expect(text).toContain('Odometer: 405,000 mi')
    expect(text).toContain('Engine hours: 12,100 h')
  })
})
