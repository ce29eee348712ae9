import { describe, expect, it } from 'vitest'
import {
  explainVerdict, fmtNumber, judgeAnswer, makerDataText, needsMakerData, nextAfter, resolveCardSpec, specInUnit, stepNeedsPartTemp,
} from '../../shared/utils/cardSpec'

// IEC 60751 Pt100 table as printed (rounded to 0.01 Ω, REFERENCES §1): 0 °C 100.00, 10 °C 103.90,
// 20 °C 107.79, 26 °C 110.12, 30 °C 111.67, 100 °C 138.51. A Pt200 reads twice these; the printed
// rounding (±0.005 Ω) doubles to ±0.01 Ω, the tolerance of each check.
const IEC_PT100 = { 0: 100.00, 10: 103.90, 20: 107.79, 26: 110.12, 30: 111.67, 100: 138.51 } as const
const pt200 = (t: keyof typeof IEC_PT100) => 2 * IEC_PT100[t]
const near = (a: number | undefined, b: number, tol: number) => expect(Math.abs(a! - b)).toBeLessThanOrEqual(tol)

// Murata NCP15XH103F03RC (10 kΩ at 25 °C) resistance table, as published by Murata and carried in
// the Linux kernel's ntc_thermistor driver (corrected in 2025 to the maker's values): °C, Ω.
const MURATA_XH103: [number, number][] = [[-40, 195652], [-20, 68237], [0, 27219], [10, 17926], [15, 14674], [20, 12081], [25, 10000],
  [30, 8315], [40, 5834], [50, 4161], [80, 1669], [100, 974], [125, 531]]

const EGT = { kind: 'rtd', r0: 200, toleranceC: 10 } as const

describe('a sensor judged at the part’s own temperature', () => {
  it('a Pt200 at 20 °C: the IEC 60751 table ×2, limits from the table at 10 and 30 °C for ± 10 °C', () => {
    const r = resolveCardSpec(EGT, 20)
    near(r.nominal, pt200(20), 0.01) // IEC 60751 table, 20 °C, ×2
    near(r.judge.min, pt200(10), 0.01) // IEC 60751 table, 10 °C, ×2
    near(r.judge.max, pt200(30), 0.01) // IEC 60751 table, 30 °C, ×2
    expect(r.model).toBe('a Pt200')
    expect(r.partTempC).toBe(20)
  })

  it('a good Pt200 6 °C above the air passes at its own temperature, where the air’s would call it high', () => {
    // IEC 60751 table, 26 °C ×2 = 220.24 Ω: the sensor really is at 26 °C
    const reading = pt200(26)
    expect(explainVerdict({ value: reading, quantity: 'resistance', spec: EGT, partTempC: 26 }).verdict).toBe('pass')
    // Judged the old way, at the air's 20 °C with ± 2 % (IEC 20 °C ×2 = 215.58 Ω, + 2 % = 219.89 Ω), the same sensor read high.
    const atAir = { kind: 'rtd', r0: 200, tolerancePct: 2 } as const
    expect(explainVerdict({ value: reading, quantity: 'resistance', spec: atAir, partTempC: 20 }).verdict).toBe('high')
  })

  it('says how it judged, in words a mechanic can check', () => {
    // IEC 60751 table ×2: 0 °C 200.00 Ω, limits −10…10 °C; 118 Ω is far below
    const e = explainVerdict({ value: 118, quantity: 'resistance', spec: EGT, partTempC: 0 })
    expect(e.verdict).toBe('low')
    expect(e.text).toBe('measured 118 Ω; a Pt200 at 0 °C should read 200 Ω (192.2–207.8 Ω for ± 10 °C); low')
    // °F = °C × 9/5 + 32; a 10 °C band is 18 °F (REFERENCES §9)
    const f = explainVerdict({ value: 118, quantity: 'resistance', spec: EGT, partTempC: 0, temperatureUnit: 'degF' })
    expect(f.text).toBe('measured 118 Ω; a Pt200 at 32 °F should read 200 Ω (192.2–207.8 Ω for ± 18 °F); low')
  })

  it('an open RTD (OL) is high: a platinum sensor reads hot when open', () => {
    // common practice: an open element shows OL
    expect(explainVerdict({ value: Infinity, quantity: 'resistance', spec: EGT, partTempC: 20 }).text).toMatch(/^measured OL \(open\);.*; high$/)
  })

  it('a maker’s NTC table: a row of the table is its own nominal, the next rows bound ± °C', () => {
    const spec = { kind: 'ntc_table', table: MURATA_XH103, toleranceC: 2 } as const
    const r = resolveCardSpec(spec, 20)
    near(r.nominal, 12081, 1e-6) // Murata NCP15XH103 table, 20 °C row
    // Between rows, ln R is linear in 1/T: the 22 °C and 18 °C limits lie between the 15/20/25 °C rows.
    expect(r.judge.min!).toBeGreaterThan(10000)
    expect(r.judge.min!).toBeLessThan(12081)
    expect(r.judge.max!).toBeGreaterThan(12081)
    expect(r.judge.max!).toBeLessThan(14674)
    // the 20 °C row passes; the 25 °C row (a sensor judged at a 25 °C air it is not at) is low; the 15 °C row is high
    expect(explainVerdict({ value: 12081, quantity: 'resistance', spec, partTempC: 20 }).verdict).toBe('pass')
    expect(explainVerdict({ value: 10000, quantity: 'resistance', spec, partTempC: 20 }).verdict).toBe('low')
    expect(explainVerdict({ value: 14674, quantity: 'resistance', spec, partTempC: 20 }).verdict).toBe('high')
    expect(r.model).toBe('this NTC sensor (maker’s table)')
  })

  it('a good coolant sensor 2 °C above the air passes at its own temperature', () => {
    // Murata NCP15XH103 table: 25 °C row 10 000 Ω; judged at a 23 °C air with ± 1 °C it would read low
    const spec = { kind: 'ntc_table', table: MURATA_XH103, toleranceC: 1 } as const
    expect(explainVerdict({ value: 10000, quantity: 'resistance', spec, partTempC: 25 }).verdict).toBe('pass')
    expect(explainVerdict({ value: 10000, quantity: 'resistance', spec, partTempC: 23 }).verdict).toBe('low')
  })

  it('refuses a temperature outside the maker’s table, or none at all', () => {
    // the table ends at 125 °C; our own input contract for the part's temperature
    const spec = { kind: 'ntc_table', table: MURATA_XH103, toleranceC: 2 } as const
    expect(() => resolveCardSpec(spec, 130)).toThrow(RangeError)
    expect(() => resolveCardSpec(spec, 124)).toThrow(/runs past/)
    expect(() => resolveCardSpec(EGT)).toThrow(/part’s temperature/)
    expect(() => resolveCardSpec(EGT, Number.NaN)).toThrow(/part’s temperature/)
    expect(() => resolveCardSpec(EGT, 1200)).toThrow(/outside/)
  })

  it('Beta and Steinhart–Hart sets take a ± °C band too', () => {
    // Murata NCP15WB473 by the Beta equation (REFERENCES §2, UliEngineering): 5 °C → 124 819.66 Ω
    const b = resolveCardSpec({ kind: 'ntc_beta', r25: 47000, beta: 4050, toleranceC: 1 }, 5)
    near(b.nominal, 124819.66, 0.01)
    expect(b.judge.min!).toBeLessThan(124819.66)
    expect(b.judge.max!).toBeGreaterThan(124819.66)
    // REFERENCES §2 common 10 kΩ Steinhart–Hart set: 50 °C → 3601.0 Ω
    near(resolveCardSpec({ kind: 'ntc_steinhart', a: 1.129148e-3, b: 2.34125e-4, c: 8.76741e-8, tolerancePct: 5 }, 50).nominal, 3601.0, 0.1)
  })
})

describe('a sensor step without the maker’s data', () => {
  it('is never judged: it says what it needs instead', () => {
    // our own rule (DESIGN.md): a card without the maker's data asks for it instead of judging
    const spec = { kind: 'needs_maker_data', sensor: 'this coolant temperature sensor' } as const
    expect(needsMakerData(spec)).toBe(true)
    expect(stepNeedsPartTemp({ spec })).toBe(true)
    expect(() => resolveCardSpec(spec, 20)).toThrow(/needs the maker’s data/)
    expect(makerDataText(spec)).toMatch(/^not judged: this card needs the maker’s data for this coolant temperature sensor/)
  })
})

describe('fixed specs', () => {
  it('a 5 V supply against 4.8–5.2 V, shown in the mechanic’s units', () => {
    // REFERENCES §7: 5 V reference 4.8–5.2 V; SI prefix m = 10⁻³
    expect(resolveCardSpec({ kind: 'range', min: 4.8, max: 5.2 }).judge).toEqual({ min: 4.8, max: 5.2 })
    expect(explainVerdict({ value: 4.62, quantity: 'voltage', spec: { kind: 'range', min: 4.8, max: 5.2 }, unit: 'mV' }).text)
      .toBe('measured 4620 mV; spec 4800–5200 mV; low')
    // A temperature tolerance is a difference: 5 °C is 9 °F, with no 32° offset (REFERENCES §9)
    expect(explainVerdict({ value: 10, quantity: 'temperature', spec: { kind: 'nominal', nominal: 20, tolerance: 5 }, unit: 'degF' }).text)
      .toBe('measured 50 °F; spec 68 ± 9 °F; low')
  })

  it('DEF: ISO 22241 limits, and a reading within the refractometer’s ± 0.5 % outside them is marginal', () => {
    // ISO 22241-1 (REFERENCES §8): 31.8–33.2 %; handheld refractometers read about ± 0.5 % (common practice)
    const def = { kind: 'range', min: 31.8, max: 33.2, margin: 0.5 } as const
    expect(explainVerdict({ value: 32.5, quantity: 'concentration', spec: def })).toMatchObject({ verdict: 'pass', marginal: false })
    const edge = explainVerdict({ value: 31.5, quantity: 'concentration', spec: def })
    expect(edge).toMatchObject({ verdict: 'low', marginal: true })
    expect(edge.text)
      .toBe('measured 31.5 %; spec 31.8–33.2 %; low, but within the ± 0.5 % the instrument itself may be off: measure again before acting')
    expect(explainVerdict({ value: 33.6, quantity: 'concentration', spec: def })).toMatchObject({ verdict: 'high', marginal: true })
    expect(explainVerdict({ value: 26, quantity: 'concentration', spec: def })).toMatchObject({ verdict: 'low', marginal: false })
  })

  it('rejects impossible input with a clear error', () => {
    // our own input contract
    expect(() => explainVerdict({ value: Number.NaN, quantity: 'resistance', spec: EGT, partTempC: 12 })).toThrow(/number/)
    expect(() => explainVerdict({ value: -3, quantity: 'resistance', spec: EGT, partTempC: 12 })).toThrow(/negative/)
    expect(() => explainVerdict({ value: 5, quantity: 'voltage', spec: EGT, partTempC: 12 })).toThrow(/resistance/)
    expect(() => explainVerdict({ value: Infinity, quantity: 'voltage', spec: { kind: 'range', min: 1 } })).toThrow(/OL/)
    expect(() => explainVerdict({ value: 5, quantity: 'voltage', spec: { kind: 'range', min: 1 }, unit: 'ohm' })).toThrow(/does not measure/)
    expect(() => explainVerdict({ value: 5, quantity: 'force' as never, spec: { kind: 'range', min: 1 } })).toThrow(/Unknown quantity/)
    expect(() => resolveCardSpec({ kind: 'magic' } as never)).toThrow(/Unknown spec kind/)
  })
})

describe('answers, next steps and display helpers', () => {
  it('judges yes/no and pick-one steps', () => {
    // our own rule: the card names the passing answers
    expect(judgeAnswer({ measure: 'yes_no', passAnswer: 'yes' }, 'yes').verdict).toBe('pass')
    expect(judgeAnswer({ measure: 'yes_no', passAnswer: 'yes' }, 'no'))
      .toEqual({ verdict: 'fail', text: 'answered no; passes on yes; fail' })
    const choice = { measure: 'choice' as const, options: ['Clear', 'Cloudy', 'Crystals'], passOptions: ['Clear'] }
    expect(judgeAnswer(choice, 'Cloudy').verdict).toBe('fail')
    expect(() => judgeAnswer(choice, 'Green')).toThrow(/not one of/)
    expect(() => judgeAnswer({ measure: 'yes_no', passAnswer: 'yes' }, 'maybe')).toThrow(/yes or no/)
    expect(() => judgeAnswer({ measure: 'voltage' }, 'yes')).toThrow(/reading/)
  })

  it('routes: an option its own way, a marginal reading the marginal way, low and high theirs, else fail', () => {
    // our own rule (card format)
    const s = {
      next: { pass: 'a', fail: 'b', high: 'c', marginal: 'm', unjudged: 'u' },
      routes: [{ option: 'Charge and retest', to: 'r' }],
    }
    expect(nextAfter(s, 'pass')).toBe('a')
    expect(nextAfter(s, 'low')).toBe('b')
    expect(nextAfter(s, 'high')).toBe('c')
    expect(nextAfter(s, 'high', { marginal: true })).toBe('m')
    expect(nextAfter(s, 'fail')).toBe('b')
    expect(nextAfter(s, 'fail', { answer: 'Charge and retest' })).toBe('r')
    expect(nextAfter(s, 'unjudged')).toBe('u')
    expect(() => nextAfter({ next: { pass: 'a', fail: 'b' } }, 'unjudged')).toThrow(/cannot be judged/)
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
