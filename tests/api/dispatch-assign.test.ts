import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { randomUUID } from 'node:crypto'
import { signedIn } from '../support/api'
import { DEMO } from '../support/env'
import { closeTestPool, count, testPool } from '../support/db'
import { caughtMail, clearMail, waitForMail } from '../support/mail'
import { seedId } from '../../server/db/seed/ids'

afterAll(closeTestPool)

// Haversine written out here again, not imported, so the ranking is checked by a second hand.
// Formula and R = 6371.0 km as in the Rosetta Code worked example (REFERENCES §9).
function kmBetween(aLat: number, aLon: number, bLat: number, bLon: number) {
  const rad = Math.PI / 180
  const s1 = Math.sin(((bLat - aLat) * rad) / 2)
  const s2 = Math.sin(((bLon - aLon) * rad) / 2)
  const h = s1 * s1 + Math.cos(aLat * rad) * Math.cos(bLat * rad) * s2 * s2
  return 2 * 6371.0 * Math.asin(Math.sqrt(h))
}

let dispatcher: Awaited<ReturnType<typeof signedIn>>
beforeAll(async () => {
  dispatcher = await signedIn(DEMO.dispatcher)
})

const newCall = async (extra: Record<string, unknown> = {}) => {
  const r = await dispatcher.post('/api/calls', {
    customerId: seedId('customer:bluestem'), unitId: seedId('unit:12'), locationText: 'Gravel Pit Road at the scale', lat: 45.2, lon: -93.2,
    complaint: 'Air pressure will not build', ...extra,
  })
  expect(r.status).toBe(201)
  return r.body
}

/** The expected order, worked out from the database's mechanics with this file's own haversine. */
async function expectedOrder(callId: string, lat: number | null, lon: number | null) {
  const { rows } = await testPool().query(`
    SELECT u.id, u.name, u.on_duty, u.last_lat, u.last_lon,
      (SELECT count(*)::int FROM calls c
        WHERE c.mechanic_id = u.id AND c.status IN ('assigned','en_route','on_site') AND c.id <> $1) AS load
    FROM users u WHERE u.role = 'mechanic' AND u.active`, [callId])
  const dist = (r: any) => (lat === null || r.last_lat === null ? Infinity : kmBetween(r.last_lat, r.last_lon, lat, lon!))
  return rows
    .sort((a: any, b: any) => (Number(b.on_duty) - Number(a.on_duty)) || (dist(a) - dist(b)) || (a.load - b.load)
      || a.name.localeCompare(b.name))
    .map((r: any) => ({ id: r.id, km: dist(r) }))
}

describe('GET /api/calls/[id]/suggestions', () => {
  it('ranks on-duty mechanics first, then by distance from their last position, then by load', async () => {
    // Three points: near the north yard, near the south yard, and near mech2's seeded position.
    for (const [lat, lon] of [[45.49, -93.0], [45.08, -93.19], [45.3, -93.39]] as const) {
      const call = await newCall({ lat, lon })
      const r = await dispatcher.get(`/api/calls/${call.id}/suggestions`)
      expect(r.status).toBe(200)
      const want = await expectedOrder(call.id, lat, lon)
      expect(r.body.items.map((x: any) => x.mechanic.id)).toEqual(want.map(w => w.id))
      for (const [i, item] of r.body.items.entries()) {
        const km = want[i]!.km
        if (km === Infinity) {
          expect(item.distanceKm).toBeNull()
          continue
        }
        expect(item.distanceKm).toBeCloseTo(km, 6)
        expect(item.driveMinutes).toBe(Math.ceil((km * 60) / r.body.averageRoadKph - 1e-9))
      }
      // An off-duty mechanic never ranks above an on-duty one.
      const duty = r.body.items.map((x: any) => x.mechanic.onDuty)
      expect(duty).toEqual([...duty].sort((a: boolean, b: boolean) => Number(b) - Number(a)))
    }
  })

  it('ranks by duty and load alone when the call has no position', async () => {
    const call = await newCall({ lat: null, lon: null })
    const r = await dispatcher.get(`/api/calls/${call.id}/suggestions`)
    expect(r.body.callPosition).toBeNull()
    expect(r.body.items.map((x: any) => x.mechanic.id)).toEqual((await expectedOrder(call.id, null, null)).map(w => w.id))
    expect(r.body.items.every((x: any) => x.distanceKm === null)).toBe(true)
  })

  it('uses the average road speed the admin sets', async () => {
    const admin = await signedIn(DEMO.admin)
    const { body: { rates } } = await admin.get('/api/rates')
    const { id: _i, version: _v, createdAt: _c, updatedAt: _u, effectiveFrom: _e, ...values } = rates
    expect((await dispatcher.post('/api/rates', { ...values, averageRoadKph: 50 })).status).toBe(403)
    expect((await admin.post('/api/rates', { ...values, averageRoadKph: 0 })).body.data.fields.averageRoadKph).toBeTruthy()
    try {
      expect((await admin.post('/api/rates', { ...values, averageRoadKph: 50 })).status).toBe(201)
      const call = await newCall({ lat: 45.49, lon: -93.0 })
      const r = await dispatcher.get(`/api/calls/${call.id}/suggestions`)
      expect(r.body.averageRoadKph).toBe(50)
      const first = r.body.items[0]
      expect(first.driveMinutes).toBe(Math.ceil((first.distanceKm * 60) / 50 - 1e-9))
    }
    finally {
      await admin.post('/api/rates', values)
    }
  })

  it('is for dispatch only', async () => {
    const call = await newCall()
    for (const email of [DEMO.office, DEMO.mech1]) {
      expect((await (await signedIn(email)).get(`/api/calls/${call.id}/suggestions`)).status).toBe(403)
    }
  })
})

describe('POST /api/calls/[id]/assign', () => {
  it('assigns, takes the mechanic\'s home truck, records the move and sends exactly one e-mail', async () => {
    const call = await newCall({ safetyNotes: 'Soft shoulder' })
    await clearMail()
    const logBefore = await count('mail_log', 'kind = \'call_assigned\'')
    const r = await dispatcher.post(`/api/calls/${call.id}/assign`, { mechanicId: seedId('user:mech2') })
    expect(r.status).toBe(200)
    expect(r.body).toMatchObject({ status: 'assigned', mechanicId: seedId('user:mech2'), serviceTruckId: seedId('truck:Truck 12') })
    expect(r.body.mail).toEqual({ queued: true })
    expect(r.body.assignedAt).toBeTruthy()
    expect(r.body.events.at(-1)).toMatchObject({
      kind: 'assigned', fromStatus: 'received', toStatus: 'assigned', mechanicId: seedId('user:mech2'),
    })

    const got = await waitForMail(m => m.to.includes(DEMO.mech2))
    await new Promise(res => setTimeout(res, 500))
    const all = (await caughtMail()).filter(m => m.to.includes(DEMO.mech2))
    expect(all).toHaveLength(1)
    expect(got[0]!.subject).toContain(`#${call.number}`)
    for (const part of [
      'Bluestem Aggregate Co.', call.unit.unitNumber, 'Gravel Pit Road at the scale', 'Air pressure will not build', 'Soft shoulder',
    ]) {
      expect(got[0]!.text).toContain(part)
    }
    expect(await count('mail_log', 'kind = \'call_assigned\'')).toBe(logBefore + 1)
    expect(await count(
      'mail_log', 'kind = \'call_assigned\' AND related_id = $1 AND status = \'sent\' AND to_address = $2', [call.id, DEMO.mech2],
    )).toBe(1)
  })

  it('reassigns and keeps the history, with a chosen service truck', async () => {
    const call = await newCall()
    await dispatcher.post(`/api/calls/${call.id}/assign`, { mechanicId: seedId('user:mech1') })
    await clearMail()
    const r = await dispatcher.post(`/api/calls/${call.id}/assign`, {
      mechanicId: seedId('user:mech2'), serviceTruckId: seedId('truck:Truck 21'),
    })
    expect(r.status).toBe(200)
    expect(r.body).toMatchObject({ mechanicId: seedId('user:mech2'), serviceTruckId: seedId('truck:Truck 21'), status: 'assigned' })
    const assigned = r.body.events.filter((e: any) => e.kind === 'assigned')
    expect(assigned.map((e: any) => [e.mechanicId, e.fromStatus, e.toStatus])).toEqual([
      [seedId('user:mech1'), 'received', 'assigned'],
      [seedId('user:mech2'), 'assigned', 'assigned'],
    ])
    expect(assigned[1].note).toBe('Reassigned from Marco Lindqvist')
    expect(await waitForMail(m => m.to.includes(DEMO.mech2))).toHaveLength(1)
    // The first mechanic no longer sees it.
    expect((await (await signedIn(DEMO.mech1)).get(`/api/calls/${call.id}`)).status).toBe(404)
  })

  it('assigns at intake when the call is taken with a mechanic, with one e-mail', async () => {
    await clearMail()
    const call = await newCall({ mechanicId: seedId('user:mech1') })
    expect(call).toMatchObject({ status: 'assigned', mechanicId: seedId('user:mech1'), serviceTruckId: seedId('truck:Truck 11') })
    expect(call.mail).toEqual({ queued: true })
    expect(call.events.map((e: any) => e.kind)).toEqual(['status', 'assigned'])
    expect(await waitForMail(m => m.to.includes(DEMO.mech1) && m.subject.includes(`#${call.number}`))).toHaveLength(1)
  })

  it('refuses an unknown mechanic, an unknown truck, a cancelled call and other roles, changing nothing', async () => {
    const call = await newCall()
    const events = await count('call_events', 'call_id = $1', [call.id])
    const unknown = await dispatcher.post(`/api/calls/${call.id}/assign`, { mechanicId: randomUUID() })
    expect(unknown.status).toBe(422)
    expect(unknown.body.data.fields.mechanicId).toMatch(/mechanic/)
    const truck = await dispatcher.post(`/api/calls/${call.id}/assign`, { mechanicId: seedId('user:mech1'), serviceTruckId: randomUUID() })
    expect(truck.status).toBe(422)
    expect(truck.body.data.fields.serviceTruckId).toBeTruthy()
    expect((await dispatcher.post(`/api/calls/${call.id}/assign`, {})).body.data.fields.mechanicId).toBeTruthy()
    for (const email of [DEMO.office, DEMO.mech1]) {
      expect((await (await signedIn(email)).post(`/api/calls/${call.id}/assign`, { mechanicId: seedId('user:mech1') })).status).toBe(403)
    }
    expect(await count('call_events', 'call_id = $1', [call.id])).toBe(events)
    expect((await dispatcher.get(`/api/calls/${call.id}`)).body).toMatchObject({ status: 'received', mechanicId: null })

    const cancelled = await dispatcher.post(`/api/calls/${seedId('call:c9')}/assign`, { mechanicId: seedId('user:mech1') })
    expect(cancelled.status).toBe(422)
    expect((await dispatcher.post(`/api/calls/${randomUUID()}/assign`, { mechanicId: seedId('user:mech1') })).status).toBe(404)
  })

  it('the assigned call shows in the mechanic\'s own list', async () => {
    const call = await newCall()
    await dispatcher.post(`/api/calls/${call.id}/assign`, { mechanicId: seedId('user:mech2') })
    const list = await (await signedIn(DEMO.mech2)).get('/api/calls?open=true&pageSize=200')
    expect(list.body.items.map((c: any) => c.id)).toContain(call.id)
  })
})
