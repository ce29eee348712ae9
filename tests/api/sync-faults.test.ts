import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedIn } from '../support/api'
import { closeTestPool, count, testPool } from '../support/db'
import { DEMO } from '../support/env'
import { ownServerPort, startOwnServer, type OwnServer } from '../support/server'
import { callRow, cleanupSyncData, Device, makeCall, type TestOp } from '../support/sync'

afterAll(async () => {
  await cleanupSyncData()
  await closeTestPool()
})

let running: OwnServer | undefined
afterEach(async () => { await running?.kill(); running = undefined })

async function own(env: Record<string, string> = {}) {
  running = await startOwnServer(ownServerPort(), env)
  return running
}

/** A device on `server` whose queue survives the server: same clientId and ops each time. */
async function deviceOn(server: OwnServer, device?: Device) {
  const api = new ApiClient(server.url)
  await api.login(DEMO.mech1)
  if (!device) return new Device(api)
  return Object.assign(Object.create(Object.getPrototypeOf(device)), device, { api }) as Device
}

const recordsOf = async (callId: string, ops: TestOp[]) => ({
  notes: await count('notes', 'id = ANY($1)', [ops.map(o => o.entityId)]),
  readings: await count('readings', 'id = ANY($1)', [ops.map(o => o.entityId)]),
  statusEvents: await count('call_events', 'call_id = $1 AND kind = \'status\'', [callId]),
  syncOps: await count('sync_ops', 'op_id = ANY($1)', [ops.map(o => o.opId)]),
})

describe('a server killed mid-push', () => {
  it('leaves nothing when killed before commit, everything once when killed after, and the resend duplicates', async () => {
    const callId = await makeCall()
    let server = await own({ WAYSIDE_SYNC_TEST_PAUSE: 'before-commit' })
    const device = await deviceOn(server)
    const ops = [
      device.update('call', callId, { status: 'en_route' }, { status: 'assigned' }),
      ...Array.from({ length: 30 }, (_, i) => device.op('note', { callId, text: `Queued note ${i + 1}` })),
      ...Array.from({ length: 10 }, (_, i) => device.op('reading', {
        callId, label: `Pin ${i}`, quantity: 'voltage', value: 12 + i / 10, unit: 'V',
      })),
    ]

    // 1. Killed inside the transaction, before COMMIT: nothing of the push exists.
    let inFlight = device.push(ops).catch(err => err)
    await server.waitForOutput('[sync-test] paused before-commit')
    await server.kill()
    expect(await inFlight).toBeInstanceOf(Error)
    expect(await recordsOf(callId, ops)).toEqual({ notes: 0, readings: 0, statusEvents: 0, syncOps: 0 })
    expect(await count('sync_clients', 'id = $1', [device.clientId])).toBe(0)
    expect((await callRow(callId)).status).toBe('assigned')

    // 2. Restarted; the device sends the same queue; killed after COMMIT, before the answer.
    server = await own({ WAYSIDE_SYNC_TEST_PAUSE: 'after-commit' })
    let again = await deviceOn(server, device)
    inFlight = again.push(ops).catch(err => err)
    await server.waitForOutput('[sync-test] paused after-commit')
    await server.kill()
    expect(await inFlight).toBeInstanceOf(Error)
    const once = { notes: 30, readings: 10, statusEvents: 1, syncOps: ops.length }
    expect(await recordsOf(callId, ops)).toEqual(once)

    // 3. Restarted once more; the device never heard back, so it sends the queue a third time.
    server = await own()
    again = await deviceOn(server, device)
    const r = await again.push(ops)
    expect(r.status).toBe(200)
    expect(r.body.lastSeq).toBe(ops.length)
    expect(new Set(r.body.results.map((x: any) => x.status))).toEqual(new Set(['duplicate']))
    expect(r.body.results.every((x: any) => x.original === 'applied')).toBe(true)
    expect(await recordsOf(callId, ops)).toEqual(once)
    expect((await callRow(callId)).status).toBe('en_route')
  }, 240_000)

  it('retries a serialization failure inside the push and applies every op exactly once', async () => {
    const callId = await makeCall()
    const server = await own({ WAYSIDE_SYNC_TEST_SERIALIZATION_FAILURES: '2' })
    const device = await deviceOn(server)
    const ops = [
      device.update('call', callId, { status: 'on_site' }, { status: 'assigned' }),
      ...Array.from({ length: 25 }, (_, i) => device.op('note', { callId, text: `Retried note ${i + 1}` })),
    ]
    const r = await device.push(ops)
    expect(r.status).toBe(200)
    expect(r.body.results.every((x: any) => x.status === 'applied')).toBe(true)
    expect(server.output().match(/\[sync\] push retried \(attempt \d\) after SQLSTATE 40001/g)).toHaveLength(2)
    expect(await recordsOf(callId, ops)).toEqual({ notes: 25, readings: 0, statusEvents: 1, syncOps: ops.length })
  }, 120_000)
})

describe('a push that stays contended', () => {
  it('answers 503 with Retry-After once every retry failed, applies nothing, and takes the resend', async () => {
    const callId = await makeCall()
    // withTxRetry makes 8 attempts; all 8 fail here, the next push finds the way clear.
    const server = await own({ WAYSIDE_SYNC_TEST_SERIALIZATION_FAILURES: '8' })
    const device = await deviceOn(server)
    const ops = Array.from({ length: 5 }, (_, i) => device.op('note', { callId, text: `Contended ${i}` }))
    const busy = await device.push(ops)
    expect(busy.status).toBe(503)
    expect(busy.headers.get('retry-after')).toBe('2')
    expect(await recordsOf(callId, ops)).toEqual({ notes: 0, readings: 0, statusEvents: 0, syncOps: 0 })
    const r = await device.push(ops)
    expect(r.body.results.map((x: any) => x.status)).toEqual(Array(5).fill('applied'))
    expect(await recordsOf(callId, ops)).toEqual({ notes: 5, readings: 0, statusEvents: 0, syncOps: 5 })
  }, 120_000)
})

describe('memory under oversized and hostile bodies', () => {
  it('refuses 50 oversized pushes at once and 20 deeply nested ones without buffering them, and still works', async () => {
    const server = await own()
    const device = await deviceOn(server)
    const callId = await makeCall()
    const warm = await device.push([device.op('note', { callId, text: 'warm-up' })])
    expect(warm.status).toBe(200)
    const before = { rss: server.rssKb(), peak: server.peakRssKb() }

    // All at once: a server that read these 3 MB bodies before refusing would hold 150 MB at its peak.
    const big = JSON.stringify({ clientId: device.clientId, ops: [], pad: 'x'.repeat(3 * 1024 * 1024) })
    const answers = await Promise.all(Array.from({ length: 50 }, () =>
      device.api.request('POST', '/api/sync/push', { body: big, headers: { 'content-type': 'application/json' } })))
    expect(answers.map(r => r.status)).toEqual(Array(50).fill(413))
    const deep = `{"clientId":"${device.clientId}","ops":[],"x":${'['.repeat(900_000)}${']'.repeat(900_000)}}`
    for (let i = 0; i < 20; i++) {
      const r = await device.api.request('POST', '/api/sync/push', { body: deep, headers: { 'content-type': 'application/json' } })
      expect(r.status).toBe(400)
    }

    // Generous bounds; the point is the order of magnitude, not a figure.
    expect(server.peakRssKb() - before.peak).toBeLessThan(100 * 1024)
    expect(server.rssKb() - before.rss).toBeLessThan(100 * 1024)
    const ok = await device.push([device.op('note', { callId, text: 'still here' })])
    expect(ok.status).toBe(200)
    expect(ok.body.results[0].status).toBe('applied')
  }, 120_000)
})

describe('many devices at once', () => {
  let mech1: Awaited<ReturnType<typeof signedIn>>
  beforeAll(async () => { mech1 = await signedIn(DEMO.mech1) })

  it('takes twenty concurrent pushes from different devices to one call: no errors, everything applied once', async () => {
    const callId = await makeCall({ status: 'en_route' })
    const devices = Array.from({ length: 20 }, () => new Device(mech1))
    const batches = devices.map((d, i) => [
      d.update('call', callId, { status: 'on_site' }, { status: 'en_route' }),
      d.op('clockEvent', { callId, kind: 'arrive' }),
      ...Array.from({ length: 5 }, (_, j) => d.op('note', { callId, text: `Device ${i}, note ${j}` })),
      d.op('reading', { callId, label: `Device ${i} battery`, quantity: 'voltage', value: 12.6, unit: 'V' }),
    ])
    const answers = await Promise.all(devices.map((d, i) => d.push(batches[i]!)))
    expect(answers.map(a => a.status)).toEqual(Array(20).fill(200))
    for (const a of answers) expect(a.body.results.map((x: any) => x.status)).toEqual(Array(8).fill('applied'))
    const all = batches.flat()
    expect(await count('notes', 'id = ANY($1)', [all.map(o => o.entityId)])).toBe(100)
    expect(await count('clock_events', 'call_id = $1', [callId])).toBe(20)
    expect(await count('readings', 'call_id = $1', [callId])).toBe(20)
    // One status move however many devices reported it.
    expect(await count('call_events', 'call_id = $1 AND kind = \'status\' AND to_status = \'on_site\'', [callId])).toBe(1)
    expect((await testPool().query(
      'SELECT count(*)::int AS n FROM sync_clients WHERE id = ANY($1) AND last_seq = 8', [devices.map(d => d.clientId)],
    )).rows[0].n).toBe(20)
  })
})
