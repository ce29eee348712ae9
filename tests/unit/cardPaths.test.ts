// Every path of every seeded card, walked the way the runner walks it (each answer, each verdict,
// through the engine's own routing), checked against the rules that keep a mechanic from throwing
// away good parts: a part is condemned only after its own check failed on the path, and the
// controller only after every wire test on the path passed. The schema enforces the same rules by
// graph search; this walk is the second, independent look.
import { describe, expect, it } from 'vitest'
import { cardDefinitionSchema, type CardDefinition, type CardStep } from '../../shared/schemas/testCards'
import { nextAfter, needsMakerData, type StepVerdict } from '../../shared/utils/cardSpec'
import { fmiKind } from '../../shared/utils/dtc'
import { parseCodePattern } from '../../shared/utils/faultMatch'
import { SEED_CARDS } from '../../server/db/seed/cards'

type Visit = { step: CardStep, verdict: StepVerdict }
type Path = { visits: Visit[], end: string }

// Every outcome a step can have, and where the engine sends it. `withData` walks a card as it will
// be once the office enters the maker's data on a step that still waits for it.
function outcomes(step: CardStep, withData: boolean): { verdict: StepVerdict, to: string }[] {
  if (step.measure === 'yes_no') {
    return (['yes', 'no'] as const).map((a) => {
      const verdict: StepVerdict = a === step.passAnswer ? 'pass' : 'fail'
      return { verdict, to: nextAfter(step, verdict, { answer: a }) }
    })
  }
  if (step.measure === 'choice') {
    return (step.options ?? []).map((o) => {
      const verdict: StepVerdict = (step.passOptions ?? []).includes(o) ? 'pass' : 'fail'
      return { verdict, to: nextAfter(step, verdict, { answer: o }) }
    })
  }
  if (needsMakerData(step.spec) && !withData) return [{ verdict: 'unjudged', to: nextAfter(step, 'unjudged') }]
  const out = (['pass', 'low', 'high'] as const).map(v => ({ verdict: v as StepVerdict, to: nextAfter(step, v) }))
  if (step.spec?.kind === 'range' && step.spec.margin !== undefined) {
    // a marginal reading is not a failed one: it is recorded as its own outcome
    for (const v of ['low', 'high'] as const) out.push({ verdict: 'marginal' as StepVerdict, to: nextAfter(step, v, { marginal: true }) })
  }
  return out
}

function walk(card: CardDefinition, withData = false): Path[] {
  const paths: Path[] = []
  const steps = new Map(card.steps.map(s => [s.id, s]))
  const go = (id: string, visits: Visit[]) => {
    const step = steps.get(id)
    if (!step) {
      paths.push({ visits, end: id })
      return
    }
    if (visits.some(v => v.step.id === id)) return // a loop back (measure again) adds no new path
    for (const o of outcomes(step, withData)) go(o.to, [...visits, { step, verdict: o.verdict }])
  }
  go(card.steps[0]!.id, [])
  return paths
}

const FAILED: readonly StepVerdict[] = ['fail', 'low', 'high']
const cards = SEED_CARDS.map(c => ({ slug: c.slug, def: cardDefinitionSchema.parse(c.definition) }))

describe('every path of every seeded card', () => {
  it.each(cards.map(c => [c.slug, c.def] as const))('%s: no part or controller is condemned without its own failed check', (_slug, def) => {
    // as seeded, and as it will be once the maker's data is entered on any step still waiting for it
    const paths = [...walk(def), ...walk(def, true)]
    expect(paths.length).toBeGreaterThan(0)
    const wiring = def.steps.filter(s => s.checks === 'wiring').map(s => s.id)
    const reached = new Set<string>()
    for (const p of paths) {
      const c = def.conclusions.find(x => x.id === p.end)
      expect(c, `path ends at "${p.end}", which is no conclusion`).toBeDefined()
      reached.add(c!.id)
      const route = p.visits.map(v => `${v.step.id}:${v.verdict}`).join(' → ')
      if (!c!.condemns) continue
      if (c!.condemns === 'controller') {
        // every wire test on the path passed, and the path holds every wire test of the card
        for (const v of p.visits.filter(x => x.step.checks === 'wiring')) expect(v.verdict, `${route} → ${c!.id}`).toBe('pass')
        expect(p.visits.map(v => v.step.id).filter(id => wiring.includes(id)).sort(), `${route} → ${c!.id}`).toEqual([...wiring].sort())
      }
      else {
        const own = p.visits.filter(v => v.step.checks === c!.condemns)
        expect(own.some(v => FAILED.includes(v.verdict)), `${route} → ${c!.id} condemns ${c!.condemns}`).toBe(true)
      }
    }
    // every conclusion is the end of some path
    expect([...reached].sort()).toEqual(def.conclusions.map(x => x.id).sort())
  })

  it.each(cards.map(c => [c.slug, c.def] as const))('%s: a conclusion replacing a part or blaming the controller says so', (_slug, def) => {
    for (const c of def.conclusions) {
      if (/^replace\b/i.test(c.text) || /controller/i.test(c.text)) expect(c.condemns, c.text).toBeDefined()
      if (/controller/i.test(c.text)) expect(c.condemns).toBe('controller')
    }
  })

  it.each(cards.map(c => [c.slug, c.def] as const))('%s: its fault codes fit what the card is for', (_slug, def) => {
    // SAE J1939-73 FMI kinds (fmiKind): sensor cards take circuit and signal FMIs, condition cards data-valid ones
    for (const text of def.codePatterns) {
      const p = parseCodePattern(text)
      if (p.form !== 'j1939') continue
      expect(p.fmi === null && p.kind === null, `${text} takes every FMI`).toBe(false)
      const kind = p.kind ?? fmiKind(p.fmi!)
      if (def.kind === 'sensor_circuit') expect(['circuit', 'signal'], text).toContain(kind)
      if (def.kind === 'condition') expect(kind, text).toBe('condition')
    }
  })

  it('the sensor-circuit and condition cards are the ones the codes need', () => {
    // our own library: exhaust and coolant temperatures each have a circuit card and a condition card
    const kinds = Object.fromEntries(cards.map(c => [c.slug, c.def.kind]))
    expect(kinds).toMatchObject({
      'egt-rtd-sensor': 'sensor_circuit', 'aftertreatment-overtemp': 'condition',
      'coolant-temp-ntc': 'sensor_circuit', 'engine-overtemp': 'condition',
      'sensor-5v-reference': 'sensor_circuit', 'dpf-pressure-sensor': 'sensor_circuit', 'def-concentration': 'condition',
    })
    // a condition card never ends at "sensor and circuit good"
    for (const c of cards.filter(x => x.def.kind === 'condition')) {
      for (const end of c.def.conclusions) expect(end.text, c.slug).not.toMatch(/sensor and circuit/i)
    }
  })

  it('the walker finds what a broken card hides', () => {
    // a check that cannot fail proves nothing: hand the walker a card whose pass way replaces the sensor
    const bad = structuredClone(cards.find(c => c.slug === 'egt-rtd-sensor')!.def)
    bad.steps.find(s => s.id === 'sensor-ohms')!.next.pass = 'replace-sensor'
    const failedSensor = (p: Path) => p.visits.some(v => v.step.checks === 'sensor' && FAILED.includes(v.verdict))
    const wrong = walk(bad).filter(p => p.end === 'replace-sensor' && !failedSensor(p))
    expect(wrong.length).toBeGreaterThan(0)
    expect(cardDefinitionSchema.safeParse(bad).success).toBe(false)
  })
})
