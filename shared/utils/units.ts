// Unit conversions for readings. Every reading is stored and judged in one base unit per
// quantity so specs, sensor models and comparisons never depend on the mechanic's preferences.

export type MeasureQuantity = 'temperature' | 'resistance' | 'voltage' | 'pressure' | 'concentration'
export type MeasureUnit = 'degC' | 'degF' | 'ohm' | 'kohm' | 'V' | 'mV' | 'kPa' | 'psi' | 'pct'

// 1 psi = 1 lbf/in², lbf = 4.4482216152605 N and in = 0.0254 m, both exact by definition.
export const PSI_IN_KPA = 4.4482216152605 / (0.0254 * 0.0254) / 1000

export const UNITS_BY_QUANTITY: Readonly<Record<MeasureQuantity, readonly MeasureUnit[]>> = {
  temperature: ['degC', 'degF'],
  resistance: ['ohm', 'kohm'],
  voltage: ['V', 'mV'],
  pressure: ['kPa', 'psi'],
  concentration: ['pct'],
}

export const BASE_UNIT_OF: Readonly<Record<MeasureQuantity, MeasureUnit>> = {
  temperature: 'degC',
  resistance: 'ohm',
  voltage: 'V',
  pressure: 'kPa',
  concentration: 'pct',
}

export const UNIT_SYMBOLS: Readonly<Record<MeasureUnit, string>> = {
  degC: '°C',
  degF: '°F',
  ohm: 'Ω',
  kohm: 'kΩ',
  V: 'V',
  mV: 'mV',
  kPa: 'kPa',
  psi: 'psi',
  pct: '%',
}

const UNIT_QUANTITY: Readonly<Record<MeasureUnit, MeasureQuantity>> = {
  degC: 'temperature',
  degF: 'temperature',
  ohm: 'resistance',
  kohm: 'resistance',
  V: 'voltage',
  mV: 'voltage',
  kPa: 'pressure',
  psi: 'pressure',
  pct: 'concentration',
}

export function isMeasureUnit(unit: unknown): unit is MeasureUnit {
  return typeof unit === 'string' && Object.prototype.hasOwnProperty.call(UNIT_QUANTITY, unit)
}

/** The quantity a unit measures; throws for units we do not convert. */
export function unitQuantity(unit: string): MeasureQuantity {
  if (!isMeasureUnit(unit)) throw new RangeError(`Unknown unit "${unit}"`)
  return UNIT_QUANTITY[unit]
}

/** Display symbol ('ohm' -> 'Ω'); text we do not know (a unit 'as printed') passes through. */
export function unitSymbol(unit: string): string {
  return isMeasureUnit(unit) ? UNIT_SYMBOLS[unit] : unit
}

function unitsCheck(value: number, unit: string): MeasureUnit {
  if (!isMeasureUnit(unit)) throw new RangeError(`Unknown unit "${unit}"`)
  if (typeof value !== 'number' || Number.isNaN(value)) throw new RangeError(`Value must be a number, got ${value}`)
  const q = UNIT_QUANTITY[unit]
  // An open circuit reads OL (Infinity); nothing else is infinite at a truck.
  if (q === 'resistance') {
    if (value < 0) throw new RangeError(`Resistance cannot be negative, got ${value} ${UNIT_SYMBOLS[unit]}`)
  }
  else if (!Number.isFinite(value)) {
    throw new RangeError(`Value must be finite, got ${value}`)
  }
  return unit
}

/** Convert a value in `unit` to its quantity's base unit (°C, Ω, V, kPa, %). */
export function toBaseUnit(value: number, unit: string): number {
  const u = unitsCheck(value, unit)
  let base: number
  switch (u) {
    case 'degF':
      base = ((value - 32) * 5) / 9
      break
    case 'kohm':
      base = value * 1000
      break
    case 'mV':
      base = value / 1000
      break
    case 'psi':
      base = value * PSI_IN_KPA
      break
    default: base = value
  }
  if (UNIT_QUANTITY[u] === 'temperature' && base < -273.15) {
    throw new RangeError(`${value} ${UNIT_SYMBOLS[u]} is below absolute zero`)
  }
  return base
}

/** Convert a base-unit value (°C, Ω, V, kPa, %) to `unit`. */
export function fromBaseUnit(value: number, unit: string): number {
  const u = unitsCheck(value, unit)
  if (UNIT_QUANTITY[u] === 'temperature' && value < -273.15) throw new RangeError(`${value} °C is below absolute zero`)
  switch (u) {
    case 'degF': return (value * 9) / 5 + 32
    case 'kohm': return value / 1000
    case 'mV': return value * 1000
    case 'psi': return value / PSI_IN_KPA
    default: return value
  }
}

/** Convert between two units of the same quantity. */
export function convertUnit(value: number, from: string, to: string): number {
  if (unitQuantity(from) !== unitQuantity(to)) throw new RangeError(`Cannot convert ${from} to ${to}: different quantities`)
  return fromBaseUnit(toBaseUnit(value, from), to)
}
