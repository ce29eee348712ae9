// Like sensors: the outlier rule is checked against the modified z-score of Iglewicz and Hoaglin
// (How to Detect and Handle Outliers, ASQC 1993, ch. 3.3: M = 0.6745 (x − median) / MAD, |M| > 3.5
// a likely outlier), with median and MAD from a general-purpose statistics library; the readings
// are the trade's own situations, marked common practice.
import { median as libMedian, medianAbsoluteDeviation as libMad } from 'simple-statistics'
import { describe, expect, it } from 'vitest'
import {
  BARO_PLAUSIBLE_KPA, COLD_SOAK_HOURS, SENSOR_TYPE_NOTES, coldSoakFit, coldestScaleHint, compareColdSoak, compareLikeSensors,
  compareManifoldToBaro, manifoldBaroFit,
} from '../../shared/utils/likeSensors'

const readings = (o: Record<string, number>) => Object.entries(o).map(([label, value]) => ({ label, value }))
// Iglewicz and Hoaglin (1993) ch. 3.3: the modified z-score and its 3.5 cut-off
const modifiedZ = (x: number, values: number[]) => (0.6745 * (x - libMedian(values))) / libMad(values)

describe('compareLikeSensors against the modified z-score', () => {
  it('after a cold soak, the open coolant sensor at -40 °C is the one flagged', () => {
    // common practice: after a long stop engine temperatures read near the air (9–13 °C here);
    // an open NTC coolant sensor reads -40 °C
    const values = { 'Oil': 11, 'Fuel': 13, 'Intake manifold air': 9, 'Coolant': -40, 'Coolant (second sensor)': 12 }
    const r = compareLikeSensors(readings(values))
    const all = Object.values(values)
    // simple-statistics: median and unscaled MAD of the same numbers
    expect(r.median).toBe(libMedian(all))
    expect(r.mad).toBe(libMad(all))
    // Iglewicz and Hoaglin: 3.5 MAD / 0.6745 (1/0.6745 = 1.4826 to 4 figures)
    expect(r.threshold).toBeCloseTo((3.5 * libMad(all)) / 0.6745, 3)
    expect(r.outliers).toEqual(['Coolant'])
    // Iglewicz and Hoaglin: every flagged reading has |M| > 3.5, every other one |M| ≤ 3.5
    for (const i of r.items) expect(i.flagged).toBe(Math.abs(modifiedZ(i.value, all)) > 3.5)
  })

  it('one of four exhaust temperatures reading 40 °C warm after a soak is flagged, by how much', () => {
    // common practice: cold, the after-treatment temperature sensors all read the air
    const values = { 'Exhaust temperature 1': 14, 'Exhaust temperature 2': 15, 'Exhaust temperature 3': 55, 'Exhaust temperature 4': 13 }
    const r = compareLikeSensors(readings(values))
    const all = Object.values(values)
    expect(r.outliers).toEqual(['Exhaust temperature 3'])
    // simple-statistics median
    expect(r.items.find(i => i.flagged)?.deviation).toBeCloseTo(55 - libMedian(all), 9)
    expect(Math.abs(modifiedZ(55, all))).toBeGreaterThan(3.5)
  })

  it('a normal 1–2 °C spread flags nothing', () => {
    // common practice: like temperature sensors agree within a couple of degrees after a soak
    const r = compareLikeSensors(readings({ 'Coolant': 11, 'Oil': 12, 'Fuel': 12.5, 'Intake manifold air': 13 }))
    expect(r.outliers).toEqual([])
  })

  it('the floor keeps sensors that agree exactly from flagging a small step', () => {
    // common practice: a 3 °C difference is within what two good sensors and their controller may show;
    // with MAD 0 the modified z-score alone would flag any difference (Iglewicz and Hoaglin divide by MAD)
    const r = compareLikeSensors(readings({ a: 20, b: 20, c: 20, d: 23 }))
    expect(libMad([20, 20, 20, 23])).toBe(0)
    expect(r.outliers).toEqual([])
    expect(r.threshold).toBe(5) // Wayside's default floor, 5 °C
  })

  it('refuses too few readings, NaN, unnamed or twice-named sensors and bad options', () => {
    // Wayside's own input contract
    expect(() => compareLikeSensors(readings({ a: 1, b: 2 }))).toThrow(/at least 3/)
    expect(() => compareLikeSensors(readings({ a: 1, b: Number.NaN, c: 2 }))).toThrow(/"b"/)
    expect(() => compareLikeSensors(readings({ a: 1, b: Infinity, c: 2 }))).toThrow(RangeError)
    expect(() => compareLikeSensors([{ label: '', value: 1 }, { label: 'b', value: 2 }, { label: 'c', value: 3 }])).toThrow(/label/)
    expect(() => compareLikeSensors([{ label: 'a', value: 1 }, { label: 'a', value: 2 }, { label: 'c', value: 3 }])).toThrow(/both labelled "a"/)
    const ok = readings({ a: 1, b: 2, c: 3 })
    expect(() => compareLikeSensors(ok, { floor: -1 })).toThrow(RangeError)
    expect(() => compareLikeSensors(ok, { k: 0 })).toThrow(RangeError)
    expect(() => compareLikeSensors(ok, { k: Number.NaN })).toThrow(RangeError)
  })
})

describe('when temperatures should agree', () => {
  it('key on, engine off after 8 h or more, with the air measured: compare', () => {
    // common practice: a cold soak of 8 h or more (overnight)
    expect(COLD_SOAK_HOURS).toBe(8)
    expect(coldSoakFit({ conditions: 'key_on_engine_off', soakHours: 10, airC: 12 })).toEqual({ verdict: 'ok', reasons: [] })
    expect(coldSoakFit({ conditions: 'key_on_engine_off', soakHours: 8, airC: 12 }).verdict).toBe('ok')
  })

  it('running: refused, the temperatures differ by design', () => {
    // common practice: running, the exhaust heats along the after-treatment (DOC, DPF) and coolant, oil and fuel run apart
    const fit = coldSoakFit({ conditions: 'running', soakHours: 10, airC: 12 })
    expect(fit.verdict).toBe('refuse')
    expect(fit.reasons.join(' ')).toMatch(/differ by design/)
  })

  it('a short soak warns; key off, no air reading or no soak time refuses', () => {
    // common practice: under 8 h the oil and exhaust still hold heat
    expect(coldSoakFit({ conditions: 'key_on_engine_off', soakHours: 3, airC: 12 })).toMatchObject({ verdict: 'warn', reasons: [expect.stringMatching(/3 h, under 8 h/)] })
    // live data needs the key on (common practice)
    expect(coldSoakFit({ conditions: 'key_off', soakHours: 10, airC: 12 }).verdict).toBe('refuse')
    expect(coldSoakFit({ conditions: 'key_on_engine_off', soakHours: 10 }).reasons).toEqual([expect.stringMatching(/air temperature/)])
    expect(coldSoakFit({ conditions: 'key_on_engine_off', airC: 12 }).reasons).toEqual([expect.stringMatching(/how long/)])
    expect(coldSoakFit({ soakHours: 10, airC: 12 }).verdict).toBe('refuse')
    // Wayside's input contract: a typed air temperature out of any roadside's range, negative hours
    expect(coldSoakFit({ conditions: 'key_on_engine_off', soakHours: 10, airC: 95 }).verdict).toBe('refuse')
    expect(coldSoakFit({ conditions: 'key_on_engine_off', soakHours: -1, airC: 12 }).verdict).toBe('refuse')
  })

  it('a block heater or the sun on the engine warns', () => {
    // common practice: a block heater warms the coolant and oil, not the fuel or intake air
    expect(coldSoakFit({ conditions: 'key_on_engine_off', soakHours: 12, airC: -5, heatSources: true }).verdict).toBe('warn')
  })

  it('the median is held against the air: sensors that agree with each other but not with the air are named', () => {
    // common practice: after a soak every engine temperature reads the air; all of them far from it means the
    // engine is not cold yet, the air was read in the sun, or the sensors share a fault (reference or return)
    const warm = compareColdSoak(readings({ 'Coolant': 21, 'Oil': 22, 'Fuel': 20, 'Intake manifold air': 21 }), 6)
    expect(warm.outliers).toEqual([])
    expect(warm.agreesWithAir).toBe(false)
    expect(warm.medianMinusAir).toBeCloseTo(21 - 6, 9)
    const cold = compareColdSoak(readings({ 'Coolant': 11, 'Oil': 12, 'Fuel': 13, 'Intake manifold air': 11 }), 12)
    expect(cold.agreesWithAir).toBe(true)
    expect(() => compareColdSoak(readings({ a: 1, b: 2, c: 3 }), Number.NaN)).toThrow(/Air temperature/)
  })
})

describe('manifold pressure against barometric, key on, engine off', () => {
  it('an absolute manifold reading equals the barometric one with the engine stopped', () => {
    // a maker's service manual (MAP data list, key on): "equivalent to atmospheric pressure";
    // standard atmospheric pressure 101 kPa, about 1 kPa less per 100 m of height
    const sea = compareManifoldToBaro({ manifoldKpa: 100.4, baroKpa: 101.3, manifoldReads: 'absolute' })
    expect(sea).toMatchObject({ agrees: true, expectedKpa: 101.3 })
    // same manual's rule: 1,600 m up, about 101 − 16 = 85 kPa, still a road's pressure
    const high = compareManifoldToBaro({ manifoldKpa: 85.5, baroKpa: 85, manifoldReads: 'absolute' })
    expect(high).toMatchObject({ agrees: true, baroPlausible: true })
    // common practice: a manifold sensor 20 kPa (3 psi) above the air with the engine stopped is wrong
    const boosted = compareManifoldToBaro({ manifoldKpa: 121, baroKpa: 101, manifoldReads: 'absolute' })
    expect(boosted.agrees).toBe(false)
    expect(boosted.differenceKpa).toBeCloseTo(20, 9)
  })

  it('a gauge (boost) reading shows 0 with the engine stopped', () => {
    // by definition gauge pressure is absolute pressure minus the atmosphere's, so 0 with the engine stopped
    expect(compareManifoldToBaro({ manifoldKpa: 0.7, baroKpa: 99, manifoldReads: 'gauge' })).toMatchObject({ agrees: true, expectedKpa: 0 })
    expect(compareManifoldToBaro({ manifoldKpa: 14, baroKpa: 99, manifoldReads: 'gauge' }).agrees).toBe(false)
  })

  it('a barometric value typed in psi is caught as implausible', () => {
    // 14.7 psi is one standard atmosphere (101.325 kPa, exact by definition); as kPa it is no road's air
    const r = compareManifoldToBaro({ manifoldKpa: 14.5, baroKpa: 14.7, manifoldReads: 'absolute' })
    expect(r.baroPlausible).toBe(false)
    expect(101.325).toBeGreaterThan(BARO_PLAUSIBLE_KPA.min)
    expect(101.325).toBeLessThan(BARO_PLAUSIBLE_KPA.max)
  })

  it('running is refused: the turbocharger boosts the manifold by design', () => {
    // common practice: compare manifold and barometric pressure key on, engine off only
    expect(manifoldBaroFit({ conditions: 'running' }).verdict).toBe('refuse')
    expect(manifoldBaroFit({ conditions: 'key_on_engine_off' }).verdict).toBe('ok')
    expect(manifoldBaroFit({}).verdict).toBe('refuse')
  })

  it('refuses bad input', () => {
    // Wayside's input contract
    expect(() => compareManifoldToBaro({ manifoldKpa: Number.NaN, baroKpa: 100, manifoldReads: 'absolute' })).toThrow(/Manifold/)
    expect(() => compareManifoldToBaro({ manifoldKpa: 100, baroKpa: 0, manifoldReads: 'absolute' })).toThrow(/above 0/)
    expect(() => compareManifoldToBaro({ manifoldKpa: 100, baroKpa: 100, manifoldReads: 'vacuum' as never })).toThrow(/absolute/)
  })
})

describe('what -40 °C means', () => {
  it('-40 °C is the bottom of a one-byte J1939 temperature, so an open NTC circuit reads it', () => {
    // SAE J1939-71, engine coolant temperature (SPN 110): 1 °C per bit, offset −40 °C, so raw 0 is −40 °C (from memory)
    const oneByte = (raw: number) => raw * 1 - 40
    expect(coldestScaleHint(oneByte(0))).toMatch(/NTC/)
    expect(coldestScaleHint(oneByte(1))).toBeUndefined()
    expect(coldestScaleHint(12)).toBeUndefined()
    expect(coldestScaleHint(Number.NaN)).toBeUndefined()
  })

  it('the notes say the rule fits NTC, one-byte temperatures and that an open RTD reads hot', () => {
    // IEC 60751: a platinum RTD's resistance rises with temperature, so an open circuit (infinite ohms) reads as hot
    const text = SENSOR_TYPE_NOTES.join(' ')
    expect(text).toMatch(/NTC/)
    expect(text).toMatch(/one byte/)
    expect(text).toMatch(/open RTD .* reads hot/)
  })
})
