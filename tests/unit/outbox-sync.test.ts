import { beforeEach, describe, expect, it } from 'vitest'
import { useFieldStore } from '../../app/stores/field'
import { useOutboxStore } from '../../app/stores/outbox'
import { useSyncStore } from '../../app/stores/sync'
import { PUSH_BATCH } from '../../app/utils/syncClient'
import { commitChanges } from '../../app/utils/fieldDb'
import { readBundle, readJournal, readOutbox } from '../../app/utils/deviceRead'
import { discardRejected } from '../../app/utils/syncApply'
import { FakeSyncServer, json } from './fakeSyncServer'
import { CALL_ID, demoCall, freshDevice, pullAnswer, reloadApp, seedCall } from './outbox-support'

let server: FakeSyncServer
beforeEach(async () => { await freshDevice(); await seedCall(); server = new FakeSyncServer() })

const note = (text: string) => useFieldStore().addRecord('note', { callId: CALL_ID, text })

describe('sync pass', () => {
  it('pushes the waiting ops in seq order and empties the outbox only for answered ops', async () => {
    await note('one'); await note('two'); await useFieldStore().updateCall(CALL_ID, { status: 'en_route' })
    const sync = useSyncStore()
    const r = await sync.runOnce({ fetch: server.fetch })
    expect(r.ok).toBe(true)
    expect(await readOutbox()).toEqual([])
    expect([...server.stored.keys()]).toEqual([1, 2, 3])
    expect((await readJournal()).map(j => [j.seq, j.status])).toEqual([[3, 'applied'], [2, 'applied'], [1, 'applied']])
    expect(sync.lastSyncAt).not.toBeNull()
  })

  it('treats a captive portal 200 as failure and keeps every op', async () => {
    await note('kept')
    server.script = url => (url === '/api/sync/push'
      ? new Response('<html><body>Accept the Wi-Fi terms</body></html>', { status: 200, headers: { 'content-type': 'text/html' } })
      : undefined)
    const sync = useSyncStore()
    const r = await sync.runOnce({ fetch: server.fetch })
    expect(r).toMatchObject({ ok: false, kind: 'invalid' })
    expect((await readOutbox()).map(e => e.state)).toEqual(['pending'])
    expect(sync.lastSyncAt).toBeNull()
  })

  it('pauses on 401 and keeps the queue; asks for an update on 426', async () => {
    await note('kept')
    server.script = () => json(401, { statusText: 'Sign in first' })
    const sync = useSyncStore()
    expect(await sync.runOnce({ fetch: server.fetch })).toMatchObject({ ok: false, kind: 'signin' })
    expect(sync.paused).toBe('signin')
    expect(await readOutbox()).toHaveLength(1)
    server.script = () => json(426, { statusText: 'Update Wayside' })
    expect(await sync.runOnce({ fetch: server.fetch })).toMatchObject({ ok: false, kind: 'update' })
    expect(sync.paused).toBe('update')
    expect(await readOutbox()).toHaveLength(1)
  })

  it('reports Retry-After of a busy server and keeps the queue', async () => {
    await note('kept')
    server.script = () => json(503, { statusText: 'Busy' }, { 'Retry-After': '30' })
    const r = await useSyncStore().runOnce({ fetch: server.fetch })
    expect(r).toMatchObject({ ok: false, kind: 'server', retryAfterMs: 30_000 })
    expect(await readOutbox()).toHaveLength(1)
  })

  it('keeps the queue when the network fails mid-way', async () => {
    await note('kept')
    server.script = () => { throw new TypeError('Failed to fetch') }
    expect(await useSyncStore().runOnce({ fetch: server.fetch })).toMatchObject({ ok: false, kind: 'offline' })
    expect(await readOutbox()).toHaveLength(1)
  })

  it(`sends at most ${PUSH_BATCH} ops a batch, in seq order`, async () => {
    const changes = Array.from({ length: 1200 }, (_, i) => ({
      entity: 'note' as const, entityId: crypto.randomUUID(), action: 'create' as const, changes: { callId: CALL_ID, text: `n${i}` },
    }))
    await commitChanges(CALL_ID, changes)
    const r = await useSyncStore().runOnce({ fetch: server.fetch })
    expect(r.ok).toBe(true)
    expect(server.requests.filter(q => q.url === '/api/sync/push').map(q => q.ops)).toEqual([500, 500, 200])
    expect(server.lastSeq).toBe(1200)
    expect(await readOutbox()).toEqual([])
  })

  it('keeps a refused op with its reason until discarded; later ops still go', async () => {
    const bad = await useFieldStore().addRecord('reading', { callId: CALL_ID, label: 'x', quantity: 'voltage', value: 1, unit: 'parsec' })
    await note('after')
    server.refuse.set(bad, 'unit: not a known unit')
    const outbox = useOutboxStore()
    const sync = useSyncStore()
    await sync.runOnce({ fetch: server.fetch })
    const left = await readOutbox()
    expect(left.map(e => [e.entityId, e.state, e.reason])).toEqual([[bad, 'rejected', 'unit: not a known unit']])
    expect(outbox.rejected).toHaveLength(1)
    // A second pass does not resend it.
    server.requests = []
    await sync.runOnce({ fetch: server.fetch })
    expect(server.requests.filter(q => q.url === '/api/sync/push')).toEqual([])
    await discardRejected(left[0]!.seq)
    expect(await readOutbox()).toEqual([])
    expect((await readBundle(CALL_ID))?.records.readings[bad]).toBeUndefined()
  })

  it('after a 409, drops ops the server already stored and sends the rest once', async () => {
    await note('a'); await note('b'); await note('c')
    // The server stored 1 and 2 but the answer was lost; this server insists on seq 3 next.
    const strict = server
    await strict.fetch('/api/sync/push', { method: 'POST', body: JSON.stringify({ clientId: 'x', ops: (await readOutbox()).slice(0, 2) }) })
    let first = true
    strict.script = (url, init) => {
      if (url !== '/api/sync/push' || !first) return undefined
      first = false
      const ops = JSON.parse(String(init.body)).ops
      return ops[0].seq < 3 ? json(409, { data: { expectedSeq: 3 } }) : undefined
    }
    const r = await useSyncStore().runOnce({ fetch: strict.fetch })
    expect(r.ok).toBe(true)
    expect(await readOutbox()).toEqual([])
    expect(strict.lastSeq).toBe(3)
    expect(strict.stored.size).toBe(3)
  })

  it('after a 409 for a gap, numbers the waiting ops on from the expected seq', async () => {
    await note('a'); await note('b')
    server.lastSeq = 0
    // Pretend the device's counter ran ahead (ops 1–5 never existed here).
    const ops = await readOutbox()
    const { deviceTx } = await import('../../app/utils/deviceDb')
    await deviceTx(['outbox', 'meta'], 'readwrite', (tx) => {
      const o = tx.objectStore('outbox')
      for (const e of ops) { o.delete(e.seq); o.put({ ...e, seq: e.seq + 5 }, e.seq + 5) }
      tx.objectStore('meta').put(7, 'seq')
    })
    const r = await useSyncStore().runOnce({ fetch: server.fetch })
    expect(r.ok).toBe(true)
    expect([...server.stored.keys()]).toEqual([1, 2])
    await note('c')
    expect((await readOutbox()).map(e => e.seq)).toEqual([3])
  })

  it('sends the position only when given one', async () => {
    await note('a')
    await useSyncStore().runOnce({ fetch: server.fetch })
    await note('b')
    await useSyncStore().runOnce({ fetch: server.fetch, position: { lat: 45.4, lon: -93.2, at: '2026-05-01T10:00:00.000Z' } })
    expect(server.requests.filter(q => q.url === '/api/sync/push').map(q => q.position)).toEqual([
      undefined, { lat: 45.4, lon: -93.2, at: '2026-05-01T10:00:00.000Z' },
    ])
  })
})

describe('pull', () => {
  it('replaces local copies with server rows unless a waiting op touches them', async () => {
    const field = useFieldStore()
    server.pullChanges = { calls: [demoCall({ version: 5, storyCause: 'Office text', locationText: 'Moved to exit 19' })] }
    // The mechanic types while the pass is under way: that change is not sent yet when the pull lands.
    server.script = async (url) => {
      if (url.startsWith('/api/sync/pull')) await field.updateCall(CALL_ID, { storyCause: 'Mine, not sent yet' })
      return undefined
    }
    await useSyncStore().runOnce({ fetch: server.fetch })
    const b = await readBundle(CALL_ID)
    expect(b?.call.locationText).toBe('Moved to exit 19') // server's field
    expect(b?.call.version).toBe(5)
    expect(b?.call.storyCause).toBe('Mine, not sent yet') // still waiting: the phone's value shows
    server.script = undefined
    server.pullChanges = { calls: [demoCall({ version: 6, storyCause: 'Mine, not sent yet', locationText: 'Moved to exit 19' })] }
    await useSyncStore().runOnce({ fetch: server.fetch })
    expect(await readOutbox()).toEqual([])
    await reloadApp()
    expect((await useFieldStore().loadCall(CALL_ID))?.call.version).toBe(6)
  })
})

describe('conflicts', () => {
  it('shows the server value once a change came back as a conflict, and settles it through the outbox', async () => {
    const field = useFieldStore()
    await field.updateCall(CALL_ID, { storyCause: 'Phone text' })
    server.script = (url, init) => {
      if (url !== '/api/sync/push') return undefined
      const [op] = JSON.parse(String(init.body)).ops
      if (!op) return json(200, { lastSeq: server.lastSeq, results: [] })
      server.lastSeq = op.seq
      return json(200, {
        lastSeq: op.seq, results: [{ opId: op.opId, seq: op.seq, status: 'conflict', reason: 'storyCause: changed in the office too' }],
      })
    }
    const conflict = {
      id: '44444444-4444-4444-8444-444444444444', callId: CALL_ID, entity: 'call', entityId: CALL_ID, field: 'storyCause', baseValue: null,
      deviceValue: 'Phone text', serverValue: 'Office text', status: 'open', reason: 'Changed in both places',
    }
    server.pullChanges = { conflicts: [conflict] }
    server.conflicts = [conflict]
    await useSyncStore().runOnce({ fetch: server.fetch })
    expect(await readOutbox()).toEqual([]) // a conflict answer takes the op out: the server holds both values now
    let view = await field.loadCall(CALL_ID)
    expect(view?.call.storyCause).toBe('Office text')
    expect(view?.conflicts.map(c => c.field)).toEqual(['storyCause'])

    await field.resolveConflict(CALL_ID, conflict.id, 'value', 'Both, merged')
    const [op] = await readOutbox()
    expect(op).toMatchObject({
      entity: 'conflictResolution', entityId: conflict.id, action: 'create',
      changes: { conflictId: conflict.id, choice: 'value', value: 'Both, merged' },
    })
    view = await field.loadCall(CALL_ID)
    expect(view?.conflicts[0]?.pendingChoice).toBe('value')
  })
})

describe('paged pull', () => {
  const reading = (id: string) => ({ id, callId: CALL_ID, label: 'Sensor', value: 209.4, unit: 'ohm', quantity: 'resistance' })

  it('follows the server\'s pages while it says more, keeping each page before asking for the next', async () => {
    server.pullPages = [
      { calls: [demoCall({ version: 7, locationText: 'Exit 19' })] },
      { readings: [reading('55555555-5555-4555-8555-555555555551')] },
      { readings: [reading('55555555-5555-4555-8555-555555555552')] },
    ]
    const r = await useSyncStore().runOnce({ fetch: server.fetch })
    expect(r.ok).toBe(true)
    const pulls = server.requests.filter(q => q.url.startsWith('/api/sync/pull'))
    expect(pulls).toHaveLength(3)
    // Each page asks from the cursor the page before it answered.
    expect(pulls.map(q => new URL(q.url, 'http://x').searchParams.get('cursor'))).toEqual(['c1', '1', '2'])
    const b = await readBundle(CALL_ID)
    expect(b?.call.locationText).toBe('Exit 19')
    expect(Object.keys(b?.records.readings ?? {})).toHaveLength(2)
  })

  it('stops with a reason when the server says more without moving on', async () => {
    const stuck = pullAnswer({}, { cursor: '9', more: true })
    server.script = url => (url.startsWith('/api/sync/pull') ? json(200, stuck) : undefined)
    const sync = useSyncStore()
    const r = await sync.runOnce({ fetch: server.fetch })
    expect(r).toMatchObject({ ok: false, kind: 'server' })
    expect(server.requests.filter(q => q.url.startsWith('/api/sync/pull')).length).toBeLessThanOrEqual(2)
    expect(sync.lastSyncAt).toBeNull()
  })
})
