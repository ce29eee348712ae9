// One run of a test card, as plain data: what was entered at each step, the verdict and why,
// where it led, and at the end the records it makes (a test run, then its readings). The phone
// keeps this in IndexedDB while the run is in progress; nothing here touches storage.
import type { CardConclusion, CardDefinition, CardStep, NumericMeasure } from '../schemas/testCards'
import { NUMERIC_MEASURES } from '../schemas/testCards'
import { cardNeedsAmbient, checkAmbient, describeCardSpec, explainVerdict, fmtValue, judgeAnswer, nextAfter } from './cardSpec'
import type { JudgeSpec } from './spec'
import { BASE_UNIT_OF, toBaseUnit, unitQuantity, type MeasureUnit } from './units'

/**
 * A meter's OL (over range, open circuit) has no number, and JSON cannot carry Infinity; a
 * reading record stores it as this many ohms, which every screen shows as OL again.
 */
export const OL_OHMS = 1e9
export const isOlOhms = (ohms: number) => ohms >= OL_OHMS

export interface RunStepResult {
  stepId: string
  title: string
  measure: CardStep['measure']
  at: string
  /** What the mechanic typed and in which unit ('OL' for an open circuit). */
  entered?: { value: number | 'OL', unit: MeasureUnit }
  /** The reading in the base unit (Ω, V, °C, kPa, %); Infinity for OL. */
  value?: number
  unit?: MeasureUnit
  answer?: string
  verdict: 'pass' | 'low' | 'high' | 'fail'
  /** Limits judged against, base unit. */
  spec?: JudgeSpec
  specText?: string
  explanation: string
  next: string
  /** The reading record made for this step, when the step measured something. */
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
  ambientC?: number
  results: RunStepResult[]
  /** The step to do next, or null once a conclusion is reached. */
  currentStepId: string | null
  conclusionId?: string
  finishedAt?: string
  /** Save progress: the run record first, then each reading, so a retry never doubles one. */
  saved: { run: boolean, readings: string[] }
}

export function startRun(input: { id: string, callId: string, card: { id: string, version: number, definition: CardDefinition }, ambientC?: number, at: string }): CardRun {
  const def = input.card.definition
  const first = def.steps[0]
  if (!first) throw new RangeError('This card has no steps')
  const run: CardRun = {
    id: input.id, callId: input.callId, cardId: input.card.id, cardVersion: input.card.version, cardTitle: def.title,
    definition: def, startedAt: input.at, results: [], currentStepId: first.id, saved: { run: false, readings: [] },
  }
  if (cardNeedsAmbient(def) || input.ambientC !== undefined) run.ambientC = checkAmbient(input.ambientC)
  return run
}

export function stepOf(run: Pick<CardRun, 'definition'>, id: string | null | undefined): CardStep | undefined {
  return id ? run.definition.steps.find(s => s.id === id) : undefined
}
export function conclusionOf(run: Pick<CardRun, 'definition'>, id: string | null | undefined): CardConclusion | undefined {
  return id ? run.definition.conclusions.find(c => c.id === id) : undefined
}
export const currentStep = (run: CardRun) => stepOf(run, run.currentStepId)

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

/**
 * Records a reading on the current step. `value` is as typed in `unit` (the mechanic's
 * preference), or 'OL' for an open circuit on a resistance step.
 */
export function recordReading(run: CardRun, input: { value: number | 'OL', unit: MeasureUnit, readingId: string, at: string, temperatureUnit?: 'degC' | 'degF' }): CardRun {
  const step = activeStep(run)
  if (!(NUMERIC_MEASURES as readonly string[]).includes(step.measure)) throw new RangeError('This step takes an answer, not a reading')
  const quantity = step.measure as NumericMeasure
  if (unitQuantity(input.unit) !== quantity) throw new RangeError(`Unit ${input.unit} does not measure ${quantity}`)
  let base: number
  if (input.value === 'OL') {
    if (quantity !== 'resistance') throw new RangeError('Only a resistance can read OL (open)')
    base = Infinity
  }
  else base = toBaseUnit(input.value, input.unit)
  const e = explainVerdict({ value: base, quantity, spec: step.spec!, ambientC: run.ambientC, unit: input.unit, temperatureUnit: input.temperatureUnit })
  return advance(run, {
    stepId: step.id, title: step.title, measure: step.measure, at: input.at,
    entered: { value: input.value, unit: input.unit }, value: base, unit: BASE_UNIT_OF[quantity],
    verdict: e.verdict, spec: e.judged, specText: e.specText, explanation: e.text,
    next: nextAfter(step, e.verdict), readingId: input.readingId,
  })
}

/** Records a yes/no or pick-one answer on the current step. */
export function recordAnswer(run: CardRun, input: { answer: string, at: string }): CardRun {
  const step = activeStep(run)
  const j = judgeAnswer(step, input.answer)
  return advance(run, {
    stepId: step.id, title: step.title, measure: step.measure, at: input.at,
    answer: input.answer, verdict: j.verdict, explanation: j.text, next: nextAfter(step, j.verdict),
  })
}

/** Takes back the last step (to measure again), as long as nothing has been saved. */
export function undoLast(run: CardRun): CardRun {
  if (run.saved.run || run.finishedAt) throw new RangeError('This run is saved to the call; start a new run to measure again')
  const last = run.results[run.results.length - 1]
  if (!last) return run
  const { conclusionId: _gone, ...rest } = run
  return { ...rest, results: run.results.slice(0, -1), currentStepId: last.stepId }
}

/** What the spec of the current step is before measuring, in the display unit. */
export function specPreview(run: CardRun, step: CardStep, unit: MeasureUnit, temperatureUnit: 'degC' | 'degF' = 'degC'): string | undefined {
  if (!step.spec) return undefined
  const { should } = describeCardSpec(step.spec, { quantity: step.measure as NumericMeasure, ambientC: run.ambientC, unit, temperatureUnit })
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

/** One reading record per measured step, linked to the run; OL is stored as OL_OHMS. */
export function runReadingRecords(run: CardRun) {
  return run.results.filter(r => r.value !== undefined && r.readingId).map((r) => {
    const step = stepOf(run, r.stepId)
    const rec: Record<string, unknown> & { callId: string, id: string } = {
      id: r.readingId!, callId: run.callId, testRunId: run.id, stepId: r.stepId, label: r.title,
      quantity: r.measure, value: r.value === Infinity ? OL_OHMS : r.value!, unit: r.unit!, spec: { ...r.spec, text: r.specText }, verdict: r.verdict,
    }
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
  catch { return `${value} ${unit}` }
}
