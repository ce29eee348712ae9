// Judging a reading against a spec. A spec states limits one of three ways (min/max,
// nominal ± absolute tolerance, nominal ± percent); when a spec states more than one,
// every stated limit applies, so the tightest wins.

import { unitSymbol } from './units'

export interface JudgeSpec {
  min?: number
  max?: number
  nominal?: number
  tolerance?: number
  tolerancePct?: number
}

export type JudgeVerdict = 'pass' | 'low' | 'high'

function specNum(name: string, v: number | undefined): v is number {
  if (v === undefined || v === null) return false
  if (typeof v !== 'number' || Number.isNaN(v)) throw new RangeError(`Spec ${name} must be a number, got ${v}`)
  if (!Number.isFinite(v)) throw new RangeError(`Spec ${name} must be finite, got ${v}`)
  return true
}

/** The lower and upper limits a spec allows (inclusive); either may be absent for a one-sided spec. */
export function specBounds(spec: JudgeSpec): { min?: number, max?: number } {
  if (!spec || typeof spec !== 'object') throw new RangeError('Spec must be an object')
  const { min, max, nominal, tolerance, tolerancePct } = spec
  const hasMin = specNum('min', min)
  const hasMax = specNum('max', max)
  const hasNom = specNum('nominal', nominal)
  const hasTol = specNum('tolerance', tolerance)
  const hasPct = specNum('tolerancePct', tolerancePct)
  if ((hasTol || hasPct) && !hasNom) throw new RangeError('Spec gives a tolerance but no nominal value')
  if (hasTol && tolerance < 0) throw new RangeError(`Spec tolerance cannot be negative, got ${tolerance}`)
  if (hasPct && tolerancePct < 0) throw new RangeError(`Spec tolerance percent cannot be negative, got ${tolerancePct}`)

  let lo: number | undefined = hasMin ? min : undefined
  let hi: number | undefined = hasMax ? max : undefined
  const tighten = (l: number, h: number) => {
    lo = lo === undefined ? l : Math.max(lo, l)
    hi = hi === undefined ? h : Math.min(hi, h)
  }
  if (hasNom && hasTol) tighten(nominal - tolerance, nominal + tolerance)
  if (hasNom && hasPct) {
    const d = (Math.abs(nominal) * tolerancePct) / 100
    tighten(nominal - d, nominal + d)
  }
  if (lo === undefined && hi === undefined) {
    throw new RangeError('Spec has nothing to judge against: give min and/or max, or nominal with a tolerance')
  }
  if (lo !== undefined && hi !== undefined && lo > hi) throw new RangeError(`Spec limits cross: low limit ${lo} is above high limit ${hi}`)
  const out: { min?: number, max?: number } = {}
  if (lo !== undefined) out.min = lo
  if (hi !== undefined) out.max = hi
  return out
}

// A reading typed exactly at a printed limit must pass even though 209.4 × 1.02 is not exact in binary.
const specSlack = (bound: number) => 1e-9 * Math.max(1, Math.abs(bound))

/** 'pass' inside the limits (limits included), else which side it fell out on. */
export function judge(value: number, spec: JudgeSpec): JudgeVerdict {
  if (typeof value !== 'number' || Number.isNaN(value)) throw new RangeError(`Reading must be a number, got ${value}`)
  const { min, max } = specBounds(spec)
  if (min !== undefined && value < min - specSlack(min)) return 'low'
  if (max !== undefined && value > max + specSlack(max)) return 'high'
  return 'pass'
}

// Trim float noise for display (0.30000000000000004 -> 0.3) without fixing a decimal count.
const specFmt = (n: number) => String(Number(n.toPrecision(10)))

/** Human text for a spec, e.g. '209.4 Ω ± 2 %', '5 ± 0.2 V', '4.8–5.2 V', '≥ 12.4 V'. */
export function describeSpec(spec: JudgeSpec, unit = ''): string {
  specBounds(spec) // same validation as judging, so we never describe a spec we cannot judge
  const sym = unitSymbol(unit)
  const withUnit = (s: string) => (sym ? `${s} ${sym}` : s)
  const parts: string[] = []
  const { min, max, nominal, tolerance, tolerancePct } = spec
  if (nominal !== undefined && tolerancePct !== undefined) parts.push(`${withUnit(specFmt(nominal))} ± ${specFmt(tolerancePct)} %`)
  if (nominal !== undefined && tolerance !== undefined) parts.push(withUnit(`${specFmt(nominal)} ± ${specFmt(tolerance)}`))
  if (min !== undefined && max !== undefined) {
    // An en dash between negatives ('-40–-20') misreads; use words then.
    const sep = min < 0 || max < 0 ? ' to ' : '–'
    parts.push(withUnit(`${specFmt(min)}${sep}${specFmt(max)}`))
  }
  else if (min !== undefined) parts.push(withUnit(`≥ ${specFmt(min)}`))
  else if (max !== undefined) parts.push(withUnit(`≤ ${specFmt(max)}`))
  return parts.join(', ')
}
