import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/api'
import { closeTestPool, testPool } from '../support/db'
import { DEMO } from '../support/env'
import { cleanupSyncData, Device, IDS, idsOf, makeCall, makeTestCard, pullUntil } from '../support/sync'

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

describe('pull: scope', () => {
  it('gives a mechanic only their calls, those calls\' records, units and customers without billing data, plus rates', async () => {
    const mine = await makeCall()
    const theirs = await makeCall({ mechanicId: IDS.mech2 })
    const cardId = await makeTestCard()
    const d = new Device(mech1)
    await d.push([d.op('note', { callId: mine, text: 'mine' })])
    await new Device(mech2).push([])
    const r = await d.pull()
    expect(r.status).toBe(200)
    const { changes } = r.body
    expect(changes.calls.length).toBeGreaterThan(0)
    for (const c of changes.calls) expect(c.mechanicId).toBe(IDS.mech1)
    const callIds = idsOf(changes.calls)
    expect(callIds.has(mine)).toBe(true)
    expect(callIds.has(theirs)).toBe(false)
    for (const key of [
      'faultCodes', 'readings', 'notes', 'photos', 'clockEvents', 'partLines', 'testRuns', 'signOffs', 'callEvents', 'conflicts',
    ]) {
      for (const row of changes[key]) expect(callIds.has(row.callId), `${key} ${row.id}`).toBe(true)
    }
    expect(changes.units.map((u: any) => u.id)).toContain(IDS.unit)
    const customer = changes.customers.find((c: any) => c.id === IDS.customer)
    expect(customer).toMatchObject({ name: 'Prairie Cold Haul' })
    for (const hidden of ['billingEmail', 'billingTerms', 'netDays', 'notes', 'taxExempt']) expect(customer).not.toHaveProperty(hidden)
    expect(changes.rates.length).toBeGreaterThan(0)
    expect(changes.testCards.find((c: any) => c.id === cardId)).toMatchObject({
      currentVersion: 1, version: 1, definition: { steps: expect.any(Array) },
    })
    expect(r.body.lastSeq).toBe(1)
    expect(r.body.cursor).toMatch(/^\d+$/)
    expect(r.body.calls).toBeUndefined()
    for (const c of changes.calls) expect(c).not.toHaveProperty('changeXid')
  })

  it('gives the office everything, billing data included', async () => {
    const theirs = await makeCall({ mechanicId: IDS.mech2 })
    const r = await new Device(office).pull()
    expect(idsOf(r.body.changes.calls).has(theirs)).toBe(true)
    expect(r.body.changes.customers.find((c: any) => c.id === IDS.customer)).toHaveProperty('billingEmail')
  })

  it('refuses another person\'s clientId and a malformed cursor', async () => {
    const d = new Device(mech1)
    await d.push([])
    const spy = Object.assign(new Device(mech2), { clientId: d.clientId }) as Device
    expect((await spy.pull()).status).toBe(403)
    const bad = await mech1.get('/api/sync/pull?cursor=abc')
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields).toHaveProperty('cursor')
  })
})

describe('pull: incremental', () => {
  it('returns only what changed after the cursor, and only what the user may see', async () => {
    const mine = await makeCall()
    const d = new Device(mech1)
    const other = new Device(mech2)
    const before = d.op('note', { callId: mine, text: 'Before the cursor' })
    await d.push([before])
    const start = await pullUntil(d, undefined, seen => idsOf(seen.calls).has(mine) && idsOf(seen.notes).has(before.entityId))
    const start2 = await pullUntil(other, undefined, () => true)
    const note = d.op('note', { callId: mine, text: 'After the cursor' })
    await d.push([note])
    const next = await pullUntil(d, start.cursor, seen => idsOf(seen.notes).has(note.entityId))
    expect(idsOf(next.seen.notes).has(note.entityId)).toBe(true)
    // What the device already has does not come again.
    expect(idsOf(next.seen.notes).has(before.entityId)).toBe(false)
    expect(next.seen.rates ?? []).toHaveLength(0)
    const theirs = await pullUntil(other, start2.cursor, () => true)
    expect(idsOf(theirs.seen.notes).has(note.entityId)).toBe(false)
    expect(idsOf(theirs.seen.calls).has(mine)).toBe(false)
  })

  it('tells the old mechanic to drop a reassigned call and hands the new one the whole call', async () => {
    const callId = await makeCall()
    const d1 = new Device(mech1)
    const d2 = new Device(mech2)
    const oldNote = d1.op('note', { callId, text: 'Written before the reassignment' })
    await d1.push([oldNote])
    const c1 = await pullUntil(d1, undefined, seen => idsOf(seen.notes).has(oldNote.entityId))
    const c2 = await pullUntil(d2, undefined, () => true)
    // Dispatch reassigns the call (as POST /api/calls/[id]/assign does: the call and an 'assigned' event).
    await testPool().query('UPDATE calls SET mechanic_id = $2 WHERE id = $1', [callId, IDS.mech2])
    await testPool().query(`INSERT INTO call_events (call_id, kind, mechanic_id) VALUES ($1, 'assigned', $2)`, [callId, IDS.mech2])

    const gone = await pullUntil(d1, c1.cursor, (_s, revoked) => revoked.has(callId))
    expect(gone.revoked.has(callId)).toBe(true)
    expect(idsOf(gone.seen.calls).has(callId)).toBe(false)
    const got = await pullUntil(d2, c2.cursor, seen => idsOf(seen.calls).has(callId) && idsOf(seen.notes).has(oldNote.entityId))
    expect(idsOf(got.seen.notes).has(oldNote.entityId)).toBe(true)
    expect(got.revoked.size).toBe(0)
  })

  it('returns the open conflicts on the mechanic\u2019s calls', async () => {
    const callId = await makeCall()
    await testPool().query('UPDATE calls SET story_complaint = $2 WHERE id = $1', [callId, 'Office wording'])
    const d = new Device(mech1)
    await d.push([d.update('call', callId, { storyComplaint: 'Device wording' }, { storyComplaint: null })])
    const r = await d.pull()
    const open = r.body.conflicts.filter((c: any) => c.callId === callId)
    expect(open).toHaveLength(1)
    expect(open[0]).toMatchObject({ field: 'storyComplaint', deviceValue: 'Device wording', serverValue: 'Office wording', status: 'open' })
    expect((await new Device(mech2).pull()).body.conflicts.filter((c: any) => c.callId === callId)).toHaveLength(0)
  })
})

describe('pull: a writer that commits late', () => {
  it('still hands out a row whose transaction committed after a later one', async () => {
    const callId = await makeCall()
    const d = new Device(mech1)
    const start = await pullUntil(d, undefined, seen => idsOf(seen.calls).has(callId))

    // A writer takes its transaction id first and holds it open.
    const writer = await testPool().connect()
    const lateId = randomUUID()
    try {
      await writer.query('BEGIN')
      await writer.query(`INSERT INTO notes (id, call_id, text) VALUES ($1, $2, 'Committed late')`, [lateId, callId])
      const lateXid = (await writer.query('SELECT pg_current_xact_id()::text AS x')).rows[0].x as string

      // Another push commits meanwhile, with a higher transaction id.
      const early = d.op('note', { callId, text: 'Committed first' })
      expect((await d.push([early])).body.results[0].status).toBe('applied')

      const during = await d.pull(start.cursor)
      expect(idsOf(during.body.changes.notes).has(lateId)).toBe(false)
      // The cursor stops at the open writer, so the later commit is held back too, not skipped past.
      expect(BigInt(during.body.cursor)).toBeLessThanOrEqual(BigInt(lateXid))
      expect(idsOf(during.body.changes.notes).has(early.entityId)).toBe(false)

      await writer.query('COMMIT')
      const after = await pullUntil(d, during.body.cursor, seen => idsOf(seen.notes).has(lateId) && idsOf(seen.notes).has(early.entityId))
      expect(idsOf(after.seen.notes).has(lateId)).toBe(true)
      expect(idsOf(after.seen.notes).has(early.entityId)).toBe(true)
    }
    finally {
      await writer.query('ROLLBACK').catch(() => {})
      writer.release()
    }
  })
})
