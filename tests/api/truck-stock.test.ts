import { randomUUID } from 'node:crypto'
import Papa from 'papaparse'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/api'
import { closeTestPool, testPool } from '../support/db'
import { BASE_URL, DEMO } from '../support/env'
import { cleanupSyncData, Device, makeCall } from '../support/sync'

afterAll(async () => {
  await cleanupSyncData()
  // Out of service, so the browser tests that run next on this database see the demo trucks only.
  await testPool().query(`UPDATE service_trucks SET active = false WHERE name LIKE 'Test truck %'`)
  await closeTestPool()
})

async function truckId(name: string) {
  return (await testPool().query('SELECT id FROM service_trucks WHERE name = $1', [name])).rows[0].id as string
}
async function onHand(stockId: string) {
  return (await testPool().query('SELECT quantity FROM truck_stock WHERE id = $1', [stockId])).rows[0].quantity as number
}
async function movesOf(where: string, params: unknown[]) {
  return (await testPool().query(`SELECT * FROM stock_moves WHERE ${where} ORDER BY at, kind`, params)).rows
}

const line = (partNumber: string, onHandQty: number, extra: Record<string, unknown> = {}) => ({
  partNumber, description: `Test part ${partNumber}`, bin: 'T1', onHand: onHandQty, minimum: 2, costCents: 1000, unitPriceCents: 1800,
  coreChargeCents: 0, ...extra,
})

let admin: Awaited<ReturnType<typeof signedIn>>
let truckA: string
let truckB: string
beforeAll(async () => {
  admin = await signedIn(DEMO.admin)
  const suffix = randomUUID().slice(0, 8)
  const a = await admin.post('/api/service-trucks', { name: `Test truck A ${suffix}`, plate: 'TST-1' })
  const b = await admin.post('/api/service-trucks', { name: `Test truck B ${suffix}` })
  expect([a.status, b.status]).toEqual([201, 201])
  truckA = a.body.id
  truckB = b.body.id
})

describe('GET /api/service-trucks/[id]/stock', () => {
  it('gives a mechanic the stock of the truck they drive, priced in cents, without what the shop paid', async () => {
    const m = await signedIn(DEMO.mech1)
    const r = await m.get(`/api/service-trucks/${await truckId('Truck 11')}/stock`)
    expect(r.status).toBe(200)
    expect(r.body.truck.name).toBe('Truck 11')
    const def = r.body.items.find((i: any) => i.partNumber === 'TR-DEF-10')
    expect(def).toMatchObject({ description: 'DEF (AUS 32), 10 L jug', unitPriceCents: 2400, bin: 'Floor', minimum: 4 })
    expect(def.costCents).toBeNull()
  })

  it('answers 404 to a mechanic for a truck that is not theirs, and to anyone for an unknown id', async () => {
    const m = await signedIn(DEMO.mech1)
    expect((await m.get(`/api/service-trucks/${await truckId('Truck 21')}/stock`)).status).toBe(404)
    expect((await m.get('/api/service-trucks/00000000-0000-4000-8000-000000000000/stock')).status).toBe(404)
  })

  it('lets the office read any truck, with costs, and names a bad id', async () => {
    const o = await signedIn(DEMO.office)
    const r = await o.get(`/api/service-trucks/${await truckId('Truck 21')}/stock`)
    expect(r.status).toBe(200)
    expect(r.body.items.find((i: any) => i.partNumber === 'TR-DEF-10').costCents).toBe(1390)
    const bad = await o.get('/api/service-trucks/not-a-uuid/stock')
    expect(bad.status).toBe(400)
  })

  it('asks for a sign-in first', async () => {
    const r = await fetch(`${BASE_URL}/api/service-trucks/${await truckId('Truck 11')}/stock`)
    expect(r.status).toBe(401)
  })
})

describe('trucks and stock lines (admin)', () => {
  it('adds a stock line, logged as added; a second line with the same part number is refused naming it', async () => {
    const r = await admin.post(`/api/service-trucks/${truckA}/stock`, line('TST-ADD', 5))
    expect(r.status).toBe(201)
    expect(r.body).toMatchObject({ partNumber: 'TST-ADD', quantity: 5, bin: 'T1', minimum: 2, costCents: 1000 })
    expect(await movesOf('stock_id = $1', [r.body.id])).toMatchObject([{ kind: 'added', delta: 5, before: 0, after: 5 }])
    const again = await admin.post(`/api/service-trucks/${truckA}/stock`, line('tst-add', 1))
    expect(again.status).toBe(422)
    expect(again.body.data.fields.partNumber).toMatch(/already carries/)
  })

  it('answers 400 naming each bad field of a stock line', async () => {
    const r = await admin.post(`/api/service-trucks/${truckA}/stock`, line('', -1, { costCents: 10.5, minimum: 'two' }))
    expect(r.status).toBe(400)
    expect(Object.keys(r.body.data.fields).sort()).toEqual(['costCents', 'minimum', 'onHand', 'partNumber'])
  })

  it('corrects a count with a reason, logging who, before and after; no reason is a 400 naming it', async () => {
    const added = await admin.post(`/api/service-trucks/${truckA}/stock`, line('TST-COUNT', 6))
    const noReason = await admin.post(`/api/stock/${added.body.id}/count`, { counted: 4 })
    expect(noReason.status).toBe(400)
    expect(noReason.body.data.fields.reason).toMatch(/why/)
    expect(await onHand(added.body.id)).toBe(6)

    const r = await admin.post(`/api/stock/${added.body.id}/count`, { counted: 4, reason: 'Counted at the yard, two missing' })
    expect(r.status).toBe(200)
    expect(await onHand(added.body.id)).toBe(4)
    const [, count] = await movesOf('stock_id = $1', [added.body.id])
    expect(count).toMatchObject({
      kind: 'count', delta: -2, before: 6, after: 4, reason: 'Counted at the yard, two missing', by_user_id: admin.user.id,
    })
  })

  it('transfers between trucks: both halves logged with one transfer id, the line made on the other truck', async () => {
    const added = await admin.post(`/api/service-trucks/${truckA}/stock`, line('TST-MOVE', 5, { unitPriceCents: 2500 }))
    const body = { fromStockId: added.body.id, toTruckId: truckB, quantity: 2, reason: 'Truck B goes north' }
    const r = await admin.post('/api/stock/transfers', body)
    expect(r.status).toBe(201)
    expect(await onHand(added.body.id)).toBe(3)
    const dst = (await testPool().query('SELECT * FROM truck_stock WHERE truck_id = $1 AND part_number = $2', [truckB, 'TST-MOVE'])).rows[0]
    expect(dst).toMatchObject({ quantity: 2, unit_price_cents: 2500, description: 'Test part TST-MOVE' })
    const halves = await movesOf('transfer_id = $1', [r.body.transferId])
    expect(halves.map(h => [h.kind, h.truck_id, h.delta, h.before, h.after])).toEqual([
      ['transfer_in', truckB, 2, 0, 2],
      ['transfer_out', truckA, -2, 5, 3],
    ])
    const moves = await admin.get(`/api/service-trucks/${truckB}/moves`)
    expect(moves.body.items[0]).toMatchObject({
      kind: 'transfer_in', otherTruck: expect.stringContaining('Test truck A'), byName: expect.any(String),
    })
  })

  it('refuses a transfer beyond what is on hand, or to the same truck, naming the field; nothing moves', async () => {
    const added = await admin.post(`/api/service-trucks/${truckA}/stock`, line('TST-SHORT', 1))
    const body = { fromStockId: added.body.id, toTruckId: truckB, quantity: 3, reason: 'Testing' }
    const tooMany = await admin.post('/api/stock/transfers', body)
    expect(tooMany.status).toBe(422)
    expect(tooMany.body.data.fields.quantity).toMatch(/Only 1 on hand/)
    const same = await admin.post('/api/stock/transfers', { ...body, toTruckId: truckA, quantity: 1 })
    expect(same.status).toBe(422)
    expect(same.body.data.fields.toTruckId).toBeDefined()
    expect(await onHand(added.body.id)).toBe(1)
    expect(await movesOf('stock_id = $1 AND kind LIKE $2', [added.body.id, 'transfer%'])).toEqual([])
  })

  it('changes a line\'s price and minimum with its version; a stale version is a 409', async () => {
    const added = await admin.post(`/api/service-trucks/${truckA}/stock`, line('TST-EDIT', 1))
    const r = await admin.patch(`/api/stock/${added.body.id}`, { minimum: 3, unitPriceCents: 1999, version: added.body.version })
    expect(r.status).toBe(200)
    expect(r.body).toMatchObject({ minimum: 3, unitPriceCents: 1999, quantity: 1 })
    const stale = await admin.patch(`/api/stock/${added.body.id}`, { minimum: 4, version: added.body.version })
    expect(stale.status).toBe(409)
  })

  it('gives a truck its mechanic, and the people form a mechanic their home truck; office staff have none', async () => {
    const mech2 = (await testPool().query(`SELECT id, home_truck_id FROM users WHERE email = $1`, [DEMO.mech2])).rows[0]
    try {
      const r = await admin.patch(`/api/users/${mech2.id}`, { homeTruckId: truckB })
      expect(r.status).toBe(200)
      expect(r.body.homeTruckId).toBe(truckB)
      const list = await admin.get('/api/service-trucks')
      expect(list.body.items.find((t: any) => t.id === truckB).mechanics).toEqual([{ id: mech2.id, name: expect.any(String) }])
      const office = (await testPool().query(`SELECT id FROM users WHERE email = $1`, [DEMO.office])).rows[0]
      const bad = await admin.patch(`/api/users/${office.id}`, { homeTruckId: truckB })
      expect(bad.status).toBe(422)
      expect(bad.body.data.fields.homeTruckId).toMatch(/Only mechanics/)
    }
    finally {
      await admin.patch(`/api/users/${mech2.id}`, { homeTruckId: mech2.home_truck_id })
    }
  })

  it('keeps trucks and stock to the admin: office and mechanics get 403', async () => {
    const office = await signedIn(DEMO.office)
    const mech = await signedIn(DEMO.mech1)
    expect((await office.post('/api/service-trucks', { name: 'Nope' })).status).toBe(403)
    expect((await office.post(`/api/service-trucks/${truckA}/stock`, line('TST-NO', 1))).status).toBe(403)
    expect((await mech.post('/api/stock/transfers', {})).status).toBe(403)
    expect((await mech.get('/api/stock/restock')).status).toBe(403)
    expect((await mech.get('/api/stock/restock.csv')).status).toBe(403)
    expect((await office.get('/api/stock/restock')).status).toBe(200)
  })
})

describe('parts used on a call come off the truck that carried them', () => {
  it('takes stock once under a resent push, and from another device with the same record', async () => {
    const stock = await admin.post(`/api/service-trucks/${truckA}/stock`, line('TST-USE', 5))
    const callId = await makeCall()
    const d = new Device(await signedIn(DEMO.mech1))
    const ops = [d.op('partLine', { callId, partNumber: 'TST-USE', description: 'Test part TST-USE', quantity: 2, serviceTruckId: truckA })]
    expect((await d.push(ops)).body.results[0].status).toBe('applied')
    expect(await onHand(stock.body.id)).toBe(3)
    // The same push again (the answer was lost on the way back): a duplicate, nothing taken.
    expect((await d.push(ops)).body.results[0].status).toBe('duplicate')
    // The same part line from a reinstalled device (new client id, same record id): still once.
    const other = new Device(d.api)
    const resent = other.op('partLine', ops[0]!.changes, { entityId: ops[0]!.entityId })
    expect((await other.push([resent])).body.results[0].status).toBe('applied')
    expect(await onHand(stock.body.id)).toBe(3)
    const moves = await movesOf('part_line_id = $1', [ops[0]!.entityId])
    expect(moves).toMatchObject([{ kind: 'used', delta: -2, before: 5, after: 3, shortfall: 0, call_id: callId }])
  })

  it('flags a shortfall instead of refusing: more used than on hand, or a part the truck does not carry', async () => {
    const stock = await admin.post(`/api/service-trucks/${truckA}/stock`, line('TST-FEW', 1))
    const callId = await makeCall()
    const d = new Device(await signedIn(DEMO.mech1))
    const used = d.op('partLine', { callId, partNumber: 'TST-FEW', description: 'Test part', quantity: 3, serviceTruckId: truckA })
    const unknown = d.op('partLine', {
      callId, partNumber: 'TST-NOT-CARRIED', description: 'Bought at a parts store', quantity: 1, serviceTruckId: truckA,
    })
    const r = await d.push([used, unknown])
    expect(r.body.results.map((x: any) => x.status)).toEqual(['applied', 'applied'])
    // 1 on hand, 3 used: on hand −2 (count again), shortfall 2.
    expect(await onHand(stock.body.id)).toBe(-2)
    expect(await movesOf('part_line_id = $1', [used.entityId])).toMatchObject([{ before: 1, after: -2, shortfall: 2 }])
    expect(await movesOf('part_line_id = $1', [unknown.entityId]))
      .toMatchObject([{ stock_id: null, shortfall: 1, reason: 'not stocked on this truck' }])
    const list = await admin.get('/api/service-trucks')
    expect(list.body.items.find((t: any) => t.id === truckA)).toMatchObject({ shortLines: 1 })
  })
})

describe('GET /api/stock/restock', () => {
  it('lists lines below their minimum as CSV a spreadsheet reads back, with how many to order', async () => {
    const lowLine = line('TST-LOW', 0.5, { minimum: 3, description: '=HYPERLINK("http://x")', costCents: 1234 })
    await admin.post(`/api/service-trucks/${truckB}/stock`, lowLine)
    await admin.post(`/api/service-trucks/${truckB}/stock`, line('TST-FULL', 9, { minimum: 3 }))
    const r = await admin.get(`/api/stock/restock.csv?truckId=${truckB}`)
    expect(r.status).toBe(200)
    expect(r.headers.get('content-type')).toMatch(/^text\/csv/)
    const parsed = Papa.parse<string[]>(r.body as string, { skipEmptyLines: true })
    expect(parsed.errors).toEqual([])
    const [header, ...rows] = parsed.data
    expect(header).toEqual(['Truck', 'Bin', 'Part number', 'Description', 'On hand', 'Minimum', 'To order', 'Unit cost'])
    const low = rows.find(x => x[2] === 'TST-LOW')!
    // 3 minimum − 0.5 on hand = 2.5 to order; cost 1234 cents = 12.34.
    expect(low.slice(4)).toEqual(['0.5', '3', '2.5', '12.34'])
    expect(low[3]).toBe('\'=HYPERLINK("http://x")')
    expect(rows.find(x => x[2] === 'TST-FULL')).toBeUndefined()
  })

  it('names a bad truck id', async () => {
    for (const path of ['/api/stock/restock', '/api/stock/restock.csv']) {
      const r = await admin.get(`${path}?truckId=nope`)
      expect(r.status).toBe(400)
      expect(Object.keys(r.body.data.fields)).toEqual(['truckId'])
    }
  })
})
