// Condition cards: they answer data-valid fault codes, where the sensor reads right and the truck
// really is too hot or its fluid really is off. They look for the cause; none ends at "sensor and
// circuit good, clear the codes".
import type { CardDefinitionInput } from '../../../../shared/schemas/testCards'
import { DEFER, DEF_SPLASH, FAN, FUEL_PRESSURE, HOT_COOLANT, HOT_EXHAUST, PARKED_REGEN, RUNNING, TRAFFIC } from './cautions'

const condition = (spns: number[]) => spns.map(spn => `SPN ${spn} FMI condition`)

export const ENGINE_OVERTEMP_CARD: CardDefinitionInput = {
  title: 'Engine running hot (coolant over temperature)',
  componentType: 'Cooling system',
  kind: 'condition',
  summary: 'For data-valid coolant temperature and level codes: the engine really is hot. Confirms it with a thermometer, then works '
    + 'through level, cap, fan, airflow, thermostat and flow.',
  // SPN 110 engine coolant temperature, SPN 111 coolant level, P0217 engine coolant over temperature (REFERENCES.md §4).
  codePatterns: [...condition([110, 111]), 'P0217'],
  cautions: [
    HOT_COOLANT,
    FAN,
    RUNNING,
    TRAFFIC,
    'Do not keep running an engine that is overheating: the derate or shutdown is protecting it.',
    DEFER,
  ],
  tools: [
    'Contact or infrared thermometer',
    'Scan tool with live data',
    'Cooling-system and cap pressure tester with the right adapters',
    'Combustion-leak (block) tester',
    'Coolant test strips or refractometer',
  ],
  sources: ['Cooling-system checks: common practice; the maker’s thermostat and cap ratings apply'],
  steps: [
    {
      id: 'confirm', title: 'Is it really hot?', measure: 'yes_no', conditions: 'running',
      component: 'Thermostat housing and upper hose',
      instruction: 'With the engine at its working temperature, compare the coolant temperature in live data with a thermometer on the '
        + 'thermostat housing and the upper hose. Do they agree within about 10 °C?',
      passAnswer: 'yes',
      next: { pass: 'level', fail: 'reading-wrong' },
    },
    {
      id: 'level', title: 'Coolant level and leaks', measure: 'yes_no', conditions: 'key_off', checks: 'coolant-level',
      component: 'Surge tank, hoses, radiator, water pump',
      instruction: 'Engine off and cool (see the cautions). Is the coolant at the cold mark in the surge tank, with no leak under the '
        + 'truck, at the hoses, the radiator, the water pump’s weep hole or the heater lines?',
      passAnswer: 'yes',
      next: { pass: 'cap', fail: 'fill-and-find-leak' },
    },
    {
      id: 'cap', title: 'Pressure cap holds', measure: 'yes_no', checks: 'cap',
      component: 'Pressure cap',
      instruction: 'Test the cap on a pressure tester with the right adapter: does it hold its rated pressure (stamped on the cap) without '
        + 'leaking down?',
      passAnswer: 'yes',
      next: { pass: 'fan', fail: 'replace-cap' },
    },
    {
      id: 'fan', title: 'Fan engages', measure: 'yes_no', conditions: 'running', checks: 'fan',
      component: 'Fan and fan drive',
      instruction: 'Engine running hot, or the fan commanded on with the scan tool: does the fan engage fully (roar, strong airflow), and '
        + 'disengage again when commanded off?',
      passAnswer: 'yes',
      next: { pass: 'airflow', fail: 'repair-fan' },
    },
    {
      id: 'airflow', title: 'Air passes through the cores', measure: 'yes_no', checks: 'airflow',
      component: 'Radiator, charge-air cooler, condenser, shroud',
      instruction: 'Look between the stacked cores with a light: no mud, chaff, bugs or plastic blocking them, fins not flattened, the '
        + 'shroud and its seals in place and the fan centred in it. Is the airflow clear?',
      passAnswer: 'yes',
      next: { pass: 'thermostat', fail: 'clean-cores' },
    },
    {
      id: 'thermostat', title: 'Thermostats open', measure: 'yes_no', conditions: 'running', checks: 'thermostat',
      component: 'Upper radiator hose',
      instruction: 'Warm the engine with the fan off. Once the coolant passes the thermostats’ opening temperature (stamped on them), the '
        + 'upper radiator hose should turn hot quickly. Does it?',
      passAnswer: 'yes',
      next: { pass: 'radiator-flow', fail: 'replace-thermostat' },
    },
    {
      id: 'radiator-flow', title: 'Radiator core warm all across', measure: 'yes_no', conditions: 'running', checks: 'radiator',
      component: 'Radiator core',
      instruction: 'Engine hot, thermostats open: scan the radiator core with an infrared thermometer from side to side and top to bottom. '
        + 'Is it warm all across, with no cold bands (blocked tubes)?',
      passAnswer: 'yes',
      next: { pass: 'combustion-gas', fail: 'radiator-blocked' },
    },
    {
      id: 'combustion-gas', title: 'No combustion gas in the coolant', measure: 'yes_no', conditions: 'running', checks: 'head-gasket',
      component: 'Surge tank',
      instruction: 'Run a combustion-leak test at the surge tank (block-tester fluid), or watch for a stream of bubbles with the engine '
        + 'running. Is the coolant free of combustion gas?',
      passAnswer: 'yes',
      next: { pass: 'no-cause', fail: 'combustion-leak' },
    },
  ],
  conclusions: [
    {
      id: 'reading-wrong', text: 'The reading does not match the engine: run the coolant temperature sensor card', kind: 'refer',
      detail: 'A sensor reading high but in range sets a data-valid code; the sensor card judges it at its own temperature.',
    },
    {
      id: 'fill-and-find-leak', text: 'Find and fix the leak, then fill and bleed the system', kind: 'fault', condemns: 'coolant-level',
      detail: 'A pressure test of the cold system finds slow leaks; bleed the air out as the maker says and check the level again after a '
        + 'run.',
    },
    {
      id: 'replace-cap', text: 'Replace the pressure cap', kind: 'fault', condemns: 'cap',
      detail: 'Use a cap of the same rating; check the filler neck seat is not damaged.',
    },
    {
      id: 'repair-fan', text: 'Repair the fan drive or its control', kind: 'fault', condemns: 'fan',
      detail: 'Check the air or electrical supply to the fan clutch and its command first, then the clutch itself.',
    },
    {
      id: 'clean-cores', text: 'Clean the cores and restore the shroud', kind: 'fault', condemns: 'airflow',
      detail: 'Wash from the fan side outward at low pressure; straighten fins; refit shroud seals.',
    },
    {
      id: 'replace-thermostat', text: 'Replace the thermostats', kind: 'fault', condemns: 'thermostat',
      detail: 'Fit the maker’s rating and new seals; bleed the air out.',
    },
    { id: 'radiator-blocked', text: 'Radiator blocked inside: flush or recore it', kind: 'fault', condemns: 'radiator' },
    {
      id: 'combustion-leak', text: 'Combustion gas in the coolant: engine repair needed', kind: 'refer', condemns: 'head-gasket',
      detail: 'A head gasket, a cracked head or an injector sleeve: refer the truck to a shop; do not run it hot.',
    },
    {
      id: 'no-cause', text: 'No cause found yet: check the water pump, the coolant mix and the load', kind: 'refer',
      detail: 'Check the water pump drive and impeller, the coolant’s mix and condition, and whether the truck was overloaded or climbing '
        + 'in heat; compare with the maker’s procedure.',
    },
  ],
}

export const AFTERTREATMENT_OVERTEMP_CARD: CardDefinitionInput = {
  title: 'After-treatment running hot (exhaust over temperature)',
  componentType: 'Exhaust after-treatment',
  kind: 'condition',
  summary: 'For data-valid exhaust temperature codes: the exhaust really is too hot. Checks the sensors agree at rest, then oil or coolant '
    + 'in the exhaust, the doser, and the DOC in a parked regeneration.',
  // SPN 3241, 3242, 3246, 4765, 4766 exhaust temperatures (REFERENCES.md §4); P2428–P2429 exhaust gas temperature too high
  // (from memory).
  codePatterns: [...condition([3241, 3242, 3246, 4765, 4766]), 'P2428-P2429'],
  cautions: [HOT_EXHAUST, PARKED_REGEN, FUEL_PRESSURE, RUNNING, TRAFFIC, DEFER],
  tools: [
    'Scan tool with live data and parked regeneration',
    'Contact or infrared thermometer',
    'Doser leak-test kit if the maker has one',
    'Fire extinguisher',
  ],
  sources: ['After-treatment checks: common practice; the maker’s regeneration limits apply'],
  steps: [
    {
      id: 'soak-compare', title: 'Exhaust sensors agree at rest', measure: 'yes_no', conditions: 'key_on_engine_off',
      component: 'Scan tool, live data',
      instruction: 'After a cold soak (8 h or more), key on, engine off: do all the exhaust temperatures read within about 10 °C of each '
        + 'other and of the air? (Running, they differ by design.)',
      passAnswer: 'yes',
      next: { pass: 'oil-coolant', fail: 'sensor-first' },
    },
    {
      id: 'oil-coolant', title: 'No oil or coolant reaching the exhaust', measure: 'yes_no', checks: 'engine-leak',
      component: 'Turbocharger outlet, exhaust joints, intake boots',
      instruction: 'Look for oil or coolant getting into the exhaust: a wet turbo outlet or exhaust joints, oil in the intake boots, blue '
        + 'or white smoke, coolant use. Is the exhaust dry and clean?',
      passAnswer: 'yes',
      next: { pass: 'doser-idle', fail: 'engine-leak' },
    },
    {
      id: 'doser-idle', title: 'DOC no hotter than its inlet at idle', measure: 'yes_no', conditions: 'running', checks: 'doser',
      component: 'Scan tool, live data',
      instruction: 'Engine idling, no regeneration running: is the DOC outlet temperature within about 30 °C of the DOC inlet? A leaking '
        + 'doser or a dribbling injector burns fuel on the DOC and makes its outlet hotter.',
      passAnswer: 'yes',
      next: { pass: 'parked-regen', fail: 'doser-leak' },
    },
    {
      id: 'doser-leak', title: 'Doser holds', measure: 'yes_no', checks: 'doser',
      component: 'Exhaust doser (hydrocarbon injector)',
      instruction: 'Run the maker’s doser leak test, or with the engine running and the doser not commanded, look at its nozzle: no fuel '
        + 'at the tip. Does it hold?',
      passAnswer: 'yes',
      next: { pass: 'injectors', fail: 'replace-doser' },
    },
    {
      id: 'parked-regen', title: 'Parked regeneration stays within limits', measure: 'yes_no', conditions: 'running', checks: 'doc',
      component: 'Scan tool, parked regeneration',
      instruction: 'Run a parked regeneration from the scan tool (see the cautions). As dosing starts, does the DOC outlet climb well '
        + 'above its inlet, and do all temperatures stay within the maker’s limits to the end?',
      passAnswer: 'yes',
      next: { pass: 'regen-done', fail: 'doc-face' },
    },
  ],
  conclusions: [
    { id: 'sensor-first', text: 'One sensor disagrees at rest: run the exhaust temperature sensor card on it first', kind: 'refer' },
    {
      id: 'engine-leak', text: 'Stop oil or coolant reaching the exhaust before any regeneration', kind: 'fault', condemns: 'engine-leak',
      detail: 'Turbo seals, a leaking injector or a head gasket: burning oil or coolant overheats the DPF and can crack it.',
    },
    {
      id: 'injectors', text: 'Doser holds: look for an injector that dribbles', kind: 'refer',
      detail: 'A cylinder contribution or cut-out test with the scan tool, and the maker’s procedure.',
    },
    {
      id: 'replace-doser', text: 'Replace the exhaust doser', kind: 'fault', condemns: 'doser',
      detail: 'Check the DOC face for fuel soaking before the next regeneration.',
    },
    {
      id: 'doc-face', text: 'DOC not lighting off or temperatures out of limits: inspect the DOC', kind: 'fault', condemns: 'doc',
      detail: 'Look at the DOC face for soot or oil glazing; clean or replace it as the maker says.',
    },
    {
      id: 'regen-done', text: 'Parked regeneration completed within limits', kind: 'ok',
      detail: 'The cause was soot load; clear the codes and verify with a drive, and note the duty cycle (long idling builds soot).',
    },
  ],
}

export const DEF_CARD: CardDefinitionInput = {
  title: 'DEF quality: concentration and contamination',
  componentType: 'Diesel exhaust fluid (DEF)',
  kind: 'condition',
  summary: 'For data-valid DEF quality codes: the fluid itself. A look, hydrocarbon strips and a coolant check, then the concentration '
    + 'against ISO 22241 (31.8–33.2 %), '
    + 'with a second sample when the first reads just outside, before anything is drained.',
  // SPN 3516 DEF concentration, SPN 3364 DEF tank quality (REFERENCES.md §4); P207F reductant quality performance (from memory).
  codePatterns: [...condition([3516, 3364]), 'P207F'],
  cautions: [DEF_SPLASH, HOT_EXHAUST, 'Keep the sample clean: dirt in a DEF tank can ruin the dosing system.', DEFER],
  tools: [
    'DEF refractometer (reads % urea)',
    'Clean sample cups and pipettes',
    'Distilled water to zero the refractometer',
    'Hydrocarbon test strips for DEF',
  ],
  sources: [
    'ISO 22241-1: urea 32.5 % by mass, 31.8–33.2 % (REFERENCES.md §8)',
    'Handheld refractometers read to about ±0.5 %: common practice',
  ],
  steps: [
    {
      id: 'sample-look', title: 'Sample clear and clean', measure: 'yes_no', checks: 'def',
      instruction: 'Take a sample from the tank into a clean cup. Is it clear, with no crystals, oil or fuel sheen, colour or dirt?',
      passAnswer: 'yes',
      next: { pass: 'hydrocarbon', fail: 'contaminated' },
    },
    {
      id: 'hydrocarbon', title: 'No fuel or oil (test strip)', measure: 'yes_no', checks: 'def',
      instruction: 'Dip a hydrocarbon test strip in the sample as its maker says. Does it show no fuel or oil?',
      passAnswer: 'yes',
      next: { pass: 'coolant', fail: 'contaminated' },
    },
    {
      id: 'coolant', title: 'No coolant in the DEF', measure: 'yes_no', checks: 'def-heater',
      instruction: 'Where the DEF tank is heated by engine coolant, a leaking heater coil puts coolant in the DEF: a green, orange or pink '
        + 'tint, a sweet smell, a DEF level that rose, or coolant lost. Is the DEF free of coolant?',
      passAnswer: 'yes',
      next: { pass: 'def-pct', fail: 'coolant-in-def' },
    },
    {
      id: 'def-pct', title: 'DEF concentration', measure: 'concentration', checks: 'def',
      component: 'DEF tank',
      instruction: 'Zero the refractometer with distilled water, then put a few drops of the sample on the prism and read the urea '
        + 'percentage.',
      spec: { kind: 'range', min: 31.8, max: 33.2, margin: 0.5 },
      next: { pass: 'def-ok', fail: 'diluted', high: 'too-strong', marginal: 'second-pct' },
    },
    {
      id: 'second-pct', title: 'Second sample', measure: 'concentration', checks: 'def',
      component: 'DEF tank',
      instruction: 'The first reading was just outside the limits, where the refractometer itself may be off. Clean and zero it again with '
        + 'distilled water, take a fresh sample from the middle of the tank (not the fill neck) and read again.',
      spec: { kind: 'range', min: 31.8, max: 33.2, margin: 0.5 },
      next: { pass: 'def-ok', fail: 'diluted', high: 'too-strong', marginal: 'lab-check' },
    },
  ],
  conclusions: [
    {
      id: 'def-ok', text: 'DEF within specification', kind: 'ok',
      detail: 'The fluid is good: if the code stays, the DEF quality sensor or its wiring is next (maker’s procedure).',
    },
    {
      id: 'diluted', text: 'DEF diluted: drain, flush and refill with fresh DEF', kind: 'fault', condemns: 'def',
      detail: 'Find how water got in (wrong fill, rain through the cap).',
    },
    {
      id: 'too-strong', text: 'DEF too strong: drain and refill with fresh DEF', kind: 'fault', condemns: 'def',
      detail: 'Old or evaporated DEF concentrates; check the stock it came from.',
    },
    {
      id: 'contaminated', text: 'DEF contaminated: drain and clean the tank before refilling', kind: 'fault', condemns: 'def',
      detail: 'Fuel or oil in the DEF system can damage the pump, lines and catalyst: do not run the dosing system; follow the maker’s '
        + 'procedure.',
    },
    {
      id: 'coolant-in-def', text: 'Coolant in the DEF: pressure-test the tank’s heater coil', kind: 'fault', condemns: 'def-heater',
      detail: 'Drain and clean the DEF tank, repair or replace the heater, and check the coolant level.',
    },
    {
      id: 'lab-check', text: 'Both samples just outside: confirm before draining', kind: 'refer',
      detail: 'Read it with a second refractometer or send a sample to a lab before draining a tank that may be good.',
    },
  ],
}
