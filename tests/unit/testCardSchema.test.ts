import { describe, expect, it } from 'vitest'
import { cardDefinitionSchema, testCardCreateSchema, testCardPatchSchema, type CardDefinitionInput } from '../../shared/schemas/testCards'
import { fieldErrorsOf } from '../../shared/utils/fieldErrors'
import { SEED_CARDS } from '../../server/db/seed/cards'
import RELEASE_01 from '../fixtures/cards-release-0.1.json'

// A small valid card: one measured step that leads to two conclusions.
function card(): CardDefinitionInput {
  return {
    title: 'Reference check',
    componentType: 'Sensor reference circuit',
    codePatterns: ['SPN 3509 FMI *', 'p0641'],
    cautions: ['Key off before unplugging.'],
    tools: ['Multimeter'],
    steps: [
      {
        id: 'ref', title: 'Reference', instruction: 'Measure it.', measure: 'voltage', conditions: 'key_on_engine_off',
        spec: { kind: 'range', min: 4.8, max: 5.2 }, next: { pass: 'good', fail: 'wire' },
      },
      {
        id: 'wire', title: 'Wire', instruction: 'Measure it.', measure: 'resistance',
        spec: { kind: 'range', max: 1 }, next: { pass: 'good', fail: 'repair' },
      },
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
    expect(new Set(SEED_CARDS.map(c => c.slug)).size).toBe(SEED_CARDS.length)
  })

  it('card versions stored by release 0.1 still load as they were', () => {
    // our own compatibility rule: a run keeps the version it started with, so old versions must still parse
    for (const c of RELEASE_01) {
      const r = cardDefinitionSchema.safeParse(c.definition)
      expect(r.success, c.slug).toBe(true)
      expect(r.data?.kind).toBe('system')
    }
    const egt = cardDefinitionSchema.parse(RELEASE_01.find(c => c.slug === 'egt-rtd-sensor')!.definition)
    expect(egt.steps[0]?.spec).toEqual({ kind: 'rtd', r0: 200, tolerancePct: 2 })
    expect(egt.codePatterns).toContain('SPN 3242 FMI *')
  })

  it('the DEF card judges against ISO 22241 31.8–33.2 % with the refractometer’s ± 0.5 % as a margin', () => {
    // ISO 22241-1 (REFERENCES §8): 31.8–33.2 % urea by mass; ± 0.5 % common practice for handheld refractometers
    const def = SEED_CARDS.find(c => c.slug === 'def-concentration')!.definition
    expect(def.steps.find(s => s.measure === 'concentration')?.spec).toEqual({ kind: 'range', min: 31.8, max: 33.2, margin: 0.5 })
  })

  it('the exhaust-temperature card judges a Pt200 at the pipe’s temperature, with a new-part comparison', () => {
    // IEC 60751 scaled to R0 = 200 Ω (REFERENCES §1)
    const egt = SEED_CARDS.find(c => c.slug === 'egt-rtd-sensor')!.definition
    expect(egt.steps.find(s => s.id === 'sensor-ohms')?.spec).toEqual({ kind: 'rtd', r0: 200, toleranceC: 10 })
    expect(egt.steps.find(s => s.partRole === 'new')?.compareWith).toBe('sensor-ohms')
    expect(egt.codePatterns).toContain('SPN 3242 FMI circuit')
    expect(egt.codePatterns).not.toContain('SPN 3242 FMI *')
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
    expect(withSpec({ kind: 'rtd', r0: 200, toleranceC: 5 })).toEqual({})
    expect(withSpec({ kind: 'rtd', r0: 200 })['steps.1.spec.tolerance']).toMatch(/not none/)
    expect(withSpec({ kind: 'rtd', r0: 200, tolerance: 1, toleranceC: 2 })['steps.1.spec.tolerance']).toMatch(/not several/)
    expect(withSpec({ kind: 'nominal', nominal: 5, toleranceC: 2 })['steps.1.spec.tolerance']).toMatch(/not none/)
    // a maker's table: rows cold to hot, resistance falling (an NTC)
    expect(withSpec({ kind: 'ntc_table', table: [[0, 27219], [25, 10000]], toleranceC: 2 })).toEqual({})
    expect(withSpec({ kind: 'ntc_table', table: [[25, 10000], [0, 27219]], toleranceC: 2 })['steps.1.spec.table.1']).toMatch(/cold to hot/)
    expect(withSpec({ kind: 'ntc_table', table: [[0, 10000], [25, 27219]], toleranceC: 2 })['steps.1.spec.table.1']).toMatch(/less as it warms/)
    expect(withSpec({ kind: 'ntc_table', table: [[0, 10000]], toleranceC: 2 })['steps.1.spec.table']).toMatch(/at least 2 rows/)
    expect(withSpec({ kind: 'ntc_table', table: [[0, Number.NaN], [25, 1]], toleranceC: 2 })['steps.1.spec.table.0.1']).toBeDefined()
    // no maker's data yet: the step must say where an unjudged reading goes
    expect(withSpec({ kind: 'needs_maker_data' })['steps.1.next.unjudged']).toMatch(/maker’s data is missing/)
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
    const c = card() as unknown as { steps: unknown[] }
    c.steps[1] = {
      id: 'wire', title: 'Look', instruction: 'x', measure: 'choice', options: ['Clear', 'Cloudy'], passOptions: ['Green'],
      next: { pass: 'good', fail: 'repair' },
    }
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

describe('what a card is for and how it may end', () => {
  const sensorCard = (): CardDefinitionInput => ({
    title: 'Coolant sensor', componentType: 'Sensor', kind: 'sensor_circuit', codePatterns: ['SPN 110 FMI circuit'],
    steps: [
      {
        id: 'look', title: 'Look', instruction: 'x', measure: 'yes_no', passAnswer: 'yes', checks: 'wiring',
        next: { pass: 'ohms', fail: 'repair' },
      },
      {
        id: 'ohms', title: 'Sensor', instruction: 'x', measure: 'resistance', checks: 'sensor',
        spec: { kind: 'rtd', r0: 200, toleranceC: 10 },
        next: { pass: 'good', fail: 'replace' },
      },
      {
        id: 'wire', title: 'Wire', instruction: 'x', measure: 'resistance', checks: 'wiring', spec: { kind: 'range', max: 1 },
        next: { pass: 'ecu', fail: 'repair' },
      },
    ],
    conclusions: [
      { id: 'good', text: 'Good', kind: 'ok' }, { id: 'replace', text: 'Replace sensor', kind: 'fault', condemns: 'sensor' },
      { id: 'repair', text: 'Repair wiring', kind: 'fault', condemns: 'wiring' },
      { id: 'ecu', text: 'Check the controller', kind: 'refer', condemns: 'controller' },
    ],
  })
  const withWire = () => {
    const c = sensorCard()
    c.steps[1]!.next.fail = 'wire'
    c.steps[1]!.next.pass = 'good'
    return c
  }

  it('a sensor-circuit card lists circuit and signal FMIs only; a condition card data-valid ones only', () => {
    // our own rule over SAE J1939-73 FMI kinds
    const c = withWire()
    c.codePatterns = ['SPN 110 FMI circuit', 'SPN 110 FMI *', 'SPN 110 FMI 0', 'P0118']
    const e = errorsOf(c)
    expect(e['codePatterns.1']).toMatch(/takes every FMI/)
    expect(e['codePatterns.2']).toMatch(/condition FMI/)
    expect(e['codePatterns.0']).toBeUndefined()
    const cond = { ...withWire(), kind: 'condition' as const, codePatterns: ['SPN 110 FMI condition', 'SPN 110 FMI 3'] }
    expect(errorsOf(cond)['codePatterns.1']).toMatch(/circuit FMI/)
  })

  it('a part is condemned only after its own check failed', () => {
    // our own rule: no path may replace a part its readings show good
    const c = withWire()
    expect(errorsOf(c)).toEqual({})
    // a failed look leading to "Replace sensor" skips the sensor's own measurement
    c.steps[0]!.next.fail = 'replace'
    expect(errorsOf(c)['conclusions.1.condemns']).toMatch(/no failed step that checks the sensor: Look → Replace sensor/)
    // so does the sensor's pass way
    const p = withWire()
    p.steps[1]!.next.pass = 'replace'
    expect(errorsOf(p)['conclusions.1.condemns']).toMatch(/condemns the sensor/)
  })

  it('the controller is blamed only after every wire test, each passed', () => {
    // our own rule: no path ends at the controller before every wire test has passed
    const c = withWire()
    c.steps[2]!.next.fail = 'ecu'
    expect(errorsOf(c)['conclusions.3.condemns']).toMatch(/after "Wire" did not pass/)
    const around = withWire()
    around.steps[1]!.next.low = 'ecu'
    expect(errorsOf(around)['conclusions.3.condemns']).toMatch(/without the wire test "Wire"/)
    const none = withWire()
    none.steps.forEach(s => delete s.checks)
    delete none.conclusions[2]!.condemns
    expect(errorsOf(none)['conclusions.3.condemns']).toMatch(/no wire tests/)
  })

  it('pick-one routes, and the marginal and not-judged ways, belong to the steps that have them', () => {
    // our own card format
    const c = card() as unknown as { steps: unknown[] }
    c.steps[1] = {
      id: 'wire', title: 'Tester', instruction: 'x', measure: 'choice', options: ['A', 'B'], passOptions: ['A', 'B'],
      routes: [{ option: 'C', to: 'good' }, { option: 'B', to: 'nowhere' }], next: { pass: 'good', fail: 'repair' },
    }
    const e = errorsOf(c)
    expect(e['steps.1.routes.0.option']).toMatch(/not one of the options/)
    expect(e['steps.1.routes.1.to']).toMatch(/neither a step nor a conclusion/)
    const m = card()
    m.steps[1]!.next.marginal = 'good'
    m.steps[1]!.next.unjudged = 'good'
    const em = errorsOf(m)
    expect(em['steps.1.next.marginal']).toMatch(/margin/)
    expect(em['steps.1.next.unjudged']).toMatch(/Only sensor steps/)
    const calc = card() as unknown as { steps: unknown[] }
    calc.steps[1] = { id: 'wire', title: 'Leak', instruction: 'x', measure: 'calc', next: { pass: 'good', fail: 'repair' } }
    expect(errorsOf(calc)['steps.1.calc']).toMatch(/Pick what to work out/)
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
