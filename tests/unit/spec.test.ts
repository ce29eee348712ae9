import { describe, expect, it } from 'vitest'
import { describeSpec, judge, specBounds } from '../../shared/utils/spec'
import { rtdResistance } from '../../shared/utils/rtd'

describe('judge', () => {
  it('min/max, bounds inclusive', () => {
    // REFERENCES.md §7: service procedures accept a 5 V reference of about 4.8–5.2 V
    const ref = { min: 4.8, max: 5.2 }
    expect(judge(4.8, ref)).toBe('pass')
    expect(judge(5.2, ref)).toBe('pass')
    expect(judge(5.0, ref)).toBe('pass')
    expect(judge(4.79, ref)).toBe('low')
    expect(judge(5.21, ref)).toBe('high')
  })

  it('one-sided limits', () => {
    // REFERENCES.md §7 battery maker's table: 12.45 V is 75 % charge at rest, 80 °F
    expect(judge(12.45, { min: 12.45 })).toBe('pass')
    expect(judge(12.24, { min: 12.45 })).toBe('low')
    // REFERENCES.md §7: voltage drop over a high-current connection should be at most 0.1 V
    expect(judge(0.1, { max: 0.1 })).toBe('pass')
    expect(judge(0.15, { max: 0.1 })).toBe('high')
  })

  it('nominal ± absolute tolerance', () => {
    // REFERENCES.md §7: 5 V reference ± 0.2 V (same window as 4.8–5.2 V)
    const spec = { nominal: 5, tolerance: 0.2 }
    expect(judge(4.8, spec)).toBe('pass')
    expect(judge(5.2, spec)).toBe('pass')
    expect(judge(4.7999, spec)).toBe('low')
    expect(judge(5.2001, spec)).toBe('high')
  })

  it('nominal ± percent, limits typed exactly as printed still pass', () => {
    // IEC 60751 class B at 100 °C: ±(0.30 + 0.005·100) = ±0.8 °C ≈ ±0.3 Ω on a Pt100 (REFERENCES.md §1)
    const nominal = rtdResistance(100) // IEC 60751 table, 100 °C: 138.5055 Ω
    const tolerance = 0.8 * 100 * (3.9083e-3 + 2 * -5.775e-7 * 100) // IEC 60751: ΔR = Δt·dR/dt = 0.3034 Ω
    expect(Math.abs(tolerance - 0.3)).toBeLessThan(0.01) // REFERENCES.md §1: class B at 100 °C ≈ ±0.30 Ω
    expect(judge(138.8, { nominal, tolerance })).toBe('pass')
    expect(judge(138.2, { nominal, tolerance })).toBe('low')
    expect(judge(139, { nominal, tolerance })).toBe('high')
    // 209.4 Ω ± 2 % (a Pt200 EGT spec written the usual way): 205.212–213.588 Ω, arithmetic
    const egt = { nominal: 209.4, tolerancePct: 2 }
    expect(judge(213.588, egt)).toBe('pass')
    expect(judge(205.212, egt)).toBe('pass')
    expect(judge(213.6, egt)).toBe('high')
    expect(judge(205.2, egt)).toBe('low')
  })

  it('percent tolerance about a negative nominal still gives a sensible window', () => {
    // arithmetic: -40 ± 5 % = -42…-38
    expect(specBounds({ nominal: -40, tolerancePct: 5 })).toEqual({ min: -42, max: -38 })
    expect(judge(-41, { nominal: -40, tolerancePct: 5 })).toBe('pass')
    expect(judge(-43, { nominal: -40, tolerancePct: 5 })).toBe('low')
  })

  it('when several limits are stated, the tightest applies', () => {
    // REFERENCES.md §7: 4.9–5.1 V is common practice inside the 4.8–5.2 V procedure window
    const spec = { min: 4.8, max: 5.2, nominal: 5, tolerance: 0.1 }
    expect(specBounds(spec)).toEqual({ min: 4.9, max: 5.1 })
    expect(judge(4.85, spec)).toBe('low')
  })

  it('OL on the meter (Infinity) is high against a max', () => {
    // common practice: the meter's OL is an open circuit, above any finite limit
    expect(judge(Infinity, { max: 1e6 })).toBe('high')
    expect(judge(Infinity, { min: 100 })).toBe('pass')
  })

  it('rejects NaN and a spec with nothing to judge against', () => {
    // our own input contract
    expect(() => judge(Number.NaN, { min: 1 })).toThrow(RangeError)
    expect(() => judge(1, {})).toThrow(/nothing to judge/)
    expect(() => judge(1, { nominal: 5 })).toThrow(/nothing to judge/)
    expect(() => judge(1, { tolerance: 0.2 })).toThrow(/nominal/)
    expect(() => judge(1, { min: Number.NaN })).toThrow(RangeError)
    expect(() => judge(1, { nominal: 5, tolerance: -1 })).toThrow(RangeError)
    expect(() => judge(1, { nominal: 5, tolerancePct: -1 })).toThrow(RangeError)
    expect(() => judge(1, { min: 5, max: 4 })).toThrow(/cross/)
    expect(() => judge(1, { max: Infinity })).toThrow(RangeError)
  })
})

describe('describeSpec', () => {
  it('writes each form the way a manual does', () => {
    // display text only; forms from the test-card spec kinds in DESIGN.md
    expect(describeSpec({ nominal: 209.4, tolerancePct: 2 }, 'ohm')).toBe('209.4 Ω ± 2 %')
    expect(describeSpec({ min: 4.8, max: 5.2 }, 'V')).toBe('4.8–5.2 V')
    expect(describeSpec({ nominal: 5, tolerance: 0.2 }, 'V')).toBe('5 ± 0.2 V')
    expect(describeSpec({ min: 12.45 }, 'V')).toBe('≥ 12.45 V')
    expect(describeSpec({ max: 0.1 }, 'V')).toBe('≤ 0.1 V')
    expect(describeSpec({ min: -40, max: -20 }, 'degC')).toBe('-40 to -20 °C')
    expect(describeSpec({ min: 0.1 + 0.2, max: 1 })).toBe('0.3–1')
    expect(describeSpec({ min: 1, max: 2 }, 'inH2O')).toBe('1–2 inH2O')
  })

  it('rejects a spec it cannot judge', () => {
    // our own input contract
    expect(() => describeSpec({}, 'V')).toThrow(RangeError)
  })
})
