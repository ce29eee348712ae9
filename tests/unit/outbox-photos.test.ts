import { beforeEach, describe, expect, it } from 'vitest'
import { sha256Hex, useFieldStore } from '../../app/stores/field'
import { useSyncStore } from '../../app/stores/sync'
import { readBundle, readOutbox, readPhotoQueue } from '../../app/utils/deviceRead'
import { FakeSyncServer, json } from './fakeSyncServer'
import { CALL_ID, freshDevice, reloadApp, seedCall } from './outbox-support'

let server: FakeSyncServer
beforeEach(async () => {
  await freshDevice()
  await seedCall()
  server = new FakeSyncServer()
})

const jpegish = () => new Uint8Array([0xFF, 0xD8, 0xFF, 0xE0, ...Array.from({ length: 2000 }, (_, i) => i % 251), 0xFF, 0xD9]).buffer

describe('photo queue', () => {
  it('hashes with SHA-256', async () => {
    // FIPS 180-4 example: SHA-256("abc")
    const digest = await sha256Hex(new TextEncoder().encode('abc').buffer as ArrayBuffer)
    expect(digest).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad')
  })

  it('keeps the bytes as an ArrayBuffer, with the op, in one write', async () => {
    const thumb = 'data:image/jpeg;base64,AA=='
    const id = await useFieldStore().addPhoto(CALL_ID, { bytes: jpegish(), contentType: 'image/jpeg', caption: 'Harness', thumb })
    const [q] = await readPhotoQueue()
    expect(q?.id).toBe(id)
    expect(q?.bytes).toBeInstanceOf(ArrayBuffer)
    expect(q?.bytes.byteLength).toBe(2006)
    expect(q?.opApplied).toBe(false)
    const [op] = await readOutbox()
    const changes = { callId: CALL_ID, contentType: 'image/jpeg', sizeBytes: 2006, sha256: q?.sha256, caption: 'Harness' }
    expect(op).toMatchObject({ entity: 'photo', entityId: id, changes })
    expect(op?.changes.thumb).toBeUndefined() // the thumbnail stays on the phone
  })

  it('uploads only after the op is applied, and keeps the bytes until the server confirms the hash', async () => {
    const id = await useFieldStore().addPhoto(CALL_ID, { bytes: jpegish(), contentType: 'image/jpeg' })
    const sync = useSyncStore()
    // 1. The push fails: nothing is uploaded.
    server.script = url => (url === '/api/sync/push' ? json(503, {}) : undefined)
    await sync.runOnce({ fetch: server.fetch })
    expect(server.requests.some(r => r.method === 'PUT')).toBe(false)
    expect(await readPhotoQueue()).toHaveLength(1)
    // 2. The op goes through, the upload answer is not a confirmation: bytes kept, error noted.
    server.script = (url, init) => (init.method === 'PUT' ? json(200, { ok: true }) : undefined)
    await sync.runOnce({ fetch: server.fetch })
    expect(await readOutbox()).toEqual([])
    let [q] = await readPhotoQueue()
    expect(q).toMatchObject({ id, opApplied: true, tries: 1 })
    expect(q?.lastError).toMatch(/did not confirm/)
    // 3. A reload in between loses nothing.
    await reloadApp()
    ;[q] = await readPhotoQueue()
    expect(q?.bytes.byteLength).toBe(2006)
    // 4. The server confirms: the phone's copy goes, the record says uploaded.
    server.script = undefined
    const r = await useSyncStore().runOnce({ fetch: server.fetch })
    expect(r.ok).toBe(true)
    expect(server.photos.get(id)).toBe(q?.sha256)
    expect(await readPhotoQueue()).toEqual([])
    expect((await readBundle(CALL_ID))?.records.photos[id]?.uploadedAt).toBeTruthy()
  })

  it('stops for good when the server keeps the photo as a conflict (a billed call): no upload, no retry', async () => {
    const id = await useFieldStore().addPhoto(CALL_ID, { bytes: jpegish(), contentType: 'image/jpeg' })
    const reason = 'callId: the call is invoiced; the photo is kept for the office to add to a credit note or a follow-up call'
    server.script = async (url, init) => {
      if (url !== '/api/sync/push') return undefined
      const { ops } = JSON.parse(String(init.body)) as { ops: { opId: string, seq: number }[] }
      return json(200, { lastSeq: ops.at(-1)!.seq, results: ops.map(o => ({ opId: o.opId, seq: o.seq, status: 'conflict', reason })) })
    }
    await useSyncStore().runOnce({ fetch: server.fetch })
    await useSyncStore().runOnce({ fetch: server.fetch })
    expect(server.requests.some(r => r.method === 'PUT')).toBe(false)
    expect(await readOutbox()).toEqual([])
    expect(await readPhotoQueue()).toEqual([])
    expect((await readBundle(CALL_ID))?.records.photos[id]?.notAdded).toBe(reason)
  })

  it('keeps the bytes when the server refuses them', async () => {
    await useFieldStore().addPhoto(CALL_ID, { bytes: jpegish(), contentType: 'image/jpeg' })
    server.script = (url, init) => (init.method === 'PUT' ? json(422, { statusText: 'Not an image' }) : undefined)
    await useSyncStore().runOnce({ fetch: server.fetch })
    const [q] = await readPhotoQueue()
    expect(q?.lastError).toMatch(/Not an image/)
    expect(q?.bytes.byteLength).toBe(2006)
  })
})
