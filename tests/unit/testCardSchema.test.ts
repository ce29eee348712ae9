import { describe, expect, it } from 'vitest'
import { cardDefinitionSchema, testCardCreateSchema, testCardPatchSchema, type CardDefinitionInput } from '../../shared/schemas/testCards'
import { fieldErrorsOf } from '../../shared/utils/fieldErrors'
import { SEED_CARDS } from '../../server/db/seed/cards'

// A small valid card: one measured step that leads to two conclusions.
function card(): CardDefinitionInput {
  return {
    title: 'Reference check',
    componentType: 'Sensor reference circuit',
    codePatterns: ['SPN 3509 FMI *', 'p0641'],
    cautions: ['Key off before unplugging.'],
    tools: ['Multimeter'],
    steps: [
      { id: 'ref', title: 'Reference', instruction: 'Measure it.', measure: 'voltage', conditions: 'key_on_engine_off', spec: { kind: 'range', min: 4.8, max: 5.2 }, next: { pass: 'good', fail: 'wire' } },
      { id: 'wire', title: 'Wire', instruction: 'Measure it.', measure: 'resistance', spec: { kind: 'range', max: 1 }, next: { pass: 'good', fail: 'repair' } },
    ],
    conclusions: [{ id: 'good', text: 'Good', kind: 'ok' }, { id: 'repair', text: 'Repair wiring', kind: 'fault' }],
  }
}
const errorsOf = (input: unknown) => {
  const r = cardDefinitionSchema.safeParse(input)
  return r.success ? {} : fieldErrorsOf(r.error)
}

describe('card definition schema', () => {
  it('accepts a good card and normalises code patterns', () => {
    // our own card format
    const r = cardDefinitionSchema.parse(card())
    expect(r.codePatterns).toEqual(['SPN 3509 FMI *', 'P0641'])
  })

  it('every seeded card is valid', () => {
    // the seed runs the same check; this keeps a broken seed out of main
    for (const c of SEED_CARDS) expect(errorsOf(c.definition), c.slug).toEqual({})
    expect(SEED_CARDS.map(c => c.slug)).toEqual(['egt-rtd-sensor', 'coolant-temp-ntc', 'battery-charging', 'def-concentration', 'sensor-5v-reference'])
  })

  it('the DEF card judges against ISO 22241 31.8–33.2 %', () => {
    // ISO 22241-1 (REFERENCES §8): 31.8–33.2 % urea by mass
    const def = SEED_CARDS.find(c => c.slug === 'def-concentration')!.definition
    expect(def.steps.find(s => s.measure === 'concentration')?.spec).toEqual({ kind: 'range', min: 31.8, max: 33.2 })
  })

  it('the exhaust-temperature card is a Pt200 at ambient with a new-part comparison', () => {
    // IEC 60751 scaled to R0 = 200 Ω (REFERENCES §1)
    const egt = SEED_CARDS.find(c => c.slug === 'egt-rtd-sensor')!.definition
    expect(egt.steps[0]?.spec).toEqual({ kind: 'rtd', r0: 200, tolerancePct: 2 })
    expect(egt.steps.find(s => s.partRole === 'new')?.compareWith).toBe('sensor-ohms')
    expect(egt.codePatterns).toContain('SPN 3242 FMI *')
  })

  it('rejects a next pointer to nothing, naming the field', () => {
    // our own rule: every `next` names a step or a conclusion
    const c = card()
    c.steps[1]!.next.fail = 'nowhere'
    expect(errorsOf(c)).toEqual({ 'steps.1.next.fail': '"nowhere" is neither a step nor a conclusion of this card' })
  })

  it('rejects a step no path reaches', () => {
    // our own rule: every step can be reached from the first
    const c = card()
    c.steps[0]!.next.fail = 'repair'
    expect(errorsOf(c)['steps.1.id']).toMatch(/No path from the first step/)
  })

  it('rejects a loop with no way out, and a step leading to itself', () => {
    // our own rule: from every step some path ends at a conclusion
    const c = card()
    c.steps.push({ id: 'c', title: 'Loop C', instruction: 'x', measure: 'yes_no', passAnswer: 'yes', next: { pass: 'd', fail: 'd' } })
    c.steps.push({ id: 'd', title: 'Loop D', instruction: 'x', measure: 'yes_no', passAnswer: 'yes', next: { pass: 'c', fail: 'c' } })
    c.steps[1]!.next.fail = 'c'
    const e = errorsOf(c)
    expect(e['steps.2.next']).toMatch(/no path reaches a conclusion/)
    expect(e['steps.3.next']).toMatch(/no path reaches a conclusion/)
    // a loop with an exit is allowed (measure again after a repair)
    const ok = card()
    ok.steps[1]!.next.fail = 'ref'
    expect(errorsOf(ok)).toEqual({})
    const self = card()
    self.steps[0]!.next.pass = 'ref'
    expect(errorsOf(self)['steps.0.next.pass']).toMatch(/itself/)
  })

  it('rejects duplicate ids and ids shared by a step and a conclusion', () => {
    // our own rule
    const c = card()
    c.steps[1]!.id = 'ref'
    expect(errorsOf(c)['steps.1.id']).toMatch(/used twice/)
    const d = card()
    d.conclusions[0]!.id = 'wire'
    expect(errorsOf(d)['conclusions.0.id']).toMatch(/already used/)
  })

  it('checks each spec kind and the measure it belongs to', () => {
    // our own card format: rtd (r0), ntc_beta (r25, beta), ntc_steinhart (a, b, c), each ± tolerance or ± %
    const withSpec = (spec: unknown, measure = 'resistance') => {
      const c = card() as any
      c.steps[1].spec = spec
      c.steps[1].measure = measure
      return errorsOf(c)
    }
    expect(withSpec({ kind: 'rtd', r0: 200, tolerancePct: 2 })).toEqual({})
    expect(withSpec({ kind: 'ntc_beta', r25: 10000, beta: 3950, tolerance: 500 })).toEqual({})
    expect(withSpec({ kind: 'ntc_steinhart', a: 1.129148e-3, b: 2.34125e-4, c: 8.76741e-8, tolerancePct: 5 })).toEqual({})
    expect(withSpec({ kind: 'rtd', r0: 200 })['steps.1.spec.tolerance']).toMatch(/either/)
    expect(withSpec({ kind: 'rtd', r0: 200, tolerance: 1, tolerancePct: 2 })['steps.1.spec.tolerance']).toMatch(/not both/)
    expect(withSpec({ kind: 'rtd', r0: -200, tolerancePct: 2 })['steps.1.spec.r0']).toMatch(/more than 0/)
    expect(withSpec({ kind: 'rtd', r0: 200, tolerancePct: 2 }, 'voltage')['steps.1.spec.kind']).toMatch(/resistance/)
    expect(withSpec({ kind: 'range' })['steps.1.spec.min']).toMatch(/min, a max/)
    expect(withSpec({ kind: 'range', min: 5, max: 4 })['steps.1.spec.max']).toMatch(/below min/)
    expect(withSpec({ kind: 'guess' })['steps.1.spec.kind']).toBeDefined()
    expect(withSpec(undefined)['steps.1.spec']).toMatch(/needs a spec/)
    expect(withSpec({ kind: 'range', min: Number.NaN })['steps.1.spec.min']).toBeDefined()
  })

  it('checks yes/no and pick-one steps', () => {
    // our own card format
    const c = card() as any
    c.steps[1] = { id: 'wire', title: 'Look', instruction: 'x', measure: 'choice', options: ['Clear', 'Cloudy'], passOptions: ['Green'], next: { pass: 'good', fail: 'repair' } }
    expect(errorsOf(c)['steps.1.passOptions.0']).toMatch(/not one of the options/)
    c.steps[1] = { id: 'wire', title: 'Look', instruction: 'x', measure: 'yes_no', next: { pass: 'good', fail: 'repair', low: 'good' } }
    const e = errorsOf(c)
    expect(e['steps.1.passAnswer']).toMatch(/answer/)
    expect(e['steps.1.next.low']).toMatch(/Only measured steps/)
  })

  it('rejects bad code patterns with the reason', () => {
    // SAE J2012 structure; J1939 FMI is 0–31
    const c = card()
    c.codePatterns = ['P0544', 'SPN 110 FMI 40', 'Q1234']
    const e = errorsOf(c)
    expect(e['codePatterns.1']).toMatch(/FMI must be 0–31/)
    expect(e['codePatterns.2']).toMatch(/not a code pattern/)
  })
})

describe('route payloads', () => {
  it('create needs a slug; patch needs something to change', () => {
    // our own route contract
    expect(testCardCreateSchema.safeParse({ slug: 'Bad slug!', definition: card() }).success).toBe(false)
    expect(testCardCreateSchema.safeParse({ slug: 'ref-check', definition: card() }).success).toBe(true)
    expect(testCardPatchSchema.safeParse({}).success).toBe(false)
    expect(testCardPatchSchema.safeParse({ active: false }).success).toBe(true)
  })
})
