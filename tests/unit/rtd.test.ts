import { describe, expect, it } from 'vitest'
import { rtdResistance, rtdTemperature, rtdWindow } from '../../shared/utils/rtd'

// Sensor Scientific, "Reference Table for Pt RTD Elements" (IEC 751 / DIN EN 60751, R0 = 100 Ω), 10 °C rows as
// printed to 0.01 Ω. Its −160 °C row prints 35.34 where its neighbours' steps (4.24, 4.18) call for 35.54: a
// misprint, left out here (REFERENCES.md).
const SENSORSCI_PT100: readonly (readonly [number, number])[] = [
  [-200, 18.52], [-190, 22.83], [-180, 27.10], [-170, 31.34], [-150, 39.72], [-140, 43.88], [-130, 48.00],
  [-120, 52.11], [-110, 56.19], [-100, 60.26], [-90, 64.30], [-80, 68.33], [-70, 72.33], [-60, 76.33], [-50, 80.31],
  [-40, 84.27], [-30, 88.22], [-20, 92.16], [-10, 96.09], [0, 100.00], [10, 103.90], [20, 107.79], [30, 111.67],
  [40, 115.54], [50, 119.40], [60, 123.24], [70, 127.08], [80, 130.90], [90, 134.71], [100, 138.51], [110, 142.29],
  [120, 146.07], [130, 149.83], [140, 153.58], [150, 157.33], [160, 161.05], [170, 164.77], [180, 168.48],
  [190, 172.17], [200, 175.86], [210, 179.53], [220, 183.19], [230, 186.84], [240, 190.47], [250, 194.10],
  [260, 197.71], [270, 201.31], [280, 204.90], [290, 208.48], [300, 212.05], [310, 215.61], [320, 219.15],
  [330, 222.68], [340, 226.21], [350, 229.72], [360, 233.21], [370, 236.70], [380, 240.18], [390, 243.64],
  [400, 247.09], [410, 250.53], [420, 253.96], [430, 257.38], [440, 260.78], [450, 264.18], [460, 267.56],
  [470, 270.93], [480, 274.29], [490, 277.64], [500, 280.98], [510, 284.30], [520, 287.62], [530, 290.92],
  [540, 294.21], [550, 297.49], [560, 300.75], [570, 304.01], [580, 307.25], [590, 310.49], [600, 313.71],
]
// A value printed to 0.01 Ω stands for anything within half a unit of its last digit.
const PRINTED = 0.005 + 1e-9

describe('rtdResistance (IEC 60751 Pt100)', () => {
  it.each(SENSORSCI_PT100)('%d °C -> %d Ω', (t, ohms) => {
    // Sensor Scientific Pt RTD reference table (IEC 751 / DIN EN 60751), row for t, printed to 0.01 Ω
    expect(Math.abs(rtdResistance(t) - ohms)).toBeLessThanOrEqual(PRINTED)
  })

  it('scales by r0 for Pt200 and Pt1000', () => {
    // Beckhoff RTD transformation notes: Pt200 at −100 °C = 120.512 Ω (printed to 1 mΩ)
    expect(Math.abs(rtdResistance(-100, 200) - 120.512)).toBeLessThanOrEqual(0.0005 + 1e-9)
    // Sensor Scientific table note: for R0 other than 100 Ω multiply the table by R0 × 10⁻²; 100 °C: 138.51 Ω -> Pt1000 1385.1 Ω
    expect(Math.abs(rtdResistance(100, 1000) - 1385.1)).toBeLessThanOrEqual(PRINTED * 10)
  })

  it('a good Pt200 EGT sensor at shop ambient reads 200–220 Ω', () => {
    // common practice: a Pt200-type exhaust temperature sensor reads roughly 200–220 Ω at shop ambient;
    // Sensor Scientific table at 20 °C, 107.79 Ω, doubled for R0 = 200 Ω: 215.58 Ω
    const r = rtdResistance(20, 200)
    expect(r).toBeGreaterThanOrEqual(200)
    expect(r).toBeLessThanOrEqual(220)
    expect(Math.abs(r - 215.58)).toBeLessThanOrEqual(PRINTED * 2)
  })

  it('rejects bad input with RangeError', () => {
    // IEC 60751 defines the curve only over −200…850 °C; the rest is our own input contract
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
  it.each(SENSORSCI_PT100)('%d °C <- %d Ω', (t, ohms) => {
    // Sensor Scientific table row for t: the printed ohms (±0.005 Ω) read back within 0.02 °C, since the curve
    // climbs 0.33–0.44 Ω per °C over the table
    expect(Math.abs(rtdTemperature(ohms) - t)).toBeLessThan(0.02)
  })

  it('inverts Pt200 and Pt1000 too', () => {
    // Beckhoff RTD transformation notes: Pt200 at −100 °C = 120.512 Ω (1 mΩ is about 0.002 °C)
    expect(Math.abs(rtdTemperature(120.512, 200) - -100)).toBeLessThan(0.005)
    // Sensor Scientific table × 10 for Pt1000: 2120.5 Ω at 300 °C
    expect(Math.abs(rtdTemperature(2120.5, 1000) - 300)).toBeLessThan(0.02)
  })

  it('rejects NaN, negative, infinite and out-of-range ohms', () => {
    // our own input contract; Sensor Scientific table: 18.52 Ω is −200 °C, the cold end of IEC 60751's range
    expect(() => rtdTemperature(Number.NaN)).toThrow(RangeError)
    expect(() => rtdTemperature(-1)).toThrow(/negative/)
    expect(() => rtdTemperature(Infinity)).toThrow(RangeError)
    expect(() => rtdTemperature(18.0)).toThrow(/below/)
    // IEC 60751 stops at 850 °C, where a Pt100 reads about 390.5 Ω (from memory of published tables)
    expect(() => rtdTemperature(391)).toThrow(/above/)
    expect(() => rtdTemperature(0)).toThrow(RangeError)
    expect(() => rtdTemperature(100, 0)).toThrow(RangeError)
  })
})

describe('rtdWindow (tolerance in °C turned into ohms)', () => {
  // Sensor Scientific table of permissible deviations, IEC 751 / DIN EN 60751 class A: ±(0.15 + 0.002|t|) °C,
  // printed beside it in ohms for a Pt100 to 0.01 Ω.
  const CLASS_A: readonly (readonly [number, number, number])[] = [
    [-100, 0.35, 0.14], [0, 0.15, 0.06], [100, 0.35, 0.13], [200, 0.55, 0.20], [300, 0.75, 0.27],
    [400, 0.95, 0.33], [500, 1.15, 0.38], [600, 1.35, 0.43], [650, 1.45, 0.46],
  ]

  it.each(CLASS_A)('class A at %d °C: ±%d °C is ±%d Ω', (t, tolC, tolOhm) => {
    // Sensor Scientific class A row for t: both sides of the window sit the printed ohms from the curve
    const w = rtdWindow(t, tolC)
    const r = rtdResistance(t)
    expect(Math.abs(w.max - r - tolOhm)).toBeLessThanOrEqual(PRINTED)
    expect(Math.abs(r - w.min - tolOhm)).toBeLessThanOrEqual(PRINTED)
  })

  it('holds the table values at the window ends', () => {
    // Sensor Scientific table: 20 °C ± 10 °C runs from the 10 °C row (103.90 Ω) to the 30 °C row (111.67 Ω)
    const w = rtdWindow(20, 10)
    expect(Math.abs(w.min - 103.9)).toBeLessThanOrEqual(PRINTED)
    expect(Math.abs(w.max - 111.67)).toBeLessThanOrEqual(PRINTED)
    // the same for a Pt200, doubled (table note: multiply by R0 × 10⁻²): 207.80–223.34 Ω
    const w200 = rtdWindow(20, 10, 200)
    expect(Math.abs(w200.min - 207.8)).toBeLessThanOrEqual(PRINTED * 2)
    expect(Math.abs(w200.max - 223.34)).toBeLessThanOrEqual(PRINTED * 2)
  })

  it('a zero tolerance is the single table value', () => {
    // Sensor Scientific table: 100 °C -> 138.51 Ω
    const w = rtdWindow(100, 0)
    expect(w.min).toBe(w.max)
    expect(Math.abs(w.min - 138.51)).toBeLessThanOrEqual(PRINTED)
  })

  it('refuses NaN, a negative tolerance and a window past the standard\'s range', () => {
    // our own input contract; IEC 60751 defines the curve only over −200…850 °C
    expect(() => rtdWindow(Number.NaN, 1)).toThrow(RangeError)
    expect(() => rtdWindow(20, Number.NaN)).toThrow(/tolerance/)
    expect(() => rtdWindow(20, -1)).toThrow(/tolerance/)
    expect(() => rtdWindow(20, Infinity)).toThrow(/tolerance/)
    expect(() => rtdWindow(-199.5, 1)).toThrow(/outside the IEC 60751 range/)
    expect(() => rtdWindow(849.5, 1)).toThrow(/outside the IEC 60751 range/)
    expect(() => rtdWindow(20, 1, 0)).toThrow(/r0/)
  })
})
