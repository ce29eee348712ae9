import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { ntcResistanceBeta, ntcTemperatureBeta, steinhartHartResistance, steinhartHartTemperature } from '../../shared/utils/ntc'

// Common 10 kΩ Steinhart–Hart set (REFERENCES §2, widely used)
const SH_A = 1.129148e-3
const SH_B = 2.34125e-4
const SH_C = 8.76741e-8

describe('Beta model', () => {
  it('worked example: 10 kΩ, B 3950 K, 10 475 Ω -> 23.96 °C', () => {
    // Beta equation worked example (REFERENCES §2): R0 = 10 kΩ, B = 3950 K, R = 10 475 Ω -> 23.96 °C
    expect(Math.abs(ntcTemperatureBeta(10475, 10000, 3950) - 23.96)).toBeLessThan(0.005)
  })

  it('gives R25 at 25 °C', () => {
    // Beta equation definition: R = R0 at T0 = 298.15 K
    expect(Math.abs(ntcResistanceBeta(25, 10000, 3950) - 10000)).toBeLessThan(1e-9)
    expect(Math.abs(ntcTemperatureBeta(47000, 47000, 4050) - 25)).toBeLessThan(1e-9)
  })

  it.each([
    [0, 162942.79, 'UliEngineering NTC tests, Murata NCP15WB473D03RC, 0 °C'],
    [-18, 463773.791, 'UliEngineering NTC tests, Murata NCP15WB473D03RC, -18 °C'],
    [5, 124819.66, 'UliEngineering NTC tests, Murata NCP15WB473D03RC, 5 °C'],
    [60, 11280.407, 'UliEngineering NTC tests, Murata NCP15WB473D03RC, 60 °C'],
  ])('Murata 47 kΩ / 4050 K at %d °C -> %d Ω (%s)', (t, ohms) => {
    // UliEngineering's NTC tests (Murata NCP15WB473D03RC by the Beta equation), see row source
    expect(Math.abs(ntcResistanceBeta(t, 47000, 4050) - ohms) / ohms).toBeLessThan(1e-6)
    expect(Math.abs(ntcTemperatureBeta(ohms, 47000, 4050) - t)).toBeLessThan(0.001)
  })

  it('round-trips temperature -> resistance -> temperature', () => {
    // Beta equation is exactly invertible
    fc.assert(
      fc.property(fc.double({ min: -40, max: 150, noNaN: true }), t =>
        Math.abs(ntcTemperatureBeta(ntcResistanceBeta(t, 10000, 3950), 10000, 3950) - t) < 1e-6,
      ),
    )
  })

  it('rejects NaN, non-positive ohms and bad parameters', () => {
    // our own input contract (ln R needs R > 0)
    expect(() => ntcTemperatureBeta(Number.NaN, 10000, 3950)).toThrow(RangeError)
    expect(() => ntcTemperatureBeta(0, 10000, 3950)).toThrow(RangeError)
    expect(() => ntcTemperatureBeta(-5, 10000, 3950)).toThrow(RangeError)
    expect(() => ntcTemperatureBeta(Infinity, 10000, 3950)).toThrow(RangeError)
    expect(() => ntcTemperatureBeta(10000, 0, 3950)).toThrow(RangeError)
    expect(() => ntcTemperatureBeta(10000, 10000, -1)).toThrow(RangeError)
    expect(() => ntcResistanceBeta(Number.NaN, 10000, 3950)).toThrow(RangeError)
    expect(() => ntcResistanceBeta(-273.15, 10000, 3950)).toThrow(/absolute zero/)
    expect(() => ntcResistanceBeta(25, Number.NaN, 3950)).toThrow(RangeError)
  })
})

describe('Steinhart–Hart', () => {
  it('common 10 kΩ set: 10 000 Ω -> 25.000 °C', () => {
    // REFERENCES §2, common 10 kΩ Steinhart–Hart set: 10 000 Ω -> 25.000 °C (coefficients are rounded; loose tolerance)
    expect(Math.abs(steinhartHartTemperature(10000, SH_A, SH_B, SH_C) - 25)).toBeLessThan(0.01)
  })

  it('common 10 kΩ set: 32 650 Ω -> 0.000 °C', () => {
    // REFERENCES §2, common 10 kΩ Steinhart–Hart set: 32 650 Ω -> 0.000 °C
    expect(Math.abs(steinhartHartTemperature(32650, SH_A, SH_B, SH_C) - 0)).toBeLessThan(0.01)
  })

  it('common 10 kΩ set: 3601.0 Ω -> 50 °C and 678.4 Ω -> 100 °C', () => {
    // REFERENCES §2 (C): 50 °C -> 3601.0 Ω, 100 °C -> 678.4 Ω
    expect(Math.abs(steinhartHartTemperature(3601.0, SH_A, SH_B, SH_C) - 50)).toBeLessThan(0.01)
    expect(Math.abs(steinhartHartTemperature(678.4, SH_A, SH_B, SH_C) - 100)).toBeLessThan(0.01)
  })

  it('agrees with Beta near 25 °C only', () => {
    // REFERENCES §2: Beta and Steinhart–Hart agree near their reference points only
    const sh = steinhartHartTemperature(10475, SH_A, SH_B, SH_C)
    expect(Math.abs(sh - ntcTemperatureBeta(10475, 10000, 3950))).toBeLessThan(0.2)
  })

  it('rejects NaN, non-positive ohms and non-finite coefficients', () => {
    // our own input contract (ln R needs R > 0)
    expect(() => steinhartHartTemperature(Number.NaN, SH_A, SH_B, SH_C)).toThrow(RangeError)
    expect(() => steinhartHartTemperature(0, SH_A, SH_B, SH_C)).toThrow(RangeError)
    expect(() => steinhartHartTemperature(-10, SH_A, SH_B, SH_C)).toThrow(RangeError)
    expect(() => steinhartHartTemperature(10000, Number.NaN, SH_B, SH_C)).toThrow(RangeError)
    expect(() => steinhartHartTemperature(10000, SH_A, Infinity, SH_C)).toThrow(RangeError)
    // A coefficient set giving 1/T <= 0 describes no physical temperature
    expect(() => steinhartHartTemperature(10000, -1, 0, 0)).toThrow(/physical/)
  })
})

describe('steinhartHartResistance (inverse of Steinhart–Hart)', () => {
  it.each([
    [25, 10000, 1, 'REFERENCES §2 common 10 kΩ set: 25 °C -> 10 000 Ω (coefficients rounded)'],
    [0, 32650, 2, 'REFERENCES §2 common 10 kΩ set: 0 °C -> 32 650 Ω'],
    [50, 3601.0, 0.1, 'REFERENCES §2 common 10 kΩ set (C): 50 °C -> 3601.0 Ω'],
    [100, 678.4, 0.1, 'REFERENCES §2 common 10 kΩ set (C): 100 °C -> 678.4 Ω'],
  ])('%d °C -> %d Ω (%s)', (t, ohms, tolOhms) => {
    // see row source
    expect(Math.abs(steinhartHartResistance(t, SH_A, SH_B, SH_C) - ohms)).toBeLessThan(tolOhms)
  })

  it('round-trips with steinhartHartTemperature', () => {
    // Steinhart–Hart equation: the cubic in ln R has one real root for B, C > 0
    fc.assert(fc.property(fc.double({ min: -40, max: 150, noNaN: true }), t =>
      Math.abs(steinhartHartTemperature(steinhartHartResistance(t, SH_A, SH_B, SH_C), SH_A, SH_B, SH_C) - t) < 1e-6))
    // with C = 0 the equation is the Beta form: 1/T = A + B ln R
    const r = steinhartHartResistance(30, 1e-3, 2.5e-4, 0)
    expect(Math.abs(steinhartHartTemperature(r, 1e-3, 2.5e-4, 0) - 30)).toBeLessThan(1e-9)
  })

  it('rejects NaN, absolute zero and coefficients no NTC has', () => {
    // our own input contract
    expect(() => steinhartHartResistance(Number.NaN, SH_A, SH_B, SH_C)).toThrow(RangeError)
    expect(() => steinhartHartResistance(-273.15, SH_A, SH_B, SH_C)).toThrow(/absolute zero/)
    expect(() => steinhartHartResistance(25, SH_A, -1, SH_C)).toThrow(RangeError)
    expect(() => steinhartHartResistance(25, SH_A, SH_B, -1e-7)).toThrow(RangeError)
    expect(() => steinhartHartResistance(25, Number.NaN, SH_B, SH_C)).toThrow(RangeError)
  })
})
