// A test card is data: this one schema says what a valid card is, for the admin form, the
// routes and the seed alike. Beyond the shape it checks the card's graph (cardGraph.ts): every
// `next` names a step or a conclusion, every step can be reached and can still reach a
// conclusion, no path condemns a part its own measurement did not fail, and no path blames the
// controller before every wire test has passed.
import { z } from 'zod'
import { CARD_KINDS, normalizeCodePattern, patternProblemForKind, parseFaultCodeText, type FaultCodeRef } from '../utils/faultMatch'
import { checkCardGraph } from './cardGraph'
import { cleanText } from './text'

export const NUMERIC_MEASURES = ['resistance', 'voltage', 'temperature', 'pressure', 'concentration'] as const
export const ANSWER_MEASURES = ['yes_no', 'choice'] as const
export const CARD_MEASURES = [...NUMERIC_MEASURES, ...ANSWER_MEASURES, 'calc'] as const
export const CARD_CONDITIONS = ['key_off', 'key_on_engine_off', 'cranking', 'running'] as const
export const SPEC_KINDS = ['range', 'nominal', 'rtd', 'ntc_table', 'ntc_beta', 'ntc_steinhart', 'needs_maker_data'] as const
/** Specs computed from a sensor model at the part's temperature (they give ohms). */
export const COMPUTED_SPEC_KINDS = ['rtd', 'ntc_table', 'ntc_beta', 'ntc_steinhart'] as const
/** Specs of a sensor step: the computed ones, and the one that waits for the maker's data. */
export const SENSOR_SPEC_KINDS = [...COMPUTED_SPEC_KINDS, 'needs_maker_data'] as const
export const CONCLUSION_KINDS = ['fault', 'ok', 'refer'] as const
export const CALC_FNS = ['air_leak', 'battery_soc', 'battery_load', 'system_volts', 'cable_drop', 'tread_depth', 'inflation'] as const
/**
 * Where a step leads: pass and fail always; low and high (measured and worked-out steps),
 * marginal (a reading just outside a spec with a margin) and unjudged (sensor steps) when given.
 */
export const STEP_WAYS = ['pass', 'fail', 'low', 'high', 'marginal', 'unjudged'] as const
/** Part ids with a meaning of their own in the graph rules. */
export const WIRING = 'wiring'
export const CONTROLLER = 'controller'
export { CARD_KINDS }

export type CardMeasure = (typeof CARD_MEASURES)[number]
export type NumericMeasure = (typeof NUMERIC_MEASURES)[number]
export type CardCondition = (typeof CARD_CONDITIONS)[number]
export type SpecKind = (typeof SPEC_KINDS)[number]
export type CalcFn = (typeof CALC_FNS)[number]
export type StepWay = (typeof STEP_WAYS)[number]
export type CardKind = (typeof CARD_KINDS)[number]

export const MEASURE_LABELS: Record<CardMeasure, string> = {
  resistance: 'Resistance', voltage: 'Voltage', temperature: 'Temperature', pressure: 'Pressure',
  concentration: 'Concentration', yes_no: 'Yes or no', choice: 'Pick one', calc: 'Worked out from several numbers',
}
export const CONDITION_LABELS: Record<CardCondition, string> = {
  key_off: 'Key off', key_on_engine_off: 'Key on, engine off', cranking: 'Cranking', running: 'Engine running',
}
export const SPEC_KIND_LABELS: Record<SpecKind, string> = {
  range: 'Fixed range (min–max)',
  nominal: 'Nominal ± tolerance',
  rtd: 'Platinum RTD at the part’s temperature (IEC 60751)',
  ntc_table: 'NTC thermistor: the maker’s table at the part’s temperature',
  ntc_beta: 'NTC thermistor: Beta and R25 at the part’s temperature',
  ntc_steinhart: 'NTC thermistor: Steinhart–Hart set at the part’s temperature',
  needs_maker_data: 'Maker’s data not entered yet (the step is not judged)',
}
export const CARD_KIND_LABELS: Record<CardKind, string> = {
  sensor_circuit: 'A sensor and its circuit (circuit and signal FMIs only)',
  condition: 'A real condition the sensor reports (data-valid FMIs only)',
  system: 'A system or part check',
}
export const CALC_LABELS: Record<CalcFn, string> = {
  air_leak: 'Air-brake leak rate (psi per minute)',
  battery_soc: 'Battery state of charge from resting voltage',
  battery_load: 'Battery load test at its temperature',
  system_volts: 'Voltage on a 12 V or 24 V system',
  cable_drop: 'Cranking cable voltage drop (both sides)',
  tread_depth: 'Tire tread depth (49 CFR 393.75)',
  inflation: 'Tire pressure against its cold inflation pressure',
}

const issue = (ctx: z.RefinementCtx, path: (string | number)[], message: string) => ctx.addIssue({ code: 'custom', path, message })
const num = (what: string) => z.number({ message: `${what} must be a number` }).finite(`${what} must be a finite number`)
const positive = (what: string) => num(what).positive(`${what} must be more than 0`)
const idText = z.string({ message: 'Give an id' }).trim()
  .regex(/^[a-z][a-z0-9_-]{0,39}$/, 'Use lower-case letters, digits, - or _, starting with a letter (at most 40)')
const text = (what: string, max: number) =>
  cleanText(what, { multiline: true, missing: `Enter ${what}` }).min(1, `Enter ${what}`).max(max, `Keep ${what} under ${max} characters`)
const optText = (max: number) => cleanText('This', { multiline: true }).max(max, `Keep it under ${max} characters`).optional()

// Fixed specs take one tolerance in the base unit or in percent; sensor models may also take it
// in °C, turned into ohms through the sensor's own curve at the part's temperature.
const tolerance = {
  tolerance: num('Tolerance').nonnegative('Tolerance cannot be negative').optional(),
  tolerancePct: num('Tolerance %').nonnegative('Tolerance % cannot be negative').max(100, 'Tolerance % must be 100 or less').optional(),
}
const sensorTolerance = {
  ...tolerance,
  toleranceC: num('Tolerance °C').positive('Tolerance °C must be more than 0').max(100, 'Tolerance °C must be 100 or less').optional(),
}
type Tol = { tolerance?: number, tolerancePct?: number, toleranceC?: number }
function oneTolerance(s: Tol, ctx: z.RefinementCtx) {
  const given = [s.tolerance, s.tolerancePct, s.toleranceC].filter(v => v !== undefined).length
  if (given !== 1) {
    const which = 'toleranceC' in s ? 'a tolerance in °C, in ohms or in %' : 'a tolerance or a tolerance %'
    issue(ctx, ['tolerance'], `Give one of ${which}, not ${given ? 'several' : 'none'}`)
  }
}

// A maker's NTC table: rows from cold to hot, each [°C, Ω]; an NTC's resistance falls as it warms.
const tableRow = z.tuple(
  [num('Temperature (°C)').min(-273, 'Below absolute zero'), positive('Resistance (Ω)')],
  { message: 'Each row is a temperature and a resistance' },
)
const ntcTable = z.array(tableRow, { message: 'Enter the maker’s table' })
  .min(2, 'Give at least 2 rows of the maker’s table').max(80, 'At most 80 rows')
  .superRefine((rows, ctx) => {
    rows.forEach(([t, ohm], i) => {
      const prev = rows[i - 1]
      if (!prev) return
      if (t <= prev[0]) issue(ctx, [i], `Rows go from cold to hot: ${t} °C comes after ${prev[0]} °C`)
      else if (ohm >= prev[1]) issue(ctx, [i], `An NTC reads less as it warms: ${ohm} Ω at ${t} °C is not below ${prev[1]} Ω`)
    })
  })

export const cardSpecSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('range'), min: num('Min').optional(), max: num('Max').optional(),
    /** How far outside the limits a reading is only doubtful (the instrument's own accuracy): it takes the marginal way. */
    margin: num('Margin').positive('Margin must be more than 0').optional(),
  }).superRefine((s, ctx) => {
    if (s.min === undefined && s.max === undefined) issue(ctx, ['min'], 'Give a min, a max or both')
    if (s.min !== undefined && s.max !== undefined && s.min > s.max) issue(ctx, ['max'], 'Max must not be below min')
  }),
  z.object({ kind: z.literal('nominal'), nominal: num('Nominal'), ...tolerance }).superRefine(oneTolerance),
  z.object({
    kind: z.literal('rtd'), r0: positive('R0 (ohms at 0 °C)').max(10_000, 'R0 above 10 000 Ω is not a platinum RTD'), ...sensorTolerance,
  }).superRefine(oneTolerance),
  z.object({ kind: z.literal('ntc_table'), table: ntcTable, source: optText(200), ...sensorTolerance }).superRefine(oneTolerance),
  z.object({
    kind: z.literal('ntc_beta'), r25: positive('R25 (ohms at 25 °C)'),
    beta: positive('Beta (K)').min(500, 'Beta is usually 2000–6000 K').max(10_000, 'Beta is usually 2000–6000 K'), ...sensorTolerance,
  }).superRefine(oneTolerance),
  z.object({
    kind: z.literal('ntc_steinhart'), a: num('A'), b: positive('B'), c: num('C').nonnegative('C cannot be negative for an NTC'),
    ...sensorTolerance,
  }).superRefine(oneTolerance),
  z.object({ kind: z.literal('needs_maker_data'), sensor: optText(120) }),
], { message: 'Pick a spec kind' })
export type CardSpec = z.infer<typeof cardSpecSchema>

const systemVolts = z.union([z.literal(12), z.literal(24)], { message: 'System voltage is 12 or 24' })
export const cardCalcSchema = z.discriminatedUnion('fn', [
  z.object({ fn: z.literal('air_leak'), brakes: z.enum(['released', 'applied'], { message: 'Pick brakes released or applied' }) }),
  z.object({
    fn: z.literal('battery_soc'), systemVolts, minPct: num('Least state of charge').min(0, 'At least 0 %').max(100, 'At most 100 %'),
  }),
  z.object({ fn: z.literal('battery_load') }),
  z.object({
    fn: z.literal('system_volts'),
    label: text('what is measured', 80),
    /** Limits for a 12 V system; a 24 V system (two 12 V batteries in series) doubles them. */
    min12: num('Min on 12 V').optional(),
    max12: num('Max on 12 V').optional(),
  }).superRefine((c, ctx) => {
    if (c.min12 === undefined && c.max12 === undefined) issue(ctx, ['min12'], 'Give a min, a max or both')
    if (c.min12 !== undefined && c.max12 !== undefined && c.min12 > c.max12) issue(ctx, ['max12'], 'Max must not be below min')
  }),
  z.object({ fn: z.literal('cable_drop') }),
  z.object({ fn: z.literal('tread_depth') }),
  z.object({ fn: z.literal('inflation') }),
], { message: 'Pick what to work out' })
export type CardCalc = z.infer<typeof cardCalcSchema>

const target = z.string({ message: 'Pick where this leads' }).trim().min(1, 'Pick where this leads')

export const cardStepSchema = z.object({
  id: idText,
  title: text('a short title', 80),
  instruction: text('what to do', 1200),
  measure: z.enum(CARD_MEASURES, { message: 'Pick what to measure' }),
  conditions: z.enum(CARD_CONDITIONS, { message: 'Pick the conditions' }).optional(),
  component: optText(120),
  pins: optText(120),
  /** 'installed' for the part on the truck, 'new' for the replacement measured beside it. */
  partRole: z.enum(['installed', 'new'], { message: 'Pick installed or new' }).optional(),
  /** A step whose reading this one is shown beside (the installed part, for a 'new' step). */
  compareWith: idText.optional(),
  /** What this step's verdict proves good or bad: a part ('sensor'), 'wiring', or nothing. */
  checks: idText.optional(),
  spec: cardSpecSchema.optional(),
  /** Sensor steps: where to take the part's own temperature, shown beside its input. */
  temperatureHint: optText(300),
  calc: cardCalcSchema.optional(),
  /** yes_no: the answer that passes. choice: the options, and those that pass. */
  passAnswer: z.enum(['yes', 'no'], { message: 'Pick the answer that passes' }).optional(),
  options: z.array(text('an option', 120)).max(8, 'At most 8 options').optional(),
  passOptions: z.array(text('an option', 120)).optional(),
  /** choice: options that lead somewhere of their own instead of the pass or fail way. */
  routes: z.array(z.object({ option: text('the option', 120), to: target }, { message: 'Pick an option and where it leads' }))
    .max(8, 'At most 8 routes').optional(),
  next: z.object({
    pass: target,
    fail: target,
    /** Measured and worked-out steps may send low and high readings different ways; otherwise `fail` is used. */
    low: target.optional(),
    high: target.optional(),
    /** Steps whose spec has a margin: a reading just outside the limits (measure again before acting). */
    marginal: target.optional(),
    /** Sensor steps: where a reading goes that cannot be judged yet (the maker's data is missing). */
    unjudged: target.optional(),
  }, { message: 'Say where pass and fail lead' }),
}).superRefine((s, ctx) => {
  const numeric = (NUMERIC_MEASURES as readonly string[]).includes(s.measure)
  const sensor = !!s.spec && (SENSOR_SPEC_KINDS as readonly string[]).includes(s.spec.kind)
  if (numeric) {
    if (!s.spec) issue(ctx, ['spec'], 'A measured step needs a spec to judge against')
    else if (sensor && s.measure !== 'resistance') {
      issue(ctx, ['spec', 'kind'], 'Sensor-model specs give ohms: use them with a resistance step')
    }
  }
  else if (s.spec) issue(ctx, ['spec'], 'Only measured steps have a spec')
  if (!numeric && s.measure !== 'calc' && (s.next.low || s.next.high)) {
    issue(ctx, ['next', s.next.low ? 'low' : 'high'], 'Only measured steps have low and high ways')
  }
  if (s.spec?.kind === 'needs_maker_data' && !s.next.unjudged) {
    issue(ctx, ['next', 'unjudged'], 'Say where a reading goes while the maker’s data is missing')
  }
  if (s.next.unjudged && !sensor) issue(ctx, ['next', 'unjudged'], 'Only sensor steps have a way for readings not judged')
  if (s.temperatureHint && !sensor) issue(ctx, ['temperatureHint'], 'Only sensor steps ask for the part’s temperature')
  const margin = s.spec?.kind === 'range' && s.spec.margin !== undefined
  if (s.next.marginal && !margin) issue(ctx, ['next', 'marginal'], 'Only a step whose spec has a margin has a marginal way')
  if (s.routes?.length && s.measure !== 'choice') issue(ctx, ['routes'], 'Only pick-one steps route options their own way')
  s.routes?.forEach((r, i) => {
    if (!(s.options ?? []).includes(r.option)) issue(ctx, ['routes', i, 'option'], `"${r.option}" is not one of the options`)
    if (s.routes!.findIndex(x => x.option === r.option) !== i) issue(ctx, ['routes', i, 'option'], `"${r.option}" is routed twice`)
  })
  if (s.measure === 'calc' && !s.calc) issue(ctx, ['calc'], 'Pick what to work out')
  if (s.measure !== 'calc' && s.calc) issue(ctx, ['calc'], 'Only worked-out steps have a calculation')
  if (s.measure === 'yes_no' && !s.passAnswer) issue(ctx, ['passAnswer'], 'Pick the answer that passes')
  if (s.measure === 'choice') {
    const opts = s.options ?? []
    if (opts.length < 2) issue(ctx, ['options'], 'Give at least 2 options')
    if (new Set(opts).size !== opts.length) issue(ctx, ['options'], 'Options must differ')
    const pass = s.passOptions ?? []
    if (!pass.length) issue(ctx, ['passOptions'], 'Mark at least one option as passing')
    pass.forEach((p, i) => {
      if (!opts.includes(p)) issue(ctx, ['passOptions', i], `"${p}" is not one of the options`)
    })
  }
})
export type CardStep = z.infer<typeof cardStepSchema>

export const cardConclusionSchema = z.object({
  id: idText,
  text: text('the conclusion', 200),
  kind: z.enum(CONCLUSION_KINDS, { message: 'Pick fault, ok or refer' }),
  detail: optText(1200),
  /** The part this conclusion replaces or repairs ('sensor', 'wiring', 'controller'…): a step that checks it must have failed. */
  condemns: idText.optional(),
})
export type CardConclusion = z.infer<typeof cardConclusionSchema>

// A code pattern: 'P0544', 'P20*', 'P2080-P2084', 'SPN 3242', 'SPN 173 FMI *', 'SPN 110 FMI 3', 'SPN 3242 FMI circuit';
// kept in one spelling ('SPN 3242' reads as 'SPN 3242 FMI *').
function normalPattern(p: string, ctx: z.RefinementCtx) {
  try {
    return normalizeCodePattern(p)
  }
  catch (err) {
    issue(ctx, [], (err as Error).message)
    return p
  }
}

export const cardDefinitionSchema = z.object({
  title: text('a title', 120),
  componentType: text('the component type', 60),
  /** Definitions saved before card kinds existed read as 'system'. */
  kind: z.enum(CARD_KINDS, { message: 'Pick what kind of card this is' }).default('system'),
  summary: optText(600),
  codePatterns: z.array(
    z.string({ message: 'Write a code like P0544, P2080-P2084 or SPN 3242 FMI circuit' }).trim().transform(normalPattern),
  ).max(40, 'At most 40 code patterns').default([]),
  cautions: z.array(text('the caution', 500)).max(12, 'At most 12 cautions').default([]),
  tools: z.array(text('the tool', 120)).max(14, 'At most 14 tools').default([]),
  /** Where the card's numbers come from, shown with the cautions. */
  sources: z.array(text('the source', 300)).max(12, 'At most 12 sources').default([]),
  steps: z.array(cardStepSchema).min(1, 'A card needs at least one step').max(50, 'At most 50 steps'),
  conclusions: z.array(cardConclusionSchema).min(1, 'A card needs at least one conclusion').max(24, 'At most 24 conclusions'),
}).superRefine((card, ctx) => {
  card.codePatterns.forEach((p, i) => {
    let problem: string | null = null
    try {
      problem = patternProblemForKind(p, card.kind)
    }
    catch {
      return // already named by normalPattern
    }
    if (problem) issue(ctx, ['codePatterns', i], problem)
  })
  checkCardGraph(card, ctx)
})
export type CardDefinition = z.infer<typeof cardDefinitionSchema>
export type CardDefinitionInput = z.input<typeof cardDefinitionSchema>

const slug = z.string({ message: 'Give a short name' }).trim().toLowerCase()
  .regex(/^[a-z0-9][a-z0-9-]{1,59}$/, 'Use 2–60 lower-case letters, digits and dashes')

/** POST /api/test-cards */
export const testCardCreateSchema = z.object({ slug, definition: cardDefinitionSchema })
/** PATCH /api/test-cards/[id]: a new definition makes a new version; `baseVersion` guards against a stale edit. */
export const testCardPatchSchema = z.object({
  definition: cardDefinitionSchema.optional(),
  active: z.boolean({ message: 'Active is true or false' }).optional(),
  baseVersion: z.number({ message: 'Base version must be a number' }).int().positive().optional(),
}).refine(v => v.definition !== undefined || v.active !== undefined, { message: 'Nothing to change' })
const versionParam = z.coerce.number({ message: 'Version must be a number' })
  .int('Version must be a whole number').positive('Version starts at 1')
/** GET /api/test-cards/[id]?version=N */
export const testCardQuerySchema = z.object({ version: versionParam.optional() })

/** `?codes=P0545,SPN 3242 FMI 4`: each code read, or a 400 naming the one that cannot be. */
const codesParam = z.string().max(2000, 'At most 2000 characters of codes').transform((s, ctx) => {
  const out: FaultCodeRef[] = []
  for (const part of s.split(',').map(x => x.trim()).filter(Boolean)) {
    try {
      out.push(parseFaultCodeText(part))
    }
    catch (err) {
      issue(ctx, [], (err as Error).message)
    }
  }
  if (!out.length && !ctx.issues?.length) issue(ctx, [], 'Give at least one fault code, like P0545 or SPN 3242 FMI 4')
  if (out.length > 50) ctx.addIssue({ code: 'custom', message: 'At most 50 codes at once' })
  return out
})
export const testCardListQuerySchema = z.object({
  all: z.enum(['true', 'false'], { message: 'all is true or false' }).optional().transform(v => v === 'true'),
  codes: codesParam.optional(),
})

const reading = z.object({
  value: z.union([num('Value'), z.literal('OL')], { message: 'Value is a number or OL' }),
  unit: z.string({ message: 'Give the unit' }).trim().min(1, 'Give the unit').max(10, 'Unknown unit'),
})
/** POST /api/test-cards/[id]/judge: one entry judged against one step of a version of the card. */
export const testCardJudgeSchema = z.object({
  version: z.number({ message: 'Version must be a number' })
    .int('Version must be a whole number').positive('Version starts at 1').optional(),
  stepId: idText,
  reading: reading.optional(),
  partTemp: reading.optional(),
  answer: cleanText('Answer').max(120, 'Answer is too long (at most 120 characters)').optional(),
  inputs: z.record(z.string(), z.union([z.number(), z.string().max(20)])).optional(),
}).refine(v => [v.reading, v.answer, v.inputs].filter(x => x !== undefined).length === 1, {
  message: 'Give one of reading, answer or inputs', path: ['reading'],
})

export type TestCardCreateInput = z.input<typeof testCardCreateSchema>
export type TestCardPatchInput = z.input<typeof testCardPatchSchema>
export type TestCardJudgeInput = z.input<typeof testCardJudgeSchema>

/** What the routes answer for one card (one version of it). */
export interface TestCardView {
  id: string
  slug: string
  title: string
  componentType: string
  active: boolean
  currentVersion: number
  version: number
  definition: CardDefinition
  updatedAt: string
  /** Set when the stored definition does not pass the card schema; such a card is not run. */
  problem?: string
  versions?: { version: number, createdAt: string, authorName: string | null }[]
}
