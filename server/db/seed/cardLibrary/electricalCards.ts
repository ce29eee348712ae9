// Batteries, cranking and charging, and a smart sensor on the CAN bus.
import type { CardDefinitionInput } from '../../../../shared/schemas/testCards'
import { BACK_PROBE, BATTERY, DEFER, HOT_EXHAUST, KEY_OFF, RUNNING, TRAFFIC } from './cautions'

export const BATTERY_CARD: CardDefinitionInput = {
  title: 'Batteries: each one isolated, charged and load tested',
  componentType: 'Batteries',
  kind: 'condition',
  summary: 'For data-valid low-voltage codes and no-crank calls: each battery read on its own (a pack in parallel hides a bad one), its '
    + 'state of charge from the resting voltage, '
    + 'then a load or conductance test at its temperature. 12 V and 24 V systems alike: each 12 V battery is tested alone.',
  // SPN 168 battery potential, SPN 158 key switch battery potential, P0560–P0563 system voltage (REFERENCES.md §4).
  codePatterns: ['SPN 168 FMI condition', 'SPN 158 FMI condition', 'P0560-P0563'],
  cautions: [
    BATTERY,
    'On a 24 V system the pack can deliver a heavy arc across a dropped tool: take care where tools lie and wear no rings or watch.',
    TRAFFIC,
    DEFER,
  ],
  tools: [
    'Digital multimeter',
    'Carbon-pile load tester or a conductance tester',
    'Thermometer for the battery',
    'Eye protection and gloves',
    'Battery charger',
  ],
  sources: [
    'State of charge from a battery maker’s open-circuit table at 80 °F (REFERENCES.md §7)',
    'Load test at half the cold-cranking rating for 15 s, least voltage by temperature (from memory)',
  ],
  steps: [
    {
      id: 'isolate', title: 'Each battery on its own', measure: 'yes_no', conditions: 'key_off',
      component: 'Battery box',
      instruction: 'Key off, lights off, and the truck stood at least an hour with nothing charging (or switch the headlights on for a '
        + 'minute and off to take off surface charge). '
        + 'Disconnect each battery’s cables, negative first, so each stands alone: in parallel they read the average and hide a bad one. '
        + 'On a 24 V system each 12 V battery is read alone too. '
        + 'Is the battery you are testing now on its own?',
      passAnswer: 'yes',
      next: { pass: 'soc', fail: 'isolate-first' },
    },
    {
      id: 'soc', title: 'State of charge from resting voltage', measure: 'calc', conditions: 'key_off', checks: 'charge',
      component: 'One 12 V battery', pins: 'On its posts, not the cable clamps',
      instruction: 'Measure across the battery’s own posts. A cold battery reads a little lower at the same charge. Below three-quarters '
        + 'charged, a load test cannot judge it: charge it first.',
      calc: { fn: 'battery_soc', systemVolts: 12, minPct: 75 },
      next: { pass: 'tester', fail: 'charge-first', low: 'charge-first' },
    },
    {
      id: 'tester', title: 'Which tester?', measure: 'choice',
      instruction: 'Test the battery with a carbon-pile load tester, or with a conductance tester set to the battery’s rating.',
      options: ['Load tester', 'Conductance tester'],
      passOptions: ['Load tester', 'Conductance tester'],
      routes: [{ option: 'Load tester', to: 'load' }, { option: 'Conductance tester', to: 'conductance' }],
      next: { pass: 'load', fail: 'conductance' },
    },
    {
      id: 'load', title: 'Load test at its temperature', measure: 'calc', checks: 'battery',
      component: 'One 12 V battery',
      instruction: 'Load the battery at half its cold-cranking rating for 15 seconds and read the voltage at the end, on its posts. Enter '
        + 'the battery’s own temperature: a cold battery is allowed a little less.',
      calc: { fn: 'battery_load' },
      next: { pass: 'battery-good', fail: 'replace-battery' },
    },
    {
      id: 'conductance', title: 'Conductance tester result', measure: 'choice', checks: 'battery',
      component: 'One 12 V battery',
      instruction: 'Set the tester to the battery’s type and rating and read its verdict.',
      options: ['Good', 'Good, recharge', 'Charge and retest', 'Replace', 'Bad cell'],
      passOptions: ['Good', 'Good, recharge'],
      routes: [{ option: 'Charge and retest', to: 'charge-first' }],
      next: { pass: 'battery-good', fail: 'replace-battery' },
    },
  ],
  conclusions: [
    {
      id: 'isolate-first', text: 'Isolate the batteries first, then run the card again', kind: 'refer',
      detail: 'Batteries in a pack read the average: a shorted or sulphated one hides behind the good ones.',
    },
    {
      id: 'charge-first', text: 'Charge this battery, let it rest, then test it again', kind: 'refer',
      detail: 'Slow-charge to full, let it stand an hour (or remove the surface charge) and run the card again; one that will not take a '
        + 'charge fails its load test.',
    },
    {
      id: 'battery-good', text: 'This battery is good: test the next one the same way', kind: 'ok',
      detail: 'When every battery is good, run the cranking and charging card for the cables, starter and alternator.',
    },
    {
      id: 'replace-battery', text: 'Replace this battery', kind: 'fault', condemns: 'battery',
      detail: 'Fit the same type and rating, test the others in the pack, and follow the fleet’s practice on replacing a pack together.',
    },
  ],
}

export const CRANKING_CHARGING_CARD: CardDefinitionInput = {
  title: 'Cranking and charging: cables, starter voltage, alternator output and ripple',
  componentType: 'Starting and charging system',
  kind: 'system',
  summary: 'With good batteries: cranking voltage, the drop across the cranking cables at cranking load, then the charging voltage, the '
    + 'alternator’s current and its ripple '
    + 'before the alternator is condemned. 12 V and 24 V systems.',
  // SPN 167 charging system potential, P0620–P0622 generator control, lamp and field circuits (REFERENCES.md §4).
  codePatterns: ['SPN 167 FMI condition', 'SPN 167 FMI circuit', 'P0620-P0622'],
  cautions: [
    BATTERY,
    RUNNING,
    'Disable fueling before cranking tests as the maker says, crank for no more than 15 seconds at a time, and let the starter cool '
    + 'between tries.',
    TRAFFIC,
    DEFER,
  ],
  tools: ['Digital multimeter with min/max and AC volts', 'DC clamp meter', 'Long test leads', 'Belt tension gauge'],
  sources: [
    'Cranking circuit total drop under 0.5 V (12 V) and 1.0 V (24 V): a US Army technical manual’s cable test (REFERENCES.md §7)',
    'Cranking voltage at least 9.6 V on 12 V: common practice (doubled on 24 V)',
    'Charging 13.5–14.5 V on 12 V: common practice (REFERENCES.md §7)',
    'Ripple under 0.5 V AC: common practice',
  ],
  steps: [
    {
      id: 'batteries-first', title: 'Batteries tested good first', measure: 'yes_no',
      instruction: 'Has every battery passed the battery card today? A weak battery makes every cranking reading look like a cable or a '
        + 'starter fault.',
      passAnswer: 'yes',
      next: { pass: 'crank-volts', fail: 'battery-card' },
    },
    {
      id: 'crank-volts', title: 'Voltage while cranking', measure: 'calc', conditions: 'cranking', checks: 'cranking',
      component: 'Battery pack', pins: 'Positive to negative post of the pack',
      instruction: 'Fueling disabled. Set the meter to min/max, crank for up to 15 seconds and read the lowest voltage at the battery '
        + 'posts.',
      calc: { fn: 'system_volts', label: 'Lowest voltage while cranking', min12: 9.6 },
      next: { pass: 'cable-drop', fail: 'starter-draw', low: 'starter-draw' },
    },
    {
      id: 'cable-drop', title: 'Cranking cables under load', measure: 'calc', conditions: 'cranking', checks: 'wiring',
      component: 'Cranking cables',
      instruction: 'Long leads: crank and read the drop from the battery positive post to the starter’s battery terminal, then from the '
        + 'battery negative post to the starter’s housing. '
        + 'The meter reads the loss in the cables and their connections at cranking current, which an ohmmeter cannot show.',
      calc: { fn: 'cable_drop' },
      next: { pass: 'charge-volts', fail: 'repair-cables', high: 'repair-cables' },
    },
    {
      id: 'charge-volts', title: 'Charging voltage, loads on', measure: 'calc', conditions: 'running', checks: 'alternator',
      component: 'Battery pack', pins: 'Positive to negative post of the pack',
      instruction: 'Engine at fast idle with the headlights, blower and other loads on. Measure at the battery posts.',
      calc: { fn: 'system_volts', label: 'Charging voltage at the batteries', min12: 13.5, max12: 14.5 },
      next: { pass: 'ripple', fail: 'belt', low: 'belt', high: 'sense-lead' },
    },
    {
      id: 'ripple', title: 'Ripple at the alternator output', measure: 'voltage', conditions: 'running', checks: 'alternator',
      component: 'Alternator output terminal', pins: 'Output terminal to the alternator housing, meter on AC volts',
      instruction: 'Engine at fast idle with the loads on, meter on AC volts: a failed diode shows as ripple.',
      spec: { kind: 'range', max: 0.5 },
      next: { pass: 'system-good', fail: 'replace-alternator' },
    },
    {
      id: 'belt', title: 'Belt and pulley sound', measure: 'yes_no', checks: 'belt',
      component: 'Alternator drive belt',
      instruction: 'Engine off. Is the belt tensioned to the maker’s figure, not glazed or cracked, the tensioner working and the pulley '
        + 'not slipping on its shaft?',
      passAnswer: 'yes',
      next: { pass: 'charge-drop', fail: 'repair-belt' },
    },
    {
      id: 'charge-drop', title: 'Charging cable drop', measure: 'voltage', conditions: 'running', checks: 'wiring',
      component: 'Charging cable', pins: 'Alternator output terminal to battery positive post',
      instruction: 'Engine at fast idle, loads on. Measure from the alternator’s output terminal to the battery positive post: the loss in '
        + 'the charging cable and its fuses or links.',
      spec: { kind: 'range', max: 0.5 },
      next: { pass: 'alt-current', fail: 'repair-charge-cable' },
    },
    {
      id: 'alt-current', title: 'Alternator current near its rating', measure: 'yes_no', conditions: 'running', checks: 'alternator',
      component: 'Alternator output cable', pins: 'Clamp meter around the output cable',
      instruction: 'Load the system (a carbon pile across the batteries, or every load on) at fast idle: does the alternator put out close '
        + 'to its rated current (on its label), at least 90 %?',
      passAnswer: 'yes',
      next: { pass: 'ripple', fail: 'replace-alternator' },
    },
    {
      id: 'sense-lead', title: 'Sense lead reads what the batteries do', measure: 'yes_no', conditions: 'running', checks: 'sense-lead',
      component: 'Alternator remote sense lead',
      instruction: 'If the alternator has a remote sense lead, does it read the same as the battery posts within 0.2 V with the engine '
        + 'running? (No sense lead: answer yes.)',
      passAnswer: 'yes',
      next: { pass: 'replace-alternator', fail: 'repair-sense-lead' },
    },
  ],
  conclusions: [
    { id: 'battery-card', text: 'Test the batteries first (battery card)', kind: 'refer' },
    {
      id: 'starter-draw', text: 'Cranking voltage low with good batteries: measure the starter’s current', kind: 'refer',
      detail: 'A clamp meter on the starter cable while cranking; compare with the maker’s figure before condemning the starter or the '
        + 'engine’s drag.',
    },
    {
      id: 'repair-cables', text: 'Repair the cranking cable or connection with the drop', kind: 'fault', condemns: 'wiring',
      detail: 'Measure across each connection on the high side to find the one that loses the voltage; clean or replace it.',
    },
    { id: 'repair-belt', text: 'Repair the alternator drive', kind: 'fault', condemns: 'belt' },
    { id: 'repair-charge-cable', text: 'Repair the charging cable or its fuse link', kind: 'fault', condemns: 'wiring' },
    { id: 'repair-sense-lead', text: 'Repair the alternator’s sense lead', kind: 'fault', condemns: 'sense-lead' },
    {
      id: 'replace-alternator', text: 'Replace the alternator', kind: 'fault', condemns: 'alternator',
      detail: 'Its output, current or ripple failed with a sound belt and cables. Fit a matching unit, then measure the charging voltage '
        + 'again.',
    },
    {
      id: 'system-good', text: 'Cranking and charging good', kind: 'ok',
      detail: 'If the complaint was a flat battery, look for a draw with the key off (parasitic draw) next.',
    },
  ],
}

export const NOX_CARD: CardDefinitionInput = {
  title: 'NOx sensor on the CAN bus: power, ground and network',
  componentType: 'Smart NOx sensor',
  kind: 'system',
  summary: 'For circuit, signal and network codes of a NOx sensor with its own module on the CAN bus: power and ground under load, the bus '
    + 'resistance key off and '
    + 'its resting voltages, before the sensor is condemned.',
  // SPN 3216 SCR intake NOx, SPN 3226 outlet NOx (REFERENCES.md §4); U029D–U029E lost communication with NOx sensors
  // (from memory).
  codePatterns: [
    'SPN 3216 FMI circuit',
    'SPN 3216 FMI signal',
    'SPN 3216 FMI network',
    'SPN 3226 FMI circuit',
    'SPN 3226 FMI signal',
    'SPN 3226 FMI network',
    'U029D-U029E',
  ],
  cautions: [HOT_EXHAUST, KEY_OFF, BACK_PROBE, TRAFFIC, DEFER],
  tools: ['Digital multimeter', 'Back-probe pins and breakout leads', 'Scan tool', 'Wiring diagram for this unit'],
  sources: [
    'CAN bus: two 120 Ω terminators in parallel read about 60 Ω key off; about 120 Ω with one missing, about 40 Ω with an extra one; each '
    + 'line about 2.5 V at rest (SAE J1939 physical layer, as commonly taught)',
    'Supply and ground drops: common practice',
  ],
  steps: [
    {
      id: 'look', title: 'Look at the wiring and connectors first', measure: 'yes_no', conditions: 'key_off', checks: 'wiring',
      component: 'NOx sensor module, its probe lead and connectors',
      instruction: 'Key off. Look at the sensor module and both its connectors (the probe lead and the harness): latched, dry, pins clean, '
        + 'the probe lead clear of the exhaust and not pulled tight. Is everything sound?',
      passAnswer: 'yes',
      next: { pass: 'power-drop', fail: 'repair-found' },
    },
    {
      id: 'power-drop', title: 'Power feed under load', measure: 'voltage', conditions: 'key_on_engine_off', checks: 'wiring',
      component: 'NOx module connector, plugged in', pins: 'Battery positive post to the module’s power pin, back-probed',
      instruction: 'Key on. Back-probe the module’s power pin with it plugged in and measure to the battery positive post: the loss along '
        + 'the feed. Full battery voltage means no power at all: check its fuse.',
      spec: { kind: 'range', max: 0.5 },
      next: { pass: 'ground-drop', fail: 'repair-power' },
    },
    {
      id: 'ground-drop', title: 'Ground under load', measure: 'voltage', conditions: 'key_on_engine_off', checks: 'wiring',
      component: 'NOx module connector, plugged in', pins: 'Module’s ground pin, back-probed, to the battery negative post',
      instruction: 'Key on, plugged in: from the module’s ground pin to the battery negative post.',
      spec: { kind: 'range', max: 0.2 },
      next: { pass: 'can-ohms', fail: 'repair-ground' },
    },
    {
      id: 'can-ohms', title: 'CAN bus resistance, key off', measure: 'resistance', conditions: 'key_off', checks: 'wiring',
      component: 'NOx module connector, harness side', pins: 'CAN-H to CAN-L',
      instruction: 'Key off and wait a minute for the modules to sleep. Unplug the module and measure CAN-H to CAN-L on the harness side. '
        + 'About 60 Ω: both terminators there. About 120 Ω: one missing or the bus open. About 40 Ω: an extra terminator. Near 0: the two '
        + 'lines shorted together.',
      spec: { kind: 'range', min: 50, max: 70 },
      next: { pass: 'can-high', fail: 'fix-termination', low: 'fix-termination', high: 'fix-termination' },
    },
    {
      id: 'can-high', title: 'CAN-H at rest', measure: 'voltage', conditions: 'key_on_engine_off', checks: 'wiring',
      component: 'NOx module connector, plugged in', pins: 'CAN-H, back-probed, to battery negative',
      instruction: 'Plug the module back in, key on. Each CAN line sits about 2.5 V; with traffic on the bus a meter shows CAN-H a little '
        + 'above that.',
      spec: { kind: 'range', min: 2, max: 3.5 },
      next: { pass: 'can-low', fail: 'repair-can' },
    },
    {
      id: 'can-low', title: 'CAN-L at rest', measure: 'voltage', conditions: 'key_on_engine_off', checks: 'wiring',
      component: 'NOx module connector, plugged in', pins: 'CAN-L, back-probed, to battery negative',
      instruction: 'The same on CAN-L: about 2.5 V, a little below it with traffic.',
      spec: { kind: 'range', min: 1.5, max: 3 },
      next: { pass: 'talks', fail: 'repair-can' },
    },
    {
      id: 'talks', title: 'The sensor answers on the bus', measure: 'yes_no', conditions: 'key_on_engine_off', checks: 'nox-sensor',
      component: 'Scan tool',
      instruction: 'Clear the codes and let the sensor warm up (engine running if its maker says). Does the scan tool see the sensor and '
        + 'its readings, with no code coming back?',
      passAnswer: 'yes',
      next: { pass: 'sensor-good', fail: 'replace-nox' },
    },
  ],
  conclusions: [
    { id: 'repair-found', text: 'Repair the wiring or connector you found, then run the card again', kind: 'fault', condemns: 'wiring' },
    { id: 'repair-power', text: 'Repair the sensor’s power feed (fuse, relay or wire)', kind: 'fault', condemns: 'wiring' },
    { id: 'repair-ground', text: 'Repair the sensor’s ground', kind: 'fault', condemns: 'wiring' },
    {
      id: 'fix-termination', text: 'Repair the CAN bus: termination or a short between the lines', kind: 'fault', condemns: 'wiring',
      detail: 'About 120 Ω: find the missing terminator or the open line; about 40 Ω: the extra terminator; near 0: the short between '
        + 'CAN-H and CAN-L.',
    },
    {
      id: 'repair-can', text: 'Repair the CAN line that sits off its resting voltage', kind: 'fault', condemns: 'wiring',
      detail: 'Look for a line shorted to ground or to power, or a module dragging it (unplug modules one at a time).',
    },
    {
      id: 'replace-nox', text: 'Replace the NOx sensor', kind: 'fault', condemns: 'nox-sensor',
      detail: 'Power, ground and bus are good and the sensor still does not answer. Some makers need the new sensor registered: follow the '
        + 'maker’s procedure.',
    },
    {
      id: 'sensor-good', text: 'Power, ground and bus good, and the sensor answers: look for an intermittent', kind: 'ok',
      detail: 'Check the probe lead near the exhaust and the connector for heat damage; verify with a drive.',
    },
  ],
}
