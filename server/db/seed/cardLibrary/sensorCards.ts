// Sensor-and-circuit cards: they answer circuit and signal fault codes only (a data-valid code is a
// real condition and goes to a condition card). Fault-code families marked "from memory" are the
// usual SAE J2012 / J1939 assignments as remembered; an admin checks them against the maker's list.
import type { CardDefinitionInput } from '../../../../shared/schemas/testCards'
import { BACK_PROBE, DEFER, HOT_EXHAUST, JUMPER, KEY_OFF, TRAFFIC } from './cautions'
import { twoWireCircuit } from './twoWire'

const circuitAndSignal = (spns: number[]) => spns.flatMap(spn => [`SPN ${spn} FMI circuit`, `SPN ${spn} FMI signal`])

const egt = twoWireCircuit({
  sensor: 'exhaust temperature sensor',
  openValue: 'An open platinum sensor reads as very hot: the value should jump to the top of its range, or the circuit-high code set '
    + 'within a few seconds.',
  shortValue: 'the value should drop to the bottom of its range (very cold), or the circuit-low code set.',
  sensorStep: 'sensor-ohms',
})

export const EGT_CARD: CardDefinitionInput = {
  title: 'Exhaust temperature sensor (platinum RTD) and circuit',
  componentType: 'Exhaust temperature sensor (RTD)',
  kind: 'sensor_circuit',
  summary: 'For circuit and signal codes of a two-wire Pt200-type exhaust or after-treatment temperature sensor: a look, the '
    + 'unplug-and-jumper test with live data, '
    + 'then the sensor judged against the IEC 60751 curve at the pipe’s own temperature, or every wire test when the live data does not '
    + 'follow.',
  // SPN 3241, 3242, 3246 after-treatment exhaust and DPF temperatures, 4765/4766 DOC intake/outlet; P0544–P0549, P2031–P2036
  // EGT sensor circuits, P2080–P2087 EGT range/performance and intermittent (code lists and SPN names of REFERENCES.md §4).
  codePatterns: [...circuitAndSignal([3241, 3242, 3246, 4765, 4766]), 'P0544-P0549', 'P2031-P2036', 'P2080-P2087'],
  cautions: [HOT_EXHAUST, KEY_OFF, BACK_PROBE, JUMPER, TRAFFIC, DEFER],
  tools: [
    'Digital multimeter with fresh battery',
    'Scan tool with live data',
    'Back-probe pins and breakout leads',
    'Fused jumper lead',
    'Contact or infrared thermometer',
    'Wiring diagram for this unit',
    'Anti-seize for the new sensor threads',
  ],
  sources: [
    'IEC 60751 platinum RTD curve (Callendar–Van Dusen), scaled to R0 = 200 Ω',
    '5 V sensor supply 4.8–5.2 V: service procedures (REFERENCES.md §7)',
    'Wire limits (100 kΩ to chassis, 1 Ω end to end, 0.1 V drop under load): common practice',
  ],
  steps: [
    ...egt.first,
    {
      id: 'sensor-ohms', title: 'Sensor resistance at the pipe’s '
        + 'temperature', measure: 'resistance', conditions: 'key_off', partRole: 'installed', checks: 'sensor',
      component: 'Exhaust temperature sensor', pins: 'Sensor side, pin to pin',
      instruction: 'Key off, sensor unplugged. Touch the meter leads together and take that reading off if it is more than a few tenths of '
        + 'an ohm, then measure across the sensor’s two pins. '
        + 'Enter the temperature of the pipe at the sensor beside the reading: the sensor is judged at that temperature, not the air’s.',
      temperatureHint: 'Contact or infrared thermometer on bare pipe right beside the sensor boss; after a soak of 8 h or more the '
        + 'engine’s coolant reading will do.',
      // Exhaust sensors are built to a wider band than IEC class B, and a pipe reading has its own error (common practice).
      spec: { kind: 'rtd', r0: 200, toleranceC: 10 },
      next: { pass: 'circuit-good', fail: 'settled' },
    },
    {
      id: 'settled', title: 'Was the sensor at a steady temperature?', measure: 'yes_no',
      instruction: 'A sensor still cooling reads a different temperature at its tip than the pipe shows: the engine ran or a regeneration '
        + 'ended in the last few hours, '
        + 'the pipe is warm to the hand, or the thermometer is still falling. Was the pipe steady and the same as the sensor’s body when '
        + 'you measured? If not, answer no, let it settle and measure again.',
      passAnswer: 'yes',
      next: { pass: 'new-sensor-ohms', fail: 'sensor-ohms' },
    },
    {
      id: 'new-sensor-ohms', title: 'New sensor beside the old one', measure: 'resistance', conditions: 'key_off',
      partRole: 'new', compareWith: 'sensor-ohms', checks: 'new-part',
      component: 'Replacement exhaust temperature sensor', pins: 'Pin to pin',
      instruction: 'Measure the replacement sensor out of its box the same way. A good new part reads inside its spec and well away from '
        + 'the old one.',
      temperatureHint: 'The new sensor’s own temperature: the air where it has lain for half an hour, out of the sun.',
      spec: { kind: 'rtd', r0: 200, toleranceC: 10 },
      next: { pass: 'replace-sensor', fail: 'new-part-out' },
    },
    ...egt.chain,
  ],
  conclusions: [
    ...egt.conclusions,
    {
      id: 'replace-sensor', text: 'Replace the exhaust temperature sensor', kind: 'fault', condemns: 'sensor',
      detail: 'The installed sensor is out of spec at its own, steady temperature and the new one reads right. Fit it with anti-seize on '
        + 'the threads, torque to the maker’s figure, clear the codes and verify with a drive.',
    },
    {
      id: 'new-part-out', text: 'Recheck before replacing: the new part is out of spec too', kind: 'refer',
      detail: 'Check the temperatures you entered, the meter and its leads, and that the card’s R0 matches this sensor (Pt200 or another); '
        + 'try another new part.',
    },
    {
      id: 'circuit-good', text: 'Sensor and circuit test good: look for an intermittent', kind: 'ok',
      detail: 'Wiggle the harness and connector with live data on, look for chafe that shows only when hot, then clear the codes and '
        + 'verify with a drive.',
    },
  ],
}

const ect = twoWireCircuit({
  sensor: 'coolant temperature sensor',
  openValue: 'An open NTC sensor reads as very cold: the value should drop to the bottom of its range (about −40 °C), or the circuit-high '
    + 'code set within a few seconds.',
  shortValue: 'the value should jump to the top of its range (very hot), or the circuit-low code set.',
  sensorStep: 'ect-ohms',
})

export const ECT_CARD: CardDefinitionInput = {
  title: 'Coolant temperature sensor (NTC thermistor) and circuit',
  componentType: 'Coolant temperature sensor (NTC)',
  kind: 'sensor_circuit',
  summary: 'For circuit and signal codes of a two-wire coolant temperature sensor: a look, the unplug-and-jumper test with live data, then '
    + 'the sensor judged against the maker’s '
    + 'table at its own temperature. The card carries no table of its own: until the office enters the maker’s data, the sensor step is '
    + 'recorded, not judged.',
  // SPN 110 engine coolant temperature, P0115–P0119 engine coolant temperature circuit codes (REFERENCES.md §4).
  codePatterns: [...circuitAndSignal([110]), 'P0115-P0119'],
  cautions: [
    'Unplugging the sensor does not open the cooling system; never remove the sensor from a hot engine: coolant under pressure can scald.',
    'The cooling fan can start on its own with the key on: keep clear of it.',
    KEY_OFF,
    BACK_PROBE,
    JUMPER,
    DEFER,
  ],
  tools: [
    'Digital multimeter',
    'Scan tool with live data',
    'Back-probe pins and breakout leads',
    'Fused jumper lead',
    'Contact or infrared thermometer',
    'Wiring diagram for this unit',
    'The maker’s resistance table for this sensor',
  ],
  sources: [
    'The maker’s resistance table for the sensor fitted (entered by the office)',
    '5 V sensor supply 4.8–5.2 V: service procedures (REFERENCES.md §7)',
    'Wire limits (100 kΩ to chassis, 1 Ω end to end, 0.1 V drop under load): common practice',
  ],
  steps: [
    ...ect.first,
    {
      id: 'ect-ohms', title: 'Sensor resistance at its own '
        + 'temperature', measure: 'resistance', conditions: 'key_off', partRole: 'installed', checks: 'sensor',
      component: 'Coolant temperature sensor', pins: 'Sensor side, pin to pin',
      instruction: 'Key off, sensor unplugged. Measure across the sensor’s pins and enter the temperature of the metal around the sensor '
        + 'beside the reading.',
      temperatureHint: 'Contact thermometer on the thermostat housing or the metal beside the sensor; after a soak of 8 h or more, the oil '
        + 'and intake temperatures in live data. '
        + 'Not the coolant reading itself: that is the sensor under test.',
      spec: { kind: 'needs_maker_data', sensor: 'this coolant temperature sensor' },
      next: { pass: 'circuit-good', fail: 'settled', unjudged: 'not-judged' },
    },
    {
      id: 'settled', title: 'Was the sensor at a steady temperature?', measure: 'yes_no',
      instruction: 'A coolant sensor in a warm engine changes by several ohms a degree: the engine ran in the last few hours or the '
        + 'housing is warm to the hand. '
        + 'Was the engine cold-soaked, or the housing steady and the same as the sensor, when you measured? If not, answer no, let it '
        + 'settle and measure again.',
      passAnswer: 'yes',
      next: { pass: 'ect-new', fail: 'ect-ohms' },
    },
    {
      id: 'ect-new', title: 'New sensor beside the old one', measure: 'resistance', conditions: 'key_off',
      partRole: 'new', compareWith: 'ect-ohms', checks: 'new-part',
      component: 'Replacement coolant temperature sensor', pins: 'Pin to pin',
      instruction: 'Measure the replacement sensor out of its box the same way.',
      temperatureHint: 'The new sensor’s own temperature: the air where it has lain for half an hour, out of the sun.',
      spec: { kind: 'needs_maker_data', sensor: 'this coolant temperature sensor' },
      next: { pass: 'replace-sensor', fail: 'new-part-out', unjudged: 'not-judged' },
    },
    ...ect.chain,
  ],
  conclusions: [
    ...ect.conclusions,
    {
      id: 'replace-sensor', text: 'Replace the coolant temperature sensor', kind: 'fault', condemns: 'sensor',
      detail: 'Have the new sensor ready or drain a little coolant first, top up with the right coolant and bleed the air out.',
    },
    {
      id: 'new-part-out', text: 'Recheck before replacing: the new part is out of spec too', kind: 'refer',
      detail: 'Check the maker’s table in the card against this sensor’s part number, and the temperatures you entered.',
    },
    {
      id: 'circuit-good', text: 'Sensor and circuit test good: look for an intermittent', kind: 'ok',
      detail: 'Wiggle the harness and connector with live data on, then clear the codes and verify with a drive.',
    },
    {
      id: 'not-judged', text: 'Sensor not judged: the card needs the maker’s data', kind: 'refer',
      detail: 'The harness and controller answered the unplug-and-jumper test. Ask the office to enter the maker’s resistance table (or '
        + 'Beta and R25) for this sensor in the card editor. '
        + 'Meanwhile compare the coolant reading with the oil and intake temperatures after a cold soak (Compare like sensors).',
    },
  ],
}

export const REFERENCE_CARD: CardDefinitionInput = {
  title: '5 V sensor supply circuit',
  componentType: 'Sensor supply circuit',
  kind: 'sensor_circuit',
  summary: 'Finds whether a 5 V sensor supply is missing, pulled down by a sensor on it, shorted high, or lost in the wiring: read '
    + 'unplugged and loaded, then every wire test.',
  // SPN 3509–3514 sensor supply voltages 1–6, P0641, P0651, P0697 sensor reference voltage A–C circuits (REFERENCES.md §4);
  // P06A3 reference D (from memory).
  codePatterns: [...circuitAndSignal([3509, 3510, 3511, 3512, 3513, 3514]), 'P0641', 'P0651', 'P0697', 'P06A3'],
  cautions: [KEY_OFF, BACK_PROBE, DEFER],
  tools: ['Digital multimeter', 'Back-probe pins and breakout leads', 'Wiring diagram for this unit'],
  sources: ['5 V sensor supply 4.8–5.2 V: service procedures (REFERENCES.md §7)', 'Wire limits: common practice'],
  steps: [
    {
      id: 'look', title: 'Look at the wiring and connectors first', measure: 'yes_no', conditions: 'key_off', checks: 'wiring',
      component: 'Sensor harness and connectors on this supply',
      instruction: 'Key off. Look along the harness of the sensors on this supply (the wiring diagram lists them): chafe, melted loom, '
        + 'water or corrosion in a connector, pushed-back pins. Is everything sound?',
      passAnswer: 'yes',
      next: { pass: 'ref-open', fail: 'repair-found' },
    },
    {
      id: 'ref-open', title: 'Supply unplugged, against the sensor return', measure: 'voltage', conditions: 'key_on_engine_off',
      component: 'Sensor harness connector', pins: 'Supply pin to sensor return pin, harness side',
      instruction: 'Sensor unplugged, key on, engine off. Measure between the supply pin and the sensor return pin on the harness side.',
      spec: { kind: 'range', min: 4.8, max: 5.2 },
      next: { pass: 'ref-loaded', fail: 'ref-open-battery', high: 'ref-power' },
    },
    {
      id: 'ref-open-battery', title: 'Supply unplugged, against battery negative', measure: 'voltage', conditions: 'key_on_engine_off',
      component: 'Sensor harness connector', pins: 'Supply pin, harness side, to battery negative',
      instruction: 'Same, with the black lead on the battery negative post. Good here but low against the return means the return wire is '
        + 'open. '
        + 'Low here too, with nothing plugged in on this connector: something else on the supply pulls it down, or the wire is open, or '
        + 'the controller does not supply it.',
      spec: { kind: 'range', min: 4.8, max: 5.2 },
      next: { pass: 'ref-power', fail: 'shared-unplug', high: 'ref-power' },
    },
    {
      id: 'shared-unplug', title: 'With the other sensors on this supply '
        + 'unplugged', measure: 'yes_no', conditions: 'key_on_engine_off', checks: 'shared-sensors',
      instruction: 'Key off and unplug the other sensors that share this supply (the wiring diagram). Key on: does the supply still read '
        + 'low? (No: it came back, so one of those sensors or its wiring pulls it down.)',
      passAnswer: 'yes',
      next: { pass: 'ref-power', fail: 'shared-sensor' },
    },
    {
      id: 'ref-loaded', title: 'Supply loaded, back-probed at the sensor', measure: 'voltage', conditions: 'key_on_engine_off',
      component: 'Sensor connector, plugged in', pins: 'Supply pin to sensor return pin, back-probed',
      instruction: 'Plug the sensor in and back-probe its supply and return pins, key on. With the sensor drawing its current, resistance '
        + 'in the wire or a loose pin shows as a lower voltage '
        + 'that an unplugged reading hides.',
      spec: { kind: 'range', min: 4.8, max: 5.2 },
      next: { pass: 'supply-good', fail: 'sensor-swap', high: 'ref-power' },
    },
    {
      id: 'sensor-swap', title: 'A new sensor plugged in: does the supply come '
        + 'back?', measure: 'yes_no', conditions: 'key_on_engine_off', checks: 'sensor', partRole: 'new',
      instruction: 'Key off, plug the new sensor into the harness without fitting it. Key on and back-probe again: does the supply still '
        + 'read low? (No: the new sensor lets it come back, so the old one draws too much.)',
      passAnswer: 'yes',
      next: { pass: 'ref-power', fail: 'replace-sensor' },
    },
    {
      id: 'ref-power', title: 'Supply wire: no voltage from a live '
        + 'wire', measure: 'voltage', conditions: 'key_on_engine_off', checks: 'wiring',
      component: 'Harness between sensor and controller', pins: 'Supply pin at the sensor connector to battery negative, both ends '
        + 'unplugged',
      instruction: 'Key off, unplug the controller connector too. Key on. With both ends unplugged the supply wire must read 0 V: any '
        + 'voltage means it touches a live wire.',
      spec: { kind: 'range', max: 0.5 },
      next: { pass: 'ref-chassis', fail: 'repair-short-power' },
    },
    {
      id: 'ref-chassis', title: 'Supply wire: open to chassis', measure: 'resistance', conditions: 'key_off', checks: 'wiring',
      component: 'Harness between sensor and controller', pins: 'Supply pin to a clean chassis point, both ends unplugged',
      instruction: 'Key off, both ends unplugged, and the other sensors on this supply unplugged too. Over 100 kΩ (OL is best) while you '
        + 'flex the harness.',
      spec: { kind: 'range', min: 100_000 },
      next: { pass: 'ref-ohms', fail: 'repair-short-ground' },
    },
    {
      id: 'ref-ohms', title: 'Supply wire end to end', measure: 'resistance', conditions: 'key_off', checks: 'wiring',
      component: 'Harness between sensor and controller', pins: 'Supply pin at the sensor connector to its pin at the controller',
      instruction: 'Take off the leads’ own reading, then measure the supply wire end to end while you flex the harness.',
      spec: { kind: 'range', max: 1 },
      next: { pass: 'return-ohms', fail: 'repair-open' },
    },
    {
      id: 'return-ohms', title: 'Return wire end to end', measure: 'resistance', conditions: 'key_off', checks: 'wiring',
      component: 'Harness between sensor and controller', pins: 'Return pin at the sensor connector to its pin at the controller',
      instruction: 'Measure the sensor return to its own pin at the controller, not to chassis.',
      spec: { kind: 'range', max: 1 },
      next: { pass: 'ref-drop', fail: 'repair-return' },
    },
    {
      id: 'ref-drop', title: 'Supply wire under load, back-probed', measure: 'voltage', conditions: 'key_on_engine_off', checks: 'wiring',
      component: 'Harness between sensor and controller', pins: 'Supply pin at the sensor to the supply pin at the controller, both '
        + 'back-probed, everything plugged in',
      instruction: 'Plug everything back in, key on. Back-probe the supply pin at the sensor and at the controller with a long lead '
        + 'between them: the meter reads the drop along the wire under load.',
      spec: { kind: 'range', max: 0.1 },
      next: { pass: 'return-drop', fail: 'repair-open' },
    },
    {
      id: 'return-drop', title: 'Return wire under load, '
        + 'back-probed', measure: 'voltage', conditions: 'key_on_engine_off', checks: 'wiring',
      component: 'Harness between sensor and controller', pins: 'Return pin at the sensor to the return pin at the controller, both '
        + 'back-probed',
      instruction: 'The same along the return wire.',
      spec: { kind: 'range', max: 0.1 },
      next: { pass: 'controller', fail: 'repair-return' },
    },
  ],
  conclusions: [
    {
      id: 'supply-good', text: 'Supply good unplugged and loaded: go on to the sensor’s own card', kind: 'ok',
      detail: 'If the code comes and goes, wiggle the harness with the supply back-probed and watch for a dip.',
    },
    { id: 'repair-found', text: 'Repair the wiring or connector you found, then run the card again', kind: 'fault', condemns: 'wiring' },
    {
      id: 'shared-sensor', text: 'A sensor on the shared supply pulls it down', kind: 'fault',
      detail: 'Plug the sensors back one at a time; the one that drops the supply is shorted inside, or its wiring is: run its own card.',
    },
    {
      id: 'replace-sensor', text: 'Replace the sensor: it draws the supply down', kind: 'fault', condemns: 'sensor',
      detail: 'With the new sensor plugged in the supply held; fit it and clear the codes.',
    },
    {
      id: 'repair-short-power', text: 'Repair the supply wire: it touches a live circuit', kind: 'fault', condemns: 'wiring',
      detail: 'Look for chafe against a 12 V or 24 V feed in the same harness.',
    },
    { id: 'repair-short-ground', text: 'Repair the supply wire: it is shorted to chassis', kind: 'fault', condemns: 'wiring' },
    {
      id: 'repair-open', text: 'Repair the supply wire: open or high resistance', kind: 'fault', condemns: 'wiring',
      detail: 'Check the pins at both ends and the splices first.',
    },
    { id: 'repair-return', text: 'Repair the sensor return wire', kind: 'fault', condemns: 'wiring' },
    {
      id: 'controller', text: 'Every wire tests good: check the controller’s power and grounds', kind: 'refer', condemns: 'controller',
      detail: 'Check the controller’s own supply and ground pins under load; follow the maker’s procedure before replacing or '
        + 'reprogramming a controller.',
    },
  ],
}

export const DPF_DP_CARD: CardDefinitionInput = {
  title: 'DPF differential-pressure sensor, hoses and circuit',
  componentType: 'DPF differential-pressure sensor',
  kind: 'sensor_circuit',
  summary: 'For circuit and signal codes of the DPF differential-pressure sensor: hoses and ports first (the usual cause), the zero '
    + 'reading key on engine off, '
    + 'then its supply and wiring before the sensor is condemned.',
  // SPN 3251 DPF differential pressure (REFERENCES.md §4); P2452–P2456 DPF pressure sensor A circuit codes (from memory).
  codePatterns: [...circuitAndSignal([3251]), 'P2452-P2456'],
  cautions: [HOT_EXHAUST, KEY_OFF, BACK_PROBE, TRAFFIC, DEFER],
  tools: [
    'Scan tool with live data',
    'Digital multimeter',
    'Back-probe pins',
    'Hand vacuum or pressure pump with gauge (optional)',
    'Wiring diagram for this unit',
  ],
  sources: [
    '5 V sensor supply 4.8–5.2 V: service procedures (REFERENCES.md §7)',
    'Hose, port and zero checks: common practice; the maker’s zero limit applies',
  ],
  steps: [
    {
      id: 'look', title: 'Look at the wiring and connector first', measure: 'yes_no', conditions: 'key_off', checks: 'wiring',
      component: 'DPF pressure sensor harness and connector',
      instruction: 'Key off. Look at the sensor’s connector and harness: latched, dry, pins clean and straight, loom not melted near the '
        + 'exhaust. Is everything sound?',
      passAnswer: 'yes',
      next: { pass: 'hoses', fail: 'repair-found' },
    },
    {
      id: 'hoses', title: 'Hoses sound, fitted the right way round', measure: 'yes_no', checks: 'hoses',
      component: 'Sensor hoses or tubes',
      instruction: 'Follow both hoses from the sensor to their ports on the DPF: not kinked, cracked, melted or soft, clamps tight, and '
        + 'each on its own port (upstream to the port marked for it; swapped hoses read backwards). Are they?',
      passAnswer: 'yes',
      next: { pass: 'ports', fail: 'fix-hoses' },
    },
    {
      id: 'ports', title: 'Ports clear', measure: 'yes_no', checks: 'ports',
      component: 'Pressure ports on the DPF',
      instruction: 'Engine off and the exhaust cool enough to touch. Take the hoses off at the ports and check each port tube is open (a '
        + 'soft wire pushed in; soot or water plugs them). Are both clear?',
      passAnswer: 'yes',
      next: { pass: 'zero', fail: 'clear-ports' },
    },
    {
      id: 'zero', title: 'Reads about zero key on, engine off', measure: 'yes_no', conditions: 'key_on_engine_off', checks: 'sensor',
      component: 'Scan tool, live data',
      instruction: 'Hoses back on. Key on, engine off: with no flow the differential pressure must read about zero (within the maker’s '
        + 'limit). Does it?',
      passAnswer: 'yes',
      next: { pass: 'rise', fail: 'ref-loaded' },
    },
    {
      id: 'rise', title: 'Rises with flow', measure: 'yes_no', conditions: 'running', checks: 'sensor',
      component: 'Scan tool, live data',
      instruction: 'Start the engine. Raise the speed to high idle and back: does the differential pressure rise smoothly with the flow '
        + 'and fall back to its idle value?',
      passAnswer: 'yes',
      next: { pass: 'sensor-good', fail: 'ref-loaded' },
    },
    {
      id: 'ref-loaded', title: '5 V supply at the sensor, back-probed', measure: 'voltage', conditions: 'key_on_engine_off',
      component: 'Sensor connector, plugged in', pins: 'Supply pin to sensor return pin, back-probed',
      instruction: 'Engine off, key on. Back-probe the sensor’s supply and return pins with it plugged in.',
      spec: { kind: 'range', min: 4.8, max: 5.2 },
      next: { pass: 'return-drop', fail: 'supply-card', high: 'supply-card' },
    },
    {
      id: 'return-drop', title: 'Return wire under load, '
        + 'back-probed', measure: 'voltage', conditions: 'key_on_engine_off', checks: 'wiring',
      component: 'Harness between sensor and controller', pins: 'Return pin at the sensor to the return pin at the controller, both '
        + 'back-probed',
      instruction: 'Back-probe the return pin at the sensor and at the controller with a long lead between them: the drop along the return '
        + 'under load.',
      spec: { kind: 'range', max: 0.1 },
      next: { pass: 'unplugged', fail: 'repair-return' },
    },
    {
      id: 'unplugged', title: 'Unplugged: live data goes to the circuit-low value', measure: 'yes_no', conditions: 'key_on_engine_off',
      component: 'Scan tool, live data',
      instruction: 'Key off, unplug the sensor. Key on: the controller pulls its signal input down, so the reading should go to the bottom '
        + 'of its range or the circuit-low code set. Does it?',
      passAnswer: 'yes',
      next: { pass: 'replace-sensor', fail: 'signal-power' },
    },
    {
      id: 'signal-power', title: 'Signal wire: no voltage from a live '
        + 'wire', measure: 'voltage', conditions: 'key_on_engine_off', checks: 'wiring',
      component: 'Harness between sensor and controller', pins: 'Signal pin at the sensor connector to battery negative, both ends '
        + 'unplugged',
      instruction: 'Key off, unplug the controller connector too. Key on: the signal wire must read 0 V with both ends unplugged.',
      spec: { kind: 'range', max: 0.5 },
      next: { pass: 'signal-chassis', fail: 'repair-short-power' },
    },
    {
      id: 'signal-chassis', title: 'Signal wire: open to chassis', measure: 'resistance', conditions: 'key_off', checks: 'wiring',
      component: 'Harness between sensor and controller', pins: 'Signal pin to a clean chassis point, both ends unplugged',
      instruction: 'Key off. Over 100 kΩ (OL is best) while you flex the harness.',
      spec: { kind: 'range', min: 100_000 },
      next: { pass: 'signal-ohms', fail: 'repair-short-ground' },
    },
    {
      id: 'signal-ohms', title: 'Signal wire end to end', measure: 'resistance', conditions: 'key_off', checks: 'wiring',
      component: 'Harness between sensor and controller', pins: 'Signal pin at the sensor connector to its pin at the controller',
      instruction: 'Take off the leads’ own reading and measure end to end while you flex the harness.',
      spec: { kind: 'range', max: 1 },
      next: { pass: 'controller', fail: 'repair-open' },
    },
  ],
  conclusions: [
    {
      id: 'sensor-good', text: 'Hoses, ports and sensor read right: look for an intermittent', kind: 'ok',
      detail: 'Check for a hose that collapses when hot or water that freezes in a port; clear the codes and verify with a drive.',
    },
    { id: 'repair-found', text: 'Repair the wiring or connector you found, then run the card again', kind: 'fault', condemns: 'wiring' },
    {
      id: 'fix-hoses', text: 'Replace or refit the sensor hoses', kind: 'fault', condemns: 'hoses',
      detail: 'Use heat-rated hose, each on its own port, routed to drain downhill toward the DPF so water cannot sit in it.',
    },
    {
      id: 'clear-ports', text: 'Clear the DPF pressure ports', kind: 'fault', condemns: 'ports',
      detail: 'Clear the soot or water plug, refit the hoses, check the zero reading again.',
    },
    { id: 'supply-card', text: 'The sensor’s 5 V supply is wrong: run the 5 V sensor supply card', kind: 'refer' },
    {
      id: 'replace-sensor', text: 'Replace the DPF differential-pressure sensor', kind: 'fault', condemns: 'sensor',
      detail: 'Hoses, ports, supply and return are good and the controller sees the unplugged value, yet the sensor reads wrong. Fit the '
        + 'new one and check its zero key on, engine off.',
    },
    { id: 'repair-return', text: 'Repair the sensor return wire', kind: 'fault', condemns: 'wiring' },
    { id: 'repair-short-power', text: 'Repair the signal wire: it touches a live circuit', kind: 'fault', condemns: 'wiring' },
    { id: 'repair-short-ground', text: 'Repair the signal wire: it is shorted to chassis', kind: 'fault', condemns: 'wiring' },
    { id: 'repair-open', text: 'Repair the signal wire: open or high resistance', kind: 'fault', condemns: 'wiring' },
    {
      id: 'controller', text: 'Every wire tests good: check the controller’s power and grounds', kind: 'refer', condemns: 'controller',
      detail: 'The signal wire is sound end to end yet the controller does not see the unplugged value. Check its supply and grounds, then '
        + 'follow the maker’s procedure.',
    },
  ],
}
