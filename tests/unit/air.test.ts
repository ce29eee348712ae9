import { describe, expect, it } from 'vitest'
import {
  AIR_BUILDUP_FROM_PSI,
  AIR_BUILDUP_MAX_SECONDS,
  AIR_BUILDUP_TO_PSI,
  AIR_GOVERNOR_CUT_IN_PSI,
  AIR_GOVERNOR_CUT_OUT_PSI,
  AIR_LEAK_MAX_PSI_PER_MIN,
  AIR_LOW_WARNING_MIN_PSI,
  AIR_SPRING_BRAKE_MAX_PSI,
  AIR_SPRING_BRAKE_MIN_PSI,
  airLeakRate,
  airLeakVerdict,
} from '../../shared/utils/air'

// Model commercial driver's manual, section 5.3 "Inspecting air brake systems" (the text state CDL manuals reprint;
// REFERENCES.md, "Air brakes"). Quoted numbers: released leakage "less than 2 psi in 1 minute for single vehicles
// and less than 3 psi in 1 minute for combination vehicles"; applied, after the initial drop, "more than 3 psi in
// 1 minute for single vehicles and more than 4 psi for combination vehicles" is too much; build-up "from 85 to 100
// psi within 45 seconds" in dual air systems; the compressor "should start at about 100 psi and stop at about 125
// psi"; the low-air warning "must come on before the pressure drops to less than 60 psi"; the parking brake knob
// pops out "usually in a range between 20 and 45 psi".

describe('the air-brake check numbers', () => {
  it('are the manual\'s', () => {
    // model CDL manual §5.3, as quoted above
    expect(AIR_LEAK_MAX_PSI_PER_MIN).toEqual({ released: { single: 2, combination: 3 }, applied: { single: 3, combination: 4 } })
    expect([AIR_BUILDUP_FROM_PSI, AIR_BUILDUP_TO_PSI, AIR_BUILDUP_MAX_SECONDS]).toEqual([85, 100, 45])
    expect([AIR_GOVERNOR_CUT_IN_PSI, AIR_GOVERNOR_CUT_OUT_PSI]).toEqual([100, 125])
    expect(AIR_LOW_WARNING_MIN_PSI).toBe(60)
    expect([AIR_SPRING_BRAKE_MIN_PSI, AIR_SPRING_BRAKE_MAX_PSI]).toEqual([20, 45])
  })
})

describe('airLeakRate', () => {
  it('is psi lost per minute', () => {
    // model CDL manual §5.3 times the drop over one minute: 125 -> 123 psi in 60 s is 2 psi a minute
    expect(airLeakRate(125, 123, 60)).toBe(2)
    // the same drop over 30 s is twice the rate; over two minutes, half
    expect(airLeakRate(125, 123, 30)).toBe(4)
    expect(airLeakRate(120, 117, 120)).toBe(1.5)
    expect(airLeakRate(110, 110, 60)).toBe(0)
  })

  it('refuses NaN, negative gauge readings, no time and a rising gauge', () => {
    // our own input contract: a leak-down is read with the engine off, so the gauge can only fall
    expect(() => airLeakRate(Number.NaN, 120, 60)).toThrow(/Starting pressure/)
    expect(() => airLeakRate(125, Infinity, 60)).toThrow(/Ending pressure/)
    expect(() => airLeakRate(-1, 0, 60)).toThrow(/below 0 psi/)
    expect(() => airLeakRate(125, 120, 0)).toThrow(/seconds/)
    expect(() => airLeakRate(125, 120, -60)).toThrow(/seconds/)
    expect(() => airLeakRate(125, 120, Number.NaN)).toThrow(/seconds/)
    expect(() => airLeakRate(110, 115, 60)).toThrow(/engine still charging/)
  })
})

describe('airLeakVerdict', () => {
  it.each([
    ['released', false, 2, 'pass'],
    ['released', false, 2.1, 'fail'],
    ['released', true, 3, 'pass'],
    ['released', true, 3.1, 'fail'],
    ['applied', false, 3, 'pass'],
    ['applied', false, 3.1, 'fail'],
    ['applied', true, 4, 'pass'],
    ['applied', true, 4.1, 'fail'],
  ] as const)('brakes %s, combination %s, %d psi/min: %s', (brakes, combination, psiPerMin, verdict) => {
    // model CDL manual §5.3 limits quoted above; the manual's pre-trip leak check fails a drop of "more than" the
    // limit, so a reading exactly at the limit passes
    expect(airLeakVerdict({ psiPerMin, brakes, combination })).toBe(verdict)
  })

  it('passes a rate at the limit even after float arithmetic', () => {
    // model CDL manual §5.3: 3 psi in one minute, applied, single vehicle, is the limit; 0.1 + 0.2 style error must not fail it
    const rate = airLeakRate(120.3, 117.3, 60)
    expect(airLeakVerdict({ psiPerMin: rate, brakes: 'applied', combination: false })).toBe('pass')
  })

  it('refuses a bad rate, brake state or vehicle kind', () => {
    // our own input contract
    expect(() => airLeakVerdict({ psiPerMin: Number.NaN, brakes: 'released', combination: false })).toThrow(/Leak rate/)
    expect(() => airLeakVerdict({ psiPerMin: -1, brakes: 'released', combination: false })).toThrow(/Leak rate/)
    expect(() => airLeakVerdict({ psiPerMin: 1, brakes: 'parked' as 'released', combination: false })).toThrow(/brakes/)
    expect(() => airLeakVerdict({ psiPerMin: 1, brakes: 'applied', combination: 'yes' as unknown as boolean })).toThrow(/combination/)
    expect(() => airLeakVerdict(undefined as unknown as Parameters<typeof airLeakVerdict>[0])).toThrow(RangeError)
  })
})
