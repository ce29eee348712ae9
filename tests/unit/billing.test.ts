import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { clockTotals, laborTenthsFromMs, markedUpCents, priceCall, type BillingRates } from '../../shared/utils/billing'

const MIN = 60_000
const rates: BillingRates = {
  laborCentsPerHour: 14500, minimumLaborTenths: 10, roadCallMinimumCents: 12500,
  travelCentsPerUnit: 225, travelUnit: 'km', partsMarkupPct: 25, taxRateBasisPoints: 725, laborTaxable: false,
}

describe('labor in tenths of an hour', () => {
  it('bills a started six minutes as a tenth', () => {
    // common practice: labor in tenths of an hour, 0.1 h = 6 min; rounding up is our stated policy
    expect(laborTenthsFromMs(6 * MIN)).toBe(1)
    expect(laborTenthsFromMs(7 * MIN)).toBe(2)
    expect(laborTenthsFromMs(60 * MIN)).toBe(10)
    expect(laborTenthsFromMs(0)).toBe(0)
    expect(laborTenthsFromMs(1)).toBe(1)
  })
  it('does not round exact tenths up through float noise', () => {
    const start = new Date('2026-03-01T10:00:00Z').getTime()
    expect(laborTenthsFromMs(start + 18 * MIN - start)).toBe(3)
  })
  it('agrees with exact integer arithmetic for any duration', () => {
    // A second, independent computation: ceil(ms / 360000) in BigInt, no floating point.
    fc.assert(fc.property(fc.integer({ min: 0, max: 48 * 60 * MIN }), (ms) => {
      const exact = Number((BigInt(ms) + 359_999n) / 360_000n)
      expect(laborTenthsFromMs(ms)).toBe(exact)
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
  it('adds up several work spans and counts an open one up to now', () => {
    const t = clockTotals([
      { kind: 'work_start', at: at(0) }, { kind: 'work_stop', at: at(30) }, { kind: 'work_start', at: at(45) },
    ], new Date(at(60)))
    expect(t.laborMs).toBe(45 * MIN)
  })
})

describe('pricing a call', () => {
  it('prices a worked example by hand', () => {
    // common practice: a hand-worked invoice. Labor 83 min → 1.4 h × $145.00 = $203.00;
    // travel 36.8 km × $2.25 = $82.80; part $389.00 + 25 % = $486.25; core $75.00 untaxed;
    // tax 7.25 % of $486.25 = $35.253… → $35.25; total $882.30.
    const inv = priceCall({ rates, laborMs: 83 * MIN, travelDistance: 36.8, taxExempt: false, parts: [
      { partNumber: 'TR-ALT-24', description: 'Alternator', quantity: 1, unitPriceCents: 38900, coreChargeCents: 7500 },
    ] })
    expect(inv.lines.map(l => [l.kind, l.amountCents])).toEqual([['labor', 20300], ['travel', 8280], ['part', 48625], ['core', 7500]])
    expect(inv.subtotalCents).toBe(84705)
    expect(inv.taxCents).toBe(3525)
    expect(inv.totalCents).toBe(88230)
  })
  it('bills the minimum labor and tops up to the road-call minimum', () => {
    // 10 minutes of work is billed as the 1.0 h minimum: $145.00; no travel; minimum $125 already met.
    const a = priceCall({ rates, laborMs: 10 * MIN, travelDistance: 0, parts: [], taxExempt: false })
    expect(a.lines.map(l => [l.kind, l.amountCents])).toEqual([['labor', 14500]])
    // With a lower labor rate the call charges fall under the road-call minimum: the difference is added.
    const b = priceCall({ rates: { ...rates, laborCentsPerHour: 9000 }, laborMs: 10 * MIN, travelDistance: 10, parts: [], taxExempt: false })
    expect(b.lines.map(l => [l.kind, l.amountCents])).toEqual([['labor', 9000], ['travel', 2250], ['minimum', 1250]])
    expect(b.totalCents).toBe(12500)
  })
  it('charges no tax to a tax-exempt customer', () => {
    const inv = priceCall({ rates, laborMs: 60 * MIN, travelDistance: 0, taxExempt: true, parts: [
      { partNumber: 'TR-FUSE-30', description: 'Fuse', quantity: 2, unitPriceCents: 650, coreChargeCents: 0 },
    ] })
    expect(inv.taxCents).toBe(0)
    expect(inv.totalCents).toBe(inv.subtotalCents)
  })
  it('keeps every amount in whole cents and the total equal to subtotal plus tax', () => {
    fc.assert(fc.property(
      fc.integer({ min: 0, max: 600 * MIN }), fc.double({ min: 0, max: 500, noNaN: true }),
      fc.array(fc.record({ q: fc.integer({ min: 1, max: 20 }), p: fc.integer({ min: 0, max: 200_000 }), c: fc.integer({ min: 0, max: 20_000 }) }), { maxLength: 6 }),
      (laborMs, dist, parts) => {
        const inv = priceCall({ rates, laborMs, travelDistance: dist, taxExempt: false, parts: parts.map((x, i) => ({ partNumber: `P${i}`, description: 'part', quantity: x.q, unitPriceCents: x.p, coreChargeCents: x.c })) })
        for (const l of inv.lines) expect(Number.isInteger(l.amountCents)).toBe(true)
        expect(inv.subtotalCents).toBe(inv.lines.reduce((s, l) => s + l.amountCents, 0))
        expect(inv.totalCents).toBe(inv.subtotalCents + inv.taxCents)
        expect(inv.totalCents).toBeGreaterThanOrEqual(rates.roadCallMinimumCents)
      },
    ))
  })
  it('marks up part prices to the cent, half up', () => {
    // common practice: 25 % markup on $10.01 = $12.5125 → $12.51; on $0.02 = $0.025 → $0.03
    expect(markedUpCents(1001, 25)).toBe(1251)
    expect(markedUpCents(2, 25)).toBe(3)
  })
  it('refuses impossible input', () => {
    expect(() => priceCall({ rates, laborMs: 0, travelDistance: -1, parts: [], taxExempt: false })).toThrow(/travel distance/)
    expect(() => priceCall({ rates, laborMs: 0, travelDistance: 0, parts: [{ partNumber: 'X', description: 'x', quantity: 0, unitPriceCents: 1, coreChargeCents: 0 }], taxExempt: false })).toThrow(/quantity/)
    expect(() => priceCall({ rates: { ...rates, laborCentsPerHour: 10.5 }, laborMs: 0, travelDistance: 0, parts: [], taxExempt: false })).toThrow(/cents/)
  })
})
