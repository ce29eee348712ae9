// A card customer's driver signs the estimate on the phone before the work: the signed estimate
// through push and pull, who may write it, bad input refused naming the field, the signing time kept
// within the call's bounds, the office's call record, and the billing flags when the bill goes above it.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { seedId } from '~~/server/db/seed/ids'
import { ApiClient, signedIn } from '../support/api'
import { closeTestPool, count, testPool } from '../support/db'
import { DEMO } from '../support/env'
import { cleanupSyncData, Device, makeCall, pullUntil } from '../support/sync'

const CARD = seedId('customer:vossberg')
const anonymous = new ApiClient()
let mech: Awaited<ReturnType<typeof signedIn>>
let mech2: Awaited<ReturnType<typeof signedIn>>
let dispatcher: Awaited<ReturnType<typeof signedIn>>
let office: Awaited<ReturnType<typeof signedIn>>

beforeAll(async () => {
  ;[mech, mech2, dispatcher, office] = await Promise.all([
    signedIn(DEMO.mech1), signedIn(DEMO.mech2), signedIn(DEMO.dispatcher), signedIn(DEMO.office)])
})
afterAll(async () => {
  await cleanupSyncData()
  await closeTestPool()
})

/** A card customer's call with the mechanic at the truck. */
async function cardCall(status = 'on_site') {
  const id = await makeCall({ status })
  await testPool().query('UPDATE calls SET customer_id = $2 WHERE id = $1', [id, CARD])
  return id
}

const signed = (callId: string, extra: Record<string, unknown> = {}) => ({
  callId, driverName: 'Rolf Vossberg', signature: 'data:image/png;base64,iVBORw0KGgo=',
  work: 'Replace the coolant temperature sensor and its pigtail', plannedLaborMinutes: 90,
  plannedParts: [{ partNumber: 'TR-ECT-10K', description: 'Coolant temperature sensor', quantity: 1, unitPriceCents: 12000 }],
  lines: [
    { description: 'Labor 2.0 h', amountCents: 29000, planned: true },
    { description: 'Coolant temperature sensor', amountCents: 15000, planned: true },
  ],
  taxCents: 1088, amountCents: 45088, ...extra,
})

describe('the signed estimate through sync', () => {
  it('is pushed from the phone, kept with its lines, pulled back and shown on the office\'s call record', async () => {
    const callId = await cardCall()
    const d = new Device(mech)
    const op = d.op('estimateSignature', signed(callId))
    const r = await d.push([op])
    expect(r.status).toBe(200)
    expect(r.body.results[0]).toMatchObject({ status: 'applied' })
    const { rows: [row] } = await testPool().query('SELECT * FROM estimate_signatures WHERE id = $1', [op.entityId])
    expect(row).toMatchObject({ call_id: callId, driver_name: 'Rolf Vossberg', amount_cents: 45088, tax_cents: 1088,
      planned_labor_minutes: 90 })
    expect(row.lines).toHaveLength(2)
    // The same op again (the phone lost the answer) is known as a duplicate, not a second signature.
    const again = await d.push([op])
    expect(again.body.results[0]).toMatchObject({ status: 'duplicate' })
    expect(await count('estimate_signatures', 'call_id = $1', [callId])).toBe(1)

    const { seen } = await pullUntil(new Device(mech), undefined, s => (s.estimateSignatures ?? []).some(x => x.id === op.entityId))
    const pulled = (seen.estimateSignatures ?? []).find(x => x.id === op.entityId) as Record<string, unknown> | undefined
    expect(pulled).toMatchObject({ callId, amountCents: 45088, driverName: 'Rolf Vossberg' })
    // The phone learns that this customer's driver signs, not the customer's billing terms.
    const customer = (seen.customers ?? []).find(c => c.id === CARD)
    expect(customer).toMatchObject({ signsEstimate: true })
    expect(customer).not.toHaveProperty('billingTerms')

    const rec = await dispatcher.get(`/api/calls/${callId}`)
    expect(rec.status).toBe(200)
    expect(rec.body.estimateSignatures).toHaveLength(1)
    expect(rec.body.estimateSignatures[0]).toMatchObject({ amountCents: 45088, work: expect.stringMatching(/coolant/) })
    expect(rec.body.repairBeforeSignature).toBe(false)
  })

  it('is append-only: a changed amount is a new signature, an update is refused', async () => {
    const callId = await cardCall()
    const d = new Device(mech)
    const first = d.op('estimateSignature', signed(callId))
    await d.push([first])
    const upd = await d.push([d.update('estimateSignature', first.entityId, { amountCents: 1 })])
    expect(upd.body.results[0]).toMatchObject({ status: 'rejected', reason: expect.stringMatching(/append-only/) })
    const more = signed(callId, { lines: [{ description: 'Labor 3.0 h', amountCents: 43500 }], taxCents: 0, amountCents: 43500 })
    expect((await d.push([d.op('estimateSignature', more)])).body.results[0].status).toBe('applied')
    expect(await count('estimate_signatures', 'call_id = $1', [callId])).toBe(2)
  })

  it('keeps the signing time between the call being taken and the server\'s now', async () => {
    const callId = await cardCall()
    const d = new Device(mech)
    const ahead = d.op('estimateSignature', signed(callId), { at: new Date(Date.now() + 3 * 86_400_000).toISOString() })
    const behind = d.op('estimateSignature', signed(callId), { at: '2020-01-01T00:00:00.000Z' })
    const r = await d.push([ahead, behind])
    expect(r.body.results.map((x: { status: string }) => x.status)).toEqual(['applied', 'applied'])
    const { rows } = await testPool().query(
      `SELECT s.id, s.signed_at, s.device_at, c.received_at FROM estimate_signatures s JOIN calls c ON c.id = s.call_id
       WHERE s.call_id = $1`, [callId])
    const of = (id: string) => rows.find(x => x.id === id)!
    expect(of(ahead.entityId).signed_at.getTime()).toBeLessThanOrEqual(Date.now())
    expect(of(ahead.entityId).device_at.getTime()).toBeGreaterThan(Date.now())
    expect(of(behind.entityId).signed_at.getTime()).toBe(of(behind.entityId).received_at.getTime())
  })
})

describe('who may write it, and bad input', () => {
  it('another mechanic\'s call is refused, and without a session the push answers 401', async () => {
    const callId = await cardCall()
    const d2 = new Device(mech2)
    const theirs = await d2.push([d2.op('estimateSignature', signed(callId))])
    expect(theirs.body.results[0]).toMatchObject({ status: 'rejected', reason: expect.stringMatching(/forbidden|not assigned/i) })
    const a = new Device(anonymous)
    expect((await a.push([a.op('estimateSignature', signed(callId))])).status).toBe(401)
    expect(await count('estimate_signatures', 'call_id = $1', [callId])).toBe(0)
  })

  it('refuses what is not whole cents of at least 0, or does not add up, naming the field; nothing is written', async () => {
    const callId = await cardCall()
    const d = new Device(mech)
    const cases: [Record<string, unknown>, RegExp][] = [
      [{ amountCents: 450.5 }, /amountCents/],
      [{ amountCents: -1 }, /amountCents/],
      [{ amountCents: '45088' }, /amountCents/],
      [{ amountCents: 50000 }, /amountCents.*added up/],
      [{ taxCents: -5 }, /taxCents/],
      [{ driverName: '' }, /driverName/],
      [{ signature: 'my name' }, /signature/],
      [{ work: '' }, /work/],
      [{ lines: [] }, /lines/],
      [{ callId: 'not-a-call' }, /callId/],
    ]
    for (const [extra, reason] of cases) {
      const r = await d.push([d.op('estimateSignature', signed(callId, extra))])
      expect(r.status, JSON.stringify(extra)).toBe(200)
      expect(r.body.results[0], JSON.stringify(extra)).toMatchObject({ status: 'rejected', reason: expect.stringMatching(reason) })
    }
    // A push whose ops are not a list is refused whole, naming the field.
    const whole = await mech.post('/api/sync/push', { clientId: d.clientId, ops: 'estimateSignature' })
    expect(whole.status).toBe(400)
    expect(JSON.stringify(whole.body)).toMatch(/ops/)
    expect(await count('estimate_signatures', 'call_id = $1', [callId])).toBe(0)
  })
})

describe('the bill against the signed estimate', () => {
  /** A finished card call: an hour on the clock from `workFrom`, a part, its invoice drafted. */
  async function finishedCardCall(partAt: Date) {
    const callId = await cardCall('completed')
    await testPool().query(`UPDATE calls SET outcome = 'repaired', completed_at = now(), story_cause = 'Open sensor',
      story_correction = 'Replaced the sensor' WHERE id = $1`, [callId])
    // Tuesday 2026-03-10 10:00 in Chicago: inside the seeded hours.
    const t0 = Date.parse('2026-03-10T15:00:00Z')
    await testPool().query(`INSERT INTO clock_events (call_id, kind, device_at) VALUES ($1, 'work_start', $2), ($1, 'work_stop', $3)`,
      [callId, new Date(t0), new Date(t0 + 60 * 60_000)])
    await testPool().query(`INSERT INTO part_lines (id, call_id, part_number, description, quantity, unit_price_cents, device_at)
      VALUES ($1, $2, 'TR-ECT-10K', 'Coolant temperature sensor', 1, 12000, $3)`, [randomUUID(), callId, partAt])
    return callId
  }
  const sign = (callId: string, amountCents: number, signedAt: Date) => testPool().query(
    `INSERT INTO estimate_signatures (call_id, driver_name, signature, work, lines, tax_cents, amount_cents, signed_at)
     VALUES ($1, 'Rolf Vossberg', 'data:image/png;base64,AAAA', 'Replace the sensor', '[]', 0, $2, $3)`, [callId, amountCents, signedAt])
  const codes = (flags: { code: string }[]) => flags.map(f => f.code)

  it('flags a bill above what the driver signed, by how much; within it, no flag; the invoice lists the signature', async () => {
    const before = new Date('2026-03-10T15:05:00Z')
    const callId = await finishedCardCall(new Date('2026-03-10T15:20:00Z'))
    const draft = await office.post('/api/invoices', { callId })
    expect(draft.status).toBe(201)
    const total = draft.body.totalCents as number
    expect(codes(draft.body.flags)).not.toContain('past_signed_estimate')
    expect(codes(draft.body.flags)).toContain('unsigned_estimate')

    await sign(callId, total - 1000, before)
    const over = await office.get(`/api/invoices/${draft.body.id}`)
    expect(over.status).toBe(200)
    const flag = over.body.flags.find((f: { code: string }) => f.code === 'past_signed_estimate')
    // $10.00 over: the total less the amount signed, 1000 cents.
    expect(flag.text).toMatch(/\$10\.00 over/)
    expect(flag.text).toMatch(/Rolf Vossberg/)
    expect(codes(over.body.flags)).not.toContain('unsigned_estimate')
    expect(over.body.signedEstimates).toHaveLength(1)
    expect(over.body.signedEstimates[0]).toMatchObject({ amountCents: total - 1000, driverName: 'Rolf Vossberg' })

    // The driver signs again for the whole amount: the newest signature is in force.
    await sign(callId, total, new Date('2026-03-10T15:10:00Z'))
    const within = await office.get(`/api/invoices/${draft.body.id}`)
    expect(codes(within.body.flags)).not.toContain('past_signed_estimate')
    const desk = (await office.get('/api/billing/desk')).body.items.find((i: { callId: string }) => i.callId === callId)
    if (desk) expect(codes(desk.flags)).not.toContain('past_signed_estimate')
  })

  it('flags repair recorded before the signature; a fleet on account is never asked', async () => {
    const callId = await finishedCardCall(new Date('2026-03-10T15:02:00Z'))
    await sign(callId, 10_000_000, new Date('2026-03-10T15:30:00Z'))
    const draft = await office.post('/api/invoices', { callId })
    expect(codes(draft.body.flags)).toContain('unsigned_estimate')
    expect((await office.get(`/api/calls/${callId}`)).body.repairBeforeSignature).toBe(true)

    const fleet = await finishedCardCall(new Date('2026-03-10T15:02:00Z'))
    await testPool().query('UPDATE calls SET customer_id = $2 WHERE id = $1', [fleet, seedId('customer:prairie')])
    await sign(fleet, 1, new Date('2026-03-10T15:30:00Z'))
    const fleetDraft = await office.post('/api/invoices', { callId: fleet })
    expect(codes(fleetDraft.body.flags)).not.toContain('unsigned_estimate')
    expect(codes(fleetDraft.body.flags)).not.toContain('past_signed_estimate')
  })
})
