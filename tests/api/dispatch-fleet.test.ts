import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { randomUUID } from 'node:crypto'
import { signedIn } from '../support/api'
import { DEMO } from '../support/env'
import { closeTestPool, count } from '../support/db'
import { seedId } from '../../server/db/seed/ids'

afterAll(closeTestPool)

const uniq = () => `${Date.now().toString(36)}${Math.floor(Math.random() * 1e6).toString(36)}`.toUpperCase()
let dispatcher: Awaited<ReturnType<typeof signedIn>>
beforeAll(async () => {
  dispatcher = await signedIn(DEMO.dispatcher)
})

describe('customers', () => {
  it('adds, reads, lists by search and edits a customer', async () => {
    const name = `Cinder Flats Haulage ${uniq()}`
    const created = await dispatcher.post('/api/customers', {
      name, billingTerms: 'account', netDays: 30, billingEmail: ' AP@Cinder.Example ', phone: '555-0177', taxExempt: true,
      notes: 'Gate code 4411',
    })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({
      name, kind: 'fleet', billingTerms: 'account', netDays: 30, billingEmail: 'ap@cinder.example', taxExempt: true,
    })
    const got = await dispatcher.get(`/api/customers/${created.body.id}`)
    expect(got.body).toMatchObject({ name, sites: [], units: [] })
    const found = await dispatcher.get(`/api/customers?q=${encodeURIComponent(name.slice(0, 20))}`)
    expect(found.body.items.map((c: any) => c.id)).toContain(created.body.id)
    const edited = await dispatcher.patch(`/api/customers/${created.body.id}`, {
      version: created.body.version, billingTerms: 'card', phone: '',
    })
    expect(edited.status).toBe(200)
    expect(edited.body).toMatchObject({ billingTerms: 'card', netDays: null, phone: null })
    const stale = await dispatcher.patch(`/api/customers/${created.body.id}`, { version: created.body.version, name: 'Overwrite' })
    expect(stale.status).toBe(409)
    expect(stale.body.data.current).toMatchObject({ name, billingTerms: 'card' })
  })

  it.each([
    ['no name', { billingTerms: 'card' }, 'name'],
    ['account terms without net days', { name: 'A', billingTerms: 'account' }, 'netDays'],
    ['net days over 180', { name: 'A', billingTerms: 'account', netDays: 365 }, 'netDays'],
    ['a bad billing e-mail', { name: 'A', billingTerms: 'card', billingEmail: 'not-mail' }, 'billingEmail'],
    ['unknown billing terms', { name: 'A', billingTerms: 'barter' }, 'billingTerms'],
  ])('refuses %s (400 naming the field) and writes nothing', async (_w, body, field) => {
    const before = await count('customers')
    const r = await dispatcher.post('/api/customers', body)
    expect(r.status).toBe(400)
    expect(r.body.data.fields[field]).toBeTruthy()
    expect(await count('customers')).toBe(before)
  })

  it('sorts and pages the list', async () => {
    const p1 = await dispatcher.get('/api/customers?sort=name&dir=asc&pageSize=2&page=1')
    const p2 = await dispatcher.get('/api/customers?sort=name&dir=asc&pageSize=2&page=2')
    expect(p1.body.items).toHaveLength(2)
    expect(p1.body.total).toBeGreaterThanOrEqual(6)
    const names = [...p1.body.items, ...p2.body.items].map((c: any) => c.name)
    expect(names).toEqual([...names].sort((a, b) => a.localeCompare(b)))
    const ironwood = (await dispatcher.get('/api/customers?q=Ironwood')).body.items[0]
    // Other test files add units of their own to Ironwood (the invoice PDF test does): compare with the table.
    expect(ironwood.unitCount).toBe(await count('units', 'customer_id = $1', [ironwood.id]))
    expect(ironwood.unitCount).toBeGreaterThanOrEqual(5) // the five seeded units
    expect(ironwood.openCalls).toBeGreaterThanOrEqual(2)
    expect((await dispatcher.get('/api/customers?sort=bogus')).status).toBe(400)
  })

  it('adds a yard to a customer for the call pick list', async () => {
    const id = seedId('customer:okonkwo')
    const bad = await dispatcher.post(`/api/customers/${id}/sites`, { name: 'Home lot', lat: 123, lon: 0 })
    expect(bad.body.data.fields.lat).toBeTruthy()
    const r = await dispatcher.post(`/api/customers/${id}/sites`, {
      name: `Home lot ${uniq()}`, address: 'Millrace', lat: 45.24, lon: -93.32,
    })
    expect(r.status).toBe(201)
    expect((await dispatcher.get(`/api/customers/${id}`)).body.sites.map((s: any) => s.id)).toContain(r.body.id)
    expect((await dispatcher.post(`/api/customers/${randomUUID()}/sites`, { name: 'X', lat: 1, lon: 1 })).status).toBe(404)
  })

  it('is closed to mechanics', async () => {
    const m = await signedIn(DEMO.mech1)
    expect((await m.get('/api/customers')).status).toBe(403)
    expect((await m.post('/api/customers', { name: 'X', billingTerms: 'card' })).status).toBe(403)
  })
})

describe('units', () => {
  const customerId = seedId('customer:bluestem')

  it('adds a unit with a valid VIN, finds it, edits it, and refuses a stale edit', async () => {
    const unitNumber = `BA-${uniq()}`
    const r = await dispatcher.post('/api/units', {
      customerId, unitNumber, vin: ' 1m8gdm9axkp042788 ', yearMakeModel: '2019 dump truck', engine: '13 L diesel',
      odometer: 402113, engineHours: 9120.5,
    })
    expect(r.status).toBe(201)
    expect(r.body).toMatchObject({ unitNumber, vin: '1M8GDM9AXKP042788', vinOverrideReason: null, odometerUnit: 'km', engineHours: 9120.5 })
    const list = await dispatcher.get(`/api/units?customerId=${customerId}&q=${unitNumber}`)
    expect(list.body.items.map((u: any) => u.id)).toEqual([r.body.id])
    expect(list.body.items[0].customer.name).toBe('Bluestem Aggregate Co.')
    const edited = await dispatcher.patch(`/api/units/${r.body.id}`, { version: r.body.version, odometer: 402500 })
    expect(edited.body.odometer).toBe(402500)
    const stale = await dispatcher.patch(`/api/units/${r.body.id}`, { version: r.body.version, odometer: 1 })
    expect(stale.status).toBe(409)
    expect(stale.body.data.current.odometer).toBe(402500)
  })

  it.each([
    ['a VIN of 16 characters', { vin: '1M8GDM9AXKP04278' }, 400, 'vin', /17/],
    ['a VIN with I', { vin: '1M8GDM9AXKP0427I8' }, 400, 'vin', /I, O or Q/],
    ['a VIN with Q', { vin: 'QM8GDM9AXKP042788' }, 400, 'vin', /I, O or Q/],
    ['a VIN with a space inside', { vin: '1M8GDM9AX P042788' }, 400, 'vin', /letters and digits/],
    ['a wrong check digit and no reason', { vin: '1M8GDM9A5KP042788' }, 400, 'vin', /Check digit/],
    ['negative engine hours', { engineHours: -1 }, 400, 'engineHours', /below 0/],
    ['no unit number', { unitNumber: ' ' }, 400, 'unitNumber', /unit number/],
    ['a unit number the customer already uses', { unitNumber: 'BL-170' }, 422, 'unitNumber', /already/],
    ['an unknown customer', { customerId: randomUUID() }, 422, 'customerId', /customer/],
  ])('refuses %s, naming the field, and writes nothing', async (_w, extra, status, field, message) => {
    const before = await count('units')
    const r = await dispatcher.post('/api/units', { customerId, unitNumber: `BA-${uniq()}`, ...extra })
    expect(r.status).toBe(status)
    expect(r.body.data.fields[field]).toMatch(message)
    expect(await count('units')).toBe(before)
  })

  it('keeps a wrong check digit with a reason, and drops a needless reason', async () => {
    const kept = await dispatcher.post('/api/units', {
      customerId, unitNumber: `BA-${uniq()}`, vin: '1M8GDM9A5KP042788', vinOverrideReason: 'Glider kit, VIN as stamped',
    })
    expect(kept.body.vinOverrideReason).toBe('Glider kit, VIN as stamped')
    const fixed = await dispatcher.patch(`/api/units/${kept.body.id}`, { version: kept.body.version, vin: '1M8GDM9AXKP042788' })
    expect(fixed.body).toMatchObject({ vin: '1M8GDM9AXKP042788', vinOverrideReason: null })
  })

  it('shows a unit\'s history with comebacks flagged', async () => {
    // Seed: unit 2 had SPN 3516 FMI 18 on c10 (20 days ago) and again on c11 (8 days ago).
    const r = await dispatcher.get(`/api/units/${seedId('unit:2')}`)
    expect(r.status).toBe(200)
    const byId = Object.fromEntries(r.body.calls.map((c: any) => [c.id, c]))
    const c11 = byId[seedId('call:c11')], c10 = byId[seedId('call:c10')]
    expect(c11.comebacks).toEqual([
      expect.objectContaining({ earlierCallId: seedId('call:c10'), code: 'SPN 3516 FMI 18', earlierNumber: c10.number }),
    ])
    expect(c11.comebacks[0].days).toBeCloseTo(12, 6)
    expect(c10.repeatedBy).toHaveLength(1)
    expect(c10.comebacks).toEqual([])
    expect(c11.partLines[0].partNumber).toBe('TR-CONN-6')
    expect(c11.story.cause).toMatch(/connector/)
    expect(c11.faultCodes[0].description.label).toBe('SPN 3516 FMI 18')
    // Seed: unit 14's open call c4 (P0118) repeats c12 from 25 days ago.
    const u14 = await dispatcher.get(`/api/units/${seedId('unit:14')}`)
    const c4 = u14.body.calls.find((c: any) => c.id === seedId('call:c4'))
    expect(c4.comebacks.map((x: { code: string }) => x.code)).toEqual(['P0118'])
    // Seed: unit 7's knock (c13, 45 days ago) is too old to make anything a comeback.
    const u7 = await dispatcher.get(`/api/units/${seedId('unit:7')}`)
    const c13 = u7.body.calls.find((c: any) => c.id === seedId('call:c13'))
    expect(c13.faultCodes.map((f: any) => f.description.label)).toEqual(['SPN 100 FMI 1'])
    expect([c13.comebacks, c13.repeatedBy]).toEqual([[], []])
  })

  it('lets a mechanic read a unit only through a call of theirs, and only their calls on it', async () => {
    const m1 = await signedIn(DEMO.mech1)
    const own = await m1.get(`/api/units/${seedId('unit:2')}`)
    expect(own.status).toBe(200)
    expect(own.body.calls.every((c: any) => c.mechanic?.id === m1.user.id)).toBe(true)
    expect((await m1.get(`/api/units/${seedId('unit:8')}`)).status).toBe(404)
    expect((await m1.get('/api/units')).status).toBe(403)
    expect((await m1.patch(`/api/units/${seedId('unit:2')}`, { version: 1, odometer: 5 })).status).toBe(403)
  })
})

describe('lists the office needs', () => {
  it('mechanics with duty, position and load; service trucks', async () => {
    const m = await dispatcher.get('/api/mechanics')
    expect(m.body.items.map((x: any) => x.name)).toEqual(expect.arrayContaining(['Marco Lindqvist', 'Priya Haldane', 'Tomasz Reyes']))
    const marco = m.body.items.find((x: any) => x.name === 'Marco Lindqvist')
    expect(marco.openCalls).toBeGreaterThanOrEqual(2)
    expect(m.body.items.find((x: any) => x.name === 'Tomasz Reyes').onDuty).toBe(false)
    expect(m.body.items.every((x: any) => !('passwordHash' in x))).toBe(true)
    const t = await dispatcher.get('/api/service-trucks')
    expect(t.body.items.map((x: any) => x.name)).toEqual(expect.arrayContaining(['Truck 11', 'Truck 12', 'Truck 21']))
    expect((await (await signedIn(DEMO.mech1)).get('/api/mechanics')).status).toBe(403)
  })
})
