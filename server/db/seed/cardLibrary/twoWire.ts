// The circuit half of a two-wire temperature sensor card (a platinum RTD or an NTC pulled up by the
// controller): a look first, the unplug-and-jumper test with live data that proves harness and
// controller in two minutes, then, only when that fails, every wire test in one chain, ending at
// the controller only when each of them passed. An ohmmeter alone passes a wire chafed to ground
// or to battery positive, and a ground measured to chassis means nothing where the controller
// isolates the sensor return, so the chain checks each of those on its own.
import type { CardDefinitionInput } from '../../../../shared/schemas/testCards'

type Step = CardDefinitionInput['steps'][number]
type Conclusion = CardDefinitionInput['conclusions'][number]

export interface TwoWireOptions {
  /** 'exhaust temperature sensor' */
  sensor: string
  /** What live data does with the sensor unplugged (an open circuit). */
  openValue: string
  /** What it does with the harness pins jumpered (a short). */
  shortValue: string
  /** The first step once harness and controller are proved: the sensor's own measurement. */
  sensorStep: string
}

export function twoWireCircuit(o: TwoWireOptions): { first: Step[], chain: Step[], conclusions: Conclusion[] } {
  const first: Step[] = [
    {
      id: 'look', title: 'Look at the wiring and connector first', measure: 'yes_no', conditions: 'key_off', checks: 'wiring',
      component: `${o.sensor} harness and connector`,
      instruction: `Key off. Follow the ${o.sensor}’s wiring from the sensor to the controller: `
        + 'chafed or melted loom (near the exhaust especially), a connector not latched, pins pushed back, spread or green with corrosion, '
        + 'water in the connector, a pigtail pulled tight. Is everything sound?',
      passAnswer: 'yes',
      next: { pass: 'unplugged', fail: 'repair-found' },
    },
    {
      id: 'unplugged', title: 'Unplugged: live data goes to the open value', measure: 'yes_no', conditions: 'key_on_engine_off',
      component: 'Scan tool, live data',
      instruction: `Key off, unplug the ${o.sensor}. Key on, engine off, and watch this temperature in the scan tool’s live data. `
        + `${o.openValue} Does it?`,
      passAnswer: 'yes',
      next: { pass: 'jumpered', fail: 'ref-return' },
    },
    {
      id: 'jumpered', title: 'Jumpered: live data goes to the shorted value', measure: 'yes_no', conditions: 'key_on_engine_off',
      component: 'Scan tool, live data', pins: 'Signal to return, harness side',
      instruction: 'Key off. Fit a fused jumper across the two harness pins (signal to return) with a breakout lead. '
        + `Key on: ${o.shortValue} Does it? `
        + 'Both answers right prove the harness and the controller: the fault is in the sensor or comes and goes. Take the jumper off.',
      passAnswer: 'yes',
      next: { pass: o.sensorStep, fail: 'ref-return' },
    },
  ]
  const chain: Step[] = [
    {
      id: 'ref-return', title: 'Supply at the harness, against the sensor return', measure: 'voltage', conditions: 'key_on_engine_off',
      component: 'Sensor harness connector', pins: 'Signal pin to return pin, harness side',
      instruction: 'Sensor unplugged, key on, engine off. Measure between the signal pin and the return pin on the harness side. The '
        + 'controller pulls the signal up to about 5 V '
        + 'through a resistor, so with nothing plugged in the meter reads that supply. High means the signal touches a higher voltage: the '
        + 'wire tests look for it first.',
      spec: { kind: 'range', min: 4.8, max: 5.2 },
      next: { pass: 'signal-power', fail: 'ref-battery', high: 'signal-power' },
    },
    {
      id: 'ref-battery', title: 'Supply at the harness, against battery negative', measure: 'voltage', conditions: 'key_on_engine_off',
      component: 'Sensor harness connector', pins: 'Signal pin, harness side, to battery negative',
      instruction: 'Same, but the black lead on the battery negative post. About 5 V here while the last step read low means the return '
        + 'wire is open or high in resistance; '
        + 'low here as well means the signal wire is open, pulled to ground, or the controller does not supply it. The wire tests that '
        + 'follow find which.',
      spec: { kind: 'range', min: 4.8, max: 5.2 },
      next: { pass: 'signal-power', fail: 'signal-power', high: 'signal-power' },
    },
    {
      id: 'signal-power', title: 'Signal wire: no voltage from a live '
        + 'wire', measure: 'voltage', conditions: 'key_on_engine_off', checks: 'wiring',
      component: 'Harness between sensor and controller', pins: 'Signal pin at the sensor connector to battery negative, both ends '
        + 'unplugged',
      instruction: 'Key off, unplug the controller connector too (the wiring diagram shows which). Key on. With both ends unplugged the '
        + 'signal wire must read 0 V: '
        + 'any voltage means it touches battery positive or another live wire along its run.',
      spec: { kind: 'range', max: 0.5 },
      next: { pass: 'signal-chassis', fail: 'repair-short-power' },
    },
    {
      id: 'signal-chassis', title: 'Signal wire: open to chassis', measure: 'resistance', conditions: 'key_off', checks: 'wiring',
      component: 'Harness between sensor and controller', pins: 'Signal pin at the sensor connector to a clean chassis point, both ends '
        + 'unplugged',
      instruction: 'Key off, both ends still unplugged. Measure from the signal pin to bare chassis metal: it should read over 100 kΩ (OL '
        + 'is best). Flex the harness along its run while you watch.',
      spec: { kind: 'range', min: 100_000 },
      next: { pass: 'signal-ohms', fail: 'repair-short-ground' },
    },
    {
      id: 'signal-ohms', title: 'Signal wire end to end', measure: 'resistance', conditions: 'key_off', checks: 'wiring',
      component: 'Harness between sensor and controller', pins: 'Signal pin at the sensor connector to its pin at the controller',
      instruction: 'Touch the meter leads together first and take that reading off. Measure the signal wire from end to end while you flex '
        + 'the harness.',
      spec: { kind: 'range', max: 1 },
      next: { pass: 'return-ohms', fail: 'repair-open' },
    },
    {
      id: 'return-ohms', title: 'Return wire end to end', measure: 'resistance', conditions: 'key_off', checks: 'wiring',
      component: 'Harness between sensor and controller', pins: 'Return pin at the sensor connector to its pin at the controller',
      instruction: 'Measure the sensor return from its pin at the sensor connector to its own pin at the controller (not to chassis: many '
        + 'controllers keep the sensor return apart from ground).',
      spec: { kind: 'range', max: 1 },
      next: { pass: 'return-drop', fail: 'repair-return' },
    },
    {
      id: 'return-drop', title: 'Return wire under load, '
        + 'back-probed', measure: 'voltage', conditions: 'key_on_engine_off', checks: 'wiring',
      component: 'Harness between sensor and controller', pins: 'Return pin at the sensor to the return pin at the controller, both '
        + 'back-probed, everything plugged in',
      instruction: 'Plug the sensor and the controller back in. Key on. Back-probe the return pin at the sensor connector and at the '
        + 'controller, with a long lead between them: '
        + 'the meter reads the drop along the return with the sensor’s current in it, which a loose pin or a few strands left show and an '
        + 'unloaded ohmmeter does not.',
      spec: { kind: 'range', max: 0.1 },
      next: { pass: 'controller', fail: 'repair-return' },
    },
  ]
  const conclusions: Conclusion[] = [
    {
      id: 'repair-found', text: 'Repair the wiring or connector you found, then run the card again', kind: 'fault', condemns: 'wiring',
      detail: 'Clean or replace corroded pins, re-pin pushed-back ones, seal the connector, and route the harness away from heat and '
        + 'edges.',
    },
    {
      id: 'repair-short-power', text: 'Repair the signal wire: it touches a live circuit', kind: 'fault', condemns: 'wiring',
      detail: 'Find where the harness rubs against a feed wire (often at a clip or a frame edge), repair and insulate both wires, then '
        + 'check the controller’s input still reads right.',
    },
    {
      id: 'repair-short-ground', text: 'Repair the signal wire: it is shorted to chassis', kind: 'fault', condemns: 'wiring',
      detail: 'Find the chafe by flexing the harness section by section with the meter on; repair, insulate and re-clip it away from the '
        + 'edge.',
    },
    {
      id: 'repair-open', text: 'Repair the signal wire: open or high resistance', kind: 'fault', condemns: 'wiring',
      detail: 'Check the pins at both ends for spread or corrosion first, then the splices and the harness near the exhaust.',
    },
    {
      id: 'repair-return', text: 'Repair the sensor return wire', kind: 'fault', condemns: 'wiring',
      detail: 'Check the return pins at both ends and any splice where several sensors share the return.',
    },
    {
      id: 'controller', text: 'Every wire tests good: check the controller’s power and grounds', kind: 'refer', condemns: 'controller',
      detail: 'The wiring passed every test, yet live data did not follow the unplug-and-jumper test. Check the controller’s own supply '
        + 'and ground pins under load and any 5 V supply it shares '
        + 'with other sensors, then follow the maker’s procedure before replacing or reprogramming a controller.',
    },
  ]
  return { first, chain, conclusions }
}
