import { describe, expect, it } from 'vitest'
import { cardNeedsAmbient, explainVerdict, fmtNumber, judgeAnswer, nextAfter, resolveCardSpec, specInUnit } from '../../shared/utils/cardSpec'

// IEC 60751 coefficients (REFERENCES §1), written out here so the check does not lean on rtd.ts.
const A = 3.9083e-3
const B = -5.775e-7
const pt = (t: number, r0: number) => r0 * (1 + A * t + B * t * t)

const EGT = { kind: 'rtd', r0: 200, tolerancePct: 2 } as const

describe('resolveCardSpec: computed specs', () => {
  it('a Pt200 at 12 °C has a nominal of 209.4 Ω', () => {
    // IEC 60751 scaled by R0/100: 200 × (1 + A·12 + B·12²) = 209.3633 Ω
    const r = resolveCardSpec(EGT, 12)
    expect(Math.abs(r.judge.nominal! - pt(12, 200))).toBeLessThan(1e-9)
    expect(Math.abs(r.judge.nominal! - 209.3633)).toBeLessThan(1e-4)
    expect(fmtNumber(r.judge.nominal!)).toBe('209.4')
    expect(r.judge.tolerancePct).toBe(2)
    expect(r.model).toBe('a Pt200')
  })

  it('a Pt200 at shop ambient (20 °C) reads about 215.6 Ω, inside the 200–220 Ω rule of thumb', () => {
    // IEC 60751 scaled (REFERENCES §1): 215.6 Ω at 20 °C
    const r = resolveCardSpec(EGT, 20)
    expect(Math.abs(r.judge.nominal! - 215.587)).toBeLessThan(0.001)
    // common practice: a good exhaust-temperature RTD reads roughly 200–220 Ω cold
    expect(r.judge.nominal!).toBeGreaterThan(200)
    expect(r.judge.nominal!).toBeLessThan(220)
  })

  it('NTC by Beta at 25 °C is R25; Steinhart–Hart common set at 50 °C is 3601 Ω', () => {
    // Beta equation definition: R = R25 at 25 °C (REFERENCES §2)
    expect(Math.abs(resolveCardSpec({ kind: 'ntc_beta', r25: 10000, beta: 3950, tolerancePct: 5 }, 25).judge.nominal! - 10000)).toBeLessThan(1e-6)
    // Murata NCP15WB473D03RC (R25 47 kΩ, B 4050 K) by the Beta equation at 5 °C: 124 819.66 Ω (REFERENCES §2, UliEngineering)
    expect(Math.abs(resolveCardSpec({ kind: 'ntc_beta', r25: 47000, beta: 4050, tolerance: 1000 }, 5).judge.nominal! - 124819.66)).toBeLessThan(0.01)
    // REFERENCES §2 common 10 kΩ Steinhart–Hart set: 50 °C -> 3601.0 Ω
    const sh = resolveCardSpec({ kind: 'ntc_steinhart', a: 1.129148e-3, b: 2.34125e-4, c: 8.76741e-8, tolerancePct: 5 }, 50)
    expect(Math.abs(sh.judge.nominal! - 3601.0)).toBeLessThan(0.1)
  })

  it('fixed specs need no ambient', () => {
    // REFERENCES §7: 5 V reference 4.8–5.2 V
    expect(resolveCardSpec({ kind: 'range', min: 4.8, max: 5.2 }).judge).toEqual({ min: 4.8, max: 5.2 })
    expect(resolveCardSpec({ kind: 'nominal', nominal: 5, tolerance: 0.2 }).judge).toEqual({ nominal: 5, tolerance: 0.2 })
  })

  it('refuses a computed spec with no ambient, or an ambient no roadside has', () => {
    // our own input contract: the spec is computed from the ambient temperature
    expect(() => resolveCardSpec(EGT)).toThrow(/ambient/i)
    expect(() => resolveCardSpec(EGT, Number.NaN)).toThrow(/ambient/i)
    expect(() => resolveCardSpec(EGT, 95)).toThrow(/outside/)
    expect(() => resolveCardSpec({ kind: 'range' } as never)).toThrow(RangeError)
    expect(() => resolveCardSpec({ kind: 'magic' } as never)).toThrow(/Unknown spec kind/)
  })

  it('knows which cards ask for the ambient first', () => {
    // our own rule: any computed spec on the card needs it
    expect(cardNeedsAmbient({ steps: [{ spec: { kind: 'range', min: 1 } }, { spec: EGT }] })).toBe(true)
    expect(cardNeedsAmbient({ steps: [{ spec: { kind: 'range', min: 1 } }, {}] })).toBe(false)
  })
})

describe('explainVerdict', () => {
  it('the issue example: 118 Ω against a Pt200 at 12 °C ± 2 % is low, and says why', () => {
    // IEC 60751 scaled: 209.36 Ω nominal; ± 2 % gives 205.18–213.55 Ω (arithmetic)
    const e = explainVerdict({ value: 118, quantity: 'resistance', spec: EGT, ambientC: 12 })
    expect(e.verdict).toBe('low')
    expect(e.text).toBe('measured 118 Ω; a Pt200 at 12 °C should read 209.4 Ω ± 2 %; low')
    expect(e.limitsText).toBe('205.2–213.6 Ω')
  })

  it('passes a good sensor and flags OL as high', () => {
    // IEC 60751 scaled: a Pt200 at 12 °C reading 210 Ω is within ± 2 %
    expect(explainVerdict({ value: 210, quantity: 'resistance', spec: EGT, ambientC: 12 }).verdict).toBe('pass')
    // common practice: an open element shows OL on the meter
    const open = explainVerdict({ value: Infinity, quantity: 'resistance', spec: EGT, ambientC: 12 })
    expect(open.verdict).toBe('high')
    expect(open.text).toMatch(/^measured OL \(open\);/)
  })

  it('shows numbers in the mechanic’s units, judging in base units', () => {
    // °F = °C × 9/5 + 32 (REFERENCES §9): 12 °C = 53.6 °F
    const f = explainVerdict({ value: 118, quantity: 'resistance', spec: EGT, ambientC: 12, unit: 'kohm', temperatureUnit: 'degF' })
    expect(f.text).toBe('measured 0.118 kΩ; a Pt200 at 53.6 °F should read 0.2094 kΩ ± 2 %; low')
    // REFERENCES §7: 5 V reference 4.8–5.2 V; SI prefix m = 10⁻³
    expect(explainVerdict({ value: 4.62, quantity: 'voltage', spec: { kind: 'range', min: 4.8, max: 5.2 }, unit: 'mV' }).text)
      .toBe('measured 4620 mV; spec 4800–5200 mV; low')
    // A temperature tolerance is a difference: 5 °C is 9 °F, with no 32° offset (REFERENCES §9)
    expect(explainVerdict({ value: 10, quantity: 'temperature', spec: { kind: 'nominal', nominal: 20, tolerance: 5 }, unit: 'degF' }).text)
      .toBe('measured 50 °F; spec 68 ± 9 °F; low')
  })

  it('DEF at 32.5 % passes the ISO 22241 window; 26 % is low', () => {
    // ISO 22241-1 (REFERENCES §8): urea 31.8–33.2 % by mass
    const def = { kind: 'range', min: 31.8, max: 33.2 } as const
    expect(explainVerdict({ value: 32.5, quantity: 'concentration', spec: def }).text).toBe('measured 32.5 %; spec 31.8–33.2 %; pass')
    expect(explainVerdict({ value: 26, quantity: 'concentration', spec: def }).verdict).toBe('low')
  })

  it('rejects impossible input with a clear error', () => {
    // our own input contract
    expect(() => explainVerdict({ value: Number.NaN, quantity: 'resistance', spec: EGT, ambientC: 12 })).toThrow(/number/)
    expect(() => explainVerdict({ value: -3, quantity: 'resistance', spec: EGT, ambientC: 12 })).toThrow(/negative/)
    expect(() => explainVerdict({ value: 5, quantity: 'voltage', spec: EGT, ambientC: 12 })).toThrow(/resistance/)
    expect(() => explainVerdict({ value: Infinity, quantity: 'voltage', spec: { kind: 'range', min: 1 } })).toThrow(/OL/)
    expect(() => explainVerdict({ value: 5, quantity: 'voltage', spec: { kind: 'range', min: 1 }, unit: 'ohm' })).toThrow(/does not measure/)
    expect(() => explainVerdict({ value: 5, quantity: 'force' as never, spec: { kind: 'range', min: 1 } })).toThrow(/Unknown quantity/)
  })
})

describe('answers, next steps and display helpers', () => {
  it('judges yes/no and pick-one steps', () => {
    // our own rule: the card names the passing answers
    expect(judgeAnswer({ measure: 'yes_no', passAnswer: 'yes' }, 'yes').verdict).toBe('pass')
    expect(judgeAnswer({ measure: 'yes_no', passAnswer: 'yes' }, 'no')).toEqual({ verdict: 'fail', text: 'answered no; passes on yes; fail' })
    const choice = { measure: 'choice' as const, options: ['Clear', 'Cloudy', 'Crystals'], passOptions: ['Clear'] }
    expect(judgeAnswer(choice, 'Cloudy').verdict).toBe('fail')
    expect(() => judgeAnswer(choice, 'Green')).toThrow(/not one of/)
    expect(() => judgeAnswer({ measure: 'yes_no', passAnswer: 'yes' }, 'maybe')).toThrow(/yes or no/)
    expect(() => judgeAnswer({ measure: 'voltage' }, 'yes')).toThrow(/reading/)
  })

  it('low and high may have their own ways, else fail', () => {
    // our own rule (card format)
    const s = { next: { pass: 'a', fail: 'b', high: 'c' } }
    expect(nextAfter(s, 'pass')).toBe('a')
    expect(nextAfter(s, 'low')).toBe('b')
    expect(nextAfter(s, 'high')).toBe('c')
    expect(nextAfter(s, 'fail')).toBe('b')
  })

  it('formats like a meter and converts specs', () => {
    // display rules only: 4 significant digits, whole numbers from 10 000, OL for open
    expect(fmtNumber(209.363288)).toBe('209.4')
    expect(fmtNumber(0.1 + 0.2)).toBe('0.3')
    expect(fmtNumber(124819.66)).toBe('124820')
    expect(fmtNumber(Infinity)).toBe('OL')
    // °F = °C × 9/5 + 32 for values, × 9/5 for differences (REFERENCES §9)
    expect(specInUnit({ nominal: 100, tolerance: 10 }, 'degF')).toEqual({ nominal: 212, tolerance: 18 })
  })
})
