// A test card is data: this one schema says what a valid card is, for the admin form, the
// routes and the seed alike. Beyond the shape it checks the card's graph: every `next` names a
// step or a conclusion, every step can be reached from the first, and every step can still reach
// a conclusion (so no loop a mechanic could never leave).
import { z } from 'zod'
import { parseCodePattern } from '../utils/faultMatch'
import { cleanText } from './text'

export const NUMERIC_MEASURES = ['resistance', 'voltage', 'temperature', 'pressure', 'concentration'] as const
export const CARD_MEASURES = [...NUMERIC_MEASURES, 'yes_no', 'choice'] as const
export const CARD_CONDITIONS = ['key_off', 'key_on_engine_off', 'running'] as const
export const SPEC_KINDS = ['range', 'nominal', 'rtd', 'ntc_beta', 'ntc_steinhart'] as const
export const COMPUTED_SPEC_KINDS = ['rtd', 'ntc_beta', 'ntc_steinhart'] as const
export const CONCLUSION_KINDS = ['fault', 'ok', 'refer'] as const

export type CardMeasure = (typeof CARD_MEASURES)[number]
export type NumericMeasure = (typeof NUMERIC_MEASURES)[number]
export type CardCondition = (typeof CARD_CONDITIONS)[number]
export type SpecKind = (typeof SPEC_KINDS)[number]

export const MEASURE_LABELS: Record<CardMeasure, string> = {
  resistance: 'Resistance', voltage: 'Voltage', temperature: 'Temperature', pressure: 'Pressure',
  concentration: 'Concentration', yes_no: 'Yes or no', choice: 'Pick one',
}
export const CONDITION_LABELS: Record<CardCondition, string> = {
  key_off: 'Key off', key_on_engine_off: 'Key on, engine off', running: 'Engine running',
}
export const SPEC_KIND_LABELS: Record<SpecKind, string> = {
  range: 'Fixed range (min–max)', nominal: 'Nominal ± tolerance', rtd: 'Platinum RTD at ambient (IEC 60751)',
  ntc_beta: 'NTC thermistor at ambient (Beta)', ntc_steinhart: 'NTC thermistor at ambient (Steinhart–Hart)',
}

const num = (what: string) => z.number({ message: `${what} must be a number` }).finite(`${what} must be a finite number`)
const positive = (what: string) => num(what).positive(`${what} must be more than 0`)
const id = z.string({ message: 'Give an id' }).trim()
  .regex(/^[a-z][a-z0-9_-]{0,39}$/, 'Use lower-case letters, digits, - or _, starting with a letter (at most 40)')
const text = (what: string, max: number, multiline = false) => cleanText(what, { multiline, missing: `Enter ${what}` })
  .min(1, `Enter ${what}`).max(max, `Keep ${what} under ${max} characters`)
const optText = (max: number, multiline = false) => cleanText('This', { multiline }).max(max, `Keep it under ${max} characters`).optional()

// Computed specs and nominal specs take one tolerance: absolute (in the base unit) or percent.
const tolerance = {
  tolerance: num('Tolerance').nonnegative('Tolerance cannot be negative').optional(),
  tolerancePct: num('Tolerance %').nonnegative('Tolerance % cannot be negative').max(100, 'Tolerance % must be 100 or less').optional(),
}
type Tol = { tolerance?: number, tolerancePct?: number }
function oneTolerance(s: Tol, ctx: z.RefinementCtx) {
  if ((s.tolerance === undefined) === (s.tolerancePct === undefined)) {
    ctx.addIssue({ code: 'custom', path: ['tolerance'], message: 'Give either a tolerance or a tolerance %, not both or neither' })
  }
}

export const cardSpecSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('range'), min: num('Min').optional(), max: num('Max').optional() }).superRefine((s, ctx) => {
    if (s.min === undefined && s.max === undefined) ctx.addIssue({ code: 'custom', path: ['min'], message: 'Give a min, a max or both' })
    if (s.min !== undefined && s.max !== undefined && s.min > s.max) ctx.addIssue({ code: 'custom', path: ['max'], message: 'Max must not be below min' })
  }),
  z.object({ kind: z.literal('nominal'), nominal: num('Nominal'), ...tolerance }).superRefine(oneTolerance),
  z.object({ kind: z.literal('rtd'), r0: positive('R0 (ohms at 0 °C)').max(10_000, 'R0 above 10 000 Ω is not a platinum RTD'), ...tolerance }).superRefine(oneTolerance),
  z.object({ kind: z.literal('ntc_beta'), r25: positive('R25 (ohms at 25 °C)'), beta: positive('Beta (K)').min(500, 'Beta is usually 2000–6000 K').max(10_000, 'Beta is usually 2000–6000 K'), ...tolerance }).superRefine(oneTolerance),
  z.object({ kind: z.literal('ntc_steinhart'), a: num('A'), b: positive('B'), c: num('C').nonnegative('C cannot be negative for an NTC'), ...tolerance }).superRefine(oneTolerance),
], { message: 'Pick a spec kind' })
export type CardSpec = z.infer<typeof cardSpecSchema>

const target = z.string({ message: 'Pick where this leads' }).trim().min(1, 'Pick where this leads')

export const cardStepSchema = z.object({
  id,
  title: text('a short title', 80),
  instruction: text('what to do', 1000, true),
  measure: z.enum(CARD_MEASURES, { message: 'Pick what to measure' }),
  conditions: z.enum(CARD_CONDITIONS, { message: 'Pick the conditions' }).optional(),
  component: optText(120),
  pins: optText(80),
  /** 'installed' for the part on the truck, 'new' for the replacement measured beside it. */
  partRole: z.enum(['installed', 'new'], { message: 'Pick installed or new' }).optional(),
  /** A step whose reading this one is shown beside (the installed part, for a 'new' step). */
  compareWith: id.optional(),
  spec: cardSpecSchema.optional(),
  /** yes_no: the answer that passes. choice: the options, and those that pass. */
  passAnswer: z.enum(['yes', 'no'], { message: 'Pick the answer that passes' }).optional(),
  options: z.array(text('an option', 80)).max(8, 'At most 8 options').optional(),
  passOptions: z.array(text('an option', 80)).optional(),
  next: z.object({
    pass: target,
    fail: target,
    /** Numeric steps may send low and high readings different ways; otherwise `fail` is used. */
    low: target.optional(),
    high: target.optional(),
  }, { message: 'Say where pass and fail lead' }),
}).superRefine((s, ctx) => {
  const numeric = (NUMERIC_MEASURES as readonly string[]).includes(s.measure)
  if (numeric) {
    if (!s.spec) ctx.addIssue({ code: 'custom', path: ['spec'], message: 'A measured step needs a spec to judge against' })
    else if ((COMPUTED_SPEC_KINDS as readonly string[]).includes(s.spec.kind) && s.measure !== 'resistance') {
      ctx.addIssue({ code: 'custom', path: ['spec', 'kind'], message: 'Sensor-model specs give ohms: use them with a resistance step' })
    }
  }
  else {
    if (s.spec) ctx.addIssue({ code: 'custom', path: ['spec'], message: 'Only measured steps have a spec' })
    if (s.next.low || s.next.high) ctx.addIssue({ code: 'custom', path: ['next', s.next.low ? 'low' : 'high'], message: 'Only measured steps have low and high ways' })
  }
  if (s.measure === 'yes_no' && !s.passAnswer) ctx.addIssue({ code: 'custom', path: ['passAnswer'], message: 'Pick the answer that passes' })
  if (s.measure === 'choice') {
    const opts = s.options ?? []
    if (opts.length < 2) ctx.addIssue({ code: 'custom', path: ['options'], message: 'Give at least 2 options' })
    if (new Set(opts).size !== opts.length) ctx.addIssue({ code: 'custom', path: ['options'], message: 'Options must differ' })
    const pass = s.passOptions ?? []
    if (!pass.length) ctx.addIssue({ code: 'custom', path: ['passOptions'], message: 'Mark at least one option as passing' })
    pass.forEach((p, i) => { if (!opts.includes(p)) ctx.addIssue({ code: 'custom', path: ['passOptions', i], message: `"${p}" is not one of the options` }) })
  }
})
export type CardStep = z.infer<typeof cardStepSchema>

export const cardConclusionSchema = z.object({
  id,
  text: text('the conclusion', 200),
  kind: z.enum(CONCLUSION_KINDS, { message: 'Pick fault, ok or refer' }),
  detail: optText(1000, true),
})
export type CardConclusion = z.infer<typeof cardConclusionSchema>

// A code pattern: 'P0544', 'P20*', 'SPN 3242', 'SPN 173 FMI *', 'SPN 110 FMI 3' (see faultMatch.ts).
function checkCodePattern(p: string, ctx: z.RefinementCtx) {
  try { parseCodePattern(p) }
  catch (err) { ctx.addIssue({ code: 'custom', message: (err as Error).message }) }
}

export const cardDefinitionSchema = z.object({
  title: text('a title', 120),
  componentType: text('the component type', 60),
  summary: optText(500, true),
  codePatterns: z.array(
    z.string({ message: 'Write a code like P0544, P20* or SPN 3242 FMI *' }).trim().toUpperCase().superRefine(checkCodePattern),
  ).max(40, 'At most 40 code patterns').default([]),
  cautions: z.array(text('the caution', 400)).max(12, 'At most 12 cautions').default([]),
  tools: z.array(text('the tool', 120)).max(12, 'At most 12 tools').default([]),
  steps: z.array(cardStepSchema).min(1, 'A card needs at least one step').max(40, 'At most 40 steps'),
  conclusions: z.array(cardConclusionSchema).min(1, 'A card needs at least one conclusion').max(20, 'At most 20 conclusions'),
}).superRefine((card, ctx) => checkCardGraph(card, ctx))
export type CardDefinition = z.infer<typeof cardDefinitionSchema>
export type CardDefinitionInput = z.input<typeof cardDefinitionSchema>

function checkCardGraph(card: { steps: CardStep[], conclusions: CardConclusion[] }, ctx: z.RefinementCtx) {
  const stepIds = new Map<string, number>()
  card.steps.forEach((s, i) => {
    if (stepIds.has(s.id)) ctx.addIssue({ code: 'custom', path: ['steps', i, 'id'], message: `Step id "${s.id}" is used twice` })
    else stepIds.set(s.id, i)
  })
  const conclusionIds = new Set<string>()
  card.conclusions.forEach((c, i) => {
    if (conclusionIds.has(c.id) || stepIds.has(c.id)) ctx.addIssue({ code: 'custom', path: ['conclusions', i, 'id'], message: `Id "${c.id}" is already used by a step or conclusion` })
    conclusionIds.add(c.id)
  })
  let broken = false
  card.steps.forEach((s, i) => {
    for (const way of ['pass', 'fail', 'low', 'high'] as const) {
      const to = s.next[way]
      if (to === undefined) continue
      if (!stepIds.has(to) && !conclusionIds.has(to)) {
        broken = true
        ctx.addIssue({ code: 'custom', path: ['steps', i, 'next', way], message: `"${to}" is neither a step nor a conclusion of this card` })
      }
      else if (to === s.id) {
        broken = true
        ctx.addIssue({ code: 'custom', path: ['steps', i, 'next', way], message: 'A step cannot lead to itself' })
      }
    }
    if (s.compareWith !== undefined) {
      const j = stepIds.get(s.compareWith)
      if (j === undefined || j >= i) ctx.addIssue({ code: 'custom', path: ['steps', i, 'compareWith'], message: 'Compare with a step that comes before this one' })
    }
  })
  if (broken || !card.steps.length) return

  const outs = (s: CardStep) => [s.next.pass, s.next.fail, s.next.low, s.next.high].filter((x): x is string => x !== undefined)
  // Forward: what the first step can reach.
  const reached = new Set<string>([card.steps[0]!.id])
  const queue = [card.steps[0]!.id]
  while (queue.length) {
    const s = card.steps[stepIds.get(queue.shift()!)!]!
    for (const to of outs(s)) if (stepIds.has(to) && !reached.has(to)) { reached.add(to); queue.push(to) }
  }
  // Backward: which steps can still end at a conclusion.
  const ends = new Set<string>()
  for (let changed = true; changed;) {
    changed = false
    for (const s of card.steps) {
      if (!ends.has(s.id) && outs(s).some(to => conclusionIds.has(to) || ends.has(to))) { ends.add(s.id); changed = true }
    }
  }
  card.steps.forEach((s, i) => {
    if (!reached.has(s.id)) ctx.addIssue({ code: 'custom', path: ['steps', i, 'id'], message: `No path from the first step leads to "${s.title}"` })
    else if (!ends.has(s.id)) ctx.addIssue({ code: 'custom', path: ['steps', i, 'next'], message: `From "${s.title}" no path reaches a conclusion (a loop with no way out)` })
  })
}

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
/** GET /api/test-cards/[id]?version=N */
export const testCardQuerySchema = z.object({
  version: z.coerce.number({ message: 'Version must be a number' }).int('Version must be a whole number').positive('Version starts at 1').optional(),
})
export const testCardListQuerySchema = z.object({
  all: z.enum(['true', 'false'], { message: 'all is true or false' }).optional().transform(v => v === 'true'),
})

export type TestCardCreateInput = z.input<typeof testCardCreateSchema>
export type TestCardPatchInput = z.input<typeof testCardPatchSchema>

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
