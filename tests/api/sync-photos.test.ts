import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/api'
import { closeTestPool, testPool } from '../support/db'
import { DEMO } from '../support/env'
import { cleanupSyncData, Device, IDS, jpegBytes, makeCall, sha256 } from '../support/sync'

afterAll(async () => {
  await cleanupSyncData()
  await closeTestPool()
})

let mech1: Awaited<ReturnType<typeof signedIn>>
let mech2: Awaited<ReturnType<typeof signedIn>>
let office: Awaited<ReturnType<typeof signedIn>>
beforeAll(async () => {
  ;[mech1, mech2, office] = await Promise.all([signedIn(DEMO.mech1), signedIn(DEMO.mech2), signedIn(DEMO.office)])
})

const put = (c: typeof mech1, id: string, bytes: Uint8Array, hash = sha256(bytes), type = 'image/jpeg') =>
  c.request('PUT', `/api/photos/${id}`, { body: bytes, headers: { 'content-type': type, 'x-content-sha256': hash } })

async function photoOp(bytes: Buffer, callId?: string) {
  const call = callId ?? await makeCall()
  const d = new Device(mech1)
  const op = d.op('photo', {
    callId: call, sha256: sha256(bytes), contentType: 'image/jpeg', sizeBytes: bytes.length, caption: 'Chafed harness',
  })
  expect((await d.push([op])).body.results[0].status).toBe('applied')
  return op.entityId
}

describe('photo bytes', () => {
  it('stores checked bytes once; a repeat PUT is a no-op; GET gives them back to those who see the call', async () => {
    const bytes = jpegBytes(2000)
    const id = await photoOp(bytes)
    const r = await put(mech1, id, bytes)
    expect(r.status).toBe(200)
    expect(r.body).toMatchObject({ id, sha256: sha256(bytes), contentType: 'image/jpeg', sizeBytes: bytes.length, stored: 'now' })
    const row = (await testPool().query('SELECT storage_key, uploaded_at FROM photos WHERE id = $1', [id])).rows[0]
    expect(row.storage_key).toBe(`photos:${id}`)
    const uploadedAt = row.uploaded_at.getTime()

    const again = await put(mech1, id, bytes)
    expect(again.status).toBe(200)
    expect(again.body.stored).toBe('already')
    expect((await testPool().query('SELECT uploaded_at FROM photos WHERE id = $1', [id])).rows[0].uploaded_at.getTime()).toBe(uploadedAt)

    for (const c of [mech1, office]) {
      const res = await fetch(`${c.base}/api/photos/${id}`, { headers: { cookie: c.cookie } })
      expect(res.status).toBe(200)
      expect(res.headers.get('content-type')).toBe('image/jpeg')
      expect(Buffer.from(await res.arrayBuffer()).equals(bytes)).toBe(true)
    }
    expect((await mech2.get(`/api/photos/${id}`)).status).toBe(404)
    expect((await put(mech2, id, bytes)).status).toBe(404)
  })

  it('refuses bytes that do not match their hash, naming the header', async () => {
    const bytes = jpegBytes()
    const id = await photoOp(bytes)
    const wrong = await put(mech1, id, bytes, sha256(Buffer.from('other bytes')))
    expect(wrong.status).toBe(422)
    expect(wrong.body.data.fields).toHaveProperty('X-Content-Sha256')
    const tampered = Buffer.from(bytes)
    tampered[30] = tampered[30]! ^ 0xff
    const r = await put(mech1, id, tampered, sha256(bytes))
    expect(r.status).toBe(422)
    expect((await put(mech1, id, bytes, 'not-hex')).status).toBe(400)
    expect((await testPool().query('SELECT storage_key FROM photos WHERE id = $1', [id])).rows[0].storage_key).toBeNull()
  })

  it('refuses text dressed up as a JPEG with 415, whatever the content type says', async () => {
    const text = Buffer.from('this is not a photo, only a file named photo.jpg')
    const callId = await makeCall()
    const d = new Device(mech1)
    const op = d.op('photo', { callId, sha256: sha256(text), contentType: 'image/jpeg', sizeBytes: text.length })
    await d.push([op])
    expect((await put(mech1, op.entityId, text)).status).toBe(415)
    expect((await put(mech1, op.entityId, text, sha256(text), 'application/octet-stream')).status).toBe(415)
    expect((await put(mech1, op.entityId, jpegBytes(), undefined, 'application/json')).status).toBe(415)
    expect((await testPool().query('SELECT storage_key FROM photos WHERE id = $1', [op.entityId])).rows[0].storage_key).toBeNull()
  })

  it('refuses a photo over the size limit with 413 before reading it', async () => {
    const big = jpegBytes(10 * 1024 * 1024) // above the default 10 MB limit (runtimeConfig.photoMaxBytes)
    const id = await photoOp(jpegBytes())
    const r = await put(mech1, id, big)
    expect(r.status).toBe(413)
  })

  it('answers 404 for bytes that arrive before their photo op, then takes them once the op is in', async () => {
    const bytes = jpegBytes()
    const id = randomUUID()
    expect((await put(mech1, id, bytes)).status).toBe(404)
    const callId = await makeCall()
    const d = new Device(mech1)
    await d.push([d.op('photo', { callId, sha256: sha256(bytes), contentType: 'image/jpeg', sizeBytes: bytes.length }, { entityId: id })])
    expect((await put(mech1, id, bytes)).status).toBe(200)
    // Bytes other than the ones the photo op declared are refused even with their own right hash.
    const other = jpegBytes()
    expect((await put(mech1, id, other)).status).toBe(422)
  })

  it('shows upload state in the pull: pending until the bytes arrive', async () => {
    const bytes = jpegBytes()
    const callId = await makeCall({ mechanicId: IDS.mech1 })
    const id = await photoOp(bytes, callId)
    const d = new Device(mech1)
    const before = (await d.pull()).body.changes.photos.find((p: any) => p.id === id)
    expect(before).toMatchObject({ uploaded: false, sha256: sha256(bytes) })
    expect(before).not.toHaveProperty('storageKey')
    await put(mech1, id, bytes)
    expect((await d.pull()).body.changes.photos.find((p: any) => p.id === id)).toMatchObject({ uploaded: true })
  })
})
