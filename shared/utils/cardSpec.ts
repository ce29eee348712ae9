// Turning a test-card step's spec into limits and a verdict a mechanic can check by hand.
// Computed specs take the ambient temperature the mechanic entered and a sensor model
// (platinum RTD or NTC thermistor); every value is judged in the quantity's base unit
// (Ω, V, °C, kPa, %) and only converted for display.
import type { CardSpec, CardStep, NumericMeasure } from '../schemas/testCards'
import { rtdResistance } from './rtd'
import { ntcResistanceBeta, steinhartHartResistance } from './ntc'
import { describeSpec, judge, specBounds, type JudgeSpec, type JudgeVerdict } from './spec'
import { BASE_UNIT_OF, UNIT_SYMBOLS, fromBaseUnit, isMeasureUnit, unitQuantity, type MeasureUnit } from './units'

/** Ambient temperatures a roadside can have; outside this a typo (°F in a °C box) is likelier. */
export const AMBIENT_MIN_C = -60
export const AMBIENT_MAX_C = 70

export interface ResolvedCardSpec {
  /** Limits in the base unit, as `judge` takes them. */
  judge: JudgeSpec
  /** For computed specs, the sensor model in words ('a Pt200'); absent for fixed specs. */
  model?: string
  ambientC?: number
}

export function isComputedSpec(spec: CardSpec | undefined): boolean {
  return !!spec && (spec.kind === 'rtd' || spec.kind === 'ntc_beta' || spec.kind === 'ntc_steinhart')
}

/** Whether running this card asks for the ambient temperature first. */
export function cardNeedsAmbient(card: { steps: { spec?: CardSpec }[] }): boolean {
  return card.steps.some(s => isComputedSpec(s.spec))
}

export function checkAmbient(ambientC: number | undefined): number {
  if (typeof ambientC !== 'number' || Number.isNaN(ambientC)) throw new RangeError('Enter the ambient temperature: this spec is computed from it')
  if (!Number.isFinite(ambientC) || ambientC < AMBIENT_MIN_C || ambientC > AMBIENT_MAX_C) {
    throw new RangeError(`Ambient temperature ${ambientC} °C is outside ${AMBIENT_MIN_C}…${AMBIENT_MAX_C} °C: check the number and its unit`)
  }
  return ambientC
}

function tol(spec: { tolerance?: number, tolerancePct?: number }): Pick<JudgeSpec, 'tolerance' | 'tolerancePct'> {
  return spec.tolerancePct !== undefined ? { tolerancePct: spec.tolerancePct } : { tolerance: spec.tolerance ?? 0 }
}

const rtdName = (r0: number) => ([100, 200, 500, 1000].includes(r0) ? `a Pt${r0}` : `a platinum RTD with R0 ${fmtNumber(r0)} Ω`)
const ohmsText = (ohms: number) => (ohms >= 1000 ? `${fmtNumber(ohms / 1000)} kΩ` : `${fmtNumber(ohms)} Ω`)

/** The limits a step's spec sets, computing the nominal from the sensor model at ambient. */
export function resolveCardSpec(spec: CardSpec, ambientC?: number): ResolvedCardSpec {
  if (!spec || typeof spec !== 'object') throw new RangeError('Spec must be an object')
  let out: ResolvedCardSpec
  switch (spec.kind) {
    case 'range': {
      const j: JudgeSpec = {}
      if (spec.min !== undefined) j.min = spec.min
      if (spec.max !== undefined) j.max = spec.max
      out = { judge: j }
      break
    }
    case 'nominal':
      out = { judge: { nominal: spec.nominal, ...tol(spec) } }
      break
    case 'rtd': {
      const t = checkAmbient(ambientC)
      out = { judge: { nominal: rtdResistance(t, spec.r0), ...tol(spec) }, model: rtdName(spec.r0), ambientC: t }
      break
    }
    case 'ntc_beta': {
      const t = checkAmbient(ambientC)
      out = { judge: { nominal: ntcResistanceBeta(t, spec.r25, spec.beta), ...tol(spec) }, model: `a ${ohmsText(spec.r25)} NTC (Beta ${fmtNumber(spec.beta)} K)`, ambientC: t }
      break
    }
    case 'ntc_steinhart': {
      const t = checkAmbient(ambientC)
      out = { judge: { nominal: steinhartHartResistance(t, spec.a, spec.b, spec.c), ...tol(spec) }, model: 'an NTC (Steinhart–Hart set)', ambientC: t }
      break
    }
    default:
      throw new RangeError(`Unknown spec kind "${(spec as { kind?: unknown }).kind}"`)
  }
  specBounds(out.judge) // same checks as judging: a spec we cannot judge is refused here
  return out
}

/** A number as a meter shows it: four significant digits, whole numbers from 10 000 up, OL for open. */
export function fmtNumber(n: number): string {
  if (n === Infinity) return 'OL'
  if (!Number.isFinite(n)) return String(n)
  if (Math.abs(n) >= 10_000) return String(Math.round(n))
  return String(Number(n.toPrecision(4)))
}

/** A base-unit value shown in `unit`, e.g. fmtValue(118, 'ohm') -> '118 Ω', fmtValue(Infinity, 'ohm') -> 'OL (open)'. */
export function fmtValue(value: number, unit: MeasureUnit): string {
  if (value === Infinity) return 'OL (open)'
  return `${fmtNumber(fromBaseUnit(value, unit))} ${UNIT_SYMBOLS[unit]}`
}

/** A spec's limits converted to `unit`; tolerances are differences, so °F scales them without the offset. */
export function specInUnit(spec: JudgeSpec, unit: MeasureUnit): JudgeSpec {
  const abs = (v: number) => Number(fmtNumber(fromBaseUnit(v, unit)))
  const diff = (v: number) => Number(fmtNumber(unit === 'degF' ? (v * 9) / 5 : fromBaseUnit(v, unit)))
  const out: JudgeSpec = {}
  if (spec.min !== undefined) out.min = abs(spec.min)
  if (spec.max !== undefined) out.max = abs(spec.max)
  if (spec.nominal !== undefined) out.nominal = abs(spec.nominal)
  if (spec.tolerance !== undefined) out.tolerance = diff(spec.tolerance)
  if (spec.tolerancePct !== undefined) out.tolerancePct = spec.tolerancePct
  return out
}

function displayUnitFor(quantity: NumericMeasure, unit: string | undefined): MeasureUnit {
  const base = BASE_UNIT_OF[quantity]
  if (unit === undefined) return base
  if (!isMeasureUnit(unit) || unitQuantity(unit) !== quantity) throw new RangeError(`Unit "${unit}" does not measure ${quantity}`)
  return unit
}

export interface VerdictExplanation {
  verdict: JudgeVerdict
  /** The limits judged against, in the base unit. */
  judged: JudgeSpec
  /** '209.4 Ω ± 2 %' in the display unit. */
  specText: string
  /** '205.2–213.6 Ω': the limits themselves. */
  limitsText: string
  /** 'measured 118 Ω; a Pt200 at 12 °C should read 209.4 Ω ± 2 %; low' */
  text: string
}

const VERDICT_WORDS: Record<JudgeVerdict, string> = { pass: 'pass', low: 'low', high: 'high' }

/** How a step's spec reads in the display unit: 'a Pt200 at 12 °C should read 209.4 Ω ± 2 %' or 'spec 4.8–5.2 V'. */
export function describeCardSpec(spec: CardSpec, opts: { quantity: NumericMeasure, ambientC?: number, unit?: MeasureUnit, temperatureUnit?: 'degC' | 'degF' }) {
  if (!(opts.quantity in BASE_UNIT_OF)) throw new RangeError(`Unknown quantity "${String(opts.quantity)}"`)
  const unit = displayUnitFor(opts.quantity, opts.unit)
  const resolved = resolveCardSpec(spec, opts.ambientC)
  if (resolved.model && opts.quantity !== 'resistance') throw new RangeError('A sensor-model spec gives ohms: the reading must be a resistance')
  const specText = describeSpec(specInUnit(resolved.judge, unit), unit)
  const limitsText = describeSpec(specInUnit(specBounds(resolved.judge), unit), unit)
  const should = resolved.model
    ? `${resolved.model} at ${fmtValue(resolved.ambientC!, opts.temperatureUnit ?? 'degC')} should read ${specText}`
    : `spec ${specText}`
  return { resolved, unit, specText, limitsText, should }
}

/**
 * The verdict on one reading and how it was reached, in words a mechanic can check by hand.
 * `value` is in the quantity's base unit; `unit` is how to show numbers (the mechanic's
 * preference), `temperatureUnit` how to show the ambient temperature.
 */
export function explainVerdict(input: {
  value: number
  quantity: NumericMeasure
  spec: CardSpec
  ambientC?: number
  unit?: MeasureUnit
  temperatureUnit?: 'degC' | 'degF'
}): VerdictExplanation {
  const { value, quantity } = input
  if (typeof value !== 'number' || Number.isNaN(value)) throw new RangeError(`Reading must be a number, got ${value}`)
  if (!(quantity in BASE_UNIT_OF)) throw new RangeError(`Unknown quantity "${String(quantity)}"`)
  if (value === Infinity && quantity !== 'resistance') throw new RangeError('Only a resistance can read OL (open)')
  if (quantity === 'resistance' && value < 0) throw new RangeError(`Resistance cannot be negative, got ${value} Ω`)
  const d = describeCardSpec(input.spec, input)
  const verdict = judge(value, d.resolved.judge)
  return {
    verdict, judged: d.resolved.judge, specText: d.specText, limitsText: d.limitsText,
    text: `measured ${fmtValue(value, d.unit)}; ${d.should}; ${VERDICT_WORDS[verdict]}`,
  }
}

/** Verdict on a yes/no or pick-one step: pass when the answer is one the card marks as passing. */
export function judgeAnswer(step: Pick<CardStep, 'measure' | 'passAnswer' | 'options' | 'passOptions'>, answer: string): { verdict: 'pass' | 'fail', text: string } {
  if (step.measure === 'yes_no') {
    if (answer !== 'yes' && answer !== 'no') throw new RangeError(`Answer yes or no, got "${answer}"`)
    const ok = answer === step.passAnswer
    return { verdict: ok ? 'pass' : 'fail', text: `answered ${answer}; passes on ${step.passAnswer}; ${ok ? 'pass' : 'fail'}` }
  }
  if (step.measure === 'choice') {
    if (!(step.options ?? []).includes(answer)) throw new RangeError(`"${answer}" is not one of this step's options`)
    const ok = (step.passOptions ?? []).includes(answer)
    return { verdict: ok ? 'pass' : 'fail', text: `picked "${answer}"; passes on ${(step.passOptions ?? []).map(o => `"${o}"`).join(' or ')}; ${ok ? 'pass' : 'fail'}` }
  }
  throw new RangeError('A measured step is judged by its reading, not an answer')
}

/** Where a step leads after a verdict: low and high may have their own ways, else `fail`. */
export function nextAfter(step: Pick<CardStep, 'next'>, verdict: JudgeVerdict | 'fail'): string {
  if (verdict === 'pass') return step.next.pass
  if (verdict === 'low') return step.next.low ?? step.next.fail
  if (verdict === 'high') return step.next.high ?? step.next.fail
  return step.next.fail
}
