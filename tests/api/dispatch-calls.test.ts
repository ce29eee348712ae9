import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { randomUUID } from 'node:crypto'
import { signedIn } from '../support/api'
import { DEMO } from '../support/env'
import { closeTestPool, count, testPool } from '../support/db'
import { seedId } from '../../server/db/seed/ids'

afterAll(closeTestPool)

const PRAIRIE = seedId('customer:prairie')
const PRAIRIE_UNIT = seedId('unit:7')
const IRONWOOD_UNIT = seedId('unit:2')
const uniq = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1e6).toString(36)}`.toUpperCase()

const base = () => ({
  customerId: PRAIRIE, unitId: PRAIRIE_UNIT, locationText: 'Route 8 eastbound, mile 44', lat: 45.29, lon: -93.1,
  complaint: 'Check-engine lamp and low power on the grade', lamps: ['check_engine'], derate: 'derated', loaded: true,
  hazmat: false, safetyNotes: 'Narrow shoulder', poNumber: 'PCH-1', authLimitCents: 150000,
})

const TABLES = ['calls', 'customers', 'units', 'call_events', 'mail_log'] as const
async function counts() {
  const out: Record<string, number> = {}
  for (const t of TABLES) out[t] = await count(t)
  return out
}

let dispatcher: Awaited<ReturnType<typeof signedIn>>
beforeAll(async () => {
  dispatcher = await signedIn(DEMO.dispatcher)
})

describe('POST /api/calls', () => {
  it('takes a call for a picked customer and unit: 201, received, with its first timeline row', async () => {
    const r = await dispatcher.post('/api/calls', base())
    expect(r.status).toBe(201)
    expect(r.body).toMatchObject({
      status: 'received', customerId: PRAIRIE, unitId: PRAIRIE_UNIT, authLimitCents: 150000,
      lamps: ['check_engine'], derate: 'derated', loaded: true,
    })
    expect(r.body.customer.name).toBe('Prairie Cold Haul')
    expect(r.body.unit.id).toBe(PRAIRIE_UNIT)
    expect(r.body.events).toEqual([expect.objectContaining({ kind: 'status', toStatus: 'received', fromStatus: null })])
    expect(r.body.createdBy).toBe(dispatcher.user.id)
    expect(r.body.mail).toBeNull()
  })

  it('takes a new customer and a new unit inline, all in one go', async () => {
    const before = await counts()
    const r = await dispatcher.post('/api/calls', {
      ...base(), customerId: undefined, unitId: undefined,
      newCustomer: {
        name: `Harrow Bend Feed ${uniq()}`, kind: 'owner_operator', billingTerms: 'card', phone: '555-0199', taxExempt: false,
      },
      newUnit: { unitNumber: `HB-${uniq()}`, vin: '1M8GDM9AXKP042788', yearMakeModel: '2016 tractor', odometer: 812000 },
    })
    expect(r.status).toBe(201)
    expect(r.body.customer.kind).toBe('owner_operator')
    expect(r.body.customer.netDays).toBeNull()
    expect(r.body.unit.vin).toBe('1M8GDM9AXKP042788')
    const after = await counts()
    expect(after.calls).toBe(before.calls + 1)
    expect(after.customers).toBe(before.customers + 1)
    expect(after.units).toBe(before.units + 1)
  })

  it('keeps a VIN whose check digit is wrong only with a reason', async () => {
    const vin = '1M8GDM9A5KP042788' // the 49 CFR 565 worked example with its check digit changed
    const without = await dispatcher.post('/api/calls', { ...base(), unitId: undefined, newUnit: { unitNumber: `CD-${uniq()}`, vin } })
    expect(without.status).toBe(400)
    expect(without.body.data.fields['newUnit.vin']).toMatch(/check digit/i)
    const withReason = await dispatcher.post('/api/calls', {
      ...base(), unitId: undefined, newUnit: { unitNumber: `CD-${uniq()}`, vin, vinOverrideReason: 'Imported truck, plate VIN read twice' },
    })
    expect(withReason.status).toBe(201)
    expect(withReason.body.unit).toMatchObject({ vin, vinOverrideReason: 'Imported truck, plate VIN read twice' })
  })

  const bad: [string, () => Record<string, unknown>, number, string, RegExp][] = [
    ['missing customer', () => ({ ...base(), customerId: undefined, unitId: undefined }), 400, 'customerId', /customer/i],
    ['unknown customer', () => ({ ...base(), customerId: randomUUID(), unitId: undefined }), 422, 'customerId', /no such customer/i],
    ['VIN with a letter O', () => ({ ...base(), unitId: undefined, newUnit: { unitNumber: `X-${uniq()}`, vin: '1M8GDM9AXKP0427O8' } }), 400, 'newUnit.vin', /I, O or Q/],
    ['VIN of the wrong length', () => ({ ...base(), unitId: undefined, newUnit: { unitNumber: `X-${uniq()}`, vin: '1M8GDM9AXKP04278' } }), 400, 'newUnit.vin', /17/],
    ['VIN with a dash', () => ({ ...base(), unitId: undefined, newUnit: { unitNumber: `X-${uniq()}`, vin: '1M8GDM9AXKP0427-8' } }), 400, 'newUnit.vin', /letters and digits/],
    ['latitude out of range', () => ({ ...base(), lat: 95 }), 400, 'lat', /-90 to 90/],
    ['longitude out of range', () => ({ ...base(), lon: -181 }), 400, 'lon', /-180 to 180/],
    ['latitude without longitude', () => ({ ...base(), lon: null }), 400, 'lon', /longitude/i],
    ['negative authorization limit', () => ({ ...base(), authLimitCents: -100 }), 400, 'authLimitCents', /negative/],
    ['no complaint', () => ({ ...base(), complaint: '  ' }), 400, 'complaint', /complaint/i],
    ['no location', () => ({ ...base(), locationText: '' }), 400, 'locationText', /where/i],
    ['unknown mechanic', () => ({ ...base(), mechanicId: randomUUID() }), 422, 'mechanicId', /mechanic/i],
    ['a dispatcher as mechanic', () => ({ ...base(), mechanicId: seedId('user:dispatch') }), 422, 'mechanicId', /mechanic/i],
    ['a unit of another customer', () => ({ ...base(), unitId: IRONWOOD_UNIT }), 422, 'unitId', /customer/i],
    ['a new unit whose number the customer already uses', () => ({ ...base(), unitId: undefined, newUnit: { unitNumber: 'PR-149' } }), 422, 'newUnit.unitNumber', /already/],
    ['a new customer with account terms and no net days', () => ({ ...base(), customerId: undefined, unitId: undefined, newCustomer: { name: 'Half Done', billingTerms: 'account' } }), 400, 'newCustomer.netDays', /net days/i],
  ]
  it.each(bad)('refuses %s with %i naming the field, and writes nothing', async (_what, body, status, field, message) => {
    const before = await counts()
    const r = await dispatcher.post('/api/calls', body())
    expect(r.status).toBe(status)
    expect(r.body.data.fields[field]).toMatch(message)
    expect(await counts()).toEqual(before)
  })

  it('refuses a mechanic and the office (403) and writes nothing', async () => {
    const before = await counts()
    for (const email of [DEMO.mech1, DEMO.office]) {
      const c = await signedIn(email)
      expect((await c.post('/api/calls', base())).status, email).toBe(403)
    }
    expect(await counts()).toEqual(before)
  })
})

describe('GET /api/calls/[id]', () => {
  it('answers the whole record of a finished call', async () => {
    const r = await dispatcher.get(`/api/calls/${seedId('call:c6')}`)
    expect(r.status).toBe(200)
    const rec = r.body
    expect(rec.customer.name).toBe('Prairie Cold Haul')
    expect(rec.unit.unitNumber).toBeTruthy()
    expect(rec.mechanic.name).toBe('Priya Haldane')
    expect(rec.faultCodes[0].description).toMatchObject({ label: 'SPN 168 FMI 1' })
    // the shared readings formatter: a no-break space before the unit
    expect(rec.readings.map((x: any) => [x.verdict, x.specText])).toEqual([['low', '13.5–14.5\u00a0V'], ['pass', '13.5–14.5\u00a0V']])
    expect(rec.partLines[0]).toMatchObject({ partNumber: 'TR-ALT-24', quantity: 1 })
    expect(rec.story.cause).toMatch(/Alternator/)
    expect(rec.signOff.driverName).toBe('J. Amundsen')
    expect(rec.signOff.signature).toMatch(/^data:image\//)
    // Seeded clock: travel 0.6 h; work from 5 min after arriving until 1.4 h after arriving.
    expect(rec.time.travelMinutes).toBeCloseTo(36, 6)
    expect(rec.time.laborMinutes).toBeCloseTo(1.4 * 60 - 5, 6)
    expect(rec.events.map((e: any) => e.toStatus)).toEqual(['received', 'assigned', 'en_route', 'on_site', 'completed'])
    expect(rec.changeXid).toBeUndefined()
  })

  it('shows a mechanic their own call and answers 404 for anyone else\'s', async () => {
    const m1 = await signedIn(DEMO.mech1)
    expect((await m1.get(`/api/calls/${seedId('call:c3')}`)).status).toBe(200)
    expect((await m1.get(`/api/calls/${seedId('call:c5')}`)).status).toBe(404)
    expect((await m1.get(`/api/calls/${randomUUID()}`)).status).toBe(404)
    expect((await dispatcher.get('/api/calls/not-a-uuid')).status).toBe(400)
  })
})

describe('PATCH /api/calls/[id]', () => {
  it('saves on the version read, and answers a stale save with 409 and the record as it is now', async () => {
    const { body: call } = await dispatcher.post('/api/calls', base())
    const first = await dispatcher.patch(`/api/calls/${call.id}`, {
      version: call.version, poNumber: 'PCH-2', complaint: 'Low power, lamp flashing',
    })
    expect(first.status).toBe(200)
    expect(first.body.poNumber).toBe('PCH-2')
    expect(first.body.version).toBeGreaterThan(call.version)
    expect(first.body.events.at(-1)).toMatchObject({ kind: 'edited', note: 'Changed complaint, PO number' })

    const other = await signedIn(DEMO.admin)
    const stale = await other.patch(`/api/calls/${call.id}`, { version: call.version, poNumber: 'PCH-3' })
    expect(stale.status).toBe(409)
    expect(stale.body.data.current).toMatchObject({ id: call.id, poNumber: 'PCH-2', version: first.body.version })
    const now = await dispatcher.get(`/api/calls/${call.id}`)
    expect(now.body.poNumber).toBe('PCH-2')
  })

  it('refuses a billed call (422), bad fields (400), and the office and mechanics (403)', async () => {
    const paid = (await dispatcher.get(`/api/calls/${seedId('call:c8')}`)).body
    const r = await dispatcher.patch(`/api/calls/${paid.id}`, { version: paid.version, poNumber: 'late' })
    expect(r.status).toBe(422)
    expect(r.body.data.fields.status).toMatch(/billed/)
    const open = (await dispatcher.get(`/api/calls/${seedId('call:c1')}`)).body
    const noVersion = await dispatcher.patch(`/api/calls/${open.id}`, { poNumber: 'x' })
    expect(noVersion.status).toBe(400)
    expect(noVersion.body.data.fields.version).toBeTruthy()
    const badLat = await dispatcher.patch(`/api/calls/${open.id}`, { version: open.version, lat: -91, lon: 0 })
    expect(badLat.body.data.fields.lat).toMatch(/-90 to 90/)
    for (const email of [DEMO.office, DEMO.mech1]) {
      expect((await (await signedIn(email)).patch(`/api/calls/${open.id}`, { version: open.version, poNumber: 'x' })).status).toBe(403)
    }
    expect((await dispatcher.get(`/api/calls/${open.id}`)).body.version).toBe(open.version)
  })
})

describe('POST /api/calls/[id]/cancel', () => {
  it('cancels with a reason, keeps it on the timeline, and refuses a second cancel', async () => {
    const { body: call } = await dispatcher.post('/api/calls', base())
    expect((await dispatcher.post(`/api/calls/${call.id}/cancel`, { reason: '' })).body.data.fields.reason).toBeTruthy()
    const r = await dispatcher.post(`/api/calls/${call.id}/cancel`, { reason: 'Driver got it going again' })
    expect(r.status).toBe(200)
    expect(r.body).toMatchObject({ status: 'cancelled', cancelReason: 'Driver got it going again' })
    expect(r.body.events.at(-1)).toMatchObject({
      kind: 'status', fromStatus: 'received', toStatus: 'cancelled', note: 'Driver got it going again',
    })
    const again = await dispatcher.post(`/api/calls/${call.id}/cancel`, { reason: 'twice' })
    expect(again.status).toBe(422)
    const { rows } = await testPool().query(
      'SELECT count(*)::int n FROM call_events WHERE call_id = $1 AND to_status = $2', [call.id, 'cancelled'],
    )
    expect(rows[0].n).toBe(1)
  })

  it('refuses to cancel finished work', async () => {
    const done = (await dispatcher.get(`/api/calls/${seedId('call:c6')}`)).body
    const r = await dispatcher.post(`/api/calls/${done.id}/cancel`, { reason: 'Changed our mind' })
    expect(r.status).toBe(422)
    expect((await dispatcher.get(`/api/calls/${done.id}`)).body.status).toBe('completed')
  })
})
