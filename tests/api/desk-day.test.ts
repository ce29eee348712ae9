// The dispatcher's and the office's day: a second call for a unit with one open, the mechanic's
// shift, the assignment alarm in the rates, the suggestion's position age, the invoice's sign-off.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/api'
import { DEMO } from '../support/env'
import { closeTestPool, testPool } from '../support/db'
import { seedId } from '../../server/db/seed/ids'

afterAll(closeTestPool)

const PRAIRIE = seedId('customer:prairie')
const uniq = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1e6).toString(36)}`.toUpperCase()
const call = (extra: Record<string, unknown>) => ({
  customerId: PRAIRIE, locationText: 'County 12 at the grain elevator', lat: 45.3, lon: -93.2,
  complaint: 'Trailer lights out on the left side', ...extra,
})

let dispatcher: Awaited<ReturnType<typeof signedIn>>
let admin: Awaited<ReturnType<typeof signedIn>>
let office: Awaited<ReturnType<typeof signedIn>>
let mech1: Awaited<ReturnType<typeof signedIn>>
beforeAll(async () => {
  [dispatcher, admin, office, mech1] = await Promise.all([DEMO.dispatcher, DEMO.admin, DEMO.office, DEMO.mech1].map(signedIn))
})

describe('a second call for a unit that already has an open call', () => {
  it('is answered with the unit\'s other open calls, and the list filters by unit and open', async () => {
    const first = await dispatcher.post('/api/calls', call({ newUnit: { unitNumber: `LT-${uniq()}` } }))
    expect(first.status).toBe(201)
    // A new unit has no other calls.
    expect(first.body.openCallsOnSameUnit).toEqual([])
    const unitId = first.body.unitId as string
    const second = await dispatcher.post('/api/calls', call({ unitId }))
    expect(second.status).toBe(201)
    expect(second.body.openCallsOnSameUnit).toEqual([{ id: first.body.id, number: first.body.number, status: 'received' }])

    const list = await dispatcher.get(`/api/calls?unitId=${unitId}&open=1`)
    expect(list.status).toBe(200)
    expect(list.body.items.map((c: any) => c.id).sort()).toEqual([first.body.id, second.body.id].sort())
    expect(list.body.items.every((c: any) => c.unit.id === unitId && c.complaint)).toBe(true)

    // A cancelled call is no longer open: it drops out of both.
    const reason = 'Same breakdown phoned in twice'
    const cancel = await dispatcher.post(`/api/calls/${first.body.id}/cancel`, { reason, version: first.body.version })
    expect(cancel.status).toBe(200)
    const after = await dispatcher.get(`/api/calls?unitId=${unitId}&open=1`)
    expect(after.body.items.map((c: any) => c.id)).toEqual([second.body.id])
    const third = await dispatcher.post('/api/calls', call({ unitId }))
    expect(third.body.openCallsOnSameUnit.map((c: any) => c.id)).toEqual([second.body.id])
    // open=0 (or no open) lists every call on the unit.
    expect((await dispatcher.get(`/api/calls?unitId=${unitId}&open=0`)).body.total).toBe(3)
  })

  it('refuses a bad unit id or open flag with 400 naming the field', async () => {
    const bad = await dispatcher.get('/api/calls?unitId=not-a-uuid&open=1')
    expect(bad.status).toBe(400)
    expect(Object.keys(bad.body.data.fields)).toEqual(['unitId'])
    const badOpen = await dispatcher.get(`/api/calls?unitId=${seedId('unit:8')}&open=maybe`)
    expect(badOpen.status).toBe(400)
    expect(Object.keys(badOpen.body.data.fields)).toEqual(['open'])
  })
})

describe('on duty', () => {
  const MECH1 = seedId('user:mech1'), MECH2 = seedId('user:mech2')
  const dutyOf = async (id: string) => (await testPool().query('SELECT on_duty FROM users WHERE id = $1', [id])).rows[0].on_duty as boolean

  it('the mechanic ends and starts their own shift', async () => {
    try {
      const off = await mech1.post('/api/me/duty', { onDuty: false })
      expect(off.status).toBe(200)
      expect(off.body).toMatchObject({ id: MECH1, onDuty: false })
      expect(await dutyOf(MECH1)).toBe(false)
      expect((await mech1.get('/api/me/duty')).body).toEqual({ onDuty: false })
      // Off duty ranks them after every mechanic on duty.
      const c = await dispatcher.post('/api/calls', call({ newUnit: { unitNumber: `LT-${uniq()}` } }))
      const s = await dispatcher.get(`/api/calls/${c.body.id}/suggestions`)
      expect(s.body.items.findIndex((i: any) => i.mechanic.id === MECH1))
        .toBeGreaterThan(s.body.items.findLastIndex((i: any) => i.mechanic.onDuty))
      expect((await mech1.post('/api/me/duty', { onDuty: true })).body.onDuty).toBe(true)
      expect(await dutyOf(MECH1)).toBe(true)
    }
    finally { await testPool().query('UPDATE users SET on_duty = true WHERE id = $1', [MECH1]) }
  })

  it('dispatch and the admin set a mechanic\'s duty; the mechanics list shows it', async () => {
    try {
      const r = await dispatcher.post(`/api/mechanics/${MECH2}/duty`, { onDuty: false })
      expect(r.status).toBe(200)
      expect(r.body.onDuty).toBe(false)
      const list = await dispatcher.get('/api/mechanics')
      expect(list.body.items.find((m: any) => m.id === MECH2).onDuty).toBe(false)
      expect((await admin.post(`/api/mechanics/${MECH2}/duty`, { onDuty: true })).body.onDuty).toBe(true)
      expect(await dutyOf(MECH2)).toBe(true)
    }
    finally { await testPool().query('UPDATE users SET on_duty = true WHERE id = $1', [MECH2]) }
  })

  it('refuses a mechanic setting another person, and the office, with 403; nothing changes', async () => {
    expect((await mech1.post(`/api/mechanics/${MECH2}/duty`, { onDuty: false })).status).toBe(403)
    expect((await office.post(`/api/mechanics/${MECH2}/duty`, { onDuty: false })).status).toBe(403)
    expect((await dispatcher.post('/api/me/duty', { onDuty: false })).status).toBe(403)
    expect(await dutyOf(MECH2)).toBe(true)
  })

  it('refuses a bad body with 400 naming onDuty, a bad id naming id, and a non-mechanic with 404', async () => {
    for (const body of [{}, { onDuty: 'yes' }, { onDuty: 1 }, { onDuty: null }]) {
      const r = await mech1.post('/api/me/duty', body)
      expect(r.status).toBe(400)
      expect(Object.keys(r.body.data.fields)).toEqual(['onDuty'])
      const d = await dispatcher.post(`/api/mechanics/${MECH2}/duty`, body)
      expect(d.status).toBe(400)
      expect(Object.keys(d.body.data.fields)).toEqual(['onDuty'])
    }
    const badId = await dispatcher.post('/api/mechanics/nobody/duty', { onDuty: false })
    expect(badId.status).toBe(400)
    expect(Object.keys(badId.body.data.fields)).toEqual(['id'])
    expect((await dispatcher.post(`/api/mechanics/${seedId('user:dispatch')}/duty`, { onDuty: false })).status).toBe(404)
    expect(await dutyOf(MECH1)).toBe(true)
    expect(await dutyOf(MECH2)).toBe(true)
  })
})

describe('the assignment alarm in the rates', () => {
  it('is 10 minutes unless the admin sets it, 1 to 240', async () => {
    const { body: { rates } } = await admin.get('/api/rates')
    expect(rates.assignmentAlarmMinutes).toBe(10)
    const { id: _i, version: _v, createdAt: _c, updatedAt: _u, effectiveFrom: _e, ...values } = rates
    for (const bad of [0, 241, 12.5, '15']) {
      const r = await admin.post('/api/rates', { ...values, assignmentAlarmMinutes: bad })
      expect(r.status).toBe(400)
      expect(Object.keys(r.body.data.fields)).toEqual(['assignmentAlarmMinutes'])
    }
    try {
      expect((await admin.post('/api/rates', { ...values, assignmentAlarmMinutes: 25 })).status).toBe(201)
      // Every signed-in person reads it: the board does.
      expect((await dispatcher.get('/api/rates')).body.rates.assignmentAlarmMinutes).toBe(25)
      const { assignmentAlarmMinutes: _a, ...without } = values
      expect((await admin.post('/api/rates', without)).body.rates.assignmentAlarmMinutes).toBe(10)
    }
    finally { await admin.post('/api/rates', values) }
  })
})

describe('suggestions and the call record', () => {
  it('carry each mechanic\'s position time, the distance unit and the mechanic\'s phone', async () => {
    const c = await dispatcher.post('/api/calls', call({ newUnit: { unitNumber: `LT-${uniq()}` }, mechanicId: seedId('user:mech1') }))
    expect(c.status).toBe(201)
    expect(c.body.mechanic).toMatchObject({ id: seedId('user:mech1'), phone: expect.any(String) })
    const s = await dispatcher.get(`/api/calls/${c.body.id}/suggestions`)
    expect(s.body.distanceUnit).toBe('km') // the seeded rates bill travel per km
    const { rows } = await testPool().query('SELECT id, last_position_at FROM users WHERE role = \'mechanic\' AND active')
    for (const item of s.body.items) {
      const row = rows.find((r: any) => r.id === item.mechanic.id)
      expect(item.mechanic.lastPositionAt === null ? null : new Date(item.mechanic.lastPositionAt).getTime())
        .toBe(row.last_position_at === null ? null : row.last_position_at.getTime())
    }
  })
})

describe('the invoice', () => {
  it('carries the driver\'s sign-off and the story being billed for', async () => {
    const c6 = seedId('call:c6')
    const draft = await office.post('/api/invoices', { callId: c6 })
    expect(draft.status).toBe(201)
    const inv = (await office.get(`/api/invoices/${draft.body.id}`)).body
    const { rows: [so] } = await testPool().query('SELECT driver_name, signature FROM sign_offs WHERE call_id = $1', [c6])
    expect(inv.signOff).toMatchObject({ driverName: so.driver_name, signature: so.signature })
    const { rows: [story] } = await testPool().query('SELECT story_cause, story_correction FROM calls WHERE id = $1', [c6])
    expect(story.story_correction).toBeTruthy()
    expect(inv.call).toMatchObject({ storyCause: story.story_cause, storyCorrection: story.story_correction })
  })
})
