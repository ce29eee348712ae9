// NTC thermistors: the Beta model (what most data sheets print) and Steinhart–Hart
// (what a fitted A/B/C set gives). Both work in kelvin inside and °C outside.

const NTC_KELVIN = 273.15
const NTC_T25_K = 298.15 // the Beta model's reference point, 25 °C

function ntcCheckPositive(name: string, v: number, unit: string): void {
  if (typeof v !== 'number' || Number.isNaN(v)) throw new RangeError(`NTC ${name} must be a number, got ${v}`)
  if (!Number.isFinite(v) || v <= 0) throw new RangeError(`NTC ${name} must be a positive finite number, got ${v} ${unit}`)
}

function ntcCheckKelvin(k: number): number {
  // A fit pushed far outside its range can give 1/T ≤ 0: that is no temperature at all, say so.
  if (!Number.isFinite(k) || k <= 0) throw new RangeError('NTC reading is outside what the model can describe (no physical temperature)')
  return k - NTC_KELVIN
}

/** Resistance (Ω) of an NTC at tempC by the Beta equation R = R25·exp(B(1/T − 1/298.15)). */
export function ntcResistanceBeta(tempC: number, r25: number, beta: number): number {
  if (typeof tempC !== 'number' || !Number.isFinite(tempC)) throw new RangeError(`NTC temperature must be a finite number, got ${tempC}`)
  if (tempC <= -NTC_KELVIN) throw new RangeError(`NTC temperature ${tempC} °C is at or below absolute zero`)
  ntcCheckPositive('R25', r25, 'Ω')
  ntcCheckPositive('Beta', beta, 'K')
  return r25 * Math.exp(beta * (1 / (tempC + NTC_KELVIN) - 1 / NTC_T25_K))
}

/** Temperature (°C) of an NTC reading `ohms`, by the Beta equation. */
export function ntcTemperatureBeta(ohms: number, r25: number, beta: number): number {
  ntcCheckPositive('resistance', ohms, 'Ω')
  ntcCheckPositive('R25', r25, 'Ω')
  ntcCheckPositive('Beta', beta, 'K')
  return ntcCheckKelvin(1 / (1 / NTC_T25_K + Math.log(ohms / r25) / beta))
}

function shCheckCoefficients(a: number, b: number, c: number): void {
  for (const [name, v] of [['A', a], ['B', b], ['C', c]] as const) {
    if (typeof v !== 'number' || !Number.isFinite(v)) {
      throw new RangeError(`Steinhart–Hart coefficient ${name} must be a finite number, got ${v}`)
    }
  }
}

/** Temperature (°C) from 1/T = a + b·ln R + c·(ln R)³, T in kelvin. */
export function steinhartHartTemperature(ohms: number, a: number, b: number, c: number): number {
  ntcCheckPositive('resistance', ohms, 'Ω')
  shCheckCoefficients(a, b, c)
  const ln = Math.log(ohms)
  return ntcCheckKelvin(1 / (a + b * ln + c * ln * ln * ln))
}

/**
 * Resistance (Ω) of an NTC at tempC from a Steinhart–Hart set: the closed-form inverse of
 * 1/T = a + b·ln R + c·(ln R)³ (a depressed cubic in ln R, one real root when b, c > 0).
 */
export function steinhartHartResistance(tempC: number, a: number, b: number, c: number): number {
  if (typeof tempC !== 'number' || !Number.isFinite(tempC)) throw new RangeError(`NTC temperature must be a finite number, got ${tempC}`)
  if (tempC <= -NTC_KELVIN) throw new RangeError(`NTC temperature ${tempC} °C is at or below absolute zero`)
  shCheckCoefficients(a, b, c)
  if (b <= 0 || c < 0) throw new RangeError('Steinhart–Hart coefficient B must be positive and C zero or more for an NTC')
  const invT = 1 / (tempC + NTC_KELVIN)
  if (c === 0) return ntcCheckOhms(Math.exp((invT - a) / b))
  const x = (a - invT) / c
  const y = Math.sqrt((b / (3 * c)) ** 3 + (x * x) / 4)
  return ntcCheckOhms(Math.exp(Math.cbrt(y - x / 2) - Math.cbrt(y + x / 2)))
}

function ntcCheckOhms(ohms: number): number {
  if (!Number.isFinite(ohms) || ohms <= 0) throw new RangeError('NTC temperature is outside what the Steinhart–Hart set can describe')
  return ohms
}

/** A maker's resistance table: [°C, Ω] rows. */
export type NtcTable = readonly (readonly [number, number])[]

function ntcCheckTable(table: NtcTable): (readonly [number, number])[] {
  if (!Array.isArray(table) || table.length < 2) throw new RangeError('NTC table needs at least two [°C, Ω] rows')
  table.forEach((row, i) => {
    if (!Array.isArray(row) || row.length !== 2) throw new RangeError(`NTC table row ${i + 1} must be a [°C, Ω] pair`)
    const [t, r] = row
    if (typeof t !== 'number' || !Number.isFinite(t) || t <= -NTC_KELVIN) {
      throw new RangeError(`NTC table row ${i + 1}: temperature must be a finite number above absolute zero, got ${t}`)
    }
    if (typeof r !== 'number' || !Number.isFinite(r) || r <= 0) {
      throw new RangeError(`NTC table row ${i + 1}: resistance must be a positive finite number of ohms, got ${r}`)
    }
  })
  // Makers print rows coldest first or hottest first; either is fine as long as it runs one way.
  const rows = table[0]![0] < table[1]![0] ? [...table] : [...table].reverse()
  for (let i = 1; i < rows.length; i++) {
    const [t0, r0] = rows[i - 1]!
    const [t1, r1] = rows[i]!
    if (!(t1 > t0)) throw new RangeError(`NTC table temperatures must run one way without repeats (${t0} °C then ${t1} °C)`)
    if (!(r1 < r0)) throw new RangeError(`NTC table resistance must fall as temperature rises (${r0} Ω at ${t0} °C, ${r1} Ω at ${t1} °C)`)
  }
  return rows
}

/**
 * Resistance (Ω) at tempC from a maker's [°C, Ω] table. Between rows, ln R is interpolated
 * linearly in 1/T (kelvin), which is exact for any Beta thermistor; outside the table it throws,
 * since a maker's table says nothing beyond its ends.
 */
export function tableResistance(tempC: number, table: NtcTable): number {
  if (typeof tempC !== 'number' || !Number.isFinite(tempC)) throw new RangeError(`NTC temperature must be a finite number, got ${tempC}`)
  const rows = ntcCheckTable(table)
  const first = rows[0]!
  const last = rows[rows.length - 1]!
  if (tempC < first[0] || tempC > last[0]) {
    throw new RangeError(`${tempC} °C is outside the maker's table (${first[0]}…${last[0]} °C)`)
  }
  let i = 1
  while (rows[i]![0] < tempC) i++
  const [t0, r0] = rows[i - 1]!
  const [t1, r1] = rows[i]!
  if (tempC === t0) return r0
  if (tempC === t1) return r1
  const x = 1 / (tempC + NTC_KELVIN)
  const x0 = 1 / (t0 + NTC_KELVIN)
  const x1 = 1 / (t1 + NTC_KELVIN)
  return Math.exp(Math.log(r0) + ((x - x0) / (x1 - x0)) * (Math.log(r1) - Math.log(r0)))
}
