import { afterAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/api'
import { closeTestPool, testPool } from '../support/db'
import { DEMO } from '../support/env'

afterAll(closeTestPool)

async function truckId(name: string) {
  return (await testPool().query('SELECT id FROM service_trucks WHERE name = $1', [name])).rows[0].id as string
}

describe('GET /api/service-trucks/[id]/stock', () => {
  it('gives a mechanic the stock of the truck they drive, priced in cents', async () => {
    const m = await signedIn(DEMO.mech1)
    const r = await m.get(`/api/service-trucks/${await truckId('Truck 11')}/stock`)
    expect(r.status).toBe(200)
    expect(r.body.truck.name).toBe('Truck 11')
    expect(r.body.items.find((i: any) => i.partNumber === 'TR-DEF-10')).toMatchObject({ description: 'DEF (AUS 32), 10 L jug', unitPriceCents: 2400 })
  })

  it('answers 404 to a mechanic for a truck that is not theirs, and to anyone for an unknown id', async () => {
    const m = await signedIn(DEMO.mech1)
    expect((await m.get(`/api/service-trucks/${await truckId('Truck 21')}/stock`)).status).toBe(404)
    expect((await m.get('/api/service-trucks/00000000-0000-4000-8000-000000000000/stock')).status).toBe(404)
  })

  it('lets the office read any truck and names a bad id', async () => {
    const o = await signedIn(DEMO.office)
    expect((await o.get(`/api/service-trucks/${await truckId('Truck 21')}/stock`)).status).toBe(200)
    const bad = await o.get('/api/service-trucks/not-a-uuid/stock')
    expect(bad.status).toBe(400)
  })

  it('asks for a sign-in first', async () => {
    const r = await fetch(`${process.env.WAYSIDE_TEST_URL ?? 'http://127.0.0.1:3100'}/api/service-trucks/${await truckId('Truck 11')}/stock`)
    expect(r.status).toBe(401)
  })
})
