// Builders for the seeded cards' steps and conclusions, so each card reads as its procedure: the
// shapes every card repeats (a yes-or-no question, the look at the wiring, the wire tests of a
// sensor circuit with the limits they share, the repairs they lead to) are written once here.
import type { CardDefinitionInput } from '../../../../shared/schemas/testCards'

export type Step = CardDefinitionInput['steps'][number]
export type Conclusion = CardDefinitionInput['conclusions'][number]
/** What a step may add to its id, title, measure, instruction and ways on. */
type Details = Partial<Omit<Step, 'id' | 'title' | 'measure' | 'instruction' | 'passAnswer' | 'next'>>

export const HARNESS = 'Harness between sensor and controller'
/** A 5 V sensor supply: service procedures accept 4.8–5.2 V (REFERENCES.md §7). */
export const FIVE_VOLTS = { kind: 'range', min: 4.8, max: 5.2 } as const
// Wire limits, common practice: a live wire shows under 0.5 V, chassis over 100 kΩ, a wire end to
// end under 1 Ω, and under 0.1 V drop with the sensor's current in it.
const NO_VOLTS = { kind: 'range', max: 0.5 } as const
const OPEN_TO_CHASSIS = { kind: 'range', min: 100_000 } as const
const END_TO_END = { kind: 'range', max: 1 } as const
const LOADED_DROP = { kind: 'range', max: 0.1 } as const

/** A question whose good answer is yes: yes goes on to `yes`, no to `no`. */
export function yesNo(id: string, title: string, details: Details & { instruction: string }, ways: { yes: string, no: string }): Step {
  return { id, title, measure: 'yes_no', ...details, passAnswer: 'yes', next: { pass: ways.yes, fail: ways.no } }
}

/** The look at the wiring and connectors that starts a circuit card; what it finds is repaired first. */
export function lookFirst(component: string, instruction: string, then: string, title = 'Look at the wiring and connector first'): Step {
  return yesNo('look', title, { conditions: 'key_off', checks: 'wiring', component, instruction }, { yes: then, no: 'repair-found' })
}

/** A 5 V supply read key on, engine off, against 4.8–5.2 V. */
export function fiveVolts(id: string, title: string, details: Pick<Step, 'component' | 'pins' | 'instruction' | 'next'>): Step {
  return { id, title, measure: 'voltage', conditions: 'key_on_engine_off', ...details, spec: FIVE_VOLTS }
}

type Wire = 'Signal' | 'Supply' | 'Return'
interface WireTest {
  id: string
  wire: Wire
  instruction: string
  /** The next test once this one passes. */
  then: string
}
const wireStep = (t: WireTest, title: string, more: Pick<Step, 'measure' | 'conditions' | 'pins' | 'spec'>, fail: string): Step => (
  { id: t.id, title, ...more, checks: 'wiring', component: HARNESS, instruction: t.instruction, next: { pass: t.then, fail } }
)
const repairOf = (wire: Wire) => (wire === 'Return' ? 'repair-return' : 'repair-open')

/** Both ends unplugged, key on: any voltage means the wire touches battery positive or another live wire. */
export function noVoltsFromLiveWire(t: WireTest): Step {
  const pins = `${t.wire} pin at the sensor connector to battery negative, both ends unplugged`
  const more = { measure: 'voltage', conditions: 'key_on_engine_off', pins, spec: NO_VOLTS } as const
  return wireStep(t, `${t.wire} wire: no voltage from a live wire`, more, 'repair-short-power')
}

/** Both ends unplugged, key off: over 100 kΩ to chassis, which an end-to-end reading cannot show. */
export function openToChassis(t: WireTest): Step {
  const pins = `${t.wire} pin at the sensor connector to a clean chassis point, both ends unplugged`
  const more = { measure: 'resistance', conditions: 'key_off', pins, spec: OPEN_TO_CHASSIS } as const
  return wireStep(t, `${t.wire} wire: open to chassis`, more, 'repair-short-ground')
}

/** The wire from its pin at the sensor connector to its own pin at the controller, key off. */
export function endToEnd(t: WireTest): Step {
  const pins = `${t.wire} pin at the sensor connector to its pin at the controller`
  const more = { measure: 'resistance', conditions: 'key_off', pins, spec: END_TO_END } as const
  return wireStep(t, `${t.wire} wire end to end`, more, repairOf(t.wire))
}

/** The drop along the wire with the sensor's current in it, back-probed at both ends: what an unloaded ohmmeter hides. */
export function dropUnderLoad(t: WireTest): Step {
  const pins = `${t.wire} pin at the sensor to the ${t.wire.toLowerCase()} pin at the controller, both back-probed, everything plugged in`
  const more = { measure: 'voltage', conditions: 'key_on_engine_off', pins, spec: LOADED_DROP } as const
  return wireStep(t, `${t.wire} wire under load, back-probed`, more, repairOf(t.wire))
}

const withDetail = (c: Conclusion, detail?: string): Conclusion => (detail ? { ...c, detail } : c)

/** A fault found: `condemns` names the part (or wiring) whose own check failed on the way here. */
export const fault = (id: string, text: string, condemns: string | undefined, detail?: string): Conclusion =>
  withDetail(condemns ? { id, text, kind: 'fault', condemns } : { id, text, kind: 'fault' }, detail)
/** Sent on: another card, another measurement, a shop, or the maker's procedure (`condemns` when it blames a part). */
export const refer = (id: string, text: string, detail?: string, condemns?: string): Conclusion =>
  withDetail(condemns ? { id, text, kind: 'refer', condemns } : { id, text, kind: 'refer' }, detail)
/** Everything on the way tested good. */
export const good = (id: string, text: string, detail?: string): Conclusion => withDetail({ id, text, kind: 'ok' }, detail)

/** The repairs the wire tests lead to, for the wire they name ('signal', 'supply'). */
export const wireRepairs = {
  found: (detail?: string) => fault('repair-found', 'Repair the wiring or connector you found, then run the card again', 'wiring', detail),
  shortToPower: (wire: string, detail?: string) =>
    fault('repair-short-power', `Repair the ${wire} wire: it touches a live circuit`, 'wiring', detail),
  shortToGround: (wire: string, detail?: string) =>
    fault('repair-short-ground', `Repair the ${wire} wire: it is shorted to chassis`, 'wiring', detail),
  open: (wire: string, detail?: string) => fault('repair-open', `Repair the ${wire} wire: open or high resistance`, 'wiring', detail),
  sensorReturn: (detail?: string) => fault('repair-return', 'Repair the sensor return wire', 'wiring', detail),
}

/** The controller, reached only after every wire test passed (the card schema and tests/unit/cardPaths.test.ts hold it to that). */
export const controllerLast = (detail: string): Conclusion => ({
  id: 'controller', text: 'Every wire tests good: check the controller’s power and grounds', kind: 'refer', condemns: 'controller', detail,
})
