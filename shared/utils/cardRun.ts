// One run of a test card, as plain data: what was entered at each step, the verdict and why,
// where it led, and at the end the records it makes (a test run, then its readings). The phone
// keeps this in IndexedDB while the run is in progress; nothing here touches storage.
import type { CardConclusion, CardDefinition, CardStep, NumericMeasure } from '../schemas/testCards'
import { NUMERIC_MEASURES } from '../schemas/testCards'
import { runCalc, type CalcInputs } from './cardCalc'
import {
  checkPartTemp, describeCardSpec, explainVerdict, fmtNumber, fmtValue, judgeAnswer, makerDataText, needsMakerData, nextAfter,
  stepNeedsPartTemp, type StepVerdict,
} from './cardSpec'
import type { JudgeSpec } from './spec'
import { BASE_UNIT_OF, toBaseUnit, unitQuantity, type MeasureUnit } from './units'

/**
 * A meter's OL (over range, open circuit) has no number, and JSON cannot carry Infinity; a
 * reading record stores it as this many ohms, which every screen shows as OL again.
 */
export const OL_OHMS = 1e9
export const isOlOhms = (ohms: number) => ohms >= OL_OHMS

type TempUnit = 'degC' | 'degF'

export interface RunStepResult {
  stepId: string
  title: string
  measure: CardStep['measure']
  at: string
  /** What the mechanic typed and in which unit ('OL' for an open circuit). */
  entered?: { value: number | 'OL', unit: MeasureUnit }
  /** The reading in the base unit (Ω, V, °C, kPa, %), Infinity for OL; or a worked-out value in `unit`. */
  value?: number
  /** A MeasureUnit for readings; the calculation's own unit ('psi/min', '%') for worked-out steps. */
  unit?: string
  /** The part's own temperature the sensor was judged at, °C, and as typed. */
  partTempC?: number
  partTempEntered?: { value: number, unit: TempUnit }
  answer?: string
  /** A worked-out step's numbers as entered. */
  inputs?: CalcInputs
  /** 'unjudged': recorded, but the card lacks the maker's data to judge it. */
  verdict: StepVerdict
  /** Outside the limits by no more than the spec's margin. */
  marginal?: boolean
  /** The answer only chose the way on (a question whose options all pass): no verdict to show. */
  question?: boolean
  /** Limits judged against, base unit. */
  spec?: JudgeSpec
  specText?: string
  explanation: string
  next: string
  /** The reading record made for this step, when the step measured or worked out something. */
  readingId?: string
}

export interface CardRun {
  id: string
  callId: string
  cardId: string
  cardVersion: number
  cardTitle: string
  definition: CardDefinition
  startedAt: string
  /** Runs saved before parts were judged at their own temperature carry the air temperature. */
  ambientC?: number
  results: RunStepResult[]
  /** The step to do next, or null once a conclusion is reached. */
  currentStepId: string | null
  conclusionId?: string
  finishedAt?: string
  /** Save progress: the run record first, then each reading, so a retry never doubles one. */
  saved: { run: boolean, readings: string[] }
}

type CardVersion = { id: string, version: number, definition: CardDefinition }

export function startRun(input: { id: string, callId: string, card: CardVersion, at: string }): CardRun {
  const def = input.card.definition
  const first = def.steps[0]
  if (!first) throw new RangeError('This card has no steps')
  const run: CardRun = {
    id: input.id, callId: input.callId, cardId: input.card.id, cardVersion: input.card.version, cardTitle: def.title,
    definition: def, startedAt: input.at, results: [], currentStepId: first.id, saved: { run: false, readings: [] },
  }
  return run
}

/** What a mechanic enters at a step: a reading (with the part's temperature on sensor steps), an answer, or a calculation's numbers. */
export type StepEntry
  = | { reading: { value: number | 'OL', unit: MeasureUnit }, partTemp?: { value: number, unit: TempUnit } }
    | { answer: string }
    | { inputs: CalcInputs }

export type StepJudgement = Omit<RunStepResult, 'stepId' | 'title' | 'measure' | 'at' | 'readingId'>

/**
 * Judges one entry against one step, the same way on the phone and on the server: a reading
 * against the step's spec (at the part's temperature for sensor steps; not judged when the
 * maker's data is missing), an answer against the passing ones, numbers through the calculation.
 */
export function judgeStep(step: CardStep, entry: StepEntry, opts: { temperatureUnit?: TempUnit } = {}): StepJudgement {
  if ('answer' in entry) {
    const j = judgeAnswer(step, entry.answer)
    const next = nextAfter(step, j.verdict, { answer: entry.answer })
    const out: StepJudgement = { answer: entry.answer, verdict: j.verdict, explanation: j.text, next }
    if (isQuestion(step)) Object.assign(out, { question: true, explanation: `answered "${entry.answer}"` })
    return out
  }
  if ('inputs' in entry) {
    if (step.measure !== 'calc' || !step.calc) throw new RangeError('This step takes a reading or an answer, not numbers to work out')
    const r = runCalc(step.calc, entry.inputs)
    const next = nextAfter(step, r.verdict)
    return { inputs: { ...entry.inputs }, value: r.value, unit: r.unit, verdict: r.verdict, explanation: r.text, next }
  }
  if (!(NUMERIC_MEASURES as readonly string[]).includes(step.measure)) throw new RangeError('This step takes an answer, not a reading')
  const quantity = step.measure as NumericMeasure
  const { value, unit } = entry.reading
  if (unitQuantity(unit) !== quantity) throw new RangeError(`Unit ${unit} does not measure ${quantity}`)
  let base: number
  if (value === 'OL') {
    if (quantity !== 'resistance') throw new RangeError('Only a resistance can read OL (open)')
    base = Infinity
  }
  else base = toBaseUnit(value, unit)
  if (quantity === 'resistance' && base < 0) throw new RangeError(`Resistance cannot be negative, got ${value}`)
  const out: StepJudgement = {
    entered: { value, unit }, value: base, unit: BASE_UNIT_OF[quantity],
    verdict: 'pass', explanation: '', next: '',
  }
  if (stepNeedsPartTemp(step)) {
    if (!entry.partTemp) throw new RangeError('Enter the part’s temperature: this spec is computed from it')
    if (unitQuantity(entry.partTemp.unit) !== 'temperature') throw new RangeError(`Unit ${entry.partTemp.unit} is not a temperature`)
    out.partTempC = checkPartTemp(toBaseUnit(entry.partTemp.value, entry.partTemp.unit))
    out.partTempEntered = { ...entry.partTemp }
  }
  if (needsMakerData(step.spec)) {
    const at = out.partTempC === undefined ? '' : ` at ${fmtValue(out.partTempC, opts.temperatureUnit ?? 'degC')}`
    const explanation = `measured ${fmtValue(base, unit)}${at}; ${makerDataText(step.spec)}`
    return { ...out, verdict: 'unjudged', explanation, next: nextAfter(step, 'unjudged') }
  }
  const { temperatureUnit } = opts
  const e = explainVerdict({ value: base, quantity, spec: step.spec!, partTempC: out.partTempC, unit, temperatureUnit })
  const next = nextAfter(step, e.verdict, { marginal: e.marginal })
  const judged: StepJudgement = { ...out, verdict: e.verdict, spec: e.judged, specText: e.specText, explanation: e.text, next }
  if (e.marginal) judged.marginal = true
  return judged
}

export function stepOf(run: Pick<CardRun, 'definition'>, id: string | null | undefined): CardStep | undefined {
  return id ? run.definition.steps.find(s => s.id === id) : undefined
}
export function conclusionOf(run: Pick<CardRun, 'definition'>, id: string | null | undefined): CardConclusion | undefined {
  return id ? run.definition.conclusions.find(c => c.id === id) : undefined
}
export const currentStep = (run: CardRun) => stepOf(run, run.currentStepId)

/** The badge a recorded step shows: its verdict, or 'answered' for a question. */
export const shownVerdict = (r: Pick<RunStepResult, 'verdict' | 'question'>) => (r.question ? 'answered' as const : r.verdict)

/** A pick-one step where every option passes only chooses the way on: its answer is no verdict. */
export function isQuestion(step: Pick<CardStep, 'measure' | 'options' | 'passOptions'> | undefined): boolean {
  return !!step && step.measure === 'choice' && (step.options ?? []).every(o => (step.passOptions ?? []).includes(o))
}

/** Where a target leads, in words: the next step's title or the conclusion's text. */
export function targetText(run: Pick<CardRun, 'definition'>, target: string): { kind: 'step' | 'conclusion', text: string } {
  const s = stepOf(run, target)
  if (s) return { kind: 'step', text: s.title }
  const c = conclusionOf(run, target)
  if (c) return { kind: 'conclusion', text: c.text }
  throw new RangeError(`"${target}" is not a step or conclusion of this card`)
}

function advance(run: CardRun, result: RunStepResult): CardRun {
  const isStep = !!stepOf(run, result.next)
  if (!isStep && !conclusionOf(run, result.next)) throw new RangeError(`Card leads to "${result.next}", which it does not have`)
  return {
    ...run,
    results: [...run.results, result],
    currentStepId: isStep ? result.next : null,
    ...(isStep ? {} : { conclusionId: result.next }),
  }
}

function activeStep(run: CardRun): CardStep {
  if (run.finishedAt) throw new RangeError('This run is finished')
  const step = currentStep(run)
  if (!step) throw new RangeError('This run has reached its conclusion')
  return step
}

function record(run: CardRun, entry: StepEntry, input: { at: string, readingId?: string, temperatureUnit?: TempUnit }): CardRun {
  const step = activeStep(run)
  const j = judgeStep(step, entry, { temperatureUnit: input.temperatureUnit })
  const result: RunStepResult = { stepId: step.id, title: step.title, measure: step.measure, at: input.at, ...j }
  if (j.value !== undefined && input.readingId) result.readingId = input.readingId
  return advance(run, result)
}

/**
 * Records a reading on the current step. `value` is as typed in `unit` (the mechanic's
 * preference), or 'OL' for an open circuit on a resistance step; sensor steps take the part's
 * own temperature as typed (°C or °F) beside it.
 */
export function recordReading(run: CardRun, input: {
  value: number | 'OL'
  unit: MeasureUnit
  readingId: string
  at: string
  temperatureUnit?: TempUnit
  partTemp?: { value: number, unit: TempUnit }
}): CardRun {
  const entry: StepEntry = { reading: { value: input.value, unit: input.unit }, ...(input.partTemp ? { partTemp: input.partTemp } : {}) }
  return record(run, entry, input)
}

/** Records a yes/no or pick-one answer on the current step. */
export function recordAnswer(run: CardRun, input: { answer: string, at: string }): CardRun {
  return record(run, { answer: input.answer }, input)
}

/** Records the numbers of a worked-out step (a leak rate, a state of charge…). */
export function recordCalc(run: CardRun, input: { inputs: CalcInputs, readingId: string, at: string }): CardRun {
  return record(run, { inputs: input.inputs }, input)
}

/** Takes back the last step (to measure again), as long as nothing has been saved. */
export function undoLast(run: CardRun): CardRun {
  if (run.saved.run || run.finishedAt) throw new RangeError('This run is saved to the call; start a new run to measure again')
  const last = run.results[run.results.length - 1]
  if (!last) return run
  const { conclusionId: _gone, ...rest } = run
  return { ...rest, results: run.results.slice(0, -1), currentStepId: last.stepId }
}

/**
 * What the spec of a step is before measuring, in the display unit. A sensor step's spec waits
 * for the part's temperature; a step without the maker's data says so.
 */
export function specPreview(step: CardStep, unit: MeasureUnit, temperatureUnit: TempUnit = 'degC', partTempC?: number): string | undefined {
  if (!step.spec) return undefined
  if (needsMakerData(step.spec)) {
    const t = makerDataText(step.spec)
    return `Reading recorded but ${t}`
  }
  if (stepNeedsPartTemp(step) && partTempC === undefined) return 'Enter the part’s temperature to see what it should read'
  const { should } = describeCardSpec(step.spec, { quantity: step.measure as NumericMeasure, partTempC, unit, temperatureUnit })
  return should.charAt(0).toUpperCase() + should.slice(1)
}

/** The test-run record for the outbox (create shape of DESIGN.md / the sync route). */
export function runRecord(run: CardRun) {
  if (!run.conclusionId) throw new RangeError('The run has not reached a conclusion yet')
  const c = conclusionOf(run, run.conclusionId)!
  const rec: Record<string, unknown> & { callId: string, id: string } = {
    id: run.id, callId: run.callId, cardId: run.cardId, cardVersion: run.cardVersion,
    steps: run.results.map(r => ({ ...r, value: r.value === Infinity ? OL_OHMS : r.value })),
    conclusion: c.text,
    finishedAt: run.finishedAt ?? new Date().toISOString(),
  }
  if (run.ambientC !== undefined) rec.ambientC = run.ambientC
  return rec
}

/**
 * One reading record per measured or worked-out step, linked to the run; OL is stored as
 * OL_OHMS, the part's temperature rides in the spec, and a reading not judged has no verdict.
 */
export function runReadingRecords(run: CardRun) {
  return run.results.filter(r => r.value !== undefined && r.readingId).map((r) => {
    const step = stepOf(run, r.stepId)
    const spec: Record<string, unknown> = { ...r.spec, text: r.specText ?? r.explanation }
    if (r.partTempC !== undefined) spec.partTempC = r.partTempC
    const rec: Record<string, unknown> & { callId: string, id: string } = {
      id: r.readingId!, callId: run.callId, testRunId: run.id, stepId: r.stepId, label: r.title,
      quantity: r.measure === 'calc' ? 'other' : r.measure, value: r.value === Infinity ? OL_OHMS : r.value!, unit: r.unit!, spec,
    }
    if (r.verdict === 'pass' || r.verdict === 'low' || r.verdict === 'high') rec.verdict = r.verdict
    if (step?.component) rec.component = step.component
    if (step?.pins) rec.pins = step.pins
    if (step?.conditions) rec.conditions = step.conditions
    if (step?.partRole) rec.partRole = step.partRole
    return rec
  })
}

/** A reading's value for display, OL included. */
export function readingText(value: number, unit: string): string {
  const u = unit as MeasureUnit
  if (u === 'ohm' && isOlOhms(value)) return 'OL (open)'
  try { return fmtValue(value, u) }
  catch { return `${fmtNumber(value)} ${unit}` }
}
