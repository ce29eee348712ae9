// Two app servers on one database and one object store (the S3-compatible fake), as behind a load
// balancer without sticky sessions: a session made on one is good on the other, what one takes in
// the other hands out, the sign-in limit counts tries made on either, a queued mail goes out once,
// and each server's health route answers 503 while the object store does not answer.
import { randomUUID } from 'node:crypto'
import { readdirSync, rmSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startS3Fake, s3FakeEnv } from '~~/scripts/fakes/s3-fake'
import { ApiClient, signedInAt } from '../support/api'
import { closeTestPool, testPool } from '../support/db'
import { DEMO } from '../support/env'
import { waitForMail } from '../support/mail'
import { photoByteTests } from '../support/photoTests'
import { ownServerPort, startOwnServer, type OwnServer } from '../support/server'
import { cleanupSyncData, Device, IDS, idsOf, jpegBytes, makeCall, pullUntil, sha256 } from '../support/sync'

const S3_PORT = ownServerPort(8)
const BUCKET = 'wayside-photos-test'
const S3_DIR = join(process.cwd(), '.data', `test-s3-${process.env.WAYSIDE_TEST_SLOT ?? 0}`)

let store: Awaited<ReturnType<typeof startS3Fake>> | undefined
let a: OwnServer
let b: OwnServer

beforeAll(async () => {
  rmSync(S3_DIR, { recursive: true, force: true })
  store = await startS3Fake({ port: S3_PORT, dir: S3_DIR, bucket: BUCKET })
  // Both from the built .output, started side by side; each works the mail queue (the default).
  const env = s3FakeEnv(S3_PORT, BUCKET)
  ;[a, b] = await Promise.all([startOwnServer(ownServerPort(6), env), startOwnServer(ownServerPort(7), env)])
})

afterAll(async () => {
  await Promise.all([a?.kill('SIGTERM'), b?.kill('SIGTERM')])
  await store?.close()
  await cleanupSyncData()
  await closeTestPool()
})

/** Every file the object-store fake keeps, by path under its folder. */
function storedFiles(dir = S3_DIR): string[] {
  return readdirSync(dir, { withFileTypes: true, recursive: true }).filter(e => e.isFile()).map(e => join(e.parentPath, e.name))
}

describe('two app servers, one database, one object store', () => {
  it('takes a session made on one server on the other (no sticky sessions), and a push to one is pulled from the other', async () => {
    const onA = await signedInAt(a.url, DEMO.mech1)
    const onB = new ApiClient(b.url)
    onB.cookie = onA.cookie
    expect((await onB.get('/api/_auth/session')).body).toMatchObject({ user: { email: DEMO.mech1 } })

    const callId = await makeCall({ mechanicId: IDS.mech1 })
    const phone = new Device(onA)
    const note = phone.op('note', { callId, text: 'Pushed through the first server' })
    expect((await phone.push([note])).body.results[0].status).toBe('applied')

    const other = new Device(onB)
    const { seen } = await pullUntil(other, undefined, s => idsOf(s.notes).has(note.entityId))
    expect(seen.notes!.find(n => n.id === note.entityId)).toMatchObject({ text: 'Pushed through the first server', callId })
  })

  it('reads a photo uploaded through one server from the other; its bytes are in the object store, not in a folder', async () => {
    const mech = await signedInAt(a.url, DEMO.mech1)
    const callId = await makeCall({ mechanicId: IDS.mech1 })
    const bytes = jpegBytes(4000)
    const phone = new Device(mech)
    const op = phone.op('photo', { callId, sha256: sha256(bytes), contentType: 'image/jpeg', sizeBytes: bytes.length })
    expect((await phone.push([op])).body.results[0].status).toBe('applied')
    const put = await mech.request('PUT', `/api/photos/${op.entityId}`,
      { body: bytes, headers: { 'content-type': 'image/jpeg', 'x-content-sha256': sha256(bytes) } })
    expect(put.status).toBe(200)

    const office = await signedInAt(b.url, DEMO.office)
    const res = await fetch(`${b.url}/api/photos/${op.entityId}`, { headers: { cookie: office.cookie } })
    expect(res.status).toBe(200)
    expect(Buffer.from(await res.arrayBuffer()).equals(bytes)).toBe(true)
    expect(storedFiles().some(f => f.includes(op.entityId))).toBe(true)
  })

  it('holds the sign-in limit across both servers, tries alternated', async () => {
    const admin = await signedInAt(a.url, DEMO.admin)
    const email = `two-servers-${randomUUID().slice(0, 8)}@wayside.test`
    const password = 'copper lantern meadow'
    expect((await admin.post('/api/users', { email, name: 'Two Servers Person', role: 'office', password })).status).toBe(201)
    const servers = [a, b]
    const limit = Number(process.env.NUXT_LOGIN_MAX_FAILURES ?? 5)
    for (let i = 0; i < limit; i++) {
      const r = await new ApiClient(servers[i % 2]!.url).post('/api/auth/login', { email, password: `wrong guess ${i}` })
      expect(r.status, `try ${i + 1} on server ${i % 2 ? 'B' : 'A'}`).toBe(401)
    }
    // The next try is refused on either server, even with the right password.
    for (const s of servers) {
      const r = await new ApiClient(s.url).post('/api/auth/login', { email, password })
      expect(r.status).toBe(429)
      expect(Number(r.headers.get('retry-after'))).toBeGreaterThan(0)
    }
  })

  it('delivers a queued mail exactly once while both servers work the queue', async () => {
    const dispatcher = await signedInAt(a.url, DEMO.dispatcher)
    const callId = await makeCall({ mechanicId: IDS.mech1 })
    const to = `two-servers-${randomUUID().slice(0, 8)}@ironwood-freight.test`
    expect((await dispatcher.post(`/api/calls/${callId}/share`, { sendTo: to })).status).toBe(200)
    expect(await waitForMail(m => m.to.includes(to), 15_000)).toHaveLength(1)
    // Long enough for each server to poll the queue again (jobsPollSeconds is 1): still one.
    await new Promise(r => setTimeout(r, 3000))
    expect(await waitForMail(m => m.to.includes(to), 100)).toHaveLength(1)
    const log = await testPool().query(`SELECT status FROM mail_log WHERE related_id = $1 AND kind = 'status_link'`, [callId])
    expect(log.rows).toEqual([{ status: 'sent' }])
  })
})

photoByteTests('two servers: the object store', () => a.url)

describe('health for the load balancer', () => {
  it('answers 503 on both servers while the object store does not answer, and 200 again once it is back', async () => {
    for (const s of [a, b]) expect((await fetch(`${s.url}/api/health`)).status).toBe(200)
    await store!.close()
    store = undefined
    for (const s of [a, b]) {
      const r = await fetch(`${s.url}/api/health`)
      expect(r.status).toBe(503)
      expect(Number(r.headers.get('retry-after'))).toBeGreaterThan(0)
      expect(await r.json()).toEqual({ ok: false, database: 'ok', storage: 'down' })
    }
    store = await startS3Fake({ port: S3_PORT, dir: S3_DIR, bucket: BUCKET })
    for (const s of [a, b]) {
      const r = await fetch(`${s.url}/api/health`)
      expect(r.status).toBe(200)
      expect(await r.json()).toEqual({ ok: true, database: 'ok', storage: 'ok' })
    }
  })
})
