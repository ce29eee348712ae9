// The demo business: Two Rivers Road Service, an invented heavy-duty road-call shop with two yards
// in an invented region, its fleets, units, mechanics and calls. Nothing here is real.
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import type { NodePgDatabase } from 'drizzle-orm/node-postgres'
import * as t from '../schema'
import { vinCheckDigit } from '../../../shared/utils/vin'
import { seedId } from './ids'

// The same hasher and defaults nuxt-auth-utils' hashPassword uses, so these hashes verify there.
const hasher = new Hash(new Scrypt({}))
export const DEMO_PASSWORD = 'wayside-demo'

export const DEMO_USERS = [
  { key: 'admin', email: 'admin@wayside.test', name: 'Ada Okafor', role: 'admin' },
  { key: 'dispatch', email: 'dispatch@wayside.test', name: 'Dee Marchetti', role: 'dispatcher' },
  { key: 'office', email: 'office@wayside.test', name: 'Olu Brandt', role: 'office' },
  { key: 'mech1', email: 'mech1@wayside.test', name: 'Marco Lindqvist', role: 'mechanic', lat: 45.512, lon: -92.981, truck: 'Truck 11',
    phone: '555-0151',
  },
  { key: 'mech2', email: 'mech2@wayside.test', name: 'Priya Haldane', role: 'mechanic', lat: 45.301, lon: -93.402, truck: 'Truck 12',
    phone: '555-0152',
  },
  {
    key: 'mech3', email: 'mech3@wayside.test', name: 'Tomasz Reyes', role: 'mechanic', lat: 45.078, lon: -93.115, truck: 'Truck 21',
    offDuty: true, phone: '555-0153',
  },
  { key: 'mech4', email: 'mech4@wayside.test', name: 'Sunniva Adeyemi', role: 'mechanic', lat: 45.164, lon: -93.236, truck: 'Truck 22',
    phone: '555-0154',
  },
  // A new hire whose phone has not synced yet: no known position.
  { key: 'mech5', email: 'mech5@wayside.test', name: 'Levi Castellanos', role: 'mechanic' },
] as const

/** A VIN of our own making with a correct check digit (49 CFR 565). */
function demoVin(wmi: string, vds: string, year: string, plant: string, serial: string) {
  const draft = `${wmi}${vds}0${year}${plant}${serial}`
  return draft.slice(0, 8) + vinCheckDigit(draft) + draft.slice(9)
}

type Db = NodePgDatabase<typeof t>

export async function seedCore(db: Db) {
  const passwordHash = await hasher.make(DEMO_PASSWORD)
  const yards = [
    { id: seedId('yard:north'), name: 'North yard', address: '14 Quarry Spur, Harrow Bend', lat: 45.498, lon: -93.012 },
    { id: seedId('yard:south'), name: 'South yard', address: '220 Cinder Flats Road, Ostby', lat: 45.071, lon: -93.187 },
  ]
  await db.insert(t.yards).values(yards).onConflictDoNothing()

  const trucks = [
    { name: 'Truck 11', plate: 'TR 4411', yard: 'north' }, { name: 'Truck 12', plate: 'TR 4412', yard: 'north' },
    { name: 'Truck 21', plate: 'TR 4421', yard: 'south' }, { name: 'Truck 22', plate: 'TR 4422', yard: 'south' },
  ]
  await db.insert(t.serviceTrucks).values(trucks.map(tr => ({
    id: seedId(`truck:${tr.name}`), name: tr.name, plate: tr.plate, yardId: seedId(`yard:${tr.yard}`),
  }))).onConflictDoNothing()

  // Part numbers are our own catalogue's, not any maker's.
  // [part number, description, on hand, price, core, bin, minimum, cost]
  const stock = [
    ['TR-EGT-200', 'Exhaust temperature sensor, RTD type', 3, 18450, 0, 'A1', 2, 11200],
    ['TR-ECT-10K', 'Coolant temperature sensor, NTC type', 4, 6275, 0, 'A2', 2, 3650],
    ['TR-FUSE-30', 'Blade fuse 30 A (pack of 5)', 10, 650, 0, 'B1', 5, 280],
    ['TR-DEF-10', 'DEF (AUS 32), 10 L jug', 6, 2400, 0, 'Floor', 4, 1390],
    ['TR-ALT-24', 'Alternator, 12 V 160 A, remanufactured', 1, 38900, 7500, 'C1', 1, 24100],
    ['TR-BAT-31', 'Battery, group 31, flooded', 2, 21900, 2500, 'C2', 1, 14300],
    ['TR-CONN-6', 'Connector repair kit, 6-way sealed', 5, 3150, 0, 'B2', 3, 1720],
  ] as const
  for (const tr of trucks) {
    await db.insert(t.truckStock).values(stock.map(([pn, desc, qty, price, core, bin, minimum, cost]) => ({
      id: seedId(`stock:${tr.name}:${pn}`), truckId: seedId(`truck:${tr.name}`), partNumber: pn, description: desc,
      quantity: qty, unitPriceCents: price, coreChargeCents: core, bin, minimum, costCents: cost,
    }))).onConflictDoNothing()
  }

  await db.insert(t.rates).values({
    id: seedId('rates:2026'), laborCentsPerHour: 14500, afterHoursMultiplierPct: 150, minimumLaborTenths: 10,
    roadCallMinimumCents: 12500, travelCentsPerUnit: 225, travelUnit: 'km', partsMarkupPct: 25,
    taxRateBasisPoints: 725, laborTaxable: false, averageRoadKph: 70, effectiveFrom: new Date('2026-01-01T00:00:00Z'),
    travelBasis: 'distance', roadFactorPct: 130, partsTaxable: true, coresTaxable: false, travelTaxable: false, feesTaxable: true,
    shopSuppliesBasisPoints: 500, shopSuppliesCapCents: 3500, environmentalFeeCents: 650,
    timeZone: 'America/Chicago', openMinute: 7 * 60, closeMinute: 18 * 60, openDays: [1, 2, 3, 4, 5],
    holidays: ['2026-01-01', '2026-05-25', '2026-07-03', '2026-09-07', '2026-11-26', '2026-12-25'],
    businessName: 'Two Rivers Road Service', businessPhone: '555-0100', businessEmail: 'billing@tworivers-road.test',
    remitAddress: 'Two Rivers Road Service, 14 Quarry Spur, Harrow Bend, MN 55099',
  }).onConflictDoNothing()

  await db.insert(t.users).values(DEMO_USERS.map(u => ({
    id: seedId(`user:${u.key}`), email: u.email, name: u.name, role: u.role, passwordHash,
    lastLat: 'lat' in u ? u.lat : null, lastLon: 'lon' in u ? u.lon : null,
    lastPositionAt: 'lat' in u ? new Date() : null,
    onDuty: !('offDuty' in u && u.offDuty),
    phone: 'phone' in u ? u.phone : null,
    homeTruckId: 'truck' in u ? seedId(`truck:${u.truck}`) : null,
  }))).onConflictDoNothing()

  const customers = [
    {
      key: 'ironwood', name: 'Ironwood Freight Lines', kind: 'fleet', billingTerms: 'account', netDays: 30,
      billingEmail: 'payables@ironwood-freight.test', phone: '555-0141',
    },
    {
      key: 'prairie', name: 'Prairie Cold Haul', kind: 'fleet', billingTerms: 'account', netDays: 15, billingEmail: 'ap@prairiecold.test',
      phone: '555-0172',
    },
    {
      key: 'bluestem', name: 'Bluestem Aggregate Co.', kind: 'fleet', billingTerms: 'card', netDays: null,
      billingEmail: 'office@bluestem-agg.test', phone: '555-0118',
    },
    {
      key: 'lakeline', name: 'Lakeline Municipal Fleet', kind: 'fleet', billingTerms: 'account', netDays: 45,
      billingEmail: 'fleet.billing@lakeline.test', phone: '555-0190', taxExempt: true,
    },
    {
      key: 'vossberg', name: 'R. Vossberg Trucking (owner-operator)', kind: 'owner_operator', billingTerms: 'card', netDays: null,
      billingEmail: 'rvossberg@mail.test', phone: '555-0133',
    },
    {
      key: 'okonkwo', name: 'Okonkwo Hauling (owner-operator)', kind: 'owner_operator', billingTerms: 'card', netDays: null,
      billingEmail: 'dispatch@okonkwo-hauling.test', phone: '555-0156',
    },
  ] as const
  await db.insert(t.customers).values(customers.map(c => ({
    id: seedId(`customer:${c.key}`), name: c.name, kind: c.kind, billingTerms: c.billingTerms, netDays: c.netDays,
    billingEmail: c.billingEmail, phone: c.phone, taxExempt: 'taxExempt' in c ? c.taxExempt : false,
  }))).onConflictDoNothing()

  const sites = [
    ['ironwood', 'Ironwood terminal', '9 Ferrous Way, Harrow Bend', 45.522, -92.944],
    ['ironwood', 'Ironwood drop lot', 'Exit 31 truck lot, Route 8', 45.402, -93.221],
    ['prairie', 'Prairie Cold dock', '410 Icehouse Road, Millrace', 45.233, -93.331],
    ['bluestem', 'Bluestem pit 2', 'Gravel Pit Road, Ostby', 45.051, -93.262],
    ['lakeline', 'Lakeline public works yard', '1 Civic Loop, Lakeline', 45.148, -92.998],
  ] as const
  await db.insert(t.customerSites).values(sites.map(([c, name, address, lat, lon]) => ({
    id: seedId(`site:${name}`), customerId: seedId(`customer:${c}`), name, address, lat, lon,
  }))).onConflictDoNothing()

  // Twenty invented units; the WMI-like prefixes are made up for the demo.
  const unitRows: (typeof t.units.$inferInsert)[] = []
  const models = [
    '2019 tractor, 13 L diesel', '2021 tractor, 15 L diesel', '2018 day cab, 11 L diesel', '2022 straight truck, 9 L diesel',
    '2017 dump truck, 13 L diesel',
  ]
  const owners = [
    'ironwood', 'ironwood', 'ironwood', 'ironwood', 'ironwood', 'prairie', 'prairie', 'prairie', 'prairie', 'bluestem', 'bluestem',
    'bluestem', 'bluestem', 'lakeline', 'lakeline', 'lakeline', 'lakeline', 'vossberg', 'okonkwo', 'okonkwo',
  ]
  const yearCodes = ['K', 'M', 'J', 'N', 'H']
  owners.forEach((owner, i) => {
    const n = i + 1
    const num = owner === 'vossberg' || owner === 'okonkwo' ? `OO-${n}` : `${owner.slice(0, 2).toUpperCase()}-${100 + n * 7}`
    unitRows.push({
      id: seedId(`unit:${n}`), customerId: seedId(`customer:${owner}`), unitNumber: num,
      vin: demoVin(
        '3WY', `TRK${String.fromCharCode(65 + (i % 8))}${i % 10}`, yearCodes[i % 5]!, 'R', String(200000 + n * 1371).padStart(6, '0'),
      ),
      yearMakeModel: models[i % models.length], engine: models[i % models.length]!.split(', ')[1],
      odometer: 180000 + n * 23117, odometerUnit: 'km', engineHours: 4000 + n * 611,
    })
  })
  await db.insert(t.units).values(unitRows).onConflictDoNothing()

  await seedCalls(db)
}

async function seedCalls(db: Db) {
  const now = Date.now()
  const at = (hoursAgo: number) => new Date(now - hoursAgo * 3600_000)
  const mech1 = seedId('user:mech1'), mech2 = seedId('user:mech2'), dispatcher = seedId('user:dispatch')
  type Seed = Partial<typeof t.calls.$inferInsert> & { key: string, customer: string, unit: number }
  const list: Seed[] = [
    {
      key: 'c1', status: 'received', customer: 'prairie', unit: 7, locationText: 'Route 8 eastbound shoulder, near mile marker 42',
      lat: 45.288, lon: -93.102, complaint: 'Check-engine lamp on and the truck will not pull over 50 km/h', lamps: ['check_engine'],
      derate: 'derated', loaded: true, safetyNotes: 'Narrow shoulder, guard rail on the right', poNumber: 'PCH-88121',
      authLimitCents: 150000, receivedAt: at(0.5),
    },
    {
      key: 'c2', status: 'received', customer: 'bluestem', unit: 11, locationText: 'Bluestem pit 2 scale house', lat: 45.051, lon: -93.262,
      complaint: 'No crank, dash lights dim', lamps: [], receivedAt: at(1.2),
    },
    {
      key: 'c3', status: 'assigned', customer: 'ironwood', unit: 2, mechanicId: mech1, locationText: 'Ironwood drop lot, row C',
      lat: 45.402, lon: -93.221, complaint: 'DEF lamp flashing, countdown on the dash', lamps: ['def', 'emissions'], derate: 'countdown',
      poNumber: 'IFL-5521', authLimitCents: 200000, receivedAt: at(2), assignedAt: at(1.8),
    },
    {
      key: 'c4', status: 'en_route', customer: 'lakeline', unit: 14, mechanicId: mech1, locationText: 'Civic Loop at 3rd, curb lane',
      lat: 45.149, lon: -92.997, complaint: 'Coolant temperature gauge reads cold with the engine warm, check-engine lamp on',
      lamps: ['check_engine'], receivedAt: at(3), assignedAt: at(2.8), enRouteAt: at(2.5),
    },
    {
      key: 'c5', status: 'on_site', customer: 'ironwood', unit: 4, mechanicId: mech2, locationText: 'Highway 12 westbound, exit 19 ramp',
      lat: 45.335, lon: -93.351, complaint: 'Exhaust temperature fault, engine derated', lamps: ['check_engine', 'emissions'],
      derate: 'derated', loaded: true, hazmat: false, safetyNotes: 'Ramp curve behind the truck: place the rear device well back',
      receivedAt: at(4), assignedAt: at(3.9), enRouteAt: at(3.7), onSiteAt: at(3.1),
    },
    {
      key: 'c6', status: 'completed', outcome: 'repaired', customer: 'prairie', unit: 8, mechanicId: mech2,
      locationText: 'Prairie Cold dock, door 4', lat: 45.233, lon: -93.331, complaint: 'Battery lamp on, voltage gauge low', lamps: [],
      receivedAt: at(30), assignedAt: at(29.8), enRouteAt: at(29.6), onSiteAt: at(29), completedAt: at(27.5),
      storyComplaint: 'Battery lamp on, gauge low.', storyCause: 'Alternator output 12.4 V at 1500 rpm; drive belt good.',
      storyCorrection: 'Replaced alternator; output 14.0 V under load. Cleared codes, road tested 8 km.',
    },
    {
      key: 'c7', status: 'invoiced', outcome: 'repaired', customer: 'bluestem', unit: 10, mechanicId: mech1,
      locationText: 'County Road 4 at the quarry gate', lat: 45.062, lon: -93.241, complaint: 'Blown fuse, no marker lamps', lamps: [],
      receivedAt: at(3 * 24), assignedAt: at(71.9), enRouteAt: at(71.7), onSiteAt: at(71), completedAt: at(70), invoicedAt: at(48),
      storyComplaint: 'No marker lamps.', storyCause: 'Chafed marker lamp feed at the frame crossmember shorted to ground.',
      storyCorrection: 'Repaired wire, added loom and clamp, replaced 30 A fuse.',
    },
    {
      key: 'c8', status: 'paid', outcome: 'no_fault_found', customer: 'vossberg', unit: 18, mechanicId: mech2,
      locationText: 'Truck stop lot, Route 8 exit 31', lat: 45.401, lon: -93.219, complaint: 'Stop-engine lamp came on once',
      lamps: ['stop_engine'], receivedAt: at(6 * 24), assignedAt: at(143.9), enRouteAt: at(143.6), onSiteAt: at(143), completedAt: at(142),
      invoicedAt: at(120), paidAt: at(100), storyComplaint: 'Stop-engine lamp once, went out.',
      storyCause: 'Stored low oil level code; level at full mark, no leaks.',
      storyCorrection: 'Checked level and sender; cleared stored code; advised to watch.',
    },
    {
      key: 'c9', status: 'cancelled', customer: 'okonkwo', unit: 20, locationText: 'Millrace town square', lat: 45.241, lon: -93.322,
      complaint: 'Flat steer tire', lamps: [], receivedAt: at(26), cancelledAt: at(25.5), cancelReason: 'Driver found a tire shop nearby',
    },
    {
      key: 'c10', status: 'completed', outcome: 'repaired', customer: 'ironwood', unit: 2, mechanicId: mech1,
      locationText: 'Ironwood terminal, bay 2', lat: 45.522, lon: -92.944, complaint: 'DEF lamp on', lamps: ['def'],
      receivedAt: at(20 * 24), assignedAt: at(479), enRouteAt: at(478.8), onSiteAt: at(478), completedAt: at(476),
      storyComplaint: 'DEF lamp on.', storyCause: 'DEF concentration 26 % by refractometer (diluted).',
      storyCorrection: 'Drained and refilled with fresh DEF; concentration 32.4 %.',
    },
    // Unit history: the DEF fault on unit 2 comes back 12 days after c10; the coolant sensor code on unit 14 (c4) repeats c12.
    {
      key: 'c11', status: 'paid', outcome: 'repaired', customer: 'ironwood', unit: 2, mechanicId: mech2,
      locationText: 'Route 8 westbound, rest area at mile 37', lat: 45.366, lon: -93.152,
      complaint: 'DEF lamp back on, says derate in 60 minutes', lamps: ['def', 'check_engine'], derate: 'countdown',
      derateNote: '60 min to derate', loaded: true, poNumber: 'IFL-5390', authLimitCents: 120000, receivedAt: at(8 * 24),
      assignedAt: at(191.8), enRouteAt: at(191.6), onSiteAt: at(191), completedAt: at(189.5), invoicedAt: at(170), paidAt: at(100),
      storyComplaint: 'DEF lamp on again with a derate countdown.',
      storyCause: 'DEF quality sensor reads low although the fluid tests 32.5 %; sensor connector pin 3 corroded.',
      storyCorrection: 'Cleaned and sealed the connector, replaced the pigtail; cleared codes, countdown gone after a 15 km drive.',
    },
    {
      key: 'c12', status: 'paid', outcome: 'repaired', customer: 'lakeline', unit: 14, mechanicId: mech1,
      locationText: 'Lakeline public works yard, bay 1', lat: 45.148, lon: -92.998, complaint: 'Temperature gauge stuck at cold',
      lamps: ['check_engine'], receivedAt: at(25 * 24), assignedAt: at(599.7), enRouteAt: at(599.5), onSiteAt: at(599),
      completedAt: at(597.8), invoicedAt: at(560), paidAt: at(400), storyComplaint: 'Gauge reads cold, check-engine on.',
      storyCause: 'Coolant temperature sensor open circuit (OL across its pins), '
        + 'so the controller saw the circuit-high voltage and the gauge read cold.',
      storyCorrection: 'Replaced the coolant temperature sensor; reads 84 °C at operating temperature.',
    },
    {
      key: 'c13', status: 'paid', outcome: 'towed', customer: 'prairie', unit: 7, mechanicId: mech2,
      locationText: 'Highway 12 eastbound near exit 22', lat: 45.318, lon: -93.292, complaint: 'Loud knock, oil pressure lamp',
      lamps: ['oil_pressure', 'stop_engine'], derate: 'shutdown', loaded: true,
      safetyNotes: 'Stopped in the right lane at night: wait for the patrol before leaving the truck', receivedAt: at(45 * 24),
      assignedAt: at(1079.8), enRouteAt: at(1079.6), onSiteAt: at(1079), completedAt: at(1078), invoicedAt: at(1000), paidAt: at(900),
      storyComplaint: 'Knock and low oil pressure.',
      storyCause: 'Oil pressure 0 kPa at idle on a mechanical gauge; internal engine damage suspected.',
      storyCorrection: 'Did not run the engine further; arranged a tow to the customer\'s shop.',
    },
  ]
  for (const c of list) {
    const { key, customer, unit, ...rest } = c
    const statusChangedAt = rest.paidAt ?? rest.invoicedAt ?? rest.completedAt ?? rest.cancelledAt
      ?? rest.onSiteAt ?? rest.enRouteAt ?? rest.assignedAt ?? rest.receivedAt
    await db.insert(t.calls).values({
      ...rest, id: seedId(`call:${key}`), customerId: seedId(`customer:${customer}`), unitId: seedId(`unit:${unit}`),
      serviceTruckId: rest.mechanicId ? seedId(`truck:${rest.mechanicId === mech1 ? 'Truck 11' : 'Truck 12'}`) : null,
      createdBy: dispatcher, statusChangedAt, locationText: rest.locationText!, complaint: rest.complaint!,
    }).onConflictDoNothing()
    const events: (typeof t.callEvents.$inferInsert)[] = [{
      id: seedId(`event:${key}:received`), callId: seedId(`call:${key}`), kind: 'status', toStatus: 'received', byUserId: dispatcher,
      at: rest.receivedAt,
    }]
    const steps = [
      ['assigned', rest.assignedAt], ['en_route', rest.enRouteAt], ['on_site', rest.onSiteAt], ['completed', rest.completedAt],
      ['invoiced', rest.invoicedAt], ['paid', rest.paidAt], ['cancelled', rest.cancelledAt],
    ] as const
    let prev: (typeof steps)[number][0] | 'received' = 'received'
    for (const [s, when] of steps) {
      if (!when) continue
      events.push({
        id: seedId(`event:${key}:${s}`), callId: seedId(`call:${key}`), kind: s === 'assigned' ? 'assigned' : 'status', fromStatus: prev,
        toStatus: s, mechanicId: s === 'assigned' ? rest.mechanicId : null, at: when,
      })
      prev = s
    }
    await db.insert(t.callEvents).values(events).onConflictDoNothing()
  }

  // The records of the finished calls, so billing, unit history and comebacks have data.
  const child = (key: string, name: string) => ({ id: seedId(`${name}:${key}`), callId: seedId(`call:${key}`) })
  const clock = (key: string, startHoursAgo: number, travelH: number, workH: number, by: string) => {
    const s = now - startHoursAgo * 3600_000
    return [
      { ...child(key, 'clock:travel_start'), kind: 'travel_start' as const, deviceAt: new Date(s), createdBy: by },
      { ...child(key, 'clock:arrive'), kind: 'arrive' as const, deviceAt: new Date(s + travelH * 3600_000), createdBy: by },
      {
        ...child(key, 'clock:work_start'), kind: 'work_start' as const, deviceAt: new Date(s + travelH * 3600_000 + 300_000), createdBy: by,
      },
      { ...child(key, 'clock:work_stop'), kind: 'work_stop' as const, deviceAt: new Date(s + (travelH + workH) * 3600_000), createdBy: by },
      {
        ...child(key, 'clock:depart'), kind: 'depart' as const, deviceAt: new Date(s + (travelH + workH) * 3600_000 + 300_000),
        createdBy: by,
      },
    ]
  }
  await db.insert(t.clockEvents).values([
    ...clock('c6', 29.6, 0.6, 1.4, mech2), ...clock('c7', 71.7, 0.7, 0.9, mech1), ...clock('c8', 143.6, 0.6, 0.8, mech2),
    ...clock('c10', 478.8, 0.8, 1.9, mech1), ...clock('c11', 191.6, 0.6, 1.4, mech2), ...clock('c12', 599.5, 0.5, 1.1, mech1),
    ...clock('c13', 1079.6, 0.6, 0.7, mech2),
  ]).onConflictDoNothing()
  await db.insert(t.faultCodes).values([
    { ...child('c6', 'fault'), spn: 168, fmi: 1, state: 'active', count: 3, createdBy: mech2, clearedAt: new Date(now - 27.6 * 3600_000) },
    { ...child('c8', 'fault'), spn: 98, fmi: 17, state: 'stored', count: 1, createdBy: mech2, clearedAt: new Date(now - 142.1 * 3600_000) },
    {
      ...child('c10', 'fault'), spn: 3516, fmi: 18, state: 'active', count: 2, createdBy: mech1,
      clearedAt: new Date(now - 476.1 * 3600_000),
    },
    { ...child('c5', 'fault'), spn: 3242, fmi: 4, state: 'active', count: 5, createdBy: mech2 },
    { ...child('c4', 'fault'), code: 'P0118', state: 'active', count: 1, createdBy: mech1 },
    {
      ...child('c11', 'fault'), spn: 3516, fmi: 18, state: 'active', count: 4, createdBy: mech2,
      clearedAt: new Date(now - 189.6 * 3600_000),
    },
    { ...child('c12', 'fault'), code: 'P0118', state: 'active', count: 2, createdBy: mech1, clearedAt: new Date(now - 597.9 * 3600_000) },
    { ...child('c13', 'fault'), spn: 100, fmi: 1, state: 'active', count: 1, createdBy: mech2 },
  ]).onConflictDoNothing()
  await db.insert(t.readings).values([
    {
      ...child('c6', 'reading:alt'), label: 'Charging voltage at 1500 rpm', quantity: 'voltage', value: 12.4, unit: 'V',
      component: 'Alternator B+', conditions: 'running', spec: { min: 13.5, max: 14.5 }, verdict: 'low', createdBy: mech2,
    },
    {
      ...child('c6', 'reading:alt2'), label: 'Charging voltage after repair', quantity: 'voltage', value: 14.0, unit: 'V',
      component: 'Alternator B+', conditions: 'running', spec: { min: 13.5, max: 14.5 }, verdict: 'pass', createdBy: mech2,
    },
    {
      ...child('c10', 'reading:def'), label: 'DEF concentration', quantity: 'concentration', value: 26, unit: '%', component: 'DEF tank',
      spec: { min: 31.8, max: 33.2 }, verdict: 'low', createdBy: mech1,
    },
  ]).onConflictDoNothing()
  await db.insert(t.partLines).values([
    {
      ...child('c6', 'part'), partNumber: 'TR-ALT-24', description: 'Alternator, 12 V 160 A, remanufactured', quantity: 1,
      unitPriceCents: 38900, coreChargeCents: 7500, serviceTruckId: seedId('truck:Truck 12'), createdBy: mech2,
    },
    {
      ...child('c7', 'part'), partNumber: 'TR-FUSE-30', description: 'Blade fuse 30 A (pack of 5)', quantity: 1, unitPriceCents: 650,
      serviceTruckId: seedId('truck:Truck 11'), createdBy: mech1,
    },
    {
      ...child('c7', 'part2'), partNumber: 'TR-CONN-6', description: 'Connector repair kit, 6-way sealed', quantity: 1,
      unitPriceCents: 3150, serviceTruckId: seedId('truck:Truck 11'), createdBy: mech1,
    },
    {
      ...child('c10', 'part'), partNumber: 'TR-DEF-10', description: 'DEF (AUS 32), 10 L jug', quantity: 3, unitPriceCents: 2400,
      serviceTruckId: seedId('truck:Truck 11'), createdBy: mech1,
    },
    {
      ...child('c11', 'part'), partNumber: 'TR-CONN-6', description: 'Connector repair kit, 6-way sealed', quantity: 1,
      unitPriceCents: 3150, serviceTruckId: seedId('truck:Truck 12'), createdBy: mech2,
    },
    {
      ...child('c12', 'part'), partNumber: 'TR-ECT-10K', description: 'Coolant temperature sensor, NTC type', quantity: 1,
      unitPriceCents: 6275, serviceTruckId: seedId('truck:Truck 11'), createdBy: mech1,
    },
  ]).onConflictDoNothing()
  await db.insert(t.notes).values([
    {
      ...child('c5', 'note'), text: 'Derated to 60 km/h per driver. Ramp is tight; parked with hazards on, devices placed.',
      createdBy: mech2,
    },
  ]).onConflictDoNothing()
  await db.insert(t.signOffs).values([
    {
      ...child('c6', 'signoff'), driverName: 'J. Amundsen',
      signature: 'data:image/svg+xml;base64,PHN2ZyB4bWxucz0iaHR0cDovL3d3dy53My5vcmcvMjAwMC9zdmciIHZpZXdCb3g9IjAgMCAyMDAgNjAiPjxw'
        + 'YXRoIGQ9Ik0xMCA0MGMyMC0zMCA0MCAzMCA2MCAwczQwIDMwIDYwIDAgNDAgMjAgNjAgMCIgc3Ryb2tlPSIjMDAwIiBmaWxsPSJub25lIiBzdH'
        + 'Jva2Utd2lkdGg9IjMiLz48L3N2Zz4=',
      createdBy: mech2,
    },
  ]).onConflictDoNothing()
}
