import { describe, expect, it } from 'vitest'
import {
  ntcResistanceBeta,
  ntcTemperatureBeta,
  steinhartHartResistance,
  steinhartHartTemperature,
  tableResistance,
  type NtcTable,
} from '../../shared/utils/ntc'

// Makers' resistance tables as the Linux kernel's NTC driver reproduces them from the data sheets
// (drivers/hwmon/ntc_thermistor.c): Murata NCP15XH103 (10 kΩ at 25 °C, ±1 % part) and EPCOS
// B57330V2103 (10 kΩ at 25 °C), printed to 1 Ω every 5 °C from −40 to 125 °C.
const MURATA_NCP15XH103: NtcTable = [
  [-40, 247565], [-35, 181742], [-30, 135128], [-25, 101678], [-20, 77373], [-15, 59504], [-10, 46222], [-5, 36244],
  [0, 28674], [5, 22878], [10, 18399], [15, 14910], [20, 12169], [25, 10000], [30, 8271], [35, 6883], [40, 5762],
  [45, 4851], [50, 4105], [55, 3492], [60, 2985], [65, 2563], [70, 2211], [75, 1915], [80, 1666], [85, 1454],
  [90, 1275], [95, 1121], [100, 990], [105, 876], [110, 779], [115, 694], [120, 620], [125, 556],
]
const EPCOS_B57330V2103: NtcTable = [
  [-40, 190030], [-35, 145360], [-30, 112060], [-25, 87041], [-20, 68104], [-15, 53665], [-10, 42576], [-5, 34001],
  [0, 27326], [5, 22096], [10, 17973], [15, 14703], [20, 12090], [25, 10000], [30, 8311], [35, 6941], [40, 5825],
  [45, 4911], [50, 4158], [55, 3536], [60, 3019], [65, 2588], [70, 2227], [75, 1924], [80, 1668], [85, 1451],
  [90, 1266], [95, 1108], [100, 973], [105, 857], [110, 757], [115, 671], [120, 596], [125, 531],
]

describe('Beta model', () => {
  it('worked example: 10 kΩ, B 3950 K, 10 475 Ω -> 23.96 °C', () => {
    // Beta equation worked example (REFERENCES.md §2): R0 = 10 kΩ, B = 3950 K, R = 10 475 Ω -> 23.96 °C, printed to 0.01 °C
    expect(Math.abs(ntcTemperatureBeta(10475, 10000, 3950) - 23.96)).toBeLessThanOrEqual(0.005)
  })

  it('gives R25 at 25 °C', () => {
    // Beta equation's published form: R = R0 at T0 = 298.15 K
    expect(Math.abs(ntcResistanceBeta(25, 10000, 3950) - 10000)).toBeLessThan(1e-9)
    expect(Math.abs(ntcTemperatureBeta(47000, 47000, 4050) - 25)).toBeLessThan(1e-9)
  })

  it.each([
    [0, 162942.79],
    [-18, 463773.791],
    [5, 124819.66],
    [60, 11280.407],
  ])('Murata 47 kΩ / 4050 K at %d °C -> %d Ω', (t, ohms) => {
    // UliEngineering's NTC tests (Murata NCP15WB473D03RC by the Beta equation), value as printed there
    expect(Math.abs(ntcResistanceBeta(t, 47000, 4050) - ohms) / ohms).toBeLessThan(1e-6)
    expect(Math.abs(ntcTemperatureBeta(ohms, 47000, 4050) - t)).toBeLessThan(0.001)
  })

  it('is a model, not the maker\'s table: Beta through 25 and 50 °C misses the 0 °C row', () => {
    // Murata NCP15WB473 table (kernel copy): 25 °C 47 000 Ω, 50 °C 16 433 Ω, 0 °C 158 214 Ω. The Beta equation with
    // B = 4050 K (UliEngineering: 0 °C -> 162 942.79 Ω) meets the 50 °C row within its 1 Ω printing but sits 3 % off
    // the 0 °C row: why a card wants the maker's table rather than Beta and R25 alone.
    const wb473: NtcTable = [[0, 158214], [25, 47000], [50, 16433]]
    expect(Math.abs(ntcResistanceBeta(50, 47000, 4050) - 16433)).toBeLessThanOrEqual(1)
    expect(Math.abs(ntcResistanceBeta(0, 47000, 4050) - 158214) / 158214).toBeGreaterThan(0.02)
    expect(tableResistance(0, wb473)).toBe(158214)
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
  // The widely published 10 kΩ set A = 1.129148e−3, B = 2.34125e−4, C = 8.76741e−8 with its two quoted points
  // (REFERENCES.md §2); the coefficients are rounded, so the points hold to about 0.01 °C.
  const SH_A = 1.129148e-3
  const SH_B = 2.34125e-4
  const SH_C = 8.76741e-8

  it('10 000 Ω -> 25.000 °C and 32 650 Ω -> 0.000 °C', () => {
    // REFERENCES.md §2, common 10 kΩ Steinhart–Hart set, its two quoted points
    expect(Math.abs(steinhartHartTemperature(10000, SH_A, SH_B, SH_C) - 25)).toBeLessThan(0.01)
    expect(Math.abs(steinhartHartTemperature(32650, SH_A, SH_B, SH_C) - 0)).toBeLessThan(0.01)
  })

  it('the inverse gives back the quoted points', () => {
    // REFERENCES.md §2 quoted points; 0.01 °C is about 45 Ω at 25 °C and 150 Ω at 0 °C on this curve
    expect(Math.abs(steinhartHartResistance(25, SH_A, SH_B, SH_C) - 10000)).toBeLessThan(45)
    expect(Math.abs(steinhartHartResistance(0, SH_A, SH_B, SH_C) - 32650)).toBeLessThan(150)
  })

  it('with C = 0 is the Beta equation', () => {
    // Steinhart–Hart's published form with C = 0: 1/T = A + B ln R, which is the Beta equation with B = 1/β and
    // A = 1/T0 − ln(R0)/β; UliEngineering's Murata 47 kΩ / 4050 K value at 60 °C is 11 280.407 Ω
    const a = 1 / 298.15 - Math.log(47000) / 4050
    expect(Math.abs(steinhartHartResistance(60, a, 1 / 4050, 0) - 11280.407) / 11280.407).toBeLessThan(1e-6)
    expect(Math.abs(steinhartHartTemperature(11280.407, a, 1 / 4050, 0) - 60)).toBeLessThan(0.001)
  })

  it('rejects NaN, non-positive ohms, absolute zero and coefficients no NTC has', () => {
    // our own input contract (ln R needs R > 0); a set giving 1/T <= 0 describes no physical temperature
    expect(() => steinhartHartTemperature(Number.NaN, SH_A, SH_B, SH_C)).toThrow(RangeError)
    expect(() => steinhartHartTemperature(0, SH_A, SH_B, SH_C)).toThrow(RangeError)
    expect(() => steinhartHartTemperature(-10, SH_A, SH_B, SH_C)).toThrow(RangeError)
    expect(() => steinhartHartTemperature(10000, Number.NaN, SH_B, SH_C)).toThrow(RangeError)
    expect(() => steinhartHartTemperature(10000, SH_A, Infinity, SH_C)).toThrow(RangeError)
    expect(() => steinhartHartTemperature(10000, -1, 0, 0)).toThrow(/physical/)
    expect(() => steinhartHartResistance(Number.NaN, SH_A, SH_B, SH_C)).toThrow(RangeError)
    expect(() => steinhartHartResistance(-273.15, SH_A, SH_B, SH_C)).toThrow(/absolute zero/)
    expect(() => steinhartHartResistance(25, SH_A, -1, SH_C)).toThrow(RangeError)
    expect(() => steinhartHartResistance(25, SH_A, SH_B, -1e-7)).toThrow(RangeError)
    expect(() => steinhartHartResistance(25, Number.NaN, SH_B, SH_C)).toThrow(RangeError)
  })
})

describe('tableResistance (a maker\'s [°C, Ω] table)', () => {
  it.each([
    ['Murata NCP15XH103', MURATA_NCP15XH103],
    ['EPCOS B57330V2103', EPCOS_B57330V2103],
  ] as const)('%s: every printed row comes back as printed', (_name, table) => {
    // the maker's table (kernel copy) row by row
    for (const [t, ohms] of table) expect(tableResistance(t, table)).toBe(ohms)
  })

  it.each([
    ['Murata NCP15XH103', MURATA_NCP15XH103],
    ['EPCOS B57330V2103', EPCOS_B57330V2103],
  ] as const)('%s: the 10 °C rows alone give the maker\'s 5 °C rows', (_name, table) => {
    // the maker's table (kernel copy): interpolating between its 10 °C rows lands on the rows it prints in between,
    // within 1 Ω (its printing) or 0.2 %, a fifth of the ±1 % such parts are sold to (from memory)
    const coarse = table.filter(([t]) => t % 10 === 0)
    for (const [t, ohms] of table) {
      if (t % 10 === 0 || t > 120) continue
      expect(Math.abs(tableResistance(t, coarse) - ohms)).toBeLessThanOrEqual(Math.max(1, ohms * 0.002))
    }
  })

  it('is exact for a Beta thermistor between two rows', () => {
    // UliEngineering's NTC tests, Murata 47 kΩ / 4050 K by the Beta equation: 0 °C 162 942.79 Ω, 60 °C 11 280.407 Ω,
    // 5 °C 124 819.66 Ω; ln R is linear in 1/T for such a part, so two far rows give the third exactly
    const rows: NtcTable = [[0, 162942.79], [60, 11280.407]]
    expect(Math.abs(tableResistance(5, rows) - 124819.66)).toBeLessThanOrEqual(0.005 + 1e-6)
  })

  it('takes the table hottest row first too', () => {
    // makers print either way; the kernel copy reversed gives the same 5 °C rows from the 10 °C ones
    const coarseReversed = MURATA_NCP15XH103.filter(([t]) => t % 10 === 0).reverse()
    expect(Math.abs(tableResistance(35, coarseReversed) - 6883)).toBeLessThanOrEqual(1)
  })

  it('refuses a temperature outside the maker\'s table', () => {
    // the Murata table (kernel copy) runs −40…125 °C and says nothing beyond
    expect(() => tableResistance(-40.1, MURATA_NCP15XH103)).toThrow(/outside the maker's table \(-40…125 °C\)/)
    expect(() => tableResistance(126, MURATA_NCP15XH103)).toThrow(/outside the maker's table/)
    expect(() => tableResistance(Number.NaN, MURATA_NCP15XH103)).toThrow(/finite/)
    expect(() => tableResistance(Infinity, MURATA_NCP15XH103)).toThrow(/finite/)
  })

  it('refuses a table that is short, unordered, rising or not numbers', () => {
    // our own input contract: at least two rows, temperatures one way, resistance falling as it warms (NTC)
    expect(() => tableResistance(25, [[25, 10000]])).toThrow(/at least two/)
    expect(() => tableResistance(25, [])).toThrow(/at least two/)
    expect(() => tableResistance(25, [[0, 28674], [50, 4105], [30, 8271]])).toThrow(/one way/)
    expect(() => tableResistance(25, [[0, 28674], [0, 28000], [50, 4105]])).toThrow(/one way/)
    expect(() => tableResistance(25, [[0, 28674], [50, 30000]])).toThrow(/fall as temperature rises/)
    expect(() => tableResistance(25, [[0, Number.NaN], [50, 4105]])).toThrow(/row 1: resistance/)
    expect(() => tableResistance(25, [[0, 28674], [50, Infinity]])).toThrow(/row 2: resistance/)
    expect(() => tableResistance(25, [[0, 28674], [50, 0]])).toThrow(/row 2: resistance/)
    expect(() => tableResistance(25, [[Number.NaN, 28674], [50, 4105]])).toThrow(/row 1: temperature/)
    expect(() => tableResistance(25, [[0, 28674], [50]] as unknown as NtcTable)).toThrow(/row 2 must be a \[°C, Ω\] pair/)
    expect(() => tableResistance(25, 'table' as unknown as NtcTable)).toThrow(/at least two/)
  })
})
