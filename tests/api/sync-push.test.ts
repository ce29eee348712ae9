import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it, onTestFinished } from 'vitest'
import { signedIn } from '../support/api'
import { closeTestPool, count, testPool } from '../support/db'
import { DEMO } from '../support/env'
import { callRow, cleanupSyncData, Device, IDS, makeCall, makeTestCard, type TestOp } from '../support/sync'

afterAll(async () => {
  await cleanupSyncData()
  await closeTestPool()
})

let mech1: Awaited<ReturnType<typeof signedIn>>
let mech2: Awaited<ReturnType<typeof signedIn>>
let office: Awaited<ReturnType<typeof signedIn>>
let dispatcher: Awaited<ReturnType<typeof signedIn>>
beforeAll(async () => {
  ;[mech1, mech2, office, dispatcher] = await Promise.all([
    signedIn(DEMO.mech1), signedIn(DEMO.mech2), signedIn(DEMO.office), signedIn(DEMO.dispatcher),
  ])
})

const reading = (callId: string, value: unknown = 138.5) => ({
  callId, label: 'Coolant sensor resistance', quantity: 'resistance', value, unit: 'ohm',
})
const idList = (ops: TestOp[]) => ops.map(o => o.entityId)
const countIds = (table: string, ops: TestOp[]) => count(table, 'id = ANY($1)', [idList(ops)])

/** A mixed batch: readings, notes, clock events, fault codes, a part line and a status move. */
function mixedBatch(d: Device, callId: string) {
  return [
    d.op('clockEvent', { callId, kind: 'arrive' }),
    d.update('call', callId, { status: 'en_route' }, { status: 'assigned' }),
    ...Array.from({ length: 5 }, (_, i) => d.op('reading', reading(callId, 100 + i))),
    d.op('note', { callId, text: 'Parked on the shoulder, cones out, hazards on.' }),
    d.op('faultCode', { callId, code: 'P0118' }),
    d.op('faultCode', { callId, spn: 110, fmi: 3 }),
    d.op('partLine', {
      callId, partNumber: 'TR-ECT-10K', description: 'Coolant temperature sensor, NTC type', quantity: 1, serviceTruckId: IDS.truck11,
    }),
  ]
}

describe('push: exactly once', () => {
  it('applies a batch once; the same batch again answers duplicates and changes nothing', async () => {
    const callId = await makeCall()
    const d = new Device(mech1)
    const ops = mixedBatch(d, callId)
    const first = await d.push(ops)
    expect(first.status).toBe(200)
    expect(first.body.lastSeq).toBe(ops.length)
    expect(first.body.results.map((r: any) => r.status)).toEqual(ops.map(() => 'applied'))
    const counts = {
      readings: await countIds('readings', ops), notes: await countIds('notes', ops),
      events: await count('call_events', 'call_id = $1', [callId]), ops: await count('sync_ops', 'client_id = $1', [d.clientId]),
    }
    expect(counts).toEqual({ readings: 5, notes: 1, events: 2, ops: ops.length })
    // Part price comes from the truck's stock when the device sent none (seed: TR-ECT-10K at 6275).
    expect((await testPool().query(
      'SELECT unit_price_cents FROM part_lines WHERE call_id = $1', [callId],
    )).rows[0].unit_price_cents).toBe(6275)

    const again = await d.push(ops)
    expect(again.status).toBe(200)
    expect(again.body.lastSeq).toBe(ops.length)
    expect(again.body.results.map((r: any) => r.status)).toEqual(ops.map(() => 'duplicate'))
    expect(again.body.results[0]).toMatchObject({ original: 'applied', version: 1 })
    expect({
      readings: await countIds('readings', ops), notes: await countIds('notes', ops),
      events: await count('call_events', 'call_id = $1', [callId]), ops: await count('sync_ops', 'client_id = $1', [d.clientId]),
    }).toEqual(counts)
  })

  it('serializes the same batch sent twice at once: one applies, the other answers duplicates', async () => {
    const callId = await makeCall()
    const d = new Device(mech1)
    const ops = mixedBatch(d, callId)
    const [a, b] = await Promise.all([d.push(ops), d.push(ops)])
    expect([a.status, b.status]).toEqual([200, 200])
    const statuses = [a, b].map(r => [...new Set(r.body.results.map((x: any) => x.status))].join())
    expect(statuses.sort()).toEqual(['applied', 'duplicate'])
    expect(await countIds('readings', ops)).toBe(5)
    expect(await countIds('fault_codes', ops)).toBe(2)
    expect(await count('call_events', 'call_id = $1 AND to_status = \'en_route\'', [callId])).toBe(1)
    expect(await count('sync_ops', 'client_id = $1', [d.clientId])).toBe(ops.length)
  })

  it('takes a batch cut off half-way and resent whole: the first half duplicates, the rest applies', async () => {
    const callId = await makeCall()
    const d = new Device(mech1)
    const ops = Array.from({ length: 20 }, (_, i) => d.op('note', { callId, text: `Note ${i + 1}` }))
    expect((await d.push(ops.slice(0, 10))).body.lastSeq).toBe(10)
    const r = await d.push(ops)
    expect(r.body.results.map((x: any) => x.status)).toEqual([...Array(10).fill('duplicate'), ...Array(10).fill('applied')])
    expect(r.body.lastSeq).toBe(20)
    expect(await countIds('notes', ops)).toBe(20)
  })

  it('answers 409 with expectedSeq for a gap and applies nothing of the batch', async () => {
    const callId = await makeCall()
    const d = new Device(mech1)
    const ok = d.op('note', { callId, text: 'first' })
    expect((await d.push([ok])).status).toBe(200)
    d.seq++ // seq 2 is lost on the device
    const late = [d.op('note', { callId, text: 'third' }), d.op('note', { callId, text: 'fourth' })]
    const r = await d.push(late)
    expect(r.status).toBe(409)
    expect(r.body.expectedSeq).toBe(2)
    expect(r.body.data.expectedSeq).toBe(2)
    expect(await countIds('notes', late)).toBe(0)
    expect((await testPool().query('SELECT last_seq FROM sync_clients WHERE id = $1', [d.clientId])).rows[0].last_seq).toBe('1')
  })

  it('refuses a clientId registered to another person', async () => {
    const callId = await makeCall()
    const d = new Device(mech1)
    expect((await d.push([d.op('note', { callId, text: 'mine' })])).status).toBe(200)
    const thief = Object.assign(new Device(mech2), { clientId: d.clientId }) as Device
    thief.seq = 1
    const op = thief.op('note', { callId, text: 'not mine' })
    const r = await thief.push([op])
    expect(r.status).toBe(403)
    expect(await countIds('notes', [op])).toBe(0)
  })
})

describe('push: one bad op', () => {
  it('rejects a malformed op in a batch of 500 with a reason naming the field; the other 499 apply', async () => {
    const callId = await makeCall()
    const d = new Device(mech1)
    const ops = Array.from({ length: 500 }, (_, i) => d.op('reading', reading(callId, i === 236 ? 'twelve' : 100 + i / 10)))
    const r = await d.push(ops)
    expect(r.status).toBe(200)
    expect(r.body.lastSeq).toBe(500)
    const bad = r.body.results.filter((x: any) => x.status !== 'applied')
    expect(bad).toHaveLength(1)
    expect(bad[0]).toMatchObject({ seq: 237, status: 'rejected', reason: expect.stringMatching(/^value: /) })
    expect(await countIds('readings', ops)).toBe(499)
    expect((await testPool().query('SELECT status, reason FROM sync_ops WHERE op_id = $1', [ops[236]!.opId])).rows[0]).toMatchObject({
      status: 'rejected', reason: bad[0].reason,
    })
    // The stored rejection answers the resend, so the device keeps showing why.
    const again = await d.push([ops[236]!])
    expect(again.body.results[0]).toMatchObject({ status: 'duplicate', original: 'rejected', reason: bad[0].reason })
  })

  it('names the field for each kind of bad create, and refuses updates of append-only records', async () => {
    const callId = await makeCall()
    const d = new Device(mech1)
    const ops = [
      d.op('faultCode', { callId, code: 'Q9999' }),
      d.op('clockEvent', { callId, kind: 'lunch' }),
      d.op('signOff', { callId, driverName: 'J. Driver', signature: 'not a data url' }),
      d.op('photo', { callId, sha256: 'abc', contentType: 'image/gif', sizeBytes: 10 }),
      d.op('partLine', { callId, partNumber: 'TR-1', description: 'x', quantity: 0 }),
      d.update('note', randomUUID(), { text: 'edited' }),
      d.op('call', { complaint: 'new call' }),
      d.op('testRun', { callId, cardId: randomUUID(), cardVersion: 1, steps: [] }),
    ]
    const r = await d.push(ops)
    const reasons = r.body.results.map((x: any) => `${x.status} ${x.reason}`)
    expect(reasons[0]).toMatch(/^rejected code: /)
    expect(reasons[1]).toMatch(/^rejected kind: /)
    expect(reasons[2]).toMatch(/^rejected signature: /)
    expect(reasons[3]).toMatch(/^rejected sha256: .*contentType: /)
    expect(reasons[4]).toMatch(/^rejected quantity: /)
    expect(reasons[5]).toMatch(/^rejected action: notes are append-only/)
    expect(reasons[6]).toMatch(/^rejected action: /)
    expect(reasons[7]).toMatch(/^rejected cardVersion: /)
    expect(r.body.lastSeq).toBe(ops.length)
  })
})

describe('push: a row the database refuses', () => {
  it('rejects only the op whose value PostgreSQL refuses (a NUL inside JSON), naming the field; the rest apply', async () => {
    const callId = await makeCall()
    const cardId = await makeTestCard()
    const d = new Device(mech1)
    const ops = [
      d.op('note', { callId, text: 'before' }),
      d.op('testRun', { callId, cardId, cardVersion: 1, steps: [{ id: 's1', note: 'bad \u0000 byte' }] }),
      d.op('note', { callId, text: 'after' }),
      d.update('call', callId, { verification: { roadTest: 'ok \u0000' } }, { verification: null }),
      d.update('call', callId, { storyCause: 'fine' }, { storyCause: null }),
      d.op('note', { callId, text: 'nul \u0000 in text' }),
    ]
    const r = await d.push(ops)
    expect(r.status).toBe(200)
    expect(r.body.results.map((x: any) => x.status)).toEqual(['applied', 'rejected', 'applied', 'rejected', 'applied', 'rejected'])
    expect(r.body.results[1].reason).toMatch(/^steps: the database refused it/)
    expect(r.body.results[3].reason).toMatch(/^verification: the database refused it/)
    expect(r.body.results[5].reason).toMatch(/^text: .*control character \(such as NUL\)/)
    expect(await count('notes', 'id = ANY($1)', [idList(ops)])).toBe(2)
    expect(await count('test_runs', 'id = $1', [ops[1]!.entityId])).toBe(0)
    const row = await callRow(callId)
    expect([row.verification, row.story_cause]).toEqual([null, 'fine'])
    expect(r.body.lastSeq).toBe(ops.length)
  })
})

describe('push: creates only', () => {
  it('writes a test run and the readings taken on it in one push', async () => {
    const callId = await makeCall()
    const cardId = await makeTestCard()
    const d = new Device(mech1)
    const run = d.op('testRun', { callId, cardId, cardVersion: 1, steps: [] })
    const ops = [
      run, d.op('reading', { ...reading(callId), testRunId: run.entityId }),
      d.op('reading', { ...reading(callId, 1e6), testRunId: run.entityId, spec: { nominal: 138.5, tolerancePct: 5 } }),
    ]
    const r = await d.push(ops)
    expect(r.body.results.map((x: any) => x.status)).toEqual(['applied', 'applied', 'applied'])
    const rows = (await testPool().query('SELECT verdict FROM readings WHERE test_run_id = $1 ORDER BY value', [run.entityId])).rows
    // 1e6 Ω against 138.5 Ω ± 5 %: high (the server's judge, shared/utils/spec.ts).
    expect(rows.map(x => x.verdict)).toEqual([null, 'high'])
  })

  it('rejects only the refused create when the push has nothing but creates', async () => {
    const callId = await makeCall()
    const cardId = await makeTestCard()
    const d = new Device(mech1)
    const ops = [
      d.op('note', { callId, text: 'kept' }),
      d.op('testRun', { callId, cardId, cardVersion: 1, steps: [{ note: 'nul \u0000' }] }),
      d.op('note', { callId, text: 'kept too' }),
    ]
    const r = await d.push(ops)
    expect(r.body.results.map((x: any) => x.status)).toEqual(['applied', 'rejected', 'applied'])
    expect(r.body.results[1].reason).toMatch(/^steps: /)
    expect(await countIds('notes', ops)).toBe(2)
  })
})

describe('push: who may write what', () => {
  it('rejects a mechanic\'s ops on another mechanic\'s call as forbidden', async () => {
    const theirs = await makeCall({ mechanicId: IDS.mech2 })
    const mine = await makeCall()
    const d = new Device(mech1)
    const ops = [
      d.op('note', { callId: theirs, text: 'not my call' }),
      d.update('call', theirs, { storyCause: 'x' }, { storyCause: null }),
      d.op('note', { callId: mine, text: 'my call' }),
      d.op('note', { callId: randomUUID(), text: 'no such call' }),
    ]
    const r = await d.push(ops)
    expect(r.body.results.map((x: any) => [x.status, x.reason ?? ''])).toEqual([
      ['rejected', 'forbidden'], ['rejected', 'forbidden'], ['applied', ''], ['rejected', 'forbidden'],
    ])
    expect(await countIds('notes', ops)).toBe(1)
    expect((await callRow(theirs)).story_cause).toBeNull()
  })

  it('rejects a dispatch field from a mechanic, naming it, and applies nothing of that op', async () => {
    const callId = await makeCall()
    const d = new Device(mech1)
    const op = d.update('call', callId, { poNumber: 'PO-1', storyCause: 'ok' }, { poNumber: null, storyCause: null })
    const r = await d.push([op])
    expect(r.body.results[0]).toMatchObject({ status: 'rejected', reason: expect.stringMatching(/^poNumber: a dispatch field/) })
    const row = await callRow(callId)
    expect([row.po_number, row.story_cause]).toEqual([null, null])
  })

  it('lets dispatch push dispatch fields for any call, and office roles append to any call', async () => {
    const callId = await makeCall({ mechanicId: IDS.mech2 })
    const d = new Device(dispatcher)
    const o = new Device(office)
    expect((await d.push([d.update(
      'call', callId, { poNumber: 'PO-77', derate: 'countdown' }, { poNumber: null, derate: 'none' },
    )])).body.results[0].status).toBe('applied')
    expect((await o.push([o.op('note', { callId, text: 'Customer called: driver has the keys.' })])).body.results[0].status).toBe('applied')
    const r = await o.push([o.update('call', callId, { poNumber: 'PO-78' }, { poNumber: 'PO-77' })])
    expect(r.body.results[0]).toMatchObject({ status: 'rejected', reason: expect.stringMatching(/^poNumber: /) })
    expect((await callRow(callId)).po_number).toBe('PO-77')
  })
})

describe('push: merging call fields', () => {
  it('keeps an office edit made meanwhile and stores one conflict with base, device and server values', async () => {
    const callId = await makeCall({ storyCause: 'Sensor suspected' })
    // The office rewrites the cause while the phone is offline (as PATCH /api/calls/[id] would).
    await testPool().query('UPDATE calls SET story_cause = $2 WHERE id = $1', [callId, 'Office: sensor connector corroded'])
    const d = new Device(mech1)
    const op = d.update(
      'call', callId, { storyCause: 'Open circuit in the sensor, 2 MΩ', storyCorrection: 'Replaced sensor' },
      { storyCause: 'Sensor suspected', storyCorrection: null },
    )
    const r = await d.push([op])
    expect(r.body.results[0]).toMatchObject({ status: 'conflict', reason: expect.stringMatching(/^storyCause: changed on the server/) })
    const row = await callRow(callId)
    expect(row.story_cause).toBe('Office: sensor connector corroded')
    expect(row.story_correction).toBe('Replaced sensor') // the other field merged cleanly
    const { rows } = await testPool().query('SELECT * FROM conflicts WHERE call_id = $1', [callId])
    expect(rows).toHaveLength(1)
    expect(rows[0]).toMatchObject({
      field: 'storyCause', status: 'open', base_value: 'Sensor suspected', device_value: 'Open circuit in the sensor, 2 MΩ',
      server_value: 'Office: sensor connector corroded', op_id: op.opId, raised_by: IDS.mech1, entity_id: callId,
    })
    expect(r.body.results[0].version).toBe(row.version)
  })

  it('moves status forward with server times and a timeline row; never backwards; completing a cancelled call conflicts', async () => {
    const callId = await makeCall()
    const d = new Device(mech1)
    const before = Date.now()
    const r1 = await d.push([d.update('call', callId, { status: 'on_site' }, { status: 'assigned' })])
    expect(r1.body.results[0].status).toBe('applied')
    const row = await callRow(callId)
    expect(row.status).toBe('on_site')
    expect(row.on_site_at.getTime()).toBeGreaterThanOrEqual(before - 5000)
    expect(row.status_changed_at.getTime()).toBe(row.on_site_at.getTime())
    expect(await count(
      'call_events', 'call_id = $1 AND kind = \'status\' AND from_status = \'assigned\' AND to_status = \'on_site\' AND by_user_id = $2',
      [callId, IDS.mech1],
    )).toBe(1)

    const r2 = await d.push([d.update('call', callId, { status: 'en_route' }, { status: 'assigned' })])
    expect(r2.body.results[0]).toMatchObject({ status: 'applied', reason: expect.stringMatching(/^status: .*never moves a status back/) })
    expect((await callRow(callId)).status).toBe('on_site')

    const cancelled = await makeCall({ status: 'cancelled' })
    const r3 = await d.push([d.update(
      'call', cancelled, { status: 'completed', outcome: 'repaired' }, { status: 'on_site', outcome: null },
    )])
    expect(r3.body.results[0]).toMatchObject({ status: 'conflict', reason: expect.stringMatching(/^status: the call was cancelled; outcome: /) })
    expect(await callRow(cancelled)).toMatchObject({ status: 'cancelled', outcome: null })
    expect(await count('conflicts', 'call_id = $1 AND field = \'outcome\'', [cancelled])).toBe(1)
    expect(await count('conflicts', 'call_id = $1 AND field = \'status\'', [cancelled])).toBe(1)
  })

  it('completes a call with its outcome, and keeps an invoiced call closed to field changes', async () => {
    const callId = await makeCall({ status: 'on_site' })
    const d = new Device(mech1)
    const r = await d.push([d.update(
      'call', callId, { status: 'completed', outcome: 'repaired', storyCorrection: 'Replaced the sensor' },
      { status: 'on_site', outcome: null, storyCorrection: null },
    )])
    expect(r.body.results[0].status).toBe('applied')
    expect((await callRow(callId))).toMatchObject({ status: 'completed', outcome: 'repaired' })

    const locked = await makeCall({ status: 'invoiced' })
    const r2 = await d.push([d.update('call', locked, { storyCause: 'late edit' }, { storyCause: null })])
    expect(r2.body.results[0]).toMatchObject({
      status: 'conflict', reason: 'storyCause: the call is invoiced and takes no more field changes',
    })
    expect((await callRow(locked)).story_cause).toBeNull()
  })
})

describe('push: in-place updates, photos, sign-off, repeated creates, position', () => {
  it('updates fault codes and test runs in place, and only on own calls', async () => {
    const callId = await makeCall()
    const cardId = await makeTestCard()
    const d = new Device(mech1)
    const fc = d.op('faultCode', { callId, spn: 110, fmi: 0, count: 2 })
    const run = d.op('testRun', { callId, cardId, cardVersion: 1, ambientC: 21.5, steps: [] })
    const readingOnRun = d.op('reading', { ...reading(callId), testRunId: run.entityId, stepId: 's1', spec: { min: 100, max: 200 } })
    const ops = [
      fc, run, readingOnRun,
      d.update('faultCode', fc.entityId, { state: 'stored', clearedAt: '2026-03-01T11:00:00Z', note: 'Cleared after repair' }),
      d.update(
        'testRun', run.entityId, { steps: [{ id: 's1', result: 'pass' }], conclusion: 'Sensor good', finishedAt: '2026-03-01T11:05:00Z' },
      ),
    ]
    const r = await d.push(ops)
    expect(r.body.results.map((x: any) => x.status)).toEqual(['applied', 'applied', 'applied', 'applied', 'applied'])
    expect(r.body.results[3].version).toBe(2)
    const f = (await testPool().query('SELECT * FROM fault_codes WHERE id = $1', [fc.entityId])).rows[0]
    expect(f).toMatchObject({ state: 'stored', note: 'Cleared after repair', count: 2 })
    const t = (await testPool().query('SELECT * FROM test_runs WHERE id = $1', [run.entityId])).rows[0]
    expect(t).toMatchObject({ conclusion: 'Sensor good', steps: [{ id: 's1', result: 'pass' }] })
    // The server judges the reading against its spec itself (138.5 within 100…200).
    expect((await testPool().query('SELECT verdict, test_run_id FROM readings WHERE id = $1', [readingOnRun.entityId])).rows[0]).toEqual({
      verdict: 'pass', test_run_id: run.entityId,
    })

    const other = new Device(mech2)
    const r2 = await other.push([other.update('faultCode', fc.entityId, { state: 'active' })])
    expect(r2.body.results[0]).toMatchObject({ status: 'rejected', reason: 'forbidden' })
  })

  it('treats a repeated create with the same content as a no-op, and a different one under that id as rejected', async () => {
    const callId = await makeCall()
    const d = new Device(mech1)
    const note = d.op('note', { callId, text: 'Belt glazed' })
    await d.push([note])
    const same = d.op('note', { callId, text: 'Belt glazed' }, { entityId: note.entityId })
    const other = d.op('note', { callId, text: 'Something else' }, { entityId: note.entityId })
    const r = await d.push([same, other])
    expect(r.body.results[0]).toMatchObject({ status: 'applied', version: 1 })
    expect(r.body.results[1]).toMatchObject({ status: 'rejected', reason: expect.stringMatching(/^entityId: /) })
    expect(await count('notes', 'id = $1', [note.entityId])).toBe(1)
  })

  it('records photo metadata, one sign-off per call, and the position sent with the push', async () => {
    const callId = await makeCall()
    const d = new Device(mech1)
    const sig = 'data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg=='
    const ops = [
      d.op('photo', { callId, sha256: 'a'.repeat(64), contentType: 'image/jpeg', sizeBytes: 2048, caption: 'Connector' }),
      d.op('signOff', { callId, driverName: 'J. Amundsen', signature: sig }),
      d.op('signOff', { callId, driverName: 'Someone else', signature: sig }),
    ]
    // Dispatch ranks mechanics by this position: put the demo's back afterwards.
    const saved = (await testPool().query('SELECT last_lat, last_lon, last_position_at FROM users WHERE id = $1', [IDS.mech1])).rows[0]
    onTestFinished(async () => {
      await testPool().query(
        'UPDATE users SET last_lat = $2, last_lon = $3, last_position_at = $4 WHERE id = $1',
        [IDS.mech1, saved.last_lat, saved.last_lon, saved.last_position_at],
      )
    })
    const at = new Date(Date.now() - 500).toISOString()
    const r = await d.push(ops, { position: { lat: 45.3, lon: -93.2, at } })
    expect(r.body.results.map((x: any) => x.status)).toEqual(['applied', 'applied', 'rejected'])
    expect(r.body.results[2].reason).toMatch(/^callId: this call already has a sign-off/)
    const p = (await testPool().query('SELECT * FROM photos WHERE id = $1', [ops[0]!.entityId])).rows[0]
    expect(p).toMatchObject({
      sha256: 'a'.repeat(64), content_type: 'image/jpeg', size_bytes: 2048, storage_key: null, created_by: IDS.mech1,
    })
    const u = (await testPool().query('SELECT last_lat, last_lon, last_position_at FROM users WHERE id = $1', [IDS.mech1])).rows[0]
    expect([u.last_lat, u.last_lon, u.last_position_at.toISOString()]).toEqual([45.3, -93.2, at])

    // An older fix sent later does not replace a newer one.
    await d.push([], { position: { lat: 44.9, lon: -93.0, at: new Date(Date.now() - 3_600_000).toISOString() } })
    expect((await testPool().query('SELECT last_lat FROM users WHERE id = $1', [IDS.mech1])).rows[0].last_lat).toBe(45.3)

    const bad = await d.push([], { position: { lat: 95, lon: -93.2, at } })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields).toHaveProperty(['position.lat'])
  })
})

describe('conflicts', () => {
  async function conflictOn(callId: string, d: Device) {
    await testPool().query('UPDATE calls SET follow_up = $2 WHERE id = $1', [callId, 'Office: book a return visit'])
    const r = await d.push([d.update('call', callId, { followUp: 'Device: order the harness' }, { followUp: null })])
    expect(r.body.results[0].status).toBe('conflict')
    return (await testPool().query('SELECT id FROM conflicts WHERE call_id = $1', [callId])).rows[0].id as string
  }

  it('lists open conflicts by role and settles one from the office with the device value', async () => {
    const callId = await makeCall()
    const id = await conflictOn(callId, new Device(mech1))
    const forOffice = await office.get(`/api/conflicts?callId=${callId}`)
    expect(forOffice.body.items.map((c: any) => c.id)).toEqual([id])
    expect((await mech1.get(`/api/conflicts?callId=${callId}`)).body.items).toHaveLength(1)
    expect((await mech2.get(`/api/conflicts?callId=${callId}`)).body.items).toHaveLength(0)
    expect((await mech2.post(`/api/conflicts/${id}/resolve`, { choice: 'device' })).status).toBe(404)

    const r = await office.post(`/api/conflicts/${id}/resolve`, { choice: 'device' })
    expect(r.status).toBe(200)
    expect(r.body.conflict).toMatchObject({
      status: 'resolved', choice: 'device', resolvedBy: IDS.office, resolvedValue: 'Device: order the harness',
    })
    expect((await callRow(callId)).follow_up).toBe('Device: order the harness')
    expect((await office.get(`/api/conflicts?callId=${callId}`)).body.items).toHaveLength(0)
    expect((await office.post(`/api/conflicts/${id}/resolve`, { choice: 'server' })).status).toBe(409)
  })

  it('settles a conflict from the device with a value of its own, and refuses a bad value naming it', async () => {
    const callId = await makeCall()
    const d = new Device(mech1)
    const id = await conflictOn(callId, d)
    const bad = await mech1.post(`/api/conflicts/${id}/resolve`, { choice: 'value', value: 42 })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields).toHaveProperty('value')
    const r = await d.push([d.op('conflictResolution', { conflictId: id, choice: 'value', value: 'Return visit with the harness' })])
    expect(r.body.results[0].status).toBe('applied')
    expect((await callRow(callId)).follow_up).toBe('Return visit with the harness')
    expect((await testPool().query('SELECT status, resolved_by FROM conflicts WHERE id = $1', [id])).rows[0]).toEqual({
      status: 'resolved', resolved_by: IDS.mech1,
    })
  })

  it('will not settle a conflict on an invoiced call by changing the call', async () => {
    const callId = await makeCall({ status: 'completed' })
    const id = await conflictOn(callId, new Device(mech1))
    await testPool().query('UPDATE calls SET status = \'invoiced\' WHERE id = $1', [callId])
    const r = await office.post(`/api/conflicts/${id}/resolve`, { choice: 'device' })
    expect(r.status).toBe(422)
    expect(r.body.data.fields).toHaveProperty('followUp')
    expect((await office.post(`/api/conflicts/${id}/resolve`, { choice: 'server' })).status).toBe(200)
    expect((await callRow(callId)).follow_up).toBe('Office: book a return visit')
  })
})
