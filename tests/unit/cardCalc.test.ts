import { describe, expect, it } from 'vitest'
import { calcInputs, runCalc } from '../../shared/utils/cardCalc'

describe('worked-out steps', () => {
  it('air-brake leakage against the model CDL manual’s limits', () => {
    // Model CDL manual air-brake check: released ≤ 2 psi/min single, ≤ 3 combination; applied ≤ 3 single, ≤ 4 combination
    const released = { fn: 'air_leak', brakes: 'released' } as const
    const applied = { fn: 'air_leak', brakes: 'applied' } as const
    expect(runCalc(released, { startPsi: 120, endPsi: 118, seconds: 60, combination: 'no' }))
      .toMatchObject({ value: 2, unit: 'psi/min', verdict: 'pass' })
    expect(runCalc(released, { startPsi: 120, endPsi: 117, seconds: 60, combination: 'no' }).verdict).toBe('high')
    expect(runCalc(released, { startPsi: 120, endPsi: 117, seconds: 60, combination: 'yes' }).verdict).toBe('pass')
    expect(runCalc(applied, { startPsi: 110, endPsi: 107, seconds: 60, combination: 'no' }).verdict).toBe('pass')
    expect(runCalc(applied, { startPsi: 110, endPsi: 106, seconds: 60, combination: 'yes' }).verdict).toBe('pass')
    expect(runCalc(applied, { startPsi: 110, endPsi: 105, seconds: 60, combination: 'yes' }).verdict).toBe('high')
    // 1.5 psi in 30 s is 3 psi per minute (arithmetic of a rate)
    expect(runCalc(applied, { startPsi: 110, endPsi: 108.5, seconds: 30, combination: 'no' })).toMatchObject({ value: 3, verdict: 'pass' })
    expect(runCalc(released, { startPsi: 120, endPsi: 118, seconds: 60, combination: 'yes' }).text)
      .toBe('lost 2 psi in 60 s: 2 psi/min with the brakes released, combination vehicle; pass')
  })

  it('battery state of charge from the maker’s 80 °F open-circuit table', () => {
    // a battery maker's table (REFERENCES §7): 12.65 V 100 %, 12.45 V 75 %, 12.24 V 50 %; a 24 V pair reads twice
    const soc = { fn: 'battery_soc', systemVolts: 12, minPct: 75 } as const
    expect(runCalc(soc, { volts: 12.45 })).toMatchObject({ value: 75, verdict: 'pass' })
    expect(runCalc(soc, { volts: 12.24 })).toMatchObject({ value: 50, verdict: 'low' })
    expect(runCalc({ fn: 'battery_soc', systemVolts: 24, minPct: 75 }, { volts: 25.3 })).toMatchObject({ value: 100, verdict: 'pass' })
  })

  it('battery load test by the battery’s temperature', () => {
    // load-test table (from memory): 70 °F and up 9.6 V, 50 °F 9.4 V, 0 °F 8.5 V; between rows the colder row
    const load = { fn: 'battery_load' } as const
    expect(runCalc(load, { volts: 9.6, tempC: 25 }).verdict).toBe('pass')
    expect(runCalc(load, { volts: 9.5, tempC: 25 }).verdict).toBe('low')
    // 10 °C is 50 °F
    expect(runCalc(load, { volts: 9.4, tempC: 10 }).verdict).toBe('pass')
    // 15 °C is 59 °F: the 50 °F row
    expect(runCalc(load, { volts: 9.41, tempC: 15 }).verdict).toBe('pass')
    expect(() => runCalc(load, { volts: 9, tempC: -20 })).toThrow(/warm it/)
  })

  it('voltages on 12 V and 24 V systems, and the cranking cables', () => {
    // cranking at least 9.6 V on 12 V (common practice), doubled on 24 V
    const crank = { fn: 'system_volts', label: 'Cranking', min12: 9.6 } as const
    expect(runCalc(crank, { system: '12 V', volts: 9.7 }).verdict).toBe('pass')
    expect(runCalc(crank, { system: '24 V', volts: 18.9 }).verdict).toBe('low')
    // total cranking cable drop under 0.5 V on 12 V, under 1.0 V on 24 V (REFERENCES §7, a US Army TM)
    const drop = { fn: 'cable_drop' } as const
    expect(runCalc(drop, { system: '12 V', posDrop: 0.2, negDrop: 0.2 }).verdict).toBe('pass')
    expect(runCalc(drop, { system: '12 V', posDrop: 0.35, negDrop: 0.2 }))
      .toMatchObject({ verdict: 'high', value: expect.closeTo(0.55, 9) })
    expect(runCalc(drop, { system: '24 V', posDrop: 0.35, negDrop: 0.2 }).verdict).toBe('pass')
    expect(runCalc(drop, { system: '12 V', posDrop: 0.1, negDrop: 0.6 }).text).toMatch(/most of it on the negative side/)
    expect(() => runCalc(drop, { system: '36 V', posDrop: 0.1, negDrop: 0.1 })).toThrow(/12 V or 24 V/)
  })

  it('tread depth by 49 CFR 393.75, and a tire run below 80 %', () => {
    // 49 CFR 393.75(b), (c): steer tires at least 4/32 in, others at least 2/32 in
    expect(runCalc({ fn: 'tread_depth' }, { steer: 'yes', depth32: 4 }).verdict).toBe('pass')
    expect(runCalc({ fn: 'tread_depth' }, { steer: 'yes', depth32: 3 }).verdict).toBe('low')
    expect(runCalc({ fn: 'tread_depth' }, { steer: 'no', depth32: 2 }).verdict).toBe('pass')
    expect(runCalc({ fn: 'tread_depth' }, { steer: 'no', depth32: 1 }).verdict).toBe('low')
    // common practice in tire service: below 80 % of its pressure, demount before airing up
    expect(runCalc({ fn: 'inflation' }, { psi: 84, coldPsi: 105 })).toMatchObject({ value: 80, verdict: 'pass' })
    expect(runCalc({ fn: 'inflation' }, { psi: 80, coldPsi: 105 }).verdict).toBe('low')
  })

  it('names the input that is missing or cannot be', () => {
    // our own input contract
    const released = { fn: 'air_leak', brakes: 'released' } as const
    expect(calcInputs(released).map(i => i.id)).toEqual(['startPsi', 'endPsi', 'seconds', 'combination'])
    expect(() => runCalc(released, { startPsi: 120, endPsi: 118, seconds: 60 })).toThrow(/trailer coupled/)
    expect(() => runCalc(released, { startPsi: 120, endPsi: Number.NaN, seconds: 60, combination: 'no' })).toThrow(/pressure at the end/)
    expect(() => runCalc(released, { startPsi: 120, endPsi: 118, seconds: 0, combination: 'no' })).toThrow(/outside 1…900/)
    expect(() => runCalc({ fn: 'tread_depth' }, { steer: 'maybe', depth32: 3 })).toThrow(/steer tire/)
  })
})
