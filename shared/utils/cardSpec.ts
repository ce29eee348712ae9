// Turning a test-card step's spec into limits and a verdict a mechanic can check by hand.
// A sensor is judged at the temperature of the part itself (a thermometer on its housing or pipe,
// or a long-soaked engine's own reading), never the air's alone: the limits come from the sensor's
// curve (platinum RTD, or an NTC by the maker's table, Beta or Steinhart–Hart) at that temperature,
// with a tolerance in °C turned into ohms through the same curve. A sensor step whose maker's data
// is not entered yet is not judged at all. Every value is judged in the quantity's base unit
// (Ω, V, °C, kPa, %) and only converted for display.
import type { CardSpec, CardStep, NumericMeasure } from '../schemas/testCards'
import { COMPUTED_SPEC_KINDS, SENSOR_SPEC_KINDS } from '../schemas/testCards'
import { rtdResistance, rtdWindow } from './rtd'
import { ntcResistanceBeta, steinhartHartResistance, tableResistance } from './ntc'
import { describeSpec, judge, specBounds, type JudgeSpec, type JudgeVerdict } from './spec'
import { BASE_UNIT_OF, UNIT_SYMBOLS, fromBaseUnit, isMeasureUnit, unitQuantity, type MeasureUnit } from './units'

/** Temperatures a part at the roadside can have; outside this a typo (°F in a °C box) is likelier. */
export const PART_TEMP_MIN_C = -60
export const PART_TEMP_MAX_C = 900

export const MAKER_DATA_NEEDED = 'needs the maker’s data'

export interface ResolvedCardSpec {
  /** Limits in the base unit, as `judge` takes them. */
  judge: JudgeSpec
  /** For sensor specs, the sensor model in words ('a Pt200'); absent for fixed specs. */
  model?: string
  /** The part's temperature the limits were computed for. */
  partTempC?: number
  /** The sensor's own value at that temperature, for display beside the limits. */
  nominal?: number
  /** A tolerance given in °C, for display. */
  toleranceC?: number
  /** How far outside the limits a reading is only doubtful (the instrument's accuracy), base unit. */
  margin?: number
}

export function isComputedSpec(spec: CardSpec | undefined): boolean {
  return !!spec && (COMPUTED_SPEC_KINDS as readonly string[]).includes(spec.kind)
}
/** A sensor spec whose maker's data has not been entered: such a step records but never judges. */
export function needsMakerData(spec: CardSpec | undefined): boolean {
  return spec?.kind === 'needs_maker_data'
}
/** Whether a step asks for the part's temperature beside its reading. */
export function stepNeedsPartTemp(step: Pick<CardStep, 'spec'>): boolean {
  return !!step.spec && (SENSOR_SPEC_KINDS as readonly string[]).includes(step.spec.kind)
}

export function checkPartTemp(tempC: number | undefined): number {
  if (typeof tempC !== 'number' || Number.isNaN(tempC)) {
    throw new RangeError('Enter the part’s temperature: this spec is computed from it')
  }
  if (!Number.isFinite(tempC) || tempC < PART_TEMP_MIN_C || tempC > PART_TEMP_MAX_C) {
    const span = `${PART_TEMP_MIN_C}…${PART_TEMP_MAX_C} °C`
    throw new RangeError(`Part temperature ${tempC} °C is outside ${span}: check the number and its unit`)
  }
  return tempC
}

function tol(spec: { tolerance?: number, tolerancePct?: number }): Pick<JudgeSpec, 'tolerance' | 'tolerancePct'> {
  return spec.tolerancePct !== undefined ? { tolerancePct: spec.tolerancePct } : { tolerance: spec.tolerance ?? 0 }
}

const rtdName = (r0: number) => ([100, 200, 500, 1000].includes(r0) ? `a Pt${r0}` : `a platinum RTD with R0 ${fmtNumber(r0)} Ω`)
const ohmsText = (ohms: number) => (ohms >= 1000 ? `${fmtNumber(ohms / 1000)} kΩ` : `${fmtNumber(ohms)} Ω`)

type SensorSpec = Extract<CardSpec, { kind: (typeof COMPUTED_SPEC_KINDS)[number] }>

// The sensor's curve: ohms at a temperature, and its name in words.
function curveOf(spec: SensorSpec): { ohms: (tC: number) => number, model: string } {
  switch (spec.kind) {
    case 'rtd': return { ohms: t => rtdResistance(t, spec.r0), model: rtdName(spec.r0) }
    case 'ntc_table': return { ohms: t => tableResistance(t, spec.table), model: 'this NTC sensor (maker’s table)' }
    case 'ntc_beta':
      return { ohms: t => ntcResistanceBeta(t, spec.r25, spec.beta), model: `a ${ohmsText(spec.r25)} NTC (Beta ${fmtNumber(spec.beta)} K)` }
    case 'ntc_steinhart': return { ohms: t => steinhartHartResistance(t, spec.a, spec.b, spec.c), model: 'an NTC (Steinhart–Hart set)' }
  }
}

// Limits for a tolerance in °C: the curve at t − tol and t + tol (an NTC falls as it warms, an RTD rises).
function windowC(spec: SensorSpec, t: number, tolC: number): JudgeSpec {
  if (spec.kind === 'rtd') return rtdWindow(t, tolC, spec.r0)
  const { ohms } = curveOf(spec)
  try {
    const [a, b] = [ohms(t - tolC), ohms(t + tolC)]
    return { min: Math.min(a, b), max: Math.max(a, b) }
  }
  catch (err) {
    const band = `${fmtNumber(t)} °C ± ${fmtNumber(tolC)} °C`
    throw new RangeError(`${band} runs past what the sensor’s data covers: ${(err as Error).message}`)
  }
}

/** The limits a step's spec sets, computed from the sensor model at the part's temperature. */
export function resolveCardSpec(spec: CardSpec, partTempC?: number): ResolvedCardSpec {
  if (!spec || typeof spec !== 'object') throw new RangeError('Spec must be an object')
  let out: ResolvedCardSpec
  switch (spec.kind) {
    case 'range': {
      const j: JudgeSpec = {}
      if (spec.min !== undefined) j.min = spec.min
      if (spec.max !== undefined) j.max = spec.max
      out = { judge: j }
      if (spec.margin !== undefined) out.margin = spec.margin
      break
    }
    case 'nominal':
      out = { judge: { nominal: spec.nominal, ...tol(spec) } }
      break
    case 'needs_maker_data':
      throw new RangeError(`This step ${MAKER_DATA_NEEDED} for ${spec.sensor ?? 'its sensor'}: it cannot be judged yet`)
    case 'rtd':
    case 'ntc_table':
    case 'ntc_beta':
    case 'ntc_steinhart': {
      const t = checkPartTemp(partTempC)
      const { ohms, model } = curveOf(spec)
      const nominal = ohms(t)
      out = spec.toleranceC !== undefined
        ? { judge: windowC(spec, t, spec.toleranceC), model, partTempC: t, nominal, toleranceC: spec.toleranceC }
        : { judge: { nominal, ...tol(spec) }, model, partTempC: t, nominal }
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

/** A temperature difference shown in °C or °F (× 9/5, no offset). */
export function fmtTempDiff(diffC: number, unit: 'degC' | 'degF' = 'degC'): string {
  return `${fmtNumber(unit === 'degF' ? (diffC * 9) / 5 : diffC)} ${UNIT_SYMBOLS[unit]}`
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
  /** Outside the limits by no more than the spec's margin: doubtful, measure again before acting. */
  marginal: boolean
  /** The limits judged against, in the base unit. */
  judged: JudgeSpec
  /** '209.4 Ω ± 2 %' or '204.8–213.8 Ω' in the display unit. */
  specText: string
  /** '205.2–213.6 Ω': the limits themselves. */
  limitsText: string
  /** 'measured 118 Ω; a Pt200 at 12 °C should read 209.4 Ω (204.8–213.8 Ω for ± 10 °C); low' */
  text: string
}

const VERDICT_WORDS: Record<JudgeVerdict, string> = { pass: 'pass', low: 'low', high: 'high' }

interface DescribeOptions {
  quantity: NumericMeasure
  /** The part's own temperature, °C (sensor specs). */
  partTempC?: number
  unit?: MeasureUnit
  temperatureUnit?: 'degC' | 'degF'
}

/**
 * How a step's spec reads in the display unit: 'a Pt200 at 12 °C should read 209.4 Ω
 * (204.8–213.8 Ω for ± 10 °C)', 'a Pt200 at 12 °C should read 209.4 Ω ± 2 %' or 'spec 4.8–5.2 V'.
 */
export function describeCardSpec(spec: CardSpec, opts: DescribeOptions) {
  if (!(opts.quantity in BASE_UNIT_OF)) throw new RangeError(`Unknown quantity "${String(opts.quantity)}"`)
  const unit = displayUnitFor(opts.quantity, opts.unit)
  const resolved = resolveCardSpec(spec, opts.partTempC)
  if (resolved.model && opts.quantity !== 'resistance') {
    throw new RangeError('A sensor-model spec gives ohms: the reading must be a resistance')
  }
  const tUnit = opts.temperatureUnit ?? 'degC'
  const limitsText = describeSpec(specInUnit(specBounds(resolved.judge), unit), unit)
  const specText = describeSpec(specInUnit(resolved.judge, unit), unit)
  let should = `spec ${specText}`
  if (resolved.model) {
    const at = `${resolved.model} at ${fmtValue(resolved.partTempC!, tUnit)} should read`
    should = resolved.toleranceC !== undefined
      ? `${at} ${fmtValue(resolved.nominal!, unit)} (${limitsText} for ± ${fmtTempDiff(resolved.toleranceC, tUnit)})`
      : `${at} ${specText}`
  }
  return { resolved, unit, specText, limitsText, should }
}

/**
 * The verdict on one reading and how it was reached, in words a mechanic can check by hand.
 * `value` is in the quantity's base unit; `unit` is how to show numbers (the mechanic's
 * preference), `temperatureUnit` how to show the part's temperature.
 */
export function explainVerdict(input: { value: number } & DescribeOptions & { spec: CardSpec }): VerdictExplanation {
  const { value, quantity } = input
  if (typeof value !== 'number' || Number.isNaN(value)) throw new RangeError(`Reading must be a number, got ${value}`)
  if (!(quantity in BASE_UNIT_OF)) throw new RangeError(`Unknown quantity "${String(quantity)}"`)
  if (value === Infinity && quantity !== 'resistance') throw new RangeError('Only a resistance can read OL (open)')
  if (quantity === 'resistance' && value < 0) throw new RangeError(`Resistance cannot be negative, got ${value} Ω`)
  const d = describeCardSpec(input.spec, input)
  const verdict = judge(value, d.resolved.judge)
  const m = d.resolved.margin
  const marginal = verdict !== 'pass' && m !== undefined && judge(value, widen(d.resolved.judge, m)) === 'pass'
  const spread = d.unit === 'degC' || d.unit === 'degF' ? fmtTempDiff(m ?? 0, d.unit) : fmtValue(m ?? 0, d.unit)
  const doubt = marginal ? `, but within the ± ${spread} the instrument itself may be off: measure again before acting` : ''
  return {
    verdict, marginal, judged: d.resolved.judge, specText: d.specText, limitsText: d.limitsText,
    text: `measured ${fmtValue(value, d.unit)}; ${d.should}; ${VERDICT_WORDS[verdict]}${doubt}`,
  }
}

function widen(spec: JudgeSpec, margin: number): JudgeSpec {
  const { min, max } = specBounds(spec)
  const out: JudgeSpec = {}
  if (min !== undefined) out.min = min - margin
  if (max !== undefined) out.max = max + margin
  return out
}

/** What a step without the maker's data says instead of a verdict. */
export function makerDataText(spec: CardSpec | undefined): string {
  const what = spec?.kind === 'needs_maker_data' && spec.sensor ? spec.sensor : 'this sensor'
  return `not judged: this card ${MAKER_DATA_NEEDED} for ${what} (the maker’s table of resistance by temperature, or Beta and R25). `
    + 'Ask the office to enter it in the card editor'
}

/** Verdict on a yes/no or pick-one step: pass when the answer is one the card marks as passing. */
export function judgeAnswer(
  step: Pick<CardStep, 'measure' | 'passAnswer' | 'options' | 'passOptions'>, answer: string,
): { verdict: 'pass' | 'fail', text: string } {
  if (step.measure === 'yes_no') {
    if (answer !== 'yes' && answer !== 'no') throw new RangeError(`Answer yes or no, got "${answer}"`)
    const ok = answer === step.passAnswer
    return { verdict: ok ? 'pass' : 'fail', text: `answered ${answer}; passes on ${step.passAnswer}; ${ok ? 'pass' : 'fail'}` }
  }
  if (step.measure === 'choice') {
    if (!(step.options ?? []).includes(answer)) throw new RangeError(`"${answer}" is not one of this step's options`)
    const ok = (step.passOptions ?? []).includes(answer)
    return {
      verdict: ok ? 'pass' : 'fail',
      text: `picked "${answer}"; passes on ${(step.passOptions ?? []).map(o => `"${o}"`).join(' or ')}; ${ok ? 'pass' : 'fail'}`,
    }
  }
  throw new RangeError('A measured step is judged by its reading, not an answer')
}

export type StepVerdict = JudgeVerdict | 'fail' | 'unjudged'

/**
 * Where a step leads after a verdict: a routed option its own way; a marginal reading the
 * marginal way when there is one; low and high their own ways, else `fail`.
 */
export function nextAfter(
  step: Pick<CardStep, 'next'> & Partial<Pick<CardStep, 'routes'>>,
  verdict: StepVerdict,
  opts: { answer?: string, marginal?: boolean } = {},
): string {
  const routed = opts.answer === undefined ? undefined : step.routes?.find(r => r.option === opts.answer)
  if (routed) return routed.to
  if (opts.marginal && step.next.marginal && (verdict === 'low' || verdict === 'high')) return step.next.marginal
  if (verdict === 'pass') return step.next.pass
  if (verdict === 'low') return step.next.low ?? step.next.fail
  if (verdict === 'high') return step.next.high ?? step.next.fail
  if (verdict === 'unjudged') {
    if (!step.next.unjudged) throw new RangeError('This step has no way for a reading that cannot be judged')
    return step.next.unjudged
  }
  return step.next.fail
}
