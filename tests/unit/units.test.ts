import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  BASE_UNIT_OF,
  PSI_IN_KPA,
  UNITS_BY_QUANTITY,
  UNIT_SYMBOLS,
  convertUnit,
  fromBaseUnit,
  toBaseUnit,
  unitQuantity,
  unitSymbol,
} from '../../shared/utils/units'

describe('pressure', () => {
  it('1 psi = 6.894757293168361 kPa from the definitions', () => {
    // definitions: lbf = 0.45359237 kg × 9.80665 m/s² = 4.4482216152605 N, in = 0.0254 m (both exact)
    expect(Math.abs(0.45359237 * 9.80665 - 4.4482216152605)).toBeLessThan(1e-13)
    // the value the brief pins, 1 psi = 6.894757293168361 kPa, from those definitions
    expect(PSI_IN_KPA).toBe(6.894757293168361)
    expect(Math.abs(toBaseUnit(1, 'psi') - 4.4482216152605 / 0.0254 ** 2 / 1000)).toBeLessThan(1e-12)
  })

  it('converts typical tire and boost pressures', () => {
    // from the exact psi definition: 100 psi = 689.4757293168361 kPa
    expect(Math.abs(toBaseUnit(100, 'psi') - 689.4757293168361)).toBeLessThan(1e-9)
    // from the exact psi definition: 30 psi ≈ 206.8427 kPa
    expect(Math.abs(toBaseUnit(30, 'psi') - 206.8427187950508)).toBeLessThan(1e-9)
    // inverse of the exact psi definition: 6.894757293168361 kPa = 1 psi
    expect(Math.abs(fromBaseUnit(6.894757293168361, 'psi') - 1)).toBeLessThan(1e-12)
  })
})

describe('temperature', () => {
  it.each([
    [0, 32],
    [100, 212],
    [-40, -40],
    [37, 98.6],
    [-273.15, -459.67],
  ])('%d °C = %d °F', (c, f) => {
    // REFERENCES.md §9: °F = °C × 9/5 + 32
    expect(Math.abs(fromBaseUnit(c, 'degF') - f)).toBeLessThan(1e-9)
    expect(Math.abs(toBaseUnit(f, 'degF') - c)).toBeLessThan(1e-9)
  })

  it('round-trips °F <-> °C', () => {
    // REFERENCES.md §9: °F = °C × 9/5 + 32 is exactly invertible
    fc.assert(fc.property(fc.double({ min: -200, max: 1500, noNaN: true }),
      c => Math.abs(toBaseUnit(fromBaseUnit(c, 'degF'), 'degF') - c) < 1e-9))
  })
})

describe('resistance, voltage, percent', () => {
  it('SI prefixes', () => {
    // SI prefix definitions: k = 10³, m = 10⁻³
    expect(toBaseUnit(10, 'kohm')).toBe(10000)
    expect(fromBaseUnit(47000, 'kohm')).toBe(47)
    expect(toBaseUnit(250, 'mV')).toBe(0.25)
    expect(fromBaseUnit(0.1, 'mV')).toBe(100)
    expect(toBaseUnit(32.5, 'pct')).toBe(32.5)
    expect(convertUnit(4.7, 'kohm', 'ohm')).toBe(4700)
  })

  it('keeps OL (Infinity) for resistance', () => {
    // common practice: an open circuit shows OL, treated as infinite ohms
    expect(toBaseUnit(Infinity, 'kohm')).toBe(Infinity)
  })
})

describe('tables and symbols', () => {
  it('lists units per quantity with base units first', () => {
    // our own table (DESIGN.md reading quantities)
    expect(UNITS_BY_QUANTITY.temperature).toEqual(['degC', 'degF'])
    expect(UNITS_BY_QUANTITY.pressure).toEqual(['kPa', 'psi'])
    for (const [q, units] of Object.entries(UNITS_BY_QUANTITY)) {
      expect(units[0]).toBe(BASE_UNIT_OF[q as keyof typeof BASE_UNIT_OF])
      for (const u of units) expect(unitQuantity(u)).toBe(q)
    }
  })

  it('display symbols', () => {
    // SI and customary symbols
    expect(UNIT_SYMBOLS).toEqual({ degC: '°C', degF: '°F', ohm: 'Ω', kohm: 'kΩ', V: 'V', mV: 'mV', kPa: 'kPa', psi: 'psi', pct: '%' })
    expect(unitSymbol('ohm')).toBe('Ω')
    expect(unitSymbol('inHg')).toBe('inHg')
  })
})

describe('rejection', () => {
  it('rejects NaN, unknown units, negative ohms, below absolute zero, mixed quantities', () => {
    // our own input contract
    expect(() => toBaseUnit(Number.NaN, 'psi')).toThrow(RangeError)
    expect(() => fromBaseUnit(Number.NaN, 'degF')).toThrow(RangeError)
    expect(() => toBaseUnit(1, 'bar')).toThrow(/Unknown unit/)
    expect(() => fromBaseUnit(1, 'K')).toThrow(/Unknown unit/)
    expect(() => toBaseUnit(-1, 'ohm')).toThrow(/negative/)
    expect(() => toBaseUnit(-0.5, 'kohm')).toThrow(/negative/)
    expect(() => toBaseUnit(-500, 'degF')).toThrow(/absolute zero/)
    expect(() => fromBaseUnit(-300, 'degF')).toThrow(/absolute zero/)
    expect(() => toBaseUnit(Infinity, 'V')).toThrow(RangeError)
    expect(() => convertUnit(1, 'psi', 'V')).toThrow(/different quantities/)
    expect(() => unitQuantity('bar')).toThrow(RangeError)
  })
})
