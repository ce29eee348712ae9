import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/api'
import { DEMO } from '../support/env'
import { closeTestPool, count } from '../support/db'
import { clearMail, waitForMail } from '../support/mail'
import { seedId } from '../../server/db/seed/ids'

afterAll(closeTestPool)

let dispatcher: Awaited<ReturnType<typeof signedIn>>
beforeAll(async () => {
  dispatcher = await signedIn(DEMO.dispatcher)
})

const newCall = async (extra: Record<string, unknown> = {}) => {
  const r = await dispatcher.post('/api/calls', {
    customerId: seedId('customer:bluestem'), unitId: seedId('unit:12'), locationText: 'Gravel Pit Road at the scale',
    complaint: 'Air pressure will not build', ...extra,
  })
  expect(r.status).toBe(201)
  return r.body
}

describe('the assignment e-mail', () => {
  it('says money as money and the derate without doubled brackets', async () => {
    const call = await newCall({ authLimitCents: 180_000, derate: 'countdown', derateNote: '(45 min to derate)' })
    await clearMail()
    const r = await dispatcher.post(`/api/calls/${call.id}/assign`, { mechanicId: seedId('user:mech2') })
    expect(r.status).toBe(200)
    const [mail] = await waitForMail(m => m.to.includes(DEMO.mech2) && m.subject.includes(`#${call.number}`))
    expect(mail).toBeTruthy()
    expect(mail!.text).toContain('Authorized up to: $1,800.00')
    expect(mail!.text).not.toMatch(/Authorized up to: 1800/)
    expect(mail!.text).toContain('Engine: Countdown to derate or shutdown: 45 min to derate')
    expect(mail!.text).not.toMatch(/\(\(|\)\)|\) \(/)
  })
})

describe('amounts too large', () => {
  it('say they are too large, not that they must be whole cents, and save nothing', async () => {
    const before = await count('calls')
    const r = await dispatcher.post('/api/calls', {
      customerId: seedId('customer:bluestem'), unitId: seedId('unit:12'), locationText: 'Yard', complaint: 'No start',
      authLimitCents: 1e20,
    })
    expect(r.status).toBe(400)
    expect(r.body.data.fields.authLimitCents).toMatch(/too large/)
    expect(r.body.data.fields.authLimitCents).not.toMatch(/whole cents/)
    expect(await count('calls')).toBe(before)

    const admin = await signedIn(DEMO.admin)
    const { body: { rates } } = await admin.get('/api/rates')
    const { id: _i, version: _v, createdAt: _c, updatedAt: _u, effectiveFrom: _e, ...values } = rates
    const huge = await admin.post('/api/rates', { ...values, laborCentsPerHour: 1e19 })
    expect(huge.status).toBe(400)
    expect(huge.body.data.fields.laborCentsPerHour).toBe('Labor rate is too large (at most $1,000,000.00)')
    // A fraction of a cent still says so.
    const half = await admin.post('/api/rates', { ...values, laborCentsPerHour: 12_500.5 })
    expect(half.body.data.fields.laborCentsPerHour).toBe('Labor rate must be whole cents')
  })
})
