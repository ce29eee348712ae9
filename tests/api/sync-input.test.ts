import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/api'
import { closeTestPool, count } from '../support/db'
import { DEMO } from '../support/env'
import { cleanupSyncData, Device, makeCall } from '../support/sync'

afterAll(async () => {
  await cleanupSyncData()
  await closeTestPool()
})

let mech1: Awaited<ReturnType<typeof signedIn>>
let callId: string
beforeAll(async () => {
  mech1 = await signedIn(DEMO.mech1)
  callId = await makeCall()
})

const raw = (body: BodyInit, headers: Record<string, string> = { 'content-type': 'application/json' }) =>
  mech1.request('POST', '/api/sync/push', { body, headers })

/** Nothing of a refused push may land: no client row, no records. */
async function nothingApplied(d: Device, entityIds: string[] = []) {
  expect(await count('sync_clients', 'id = $1', [d.clientId])).toBe(0)
  expect(await count('notes', 'id = ANY($1)', [entityIds])).toBe(0)
}

describe('push: malformed requests are refused whole', () => {
  it('refuses a body over 2 MB with 413, declared or streamed', async () => {
    const d = new Device(mech1)
    const ops = Array.from({ length: 400 }, () => d.op('note', { callId, text: 'x'.repeat(6000) }))
    const body = JSON.stringify({ clientId: d.clientId, ops })
    expect(body.length).toBeGreaterThan(2 * 1024 * 1024)
    expect((await raw(body)).status).toBe(413)
    // Sent chunked, with no Content-Length to refuse up front: cut off once past the cap.
    const stream = new ReadableStream({
      start(c) { for (let i = 0; i < body.length; i += 65536) c.enqueue(new TextEncoder().encode(body.slice(i, i + 65536))); c.close() },
    })
    const res = await fetch(`${mech1.base}/api/sync/push`, {
      method: 'POST', body: stream, duplex: 'half', headers: {
        'content-type': 'application/json', 'x-wayside': '1', 'cookie': mech1.cookie,
      },
    } as RequestInit)
    expect(res.status).toBe(413)
    await nothingApplied(d, ops.map(o => o.entityId))
  })

  it('refuses deeply nested JSON with 400', async () => {
    const d = new Device(mech1)
    const op = d.op('testRun', { callId, steps: [JSON.parse('['.repeat(40) + ']'.repeat(40))] })
    const r = await raw(JSON.stringify({ clientId: d.clientId, ops: [op] }))
    expect(r.status).toBe(400)
    expect(r.body.message).toMatch(/nests deeper/)
    expect((await raw('{"a":' + '['.repeat(200_000) + ']'.repeat(200_000) + '}')).status).toBe(400)
    await nothingApplied(d)
  })

  it('refuses NaN, a string where a number belongs, an unknown entity and more than 500 ops, naming the field', async () => {
    const d = new Device(mech1)
    const note = d.op('note', { callId, text: 'ok' })
    const nan = JSON.stringify({ clientId: d.clientId, ops: [note] }).replace('"seq":1', '"seq":NaN')
    expect((await raw(nan)).status).toBe(400)

    const asString = await d.push([{ ...note, seq: '1' as unknown as number }])
    expect(asString.status).toBe(400)
    expect(asString.body.data.fields).toHaveProperty(['ops.0.seq'])

    const unknown = await d.push([note, { ...d.op('invoice', {}), seq: 2 }])
    expect(unknown.status).toBe(400)
    expect(unknown.body.data.fields['ops.1.entity']).toMatch(/Unknown entity/)

    d.seq = 0
    const many = Array.from({ length: 501 }, () => d.op('note', { callId, text: 'x' }))
    const tooMany = await d.push(many)
    expect(tooMany.status).toBe(400)
    expect(tooMany.body.data.fields.ops).toMatch(/500/)
    await nothingApplied(d, [note.entityId, ...many.map(o => o.entityId)])
  })

  it('refuses a body that is not an object, ops that are not a list, and an op from another clientId', async () => {
    const d = new Device(mech1)
    expect((await raw('[]')).status).toBe(400)
    expect((await raw('"push"')).status).toBe(400)
    const notList = await d.push({} as never)
    expect(notList.status).toBe(400)
    expect(notList.body.data.fields).toHaveProperty('ops')
    const other = await d.push([{ ...d.op('note', { callId, text: 'x' }), clientId: randomUUID() }])
    expect(other.body.data.fields).toHaveProperty(['ops.0.clientId'])
    await nothingApplied(d)
  })

  it('refuses a push without the X-Wayside header, or sent as a form', async () => {
    const d = new Device(mech1)
    const op = d.op('note', { callId, text: 'forged' })
    const json = JSON.stringify({ clientId: d.clientId, ops: [op] })
    const noHeader = await mech1.request(
      'POST', '/api/sync/push', { body: json, headers: { 'content-type': 'application/json' }, noWaysideHeader: true },
    )
    expect(noHeader.status).toBe(403)
    const form = await raw(
      new URLSearchParams({ clientId: d.clientId, ops: JSON.stringify([op]) }).toString(),
      { 'content-type': 'application/x-www-form-urlencoded' },
    )
    expect(form.status).toBe(415)
    const text = await raw(json, { 'content-type': 'text/plain' })
    expect(text.status).toBe(415)
    await nothingApplied(d, [op.entityId])
  })

  it('refuses a push when signed out', async () => {
    const d = new Device(new (mech1.constructor as typeof import('../support/api').ApiClient)())
    expect((await d.push([d.op('note', { callId, text: 'x' })])).status).toBe(401)
  })
})
