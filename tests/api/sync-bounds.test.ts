// A phone's clock cannot bill, and a billed call takes no new work silently: both through the push
// as a phone makes it, then through drafting and settling as the office does.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/api'
import { closeTestPool, count, testPool } from '../support/db'
import { DEMO } from '../support/env'
import { cleanupSyncData, Device, jpegBytes, makeCall, makeTestCard, sha256 } from '../support/sync'

afterAll(async () => {
  await cleanupSyncData()
  await closeTestPool()
})

let mech1: Awaited<ReturnType<typeof signedIn>>
let office: Awaited<ReturnType<typeof signedIn>>
beforeAll(async () => {
  ;[mech1, office] = await Promise.all([signedIn(DEMO.mech1), signedIn(DEMO.office)])
})

const HOUR = 3_600_000
const iso = (ms: number) => new Date(ms).toISOString()
const flags = async (callId: string) => {
  const { rows } = await testPool().query('SELECT kind, flag FROM clock_events WHERE call_id = $1 ORDER BY device_at', [callId])
  return rows.map(r => `${r.kind}:${r.flag}`)
}

/** A call at the truck, its clock pushed from a phone with the given times, then completed from the phone. */
async function workedCall(times: { start: number, stop: number }) {
  const callId = await makeCall({ status: 'on_site' })
  const d = new Device(mech1)
  const r = await d.push([
    d.op('clockEvent', { callId, kind: 'work_start' }, { at: iso(times.start) }),
    d.op('clockEvent', { callId, kind: 'work_stop' }, { at: iso(times.stop) }),
    d.update('call', callId, { status: 'completed', outcome: 'repaired' }, { status: 'on_site', outcome: null }),
  ])
  expect(r.status).toBe(200)
  expect(r.body.results.map((x: any) => x.status)).toEqual(['applied', 'applied', 'applied'])
  return callId
}

const laborTenths = (inv: any) => inv.lines.filter((l: any) => l.kind === 'labor')
  .reduce((s: number, l: any) => s + Math.round(l.quantity * 10), 0)

describe('clock bounds', () => {
  it('a phone whose clock says 2000: kept, flagged before the call, and the draft neither bills it nor answers 500', async () => {
    const start = Date.parse('2000-01-01T10:00:00Z')
    const callId = await workedCall({ start, stop: start + HOUR })
    expect(await flags(callId)).toEqual(['work_start:before_call', 'work_stop:before_call'])
    const inv = await office.post('/api/invoices', { callId })
    expect(inv.status).toBe(201)
    expect(inv.body.excludedClock.map((e: any) => e.flag)).toEqual(['before_call', 'before_call'])
    expect(inv.body.flags.map((f: any) => f.code)).toContain('untrusted_clock')
    // Nothing from the flagged hour: at most the shop's minimum labor.
    expect(laborTenths(inv.body)).toBeLessThanOrEqual(10)
  })

  it('a phone a year ahead: flagged future, not billed', async () => {
    const start = Date.now() + 365 * 24 * HOUR
    const callId = await workedCall({ start, stop: start + 2 * HOUR })
    expect(await flags(callId)).toEqual(['work_start:future', 'work_stop:future'])
    const inv = await office.post('/api/invoices', { callId })
    expect(inv.status).toBe(201)
    expect(inv.body.excludedClock).toHaveLength(2)
  })

  it('a stop a month after its start (720 h): the stop is flagged and the month is never billed', async () => {
    const start = Date.now() - 2 * 60_000
    const callId = await workedCall({ start, stop: start + 30 * 24 * HOUR })
    expect(await flags(callId)).toEqual(['work_start:null', 'work_stop:future'])
    const inv = await office.post('/api/invoices', { callId })
    expect(inv.status).toBe(201)
    // The start runs to the completion, a few minutes later: well under an hour.
    expect(laborTenths(inv.body)).toBeLessThanOrEqual(10)
  })

  it('labor over 16 h in one go flags both ends, the start already stored by an earlier push', async () => {
    const callId = await makeCall({ status: 'on_site' })
    await testPool().query(`UPDATE calls SET received_at = now() - interval '20 hours' WHERE id = $1`, [callId])
    const d = new Device(mech1)
    const start = Date.now() - 17 * HOUR
    expect((await d.push([d.op('clockEvent', { callId, kind: 'work_start' }, { at: iso(start) })])).body.results[0].status).toBe('applied')
    expect(await flags(callId)).toEqual(['work_start:null'])
    const stop = d.op('clockEvent', { callId, kind: 'work_stop' }, { at: iso(Date.now()) })
    expect((await d.push([stop])).body.results[0].status).toBe('applied')
    expect(await flags(callId)).toEqual(['work_start:long_span', 'work_stop:long_span'])
    // Travel of 11 h is a long drive, not a flag (the limit is 12 h).
    await d.push([
      d.op('clockEvent', { callId, kind: 'travel_start' }, { at: iso(Date.now() - 19 * HOUR) }),
      d.op('clockEvent', { callId, kind: 'arrive' }, { at: iso(Date.now() - 8 * HOUR) }),
    ])
    expect((await flags(callId)).filter(f => !f.startsWith('work'))).toEqual(['travel_start:null', 'arrive:null'])
  })

  it('a status move made on the phone is on the timeline when it happened; the server keeps when it learned it', async () => {
    const callId = await makeCall()
    // Assigned ten minutes ago; the phone, out of signal, started driving six minutes ago.
    await testPool().query(`UPDATE calls SET assigned_at = now() - interval '10 minutes', status_changed_at = now() - interval '10 minutes'
      WHERE id = $1`, [callId])
    const d = new Device(mech1)
    const drove = Date.now() - 6 * 60_000
    await d.push([d.update('call', callId, { status: 'en_route' }, { status: 'assigned' })].map(o => ({ ...o, at: iso(drove) })))
    const { rows: [e] } = await testPool().query(
      `SELECT at, created_at FROM call_events WHERE call_id = $1 AND to_status = 'en_route'`, [callId])
    expect(e.at.getTime()).toBe(drove)
    expect(e.created_at.getTime()).toBeGreaterThan(drove + 5 * 60_000)
    const { rows: [c] } = await testPool().query('SELECT en_route_at, assigned_at FROM calls WHERE id = $1', [callId])
    expect(c.en_route_at.getTime()).toBe(drove)
    // A phone clock behind the call's last move cannot put the move before it.
    const callId2 = await makeCall()
    await d.push([{ ...d.update('call', callId2, { status: 'en_route' }, { status: 'assigned' }), at: '2000-01-01T00:00:00Z' }])
    const { rows: [c2] } = await testPool().query('SELECT en_route_at, assigned_at FROM calls WHERE id = $1', [callId2])
    expect(c2.en_route_at.getTime()).toBe(c2.assigned_at.getTime())
  })
})

const RECORD_TABLES = ['notes', 'clock_events', 'part_lines', 'photos', 'readings', 'fault_codes', 'test_runs', 'sign_offs']

describe('a billed call takes no new work silently', () => {
  for (const status of ['invoiced', 'paid']) {
    it(`every kind of record pushed to a ${status} call becomes a conflict; the record stays as it was priced`, async () => {
      const callId = await makeCall({ status: 'completed' })
      const cardId = await makeTestCard()
      const d = new Device(mech1)
      // A fault code read before the call was billed, changed on the phone afterwards.
      const code = d.op('faultCode', { callId, spn: 110, fmi: 3 })
      expect((await d.push([code])).body.results[0].status).toBe('applied')
      await testPool().query('UPDATE calls SET status = $2 WHERE id = $1', [callId, status])
      const before = await Promise.all(RECORD_TABLES.map(t => count(t, 'call_id = $1', [callId])))
      const bytes = jpegBytes()
      const ops = [
        d.op('partLine', { callId, partNumber: 'TR-ECT-10K', description: 'Coolant sensor', quantity: 1, unitPriceCents: 6275 }),
        d.op('clockEvent', { callId, kind: 'work_start' }),
        d.op('note', { callId, text: 'Came back for the clamp' }),
        d.op('photo', { callId, sha256: sha256(bytes), contentType: 'image/jpeg', sizeBytes: bytes.length }),
        d.op('reading', { callId, label: 'Battery voltage', quantity: 'voltage', value: 12.6, unit: 'V' }),
        d.op('faultCode', { callId, code: 'P0118' }),
        d.op('testRun', { callId, cardId, cardVersion: 1, steps: [] }),
        d.op('signOff', { callId, driverName: 'Test Driver', signature: 'data:image/png;base64,AAAA' }),
        d.update('faultCode', code.entityId, { state: 'stored', note: 'Went inactive after the visit' }),
      ]
      const r = await d.push(ops)
      expect(r.status).toBe(200)
      expect(r.body.results.map((x: any) => x.status)).toEqual(ops.map(() => 'conflict'))
      expect(r.body.results[0].reason).toMatch(new RegExp(`^callId: the call is ${status}; the part line is kept for the office`))
      expect(r.body.results[8].reason).toMatch(/^state: the call is/)
      const after = await Promise.all(RECORD_TABLES.map(t => count(t, 'call_id = $1', [callId])))
      expect(after).toEqual(before)
      expect((await testPool().query('SELECT state FROM fault_codes WHERE id = $1', [code.entityId])).rows[0].state).toBe('active')
      const { rows: kept } = await testPool().query('SELECT entity, field, device_value FROM conflicts WHERE call_id = $1', [callId])
      // One per new record, one per changed field of the fault code.
      expect(kept.map(k => k.entity).sort()).toEqual(
        ['clockEvent', 'faultCode', 'faultCode', 'faultCode', 'note', 'partLine', 'photo', 'reading', 'signOff', 'testRun'])
      expect(kept.find(k => k.entity === 'note').device_value).toMatchObject({ text: 'Came back for the clamp' })

      // Sent again from another tab (a new op, the same record): the same conflict, not a second one.
      const tab = new Device(mech1)
      const again = await tab.push([{ ...tab.op('note', {}), entityId: ops[2]!.entityId, changes: ops[2]!.changes }])
      expect(again.body.results[0].status).toBe('conflict')
      expect(await count('conflicts', 'call_id = $1', [callId])).toBe(kept.length)

      // The office keeps the record as billed; taking the phone's side is refused, naming the field.
      const note = (await testPool().query(`SELECT id FROM conflicts WHERE call_id = $1 AND entity = 'note'`, [callId])).rows[0].id
      const refused = await office.post(`/api/conflicts/${note}/resolve`, { choice: 'device' })
      expect(refused.status).toBe(422)
      expect(refused.body.data.fields.choice).toMatch(/credit note or a follow-up call/)
      const settled = await office.post(`/api/conflicts/${note}/resolve`, { choice: 'server' })
      expect(settled.status).toBe(200)
      expect(await count('notes', 'call_id = $1', [callId])).toBe(before[0])
    })
  }

  it('a record stored before the call was billed, sent again, is a plain repeat', async () => {
    const callId = await makeCall({ status: 'completed' })
    const d = new Device(mech1)
    const note = d.op('note', { callId, text: 'Belt dressing applied' })
    await d.push([note])
    await testPool().query(`UPDATE calls SET status = 'invoiced' WHERE id = $1`, [callId])
    const tab = new Device(mech1)
    const r = await tab.push([{ ...tab.op('note', {}), entityId: note.entityId, changes: note.changes }])
    expect(r.body.results[0]).toMatchObject({ status: 'applied', version: 1 })
    expect(await count('conflicts', 'call_id = $1', [callId])).toBe(0)
  })
})
