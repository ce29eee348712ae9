// Readings as people write them, for every screen and document that shows one: unit symbols
// after a space ("209.4 Ω", "12 °C", "2 %", the SI Brochure's spacing), four significant figures
// as a meter shows them, resistance auto-ranged like a meter (Ω, kΩ, MΩ), ranges with an en dash
// ("205.2–213.6 Ω"), conditions in words ("key on, engine off") and OL as "OL (open)".
import { CONDITION_LABELS, type CardCondition } from '../schemas/testCards'
import { isOlOhms } from './cardRun'
import { unitSymbol } from './units'

/** Between a number and its unit: a space that never breaks the line (SI Brochure 5.4.3). */
export const UNIT_SPACE = '\u00A0'
export const OPEN_CIRCUIT_TEXT = 'OL (open)'

export const VERDICT_TEXT: Readonly<Record<string, string>> = { pass: 'In spec', low: 'Low', high: 'High', fail: 'Fail' }

const finiteOrThrow = (n: number, what: string) => {
  if (typeof n !== 'number' || !Number.isFinite(n)) throw new RangeError(`${what} must be a finite number, got ${n}`)
  return n
}

/**
 * A number as a meter shows it: four significant figures, no float noise, no trailing zeros;
 * from 10 000 up a whole number with its digits in groups of three (SI Brochure 5.4.4).
 */
export function formatNumber(n: number): string {
  finiteOrThrow(n, 'A number')
  if (Math.abs(n) >= 10_000) {
    const whole = String(Math.round(Math.abs(n))).replace(/\B(?=(\d{3})+(?!\d))/g, UNIT_SPACE)
    return n < 0 ? `-${whole}` : whole
  }
  // Nudged so a decimal tie stored a hair low in binary (10.475) rounds as written, up.
  const s = String(Number((n * (1 + 1e-12)).toPrecision(4)))
  return s === '-0' ? '0' : s
}

/** 'degC' → '°C', 'ohm' → 'Ω', 'pct' → '%'; a unit we do not know ('as printed') passes through. */
export function formatUnit(unit: string | null | undefined): string {
  return unit ? unitSymbol(unit) : ''
}

const RESISTANCE_TO_OHMS: Readonly<Record<string, number>> = { ohm: 1, kohm: 1000 }

/** A resistance moved to the range a meter would pick for `magnitude` ohms. */
function ohmRange(magnitude: number): { factor: number, symbol: string } {
  if (magnitude >= 1e6) return { factor: 1e6, symbol: 'MΩ' }
  if (magnitude >= 1000) return { factor: 1000, symbol: 'kΩ' }
  return { factor: 1, symbol: 'Ω' }
}

/** How values in `unit` are shown together: a converter for each number and the symbol after them. */
function displayScale(values: number[], unit: string): { show: (v: number) => number, symbol: string } {
  const toOhms = RESISTANCE_TO_OHMS[unit]
  if (toOhms === undefined) return { show: v => v, symbol: formatUnit(unit) }
  const { factor, symbol } = ohmRange(Math.max(...values.map(v => Math.abs(v * toOhms))))
  return { show: v => (v * toOhms) / factor, symbol }
}

const withUnit = (text: string, symbol: string) => (symbol ? `${text}${UNIT_SPACE}${symbol}` : text)

/** One value with its unit: '209.4 Ω', '12.65 V', '10.48 kΩ', '-40 °C'; an open circuit 'OL (open)'. */
export function formatQuantity(value: number, unit: string): string {
  if (typeof value !== 'number' || Number.isNaN(value)) throw new RangeError(`A reading must be a number, got ${value}`)
  const ohms = RESISTANCE_TO_OHMS[unit]
  if (ohms !== undefined && (value === Infinity || isOlOhms(value * ohms))) return OPEN_CIRCUIT_TEXT
  finiteOrThrow(value, 'A reading')
  const { show, symbol } = displayScale([value], unit)
  return withUnit(formatNumber(show(value)), symbol)
}

/**
 * Limits as a range: '205.2–213.6 Ω' (en dash, the unit once); with a negative end the dash would
 * read as a minus sign, so '-40 to -20 °C'. One side only: '≥ 12.4 V', '≤ 0.5 V'.
 */
export function formatRange(min: number | null | undefined, max: number | null | undefined, unit: string): string {
  const lo = min ?? undefined
  const hi = max ?? undefined
  if (lo === undefined && hi === undefined) throw new RangeError('A range needs a low or a high limit')
  const ends = [lo, hi].filter((v): v is number => v !== undefined).map(v => finiteOrThrow(v, 'A limit'))
  const { show, symbol } = displayScale(ends, unit)
  if (lo !== undefined && hi !== undefined) {
    const sep = lo < 0 || hi < 0 ? ' to ' : '–'
    return withUnit(`${formatNumber(show(lo))}${sep}${formatNumber(show(hi))}`, symbol)
  }
  return `${lo !== undefined ? '≥' : '≤'} ${withUnit(formatNumber(show(ends[0]!)), symbol)}`
}

export interface StoredSpec {
  min?: number | null
  max?: number | null
  nominal?: number | null
  tolerance?: number | null
  tolerancePct?: number | null
  text?: unknown
}

/** The limits a spec sets; every stated limit applies (as `judge` reads a spec). */
function specLimits(spec: StoredSpec): { min?: number, max?: number } {
  const out: { min?: number, max?: number } = {}
  const tighten = (lo: number, hi: number) => {
    out.min = out.min === undefined ? lo : Math.max(out.min, lo)
    out.max = out.max === undefined ? hi : Math.min(out.max, hi)
  }
  if (spec.min != null) out.min = spec.min
  if (spec.max != null) out.max = spec.max
  if (spec.nominal != null && spec.tolerance != null) tighten(spec.nominal - spec.tolerance, spec.nominal + spec.tolerance)
  if (spec.nominal != null && spec.tolerancePct != null) {
    const d = (Math.abs(spec.nominal) * spec.tolerancePct) / 100
    tighten(spec.nominal - d, spec.nominal + d)
  }
  return out
}

/**
 * A spec as people write it: '209.4 Ω ± 2 % (205.2–213.6 Ω)', '5 V ± 0.2 V (4.8–5.2 V)', '4.8–5.2 V',
 * '≥ 12.4 V'. Undefined when the spec states no limit.
 */
export function formatSpec(spec: StoredSpec | null | undefined, unit: string): string | undefined {
  if (!spec || typeof spec !== 'object') return undefined
  const { min, max } = specLimits(spec)
  if (min === undefined && max === undefined) return undefined
  const limits = formatRange(min, max, unit)
  const nominal = spec.nominal ?? undefined
  if (nominal === undefined) return limits
  // The nominal and a tolerance share the range of the limits; a tolerance is a difference, only scaled.
  const { show, symbol } = displayScale([nominal, ...[min, max].filter((v): v is number => v !== undefined)], unit)
  const nom = withUnit(formatNumber(show(nominal)), symbol)
  if (spec.tolerancePct != null) return `${nom} ± ${formatNumber(spec.tolerancePct)}${UNIT_SPACE}% (${limits})`
  if (spec.tolerance != null) return `${nom} ± ${withUnit(formatNumber(show(spec.tolerance)), symbol)} (${limits})`
  return limits
}

/** 'key_on_engine_off' → 'key on, engine off'; words typed on the phone pass through as typed. */
export function formatConditions(conditions: string | null | undefined): string {
  const c = (conditions ?? '').trim()
  if (!c) return ''
  const label = (CONDITION_LABELS as Record<string, string>)[c as CardCondition]
  if (label) return label.charAt(0).toLowerCase() + label.slice(1)
  // An unknown key written the way the code stores them: show its words.
  return /^[a-z]+(?:_[a-z]+)+$/.test(c) ? c.replace(/_/g, ' ') : c
}

export interface ReadingLike {
  label?: string | null
  value: number
  unit: string
  component?: string | null
  pins?: string | null
  conditions?: string | null
  spec?: StoredSpec | null
  verdict?: string | null
  partRole?: string | null
}

export interface ReadingParts {
  value: string
  where: string
  conditions: string
  spec?: string
  /** The words saved with the spec when they say more than its numbers ('within 5 °C of the median of 4 like sensors'). */
  specNote?: string
  verdict?: string
}

/** Every piece of a reading, formatted: for the phone's list, the office's table, the service report. */
export function formatReading(r: ReadingLike): ReadingParts {
  let value: string
  try {
    value = formatQuantity(r.value, r.unit)
  }
  catch {
    value = `${String(r.value)} ${formatUnit(r.unit)}`.trim()
  }
  let spec: string | undefined
  try {
    spec = formatSpec(r.spec, r.unit)
  }
  catch {
    spec = undefined
  }
  const note = typeof r.spec?.text === 'string' ? r.spec.text.trim() : ''
  const parts: ReadingParts = {
    value,
    where: [r.component, r.pins && `pins ${r.pins}`].filter(Boolean).join(', '),
    conditions: formatConditions(r.conditions),
  }
  if (spec) parts.spec = spec
  // Saved words that only repeat the numbers add nothing; words that explain them do.
  if (/\p{L}{3,}/u.test(note.replace(/\b(?:kPa|psi|mV|Pt\d+)\b/g, ''))) parts.specNote = note
  if (r.verdict) parts.verdict = VERDICT_TEXT[r.verdict] ?? r.verdict
  return parts
}
