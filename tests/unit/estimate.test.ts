// The phone's estimate and the office's invoice draft agree to the cent on the same record. The phone
// side reads the rates the way the phone does (a pulled rates row, stored on the device, read back by
// readRates) and builds its record from the device's rows (ISO text) with fieldEstimateRecord; the
// server side builds its record from database rows (Date objects) with estimateRecordOfRows and prices
// it with priceCall, as the invoice draft does (server/utils/pricing.ts). Random clock events, parts
// and rates by fast-check. A second property: what the estimate says the work still needed will cost
// is what the invoice comes to once that work is done.
import fc from 'fast-check'
import { beforeAll, describe, expect, it } from 'vitest'
import { billingRatesOf, priceCall } from '../../shared/utils/billing'
import type { ClockKind } from '../../shared/utils/clockSpans'
import { approvalCoverage, estimateCall, estimateRecordOfRows, limitState, pricingInputOf } from '../../shared/utils/estimate'
import { applyPull, readRates } from '../../app/utils/syncApply'
import { fieldEstimateRecord, type EstimateBasis } from '../../app/utils/fieldEstimate'
import type { CallView } from '../../app/stores/field'
import { freshDevice, pullAnswer } from './outbox-support'

const KINDS: ClockKind[] = ['travel_start', 'arrive', 'work_start', 'work_stop', 'depart']
const T0 = Date.parse('2026-11-30T13:05:00Z')

const ratesArb = fc.record({
  laborCentsPerHour: fc.integer({ min: 0, max: 40_000 }),
  afterHoursMultiplierPct: fc.integer({ min: 100, max: 250 }),
  minimumLaborTenths: fc.integer({ min: 0, max: 20 }),
  roadCallMinimumCents: fc.integer({ min: 0, max: 40_000 }),
  travelBasis: fc.constantFrom('distance', 'time'),
  travelCentsPerUnit: fc.integer({ min: 0, max: 500 }),
  travelUnit: fc.constantFrom('km', 'mi'),
  travelCentsPerHour: fc.integer({ min: 0, max: 20_000 }),
  roadFactorPct: fc.integer({ min: 100, max: 180 }),
  partsMarkupPct: fc.integer({ min: 0, max: 80 }),
  taxRateBasisPoints: fc.integer({ min: 0, max: 1200 }),
  laborTaxable: fc.boolean(), travelTaxable: fc.boolean(), partsTaxable: fc.boolean(), coresTaxable: fc.boolean(),
  feesTaxable: fc.boolean(),
  shopSuppliesBasisPoints: fc.integer({ min: 0, max: 1500 }),
  shopSuppliesCapCents: fc.option(fc.integer({ min: 0, max: 10_000 }), { nil: null }),
  environmentalFeeCents: fc.integer({ min: 0, max: 3000 }),
  averageRoadKph: fc.constant(60),
  timeZone: fc.constantFrom('America/Chicago', 'America/Denver', 'UTC'),
  openMinute: fc.constantFrom(0, 420, 480),
  closeMinute: fc.constantFrom(1020, 1080),
  openDays: fc.constantFrom([1, 2, 3, 4, 5], [1, 2, 3, 4, 5, 6]),
  holidays: fc.constant(['2026-11-26']),
})
const clockArb = fc.array(fc.record({
  kind: fc.constantFrom(...KINDS),
  minutes: fc.integer({ min: 0, max: 600 }),
  flag: fc.option(fc.constant('before_call'), { nil: null, freq: 8 }),
}), { maxLength: 8 })
const partArb = fc.record({
  partNumber: fc.stringMatching(/^[A-Z]{2}-\d{2,4}$/),
  description: fc.constantFrom('Coolant temperature sensor', 'Alternator', 'Air dryer cartridge', 'Fuse 15 A'),
  quantity: fc.constantFrom(0.5, 1, 2, 3, 12.5),
  unitPriceCents: fc.integer({ min: 0, max: 150_000 }),
  coreChargeCents: fc.integer({ min: 0, max: 20_000 }),
})
const siteArb = fc.record({
  yard: fc.option(fc.record({ lat: fc.double({ min: 40, max: 48, noNaN: true }), lon: fc.double({ min: -100, max: -88, noNaN: true }) }),
    { nil: null }),
  lat: fc.option(fc.double({ min: 40, max: 48, noNaN: true }), { nil: null }),
  lon: fc.double({ min: -100, max: -88, noNaN: true }),
  taxExempt: fc.boolean(),
})

const iso = (ms: number) => new Date(ms).toISOString()
const uuid = (n: number, tag: string) => `${tag}0000000-0000-4000-8000-${String(n).padStart(12, '0')}`

let pulled = 0
/** The phone's rates: pulled (as JSON), kept on the device, read back by the typed read path. */
async function ratesOnPhone(rates: Record<string, unknown>) {
  // Each run's rates take effect after the last run's, so the phone's rates in force are this run's.
  pulled++
  const id = uuid(pulled, 'a')
  const row = JSON.parse(JSON.stringify({ id, effectiveFrom: new Date(Date.UTC(2026, 0, 1) + pulled * 1000).toISOString(), ...rates }))
  await applyPull(pullAnswer({ rates: [row] }, { cursor: `c${Math.random()}` }))
  const read = await readRates()
  expect(read).toBeDefined()
  return read!
}

type Case = {
  rates: Record<string, unknown>
  clock: { kind: ClockKind, minutes: number, flag: string | null }[]
  parts: Record<string, number | string>[]
  site: { yard: { lat: number, lon: number } | null, lat: number | null, lon: number, taxExempt: boolean }
}
type PartRow = { id: string, partNumber: string, description: string, quantity: number, unitPriceCents: number, coreChargeCents: number }

/** The same record as the server's rows and as the phone's view. */
function sides(c: Case, now: number) {
  const clock = c.clock.map((e, i) => ({
    id: uuid(i, 'c'), kind: e.kind, deviceAt: new Date(T0 + e.minutes * 60_000), createdAt: new Date(now), flag: e.flag,
  }))
  const parts = c.parts.map((p, i) => ({ id: uuid(i, 'b'), ...p })) as PartRow[]
  const view = {
    call: { id: uuid(1, 'd'), status: 'on_site', lat: c.site.lat, lon: c.site.lon, serviceTruckId: uuid(1, 'e'), authLimitCents: 150_000 },
    customer: { id: uuid(1, 'f'), taxExempt: c.site.taxExempt },
    // What the pull delivers, as JSON: dates as ISO text.
    clockEvents: JSON.parse(JSON.stringify(clock)),
    partLines: JSON.parse(JSON.stringify(parts)),
    approvals: [], approvalRequests: [],
  } as unknown as CallView
  return { clock, parts, view }
}

beforeAll(async () => {
  await freshDevice()
})

describe('the phone\'s estimate and the invoice draft', () => {
  it('agree to the cent on the same record: random clock events, parts and rates', async () => {
    const partsArb = fc.array(partArb, { maxLength: 4 })
    await fc.assert(fc.asyncProperty(ratesArb, clockArb, partsArb, siteArb, async (rates, clockIn, partsIn, site) => {
      const c: Case = { rates, clock: clockIn, parts: partsIn, site }
      const now = T0 + 11 * 3_600_000
      const { clock, parts, view } = sides(c, now)
      // The server: database rows, the rates row through billingRatesOf, priced as the draft is.
      const server = priceCall(pricingInputOf(estimateRecordOfRows({
        rates: billingRatesOf(rates as Parameters<typeof billingRatesOf>[0]), site: { lat: site.lat, lon: site.lon }, clock, parts,
        yard: site.yard, taxExempt: site.taxExempt, until: new Date(now),
      })))
      // The phone: its own rows and the rates read back from the device.
      const basis: EstimateBasis = {
        rates: await ratesOnPhone(rates),
        trucks: site.yard ? { [uuid(1, 'e')]: { id: uuid(1, 'e'), yardLat: site.yard.lat, yardLon: site.yard.lon } } : {},
        stock: [],
      }
      const phone = estimateCall(fieldEstimateRecord(view, basis, new Date(now))!, 150_000).sofar
      expect(phone.totalCents).toBe(server.totalCents)
      expect(phone.taxCents).toBe(server.taxCents)
      expect(phone.lines.map(l => [l.key, l.amountCents])).toEqual(server.lines.map(l => [l.key, l.amountCents]))
    }), { numRuns: 60 })
  }, 120_000)

  it('what the estimate expects for the work still needed is what the invoice comes to once it is done', () => {
    fc.assert(fc.property(ratesArb, fc.integer({ min: 5, max: 240 }), fc.integer({ min: 0, max: 300 }), fc.array(partArb, { maxLength: 3 }),
      siteArb, (rates, travelMin, plannedMin, planned, site) => {
        const r = billingRatesOf(rates as Parameters<typeof billingRatesOf>[0])
        const arrive = T0 + travelMin * 60_000
        const now = arrive + 45 * 60_000
        const clock = [
          { id: 'c1', kind: 'travel_start' as const, deviceAt: iso(T0) }, { id: 'c2', kind: 'arrive' as const, deviceAt: iso(arrive) },
          { id: 'c3', kind: 'work_start' as const, deviceAt: iso(arrive + 5 * 60_000) },
        ]
        const base = { rates: r, site: { lat: site.lat, lon: site.lon }, yard: site.yard, taxExempt: site.taxExempt }
        const est = estimateCall(estimateRecordOfRows({ ...base, clock, parts: [], until: iso(now) }), null,
          { laborMinutes: plannedMin, parts: planned as never })
        // The work done as planned: the clock stops after the planned minutes, the parts are fitted.
        const done = now + plannedMin * 60_000
        const invoice = priceCall(pricingInputOf(estimateRecordOfRows({
          ...base, until: iso(done),
          clock: [...clock, { id: 'c4', kind: 'work_stop' as const, deviceAt: iso(done) }],
          parts: (planned as { partNumber: string, description: string, quantity: number }[]).map((p, i) => ({ id: `p${i}`, ...p })),
        })))
        expect(est.expected.totalCents).toBe(invoice.totalCents)
        expect(est.expected.taxCents).toBe(invoice.taxCents)
      }), { numRuns: 150 })
  }, 120_000)
})

describe('the limit and the approvals', () => {
  it('warns from 80 % and stops from 100 % of the limit', () => {
    // The shop's rule (issue text): warn at 80 %, stop at 100 %.
    expect(limitState(119_999, 150_000).state).toBe('ok')
    expect(limitState(120_000, 150_000).state).toBe('warn')
    expect(limitState(149_999, 150_000).state).toBe('warn')
    expect(limitState(150_000, 150_000).state).toBe('stop')
    expect(limitState(500, null).state).toBe('none')
    expect(limitState(1, 0).state).toBe('stop')
  })

  it('each line is covered by the first approval its running total fits; what is past the last one is counted', () => {
    // Worked by hand: lines of $1,000, $400 and $300 with 10 % tax on the first two: running 1,100, 1,540, 1,840.
    const lines = [
      { key: 'labor', amountCents: 100_000, taxable: true }, { key: 'part:a', amountCents: 40_000, taxable: true },
      { key: 'part:b', amountCents: 30_000, taxable: false },
    ] as never
    const steps = [{ id: null, amountCents: 150_000, label: 'limit' }, { id: 'a1', amountCents: 160_000, label: 'approval' }]
    const c = approvalCoverage({ lines, totalCents: 184_000 }, 1000, steps)
    expect(c.lines.map(l => l.runningCents)).toEqual([110_000, 154_000, 184_000])
    expect(c.lines.map(l => l.coveredBy?.label ?? 'none')).toEqual(['limit', 'approval', 'none'])
    expect(c.pastCents).toBe(24_000)
  })
})
