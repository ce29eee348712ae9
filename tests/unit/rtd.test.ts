import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { rtdResistance, rtdTemperature } from '../../shared/utils/rtd'

// Pt100 resistance from the exact Callendar–Van Dusen equation with the IEC 60751 coefficients.
// Values as listed in REFERENCES.md §1 (matches manufacturers' IEC 60751 tables to 0.01 Ω).
const PT100_TABLE: [number, number, string][] = [
  [-200, 18.52008, 'IEC 60751 table, -200 °C'],
  [-100, 60.25584, 'IEC 60751 table, -100 °C'],
  [-40, 84.27065, 'IEC 60751 table, -40 °C'],
  [-20, 92.1599, 'IEC 60751 table, -20 °C'],
  [0, 100.0, 'IEC 60751 table, 0 °C'],
  [20, 107.7935, 'IEC 60751 table, 20 °C'],
  [25, 109.73466, 'IEC 60751 table, 25 °C'],
  [100, 138.5055, 'IEC 60751 table, 100 °C'],
  [200, 175.856, 'IEC 60751 table, 200 °C'],
  [300, 212.0515, 'IEC 60751 table, 300 °C'],
  [400, 247.092, 'IEC 60751 table, 400 °C'],
  [500, 280.9775, 'IEC 60751 table, 500 °C'],
  [600, 313.708, 'IEC 60751 table, 600 °C'],
  [700, 345.2835, 'IEC 60751 table, 700 °C'],
  [800, 375.704, 'IEC 60751 table, 800 °C'],
  [850, 390.481125, 'IEC 60751 table, 850 °C'],
]

describe('rtdResistance (IEC 60751 Pt100)', () => {
  it.each(PT100_TABLE)('%d °C -> %d Ω (%s)', (t, ohms) => {
    // IEC 60751 table value at t (see source column of PT100_TABLE)
    expect(Math.abs(rtdResistance(t) - ohms)).toBeLessThan(1e-5)
  })

  it('rounds to the published 0.01 Ω table values', () => {
    // IEC 60751 table, 100 °C: printed 138.51 Ω (exact 138.5055 — compare numerically, not by toFixed)
    expect(Math.abs(rtdResistance(100) - 138.51)).toBeLessThanOrEqual(0.005 + 1e-9)
    // IEC 60751 table, -200 °C: printed 18.52 Ω
    expect(Math.abs(rtdResistance(-200) - 18.52)).toBeLessThan(0.005)
  })

  it('scales by r0 for Pt200', () => {
    // Beckhoff RTD transformation notes: Pt200 at -100 °C = 120.512 Ω
    expect(Math.abs(rtdResistance(-100, 200) - 120.512)).toBeLessThan(0.001)
    // IEC 60751 scaled by R0/100: Pt200 at 20 °C = 215.587 Ω (REFERENCES §1)
    expect(Math.abs(rtdResistance(20, 200) - 215.587)).toBeLessThan(0.001)
  })

  it('a good Pt200 EGT sensor at shop ambient reads 200–220 Ω', () => {
    // common practice: Pt200-type EGT sensor reads roughly 200–220 Ω at shop ambient
    const r = rtdResistance(20, 200)
    expect(r).toBeGreaterThanOrEqual(200)
    expect(r).toBeLessThanOrEqual(220)
    // IEC 60751 scaled (REFERENCES §1): ≈ 215.6 Ω at 20 °C
    expect(Math.abs(r - 215.6)).toBeLessThan(0.05)
  })

  it('rejects bad input with RangeError', () => {
    // our own input contract
    // IEC 60751 defines the curve only over -200…850 °C
    expect(() => rtdResistance(-200.01)).toThrow(RangeError)
    expect(() => rtdResistance(850.01)).toThrow(RangeError)
    expect(() => rtdResistance(Number.NaN)).toThrow(RangeError)
    expect(() => rtdResistance(Infinity)).toThrow(RangeError)
    expect(() => rtdResistance(20, 0)).toThrow(RangeError)
    expect(() => rtdResistance(20, -100)).toThrow(RangeError)
    expect(() => rtdResistance(20, Number.NaN)).toThrow(RangeError)
  })
})

describe('rtdTemperature (inverse)', () => {
  it.each(PT100_TABLE)('%d °C <- %d Ω (%s)', (t, ohms) => {
    // IEC 60751 table value at t, inverted; 0.01 °C required, far tighter achieved
    expect(Math.abs(rtdTemperature(ohms) - t)).toBeLessThan(0.001)
  })

  it('inverts Pt200 too', () => {
    // Beckhoff RTD transformation notes: Pt200 at -100 °C = 120.512 Ω (rounded to 1 mΩ ≈ 0.002 °C)
    expect(Math.abs(rtdTemperature(120.512, 200) - -100)).toBeLessThan(0.01)
  })

  it('round-trips to 0.01 °C over -200…850 °C for Pt100, Pt200 and Pt1000', () => {
    // IEC 60751 Callendar–Van Dusen, both branches: t -> R -> t
    fc.assert(
      fc.property(
        fc.double({ min: -200, max: 850, noNaN: true }),
        fc.constantFrom(100, 200, 500, 1000),
        (t, r0) => Math.abs(rtdTemperature(rtdResistance(t, r0), r0) - t) < 0.01,
      ),
      { numRuns: 2000 },
    )
  })

  it('is continuous across 0 °C', () => {
    // IEC 60751: both branches meet at R0 at 0 °C
    expect(Math.abs(rtdTemperature(100))).toBeLessThan(1e-12)
    expect(Math.abs(rtdTemperature(rtdResistance(-0.001)) - -0.001)).toBeLessThan(1e-6)
    expect(Math.abs(rtdTemperature(rtdResistance(0.001)) - 0.001)).toBeLessThan(1e-6)
  })

  it('rejects NaN, negative, infinite and out-of-range ohms', () => {
    // our own input contract
    expect(() => rtdTemperature(Number.NaN)).toThrow(RangeError)
    expect(() => rtdTemperature(-1)).toThrow(/negative/)
    expect(() => rtdTemperature(Infinity)).toThrow(RangeError)
    // IEC 60751 table: 18.52 Ω is -200 °C, 390.48 Ω is 850 °C; beyond them the standard is silent
    expect(() => rtdTemperature(18.0)).toThrow(/below/)
    expect(() => rtdTemperature(391)).toThrow(/above/)
    expect(() => rtdTemperature(0)).toThrow(RangeError)
    expect(() => rtdTemperature(100, 0)).toThrow(RangeError)
  })
})
