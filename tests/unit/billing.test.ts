import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  laborTenthsFromMs, markedUpCents, priceCall, type BillingRates, type PriceAdjustment, type PricingInput,
} from '../../shared/utils/billing'
import { clockTotals, type BillingClockEvent } from '../../shared/utils/clockSpans'

const MIN = 60_000
// An invented shop: $145/h, after hours at 150 %, open 07:00–18:00 Monday to Friday in Chicago.
const rates: BillingRates = {
  laborCentsPerHour: 14500, afterHoursMultiplierPct: 150, minimumLaborTenths: 10, roadCallMinimumCents: 12500,
  travelBasis: 'distance', travelCentsPerUnit: 225, travelUnit: 'km', travelCentsPerHour: 9500, roadFactorPct: 130,
  partsMarkupPct: 25, taxRateBasisPoints: 725,
  laborTaxable: false, travelTaxable: false, partsTaxable: true, coresTaxable: false, feesTaxable: true,
  shopSuppliesBasisPoints: 0, shopSuppliesCapCents: null, environmentalFeeCents: 0,
  timeZone: 'America/Chicago', openMinute: 7 * 60, closeMinute: 18 * 60, openDays: [1, 2, 3, 4, 5], holidays: ['2026-12-25'],
}
const work = (from: string, to: string, flag?: string): BillingClockEvent[] => [
  { id: `s-${from}`, kind: 'work_start', at: from, ...(flag ? { flag } : {}) }, { id: `e-${to}`, kind: 'work_stop', at: to },
]
const base = (over: Partial<PricingInput> = {}): PricingInput => ({
  rates, clock: [], clockUntil: '2026-03-10T23:59:00Z', distance: { straightKm: null }, parts: [], taxExempt: false, ...over,
})
const amounts = (p: ReturnType<typeof priceCall>) => p.lines.map(l => [l.key, l.amountCents])

describe('labor in tenths of an hour', () => {
  it('bills a started six minutes as a tenth', () => {
    // common practice: labor in tenths of an hour, 0.1 h = 6 min; rounding up is our stated policy
    expect(laborTenthsFromMs(6 * MIN)).toBe(1)
    expect(laborTenthsFromMs(7 * MIN)).toBe(2)
    expect(laborTenthsFromMs(60 * MIN)).toBe(10)
    expect(laborTenthsFromMs(0)).toBe(0)
    expect(laborTenthsFromMs(1)).toBe(1)
  })
  it('agrees with exact integer arithmetic for any duration', () => {
    // A second, independent computation: ceil(ms / 360000) in BigInt, no floating point.
    fc.assert(fc.property(fc.integer({ min: 0, max: 48 * 60 * MIN }), (ms) => {
      expect(laborTenthsFromMs(ms)).toBe(Number((BigInt(ms) + 359_999n) / 360_000n))
    }))
  })
  it('refuses negative or NaN time', () => {
    expect(() => laborTenthsFromMs(-1)).toThrow(RangeError)
    expect(() => laborTenthsFromMs(Number.NaN)).toThrow(RangeError)
  })
})

describe('clock totals', () => {
  const at = (m: number) => new Date(Date.UTC(2026, 2, 1, 8, 0) + m * MIN).toISOString()
  it('derives travel and labor from the events, in time order whatever the input order', () => {
    const t = clockTotals([
      { kind: 'work_stop', at: at(120) }, { kind: 'travel_start', at: at(0) }, { kind: 'arrive', at: at(35) },
      { kind: 'work_start', at: at(40) }, { kind: 'depart', at: at(125) },
    ])
    expect(t.travelMs).toBe(35 * MIN)
    expect(t.laborMs).toBe(80 * MIN)
  })
})

describe('a priced call, worked by hand', () => {
  it('splits labor at closing time, adds road travel, parts, core, fees and tax', () => {
    // Tuesday 2026-03-10 in Chicago is daylight time, UTC−5 (US rule: from the second Sunday of
    // March, 15 U.S.C. §260a as amended by the Energy Policy Act of 2005).
    // Work 16:55–18:18 CDT = 21:55Z–23:18Z: 83 min, of which 65 before the 18:00 close and 18 after.
    // Total ⌈83/6⌉ = 14 tenths; after hours ⌈18/6⌉ = 3 tenths; normal 14 − 3 = 11 tenths.
    //   labor        1.1 h × $145.00                       = $159.50
    //   after hours  0.3 h × ($145.00 × 150 % = $217.50)   =  $65.25
    //   travel       28.3 km straight × 1.3 = 36.79 → 36.8 km × $2.25 = $82.80
    //   part         $389.00 + 25 % = $486.25 (taxed);  core $75.00 (untaxed)
    //   env. fee     $6.50 (taxed)
    //   supplies     5 % of labor ($159.50 + $65.25 = $224.75) = $11.2375 → $11.24, under the $35 cap (taxed)
    // Subtotal 159.50 + 65.25 + 82.80 + 486.25 + 75.00 + 6.50 + 11.24 = $886.54
    // Tax 7.25 % × (486.25 + 6.50 + 11.24 = $503.99) = $36.539… → $36.54; total $923.08
    const p = priceCall(base({
      rates: { ...rates, shopSuppliesBasisPoints: 500, shopSuppliesCapCents: 3500, environmentalFeeCents: 650 },
      clock: work('2026-03-10T21:55:00Z', '2026-03-10T23:18:00Z'),
      distance: { straightKm: 28.3 },
      parts: [{ id: 'p1', partNumber: 'TR-ALT-24', description: 'Alternator', quantity: 1, unitPriceCents: 38900, coreChargeCents: 7500 }],
    }))
    expect(amounts(p)).toEqual([
      ['labor', 15950], ['labor:after', 6525], ['travel', 8280], ['part:p1', 48625], ['core:p1', 7500], ['env-fee', 650],
      ['supplies', 1124],
    ])
    expect(p.lines.find(l => l.key === 'labor:after')!.unitCents).toBe(21750)
    expect(p.subtotalCents).toBe(88654)
    expect(p.taxCents).toBe(3654)
    expect(p.totalCents).toBe(92308)
    // Every line names where it comes from.
    expect(p.lines.find(l => l.key === 'labor')!.source).toEqual({ rate: 'laborCentsPerHour',
      clockEventIds: ['s-2026-03-10T21:55:00Z', 'e-2026-03-10T23:18:00Z'] })
    expect(p.lines.find(l => l.key === 'part:p1')!.source).toEqual({ partLineId: 'p1', rate: 'partsMarkupPct' })
  })

  it('caps shop supplies', () => {
    // 8 h inside hours × $145 = $1,160.00; 5 % = $58.00, capped at $35.00
    const p = priceCall(base({ rates: { ...rates, shopSuppliesBasisPoints: 500, shopSuppliesCapCents: 3500 },
      clock: work('2026-03-10T13:00:00Z', '2026-03-10T21:00:00Z') }))
    expect(amounts(p)).toEqual([['labor', 116000], ['supplies', 3500]])
  })

  it('bills the minimum labor and tops up to the road-call minimum', () => {
    // 10 min of work at 10:00 CDT is billed as the 1.0 h minimum: $145.00; road-call minimum $125 met.
    const a = priceCall(base({ clock: work('2026-03-10T15:00:00Z', '2026-03-10T15:10:00Z') }))
    expect(amounts(a)).toEqual([['labor', 14500]])
    expect(a.lines[0]!.description).toMatch(/minimum 1\.0 h; 0\.2 h on the clock/)
    // At $90/h: labor $90.00 + travel 10 km × 1.3 = 13.0 km × $2.25 = $29.25 → $119.25; minimum $125 → $5.75 more.
    const b = priceCall(base({ rates: { ...rates, laborCentsPerHour: 9000 }, clock: work('2026-03-10T15:00:00Z',
      '2026-03-10T15:10:00Z'), distance: { straightKm: 10 } }))
    expect(amounts(b)).toEqual([['labor', 9000], ['travel', 2925], ['minimum', 575]])
    expect(b.totalCents).toBe(12500)
  })

  it('bills travel by the mile, by road when known', () => {
    // 20 km straight × 1.3 = 26 km = 16.155… mi (1 mi = 1.609344 km exactly) → 16.2 mi × $3.50 = $56.70
    const mi = { ...rates, travelUnit: 'mi' as const, travelCentsPerUnit: 350 }
    expect(amounts(priceCall(base({ rates: mi, distance: { straightKm: 20 } })))[1]).toEqual(['travel', 5670])
    // By road 30 km = 18.64… mi → 18.6 mi × $3.50 = $65.10; the road factor does not apply
    const road = priceCall(base({ rates: mi, distance: { straightKm: 20, roadKm: 30 } }))
    expect(amounts(road)[1]).toEqual(['travel', 6510])
    expect(road.lines[1]!.description).toMatch(/by road/)
  })

  it('bills travel by the clocked time when the rates say so', () => {
    // Travel 10:00–10:35 CDT: ⌈35/6⌉ = 6 tenths = 0.6 h × $95.00 = $57.00
    const p = priceCall(base({
      rates: { ...rates, travelBasis: 'time', minimumLaborTenths: 0, roadCallMinimumCents: 0 }, distance: { straightKm: 50 },
      clock: [{ kind: 'travel_start', at: '2026-03-10T15:00:00Z' }, { kind: 'arrive', at: '2026-03-10T15:35:00Z' }],
    }))
    expect(amounts(p)).toEqual([['travel', 5700]])
  })

  it('charges no tax to a tax-exempt customer', () => {
    const p = priceCall(base({ taxExempt: true, clock: work('2026-03-10T15:00:00Z', '2026-03-10T16:00:00Z'),
      parts: [{ partNumber: 'TR-FUSE-30', description: 'Fuse', quantity: 2, unitPriceCents: 650, coreChargeCents: 0 }] }))
    expect(p.taxCents).toBe(0)
    expect(p.totalCents).toBe(p.subtotalCents)
  })

  it('taxes the line kinds the rates name', () => {
    // 1.0 h labor $145.00, travel 13.0 km $29.25, part $10.00 + 25 % = $12.50, core $5.00, env. fee $6.50.
    const input = base({
      rates: { ...rates, environmentalFeeCents: 650 }, clock: work('2026-03-10T15:00:00Z', '2026-03-10T16:00:00Z'),
      distance: { straightKm: 10 },
      parts: [{ id: 'x', partNumber: 'X', description: 'x', quantity: 1, unitPriceCents: 1000, coreChargeCents: 500 }],
    })
    const taxed = (over: Partial<BillingRates>) => priceCall({ ...input, rates: { ...input.rates, ...over } }).taxCents
    const none = { laborTaxable: false, travelTaxable: false, partsTaxable: false, coresTaxable: false, feesTaxable: false }
    expect(taxed(none)).toBe(0)
    expect(taxed({ ...none, laborTaxable: true })).toBe(1051) // 7.25 % × $145.00 = $10.5125 → $10.51
    expect(taxed({ ...none, travelTaxable: true })).toBe(212) // 7.25 % × $29.25 = $2.1206 → $2.12
    expect(taxed({ ...none, partsTaxable: true })).toBe(91) // 7.25 % × $12.50 = $0.906 → $0.91
    expect(taxed({ ...none, coresTaxable: true })).toBe(36) // 7.25 % × $5.00 = $0.3625 → $0.36
    expect(taxed({ ...none, feesTaxable: true })).toBe(47) // 7.25 % × $6.50 = $0.4712 → $0.47
  })

  it('marks up part prices to the cent, half up', () => {
    // 25 % markup on $10.01 = $12.5125 → $12.51; on $0.02 = $0.025 → $0.03
    expect(markedUpCents(1001, 25)).toBe(1251)
    expect(markedUpCents(2, 25)).toBe(3)
  })

  it('refuses impossible input', () => {
    expect(() => priceCall(base({ distance: { straightKm: -1 } }))).toThrow(/travel distance/)
    expect(() => priceCall(base({ parts: [{ partNumber: 'X', description: 'x', quantity: 0, unitPriceCents: 1,
      coreChargeCents: 0 }] }))).toThrow(/quantity/)
    expect(() => priceCall(base({ rates: { ...rates, laborCentsPerHour: 10.5 } }))).toThrow(/cents/)
  })
})

describe('after hours, by the local time in the business\'s zone', () => {
  const open7 = { ...rates, openDays: [1, 2, 3, 4, 5, 6, 7], minimumLaborTenths: 0, roadCallMinimumCents: 0 }
  const split = (r: BillingRates, from: string, to: string) => {
    const p = priceCall(base({ rates: r, clock: work(from, to) }))
    return { normal: p.lines.find(l => l.key === 'labor')?.quantity ?? 0, after: p.lines.find(l => l.key === 'labor:after')?.quantity ?? 0 }
  }

  it('splits work across midnight into the next morning', () => {
    // Sunday 2026-03-15 23:00 CDT (04:00Z Monday) to Monday 08:30 CDT (13:30Z): 9.5 h.
    // Sunday is closed (1 h after) and Monday 00:00–07:00 is before opening (7 h after): 8.0 h after, 1.5 h normal.
    expect(split(rates, '2026-03-16T04:00:00Z', '2026-03-16T13:30:00Z')).toEqual({ normal: 1.5, after: 8 })
  })

  it('opens at 07:00 local on the spring-forward day (America/Chicago, 2026-03-08)', () => {
    // Clocks go from 02:00 CST to 03:00 CDT on the second Sunday of March (15 U.S.C. §260a, EPAct 2005):
    // 2026-03-08. So 07:00 that morning is 12:00Z (UTC−5), not 13:00Z as a fixed CST offset would give.
    // Work 10:00Z–14:00Z = 05:00–09:00 CDT: 2.0 h before opening, 2.0 h inside hours.
    expect(split(open7, '2026-03-08T10:00:00Z', '2026-03-08T14:00:00Z')).toEqual({ normal: 2, after: 2 })
    // Across the jump: 00:30 CST (06:30Z) to 04:30 CDT (09:30Z) is 3 real hours, though the wall clock shows 4.
    expect(split(open7, '2026-03-08T06:30:00Z', '2026-03-08T09:30:00Z')).toEqual({ normal: 0, after: 3 })
  })

  it('closes at 18:00 local on the fall-back day (America/Chicago, 2026-11-01)', () => {
    // First Sunday of November: 02:00 CDT becomes 01:00 CST; 18:00 that evening is 00:00Z on 11-02 (UTC−6).
    // Work 22:00Z–02:00Z = 16:00–20:00 CST: 2.0 h normal, 2.0 h after.
    expect(split(open7, '2026-11-01T22:00:00Z', '2026-11-02T02:00:00Z')).toEqual({ normal: 2, after: 2 })
  })

  it('bills a holiday as after hours all day', () => {
    // Friday 2026-12-25 10:00–12:00 CST (16:00Z–18:00Z) is in the rates' holidays.
    expect(split(open7, '2026-12-25T16:00:00Z', '2026-12-25T18:00:00Z')).toEqual({ normal: 0, after: 2 })
    expect(split(open7, '2026-12-24T16:00:00Z', '2026-12-24T18:00:00Z')).toEqual({ normal: 2, after: 0 })
  })

  it('agrees minute by minute with the local time Intl reports', () => {
    // An independent computation: for each minute of the span, ask Intl.DateTimeFormat for the local
    // weekday and time in the zone, and count the minutes inside the hours.
    const zones = ['America/Chicago', 'Europe/Berlin', 'Australia/Lord_Howe', 'Asia/Kathmandu']
    const weekday: Record<string, number> = { Mon: 1, Tue: 2, Wed: 3, Thu: 4, Fri: 5, Sat: 6, Sun: 7 }
    fc.assert(fc.property(
      fc.constantFrom(...zones), fc.integer({ min: 0, max: 2 * 366 * 24 * 60 }), fc.integer({ min: 1, max: 30 * 60 }),
      fc.integer({ min: 0, max: 23 }), fc.integer({ min: 1, max: 24 }), fc.subarray([1, 2, 3, 4, 5, 6, 7], { minLength: 1 }),
      (timeZone, startMin, lengthMin, openH, lenH, openDays) => {
        const r: BillingRates = { ...open7, timeZone, openMinute: openH * 60, closeMinute: Math.min(1440, (openH + lenH) * 60),
          openDays, holidays: [] }
        const start = Date.UTC(2025, 0, 1) + startMin * MIN
        const fmt = new Intl.DateTimeFormat('en-US', { timeZone, weekday: 'short', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' })
        let inside = 0
        for (let m = 0; m < lengthMin; m++) {
          const parts = Object.fromEntries(fmt.formatToParts(start + m * MIN).map(x => [x.type, x.value]))
          const local = Number(parts.hour) * 60 + Number(parts.minute)
          if (openDays.includes(weekday[parts.weekday!]!) && local >= r.openMinute && local < r.closeMinute) inside++
        }
        const p = priceCall(base({ rates: r, clock: work(new Date(start).toISOString(), new Date(start + lengthMin * MIN).toISOString()) }))
        const total = Math.ceil(lengthMin / 6)
        const after = Math.min(total, Math.ceil((lengthMin - inside) / 6))
        expect(p.lines.find(l => l.key === 'labor:after')?.quantity ?? 0).toBeCloseTo(after / 10, 9)
        expect(p.lines.find(l => l.key === 'labor')?.quantity ?? 0).toBeCloseTo((total - after) / 10, 9)
      },
    ), { numRuns: 60 })
  })
})

describe('the office\'s changes to a draft', () => {
  const input = base({
    rates: { ...rates, shopSuppliesBasisPoints: 500, shopSuppliesCapCents: null },
    clock: work('2026-03-10T15:00:00Z', '2026-03-10T17:00:00Z'), distance: { straightKm: 10 },
  })
  it('reprices what depends on a changed line', () => {
    // 2.0 h → 1.5 h at $145: labor $217.50; shop supplies 5 % follow: $10.875 → $10.88
    const p = priceCall({ ...input, adjustments: [{ action: 'change', key: 'labor', changes: { quantity: 1.5 } }] })
    expect(amounts(p)).toEqual([['labor', 21750], ['travel', 2925], ['supplies', 1088]])
    expect(p.lines[0]!.adjusted).toBe(true)
    // The description names the new hours, so the customer never reads 2.0 h beside a quantity of 1.5.
    expect(p.lines[0]!.description).toBe('Labor 1.5 h (tenths of an hour, rounded up)')
    const described = priceCall({ ...input, adjustments: [{ action: 'change', key: 'labor', changes: { quantity: 1.5,
      description: 'Labor, agreed' } }] })
    expect(described.lines[0]!.description).toBe('Labor, agreed')
  })
  it('adds, removes and replays in order; a change to a line that is gone is reported, not applied', () => {
    const adj: PriceAdjustment[] = [
      { action: 'add', key: 'office:1', line: { kind: 'fee', description: 'Tire disposal', quantity: 2, unitCents: 400, taxable: true } },
      { action: 'remove', key: 'supplies' },
      { action: 'change', key: 'nope', changes: { quantity: 1 } },
      { action: 'road', distance: 15 },
    ]
    const p = priceCall({ ...input, adjustments: adj })
    // travel by road 15.0 km × $2.25 = $33.75; two tires × $4.00 = $8.00, taxed 7.25 % = $0.58
    expect(amounts(p)).toEqual([['labor', 29000], ['travel', 3375], ['office:1', 800]])
    expect(p.taxCents).toBe(58)
    expect(p.unapplied).toEqual([adj[2]])
    expect(p.lines.find(l => l.key === 'office:1')!.source).toEqual({ office: true })
  })
})

describe('clock events the phone could not be trusted on', () => {
  it('are left out of the priced time and reported', () => {
    const clock = [...work('2026-03-10T15:00:00Z', '2026-03-10T16:00:00Z'), ...work('2026-03-10T18:00:00Z', '2026-03-10T23:00:00Z',
      'future')]
    const p = priceCall(base({ clock }))
    // Only the trusted hour is billed: 1.0 h × $145.00
    expect(amounts(p)).toEqual([['labor', 14500]])
    expect(p.excludedClock).toEqual([{ id: 's-2026-03-10T18:00:00Z', kind: 'work_start', at: '2026-03-10T18:00:00.000Z', flag: 'future' }])
  })
})

describe('an estimate of a call still in progress', () => {
  it('prices the clock so far plus the time and parts still expected', () => {
    // On the clock 15:00Z–15:30Z (open span up to now = 15:30Z), 60 min more expected from 15:30Z:
    // 90 min inside hours = 1.5 h × $145 = $217.50; expected part $50 + 25 % = $62.50.
    const p = priceCall(base({
      clock: [{ kind: 'work_start', at: '2026-03-10T15:00:00Z' }], clockUntil: '2026-03-10T15:30:00Z',
      planned: [{ kind: 'labor', start: '2026-03-10T15:30:00Z', minutes: 60 }],
      parts: [{ partNumber: 'TR-ECT-10K', description: 'Sensor', quantity: 1, unitPriceCents: 5000, coreChargeCents: 0 }],
    }))
    expect(amounts(p)).toEqual([['labor', 21750], ['part:0', 6250]])
    expect(p.lines[0]!.source.planned).toBe(true)
  })
})

describe('properties of every priced invoice', () => {
  const arbRates = fc.record({
    laborCentsPerHour: fc.integer({ min: 0, max: 40_000 }), afterHoursMultiplierPct: fc.integer({ min: 100, max: 400 }),
    minimumLaborTenths: fc.integer({ min: 0, max: 40 }), roadCallMinimumCents: fc.integer({ min: 0, max: 50_000 }),
    travelBasis: fc.constantFrom('distance' as const, 'time' as const), travelCentsPerUnit: fc.integer({ min: 0, max: 1000 }),
    travelUnit: fc.constantFrom('km' as const, 'mi' as const), travelCentsPerHour: fc.integer({ min: 0, max: 20_000 }),
    roadFactorPct: fc.integer({ min: 100, max: 300 }), partsMarkupPct: fc.integer({ min: 0, max: 500 }),
    taxRateBasisPoints: fc.integer({ min: 0, max: 3000 }),
    laborTaxable: fc.boolean(), travelTaxable: fc.boolean(), partsTaxable: fc.boolean(), coresTaxable: fc.boolean(),
    feesTaxable: fc.boolean(),
    shopSuppliesBasisPoints: fc.integer({ min: 0, max: 2500 }), shopSuppliesCapCents: fc.option(fc.integer({ min: 0, max: 10_000 })),
    environmentalFeeCents: fc.integer({ min: 0, max: 5000 }),
    timeZone: fc.constantFrom('America/Chicago', 'America/New_York', 'Europe/London', 'UTC'),
    openMinute: fc.integer({ min: 0, max: 720 }), closeMinute: fc.integer({ min: 721, max: 1440 }),
    openDays: fc.subarray([1, 2, 3, 4, 5, 6, 7]), holidays: fc.constant(['2026-03-08']),
  })
  const arbInput = fc.record({
    rates: arbRates,
    start: fc.integer({ min: 0, max: 60 * 24 * 60 }), work: fc.integer({ min: 0, max: 20 * 60 }), travel: fc.integer({ min: 0,
      max: 5 * 60 }),
    km: fc.option(fc.double({ min: 0, max: 800, noNaN: true })), exempt: fc.boolean(),
    parts: fc.array(fc.record({ q: fc.integer({ min: 1, max: 20 }), p: fc.integer({ min: 0, max: 200_000 }), c: fc.integer({ min: 0,
      max: 20_000 }) }), { maxLength: 5 }),
    qty: fc.option(fc.double({ min: 0.1, max: 20, noNaN: true })),
  })
  const toInput = (x: typeof arbInput extends fc.Arbitrary<infer T> ? T : never): PricingInput => {
    const t0 = Date.UTC(2026, 1, 1) + x.start * MIN
    const iso = (m: number) => new Date(t0 + m * MIN).toISOString()
    return {
      rates: x.rates, taxExempt: x.exempt, clockUntil: iso(x.travel + x.work + 10), distance: { straightKm: x.km },
      clock: [
        { kind: 'travel_start', at: iso(0) }, { kind: 'arrive', at: iso(x.travel) },
        { kind: 'work_start', at: iso(x.travel) }, { kind: 'work_stop', at: iso(x.travel + x.work) },
      ],
      parts: x.parts.map((p, i) => ({ id: `p${i}`, partNumber: `P${i}`, description: 'part', quantity: p.q, unitPriceCents: p.p,
        coreChargeCents: p.c })),
      adjustments: x.qty === null ? [] : [{ action: 'change', key: 'labor', changes: { quantity: Math.round(x.qty * 10) / 10 } }],
    }
  }

  it('adds up to the cent: whole-cent lines, subtotal the sum of the lines, total = subtotal + tax', () => {
    fc.assert(fc.property(arbInput, (x) => {
      const p = priceCall(toInput(x))
      for (const l of p.lines) {
        expect(Number.isInteger(l.amountCents), l.key).toBe(true)
        expect(Number.isInteger(l.unitCents), l.key).toBe(true)
      }
      expect(p.subtotalCents).toBe(p.lines.reduce((s, l) => s + l.amountCents, 0))
      expect(Number.isInteger(p.taxCents)).toBe(true)
      expect(p.totalCents).toBe(p.subtotalCents + p.taxCents)
      // The tax is the rate on the taxable lines, to the nearest cent (half a cent at most off the exact figure).
      const taxable = p.lines.filter(l => l.taxable).reduce((s, l) => s + l.amountCents, 0)
      expect(Math.abs(p.taxCents - taxable * x.rates.taxRateBasisPoints / 10_000)).toBeLessThanOrEqual(0.5 + 1e-9)
      if (x.exempt) expect(p.taxCents).toBe(0)
    }), { numRuns: 300 })
  })

  it('never bills below the minimums the rates set', () => {
    fc.assert(fc.property(arbInput, (x) => {
      const p = priceCall({ ...toInput(x), adjustments: [] })
      const labor = p.lines.filter(l => l.kind === 'labor' && l.key.startsWith('labor'))
      expect(Math.round(labor.reduce((s, l) => s + l.quantity * 10, 0))).toBeGreaterThanOrEqual(x.rates.minimumLaborTenths)
      const call = p.lines.filter(l => ['labor', 'travel', 'minimum'].includes(l.kind)).reduce((s, l) => s + l.amountCents, 0)
      expect(call).toBeGreaterThanOrEqual(x.rates.roadCallMinimumCents)
      const supplies = p.lines.find(l => l.key === 'supplies')
      if (supplies && x.rates.shopSuppliesCapCents !== null) expect(supplies.amountCents).toBeLessThanOrEqual(x.rates.shopSuppliesCapCents)
    }), { numRuns: 300 })
  })
})
