// Condition cards: they answer data-valid fault codes, where the sensor reads right and the truck
// really is too hot or its fluid really is off. They look for the cause; none ends at "sensor and
// circuit good, clear the codes".
import type { CardDefinitionInput } from '../../../../shared/schemas/testCards'
import { DEFER, DEF_SPLASH, FAN, FUEL_PRESSURE, HOT_COOLANT, HOT_EXHAUST, PARKED_REGEN, RUNNING, TRAFFIC } from './cautions'
import { fault, good, refer, yesNo } from './steps'

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
    yesNo('confirm', 'Is it really hot?', {
      conditions: 'running',
      component: 'Thermostat housing and upper hose',
      instruction: 'With the engine at its working temperature, compare the coolant temperature in live data with a thermometer on the '
        + 'thermostat housing and the upper hose. Do they agree within about 10 °C?',
    }, { yes: 'level', no: 'reading-wrong' }),
    yesNo('level', 'Coolant level and leaks', {
      conditions: 'key_off', checks: 'coolant-level',
      component: 'Surge tank, hoses, radiator, water pump',
      instruction: 'Engine off and cool (see the cautions). Is the coolant at the cold mark in the surge tank, with no leak under the '
        + 'truck, at the hoses, the radiator, the water pump’s weep hole or the heater lines?',
    }, { yes: 'cap', no: 'fill-and-find-leak' }),
    yesNo('cap', 'Pressure cap holds', {
      checks: 'cap',
      component: 'Pressure cap',
      instruction: 'Test the cap on a pressure tester with the right adapter: does it hold its rated pressure (stamped on the cap) without '
        + 'leaking down?',
    }, { yes: 'fan', no: 'replace-cap' }),
    yesNo('fan', 'Fan engages', {
      conditions: 'running', checks: 'fan',
      component: 'Fan and fan drive',
      instruction: 'Engine running hot, or the fan commanded on with the scan tool: does the fan engage fully (roar, strong airflow), and '
        + 'disengage again when commanded off?',
    }, { yes: 'airflow', no: 'repair-fan' }),
    yesNo('airflow', 'Air passes through the cores', {
      checks: 'airflow',
      component: 'Radiator, charge-air cooler, condenser, shroud',
      instruction: 'Look between the stacked cores with a light: no mud, chaff, bugs or plastic blocking them, fins not flattened, the '
        + 'shroud and its seals in place and the fan centred in it. Is the airflow clear?',
    }, { yes: 'thermostat', no: 'clean-cores' }),
    yesNo('thermostat', 'Thermostats open', {
      conditions: 'running', checks: 'thermostat',
      component: 'Upper radiator hose',
      instruction: 'Warm the engine with the fan off. Once the coolant passes the thermostats’ opening temperature (stamped on them), the '
        + 'upper radiator hose should turn hot quickly. Does it?',
    }, { yes: 'radiator-flow', no: 'replace-thermostat' }),
    yesNo('radiator-flow', 'Radiator core warm all across', {
      conditions: 'running', checks: 'radiator',
      component: 'Radiator core',
      instruction: 'Engine hot, thermostats open: scan the radiator core with an infrared thermometer from side to side and top to bottom. '
        + 'Is it warm all across, with no cold bands (blocked tubes)?',
    }, { yes: 'combustion-gas', no: 'radiator-blocked' }),
    yesNo('combustion-gas', 'No combustion gas in the coolant', {
      conditions: 'running', checks: 'head-gasket',
      component: 'Surge tank',
      instruction: 'Run a combustion-leak test at the surge tank (block-tester fluid), or watch for a stream of bubbles with the engine '
        + 'running. Is the coolant free of combustion gas?',
    }, { yes: 'no-cause', no: 'combustion-leak' }),
  ],
  conclusions: [
    refer('reading-wrong', 'The reading does not match the engine: run the coolant temperature sensor card',
      'A sensor reading high but in range sets a data-valid code; the sensor card judges it at its own temperature.'),
    fault('fill-and-find-leak', 'Find and fix the leak, then fill and bleed the system', 'coolant-level',
      'A pressure test of the cold system finds slow leaks; bleed the air out as the maker says and check the level again after a '
      + 'run.'),
    fault('replace-cap', 'Replace the pressure cap', 'cap',
      'Use a cap of the same rating; check the filler neck seat is not damaged.'),
    fault('repair-fan', 'Repair the fan drive or its control', 'fan',
      'Check the air or electrical supply to the fan clutch and its command first, then the clutch itself.'),
    fault('clean-cores', 'Clean the cores and restore the shroud', 'airflow',
      'Wash from the fan side outward at low pressure; straighten fins; refit shroud seals.'),
    fault('replace-thermostat', 'Replace the thermostats', 'thermostat',
      'Fit the maker’s rating and new seals; bleed the air out.'),
    fault('radiator-blocked', 'Radiator blocked inside: flush or recore it', 'radiator'),
    refer('combustion-leak', 'Combustion gas in the coolant: engine repair needed',
      'A head gasket, a cracked head or an injector sleeve: refer the truck to a shop; do not run it hot.', 'head-gasket'),
    refer('no-cause', 'No cause found yet: check the water pump, the coolant mix and the load',
      'Check the water pump drive and impeller, the coolant’s mix and condition, and whether the truck was overloaded or climbing '
      + 'in heat; compare with the maker’s procedure.'),
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
    yesNo('soak-compare', 'Exhaust sensors agree at rest', {
      conditions: 'key_on_engine_off',
      component: 'Scan tool, live data',
      instruction: 'After a cold soak (8 h or more), key on, engine off: do all the exhaust temperatures read within about 10 °C of each '
        + 'other and of the air? (Running, they differ by design.)',
    }, { yes: 'oil-coolant', no: 'sensor-first' }),
    yesNo('oil-coolant', 'No oil or coolant reaching the exhaust', {
      checks: 'engine-leak',
      component: 'Turbocharger outlet, exhaust joints, intake boots',
      instruction: 'Look for oil or coolant getting into the exhaust: a wet turbo outlet or exhaust joints, oil in the intake boots, blue '
        + 'or white smoke, coolant use. Is the exhaust dry and clean?',
    }, { yes: 'doser-idle', no: 'engine-leak' }),
    yesNo('doser-idle', 'DOC no hotter than its inlet at idle', {
      conditions: 'running', checks: 'doser',
      component: 'Scan tool, live data',
      instruction: 'Engine idling, no regeneration running: is the DOC outlet temperature within about 30 °C of the DOC inlet? A leaking '
        + 'doser or a dribbling injector burns fuel on the DOC and makes its outlet hotter.',
    }, { yes: 'parked-regen', no: 'doser-leak' }),
    yesNo('doser-leak', 'Doser holds', {
      checks: 'doser',
      component: 'Exhaust doser (hydrocarbon injector)',
      instruction: 'Run the maker’s doser leak test, or with the engine running and the doser not commanded, look at its nozzle: no fuel '
        + 'at the tip. Does it hold?',
    }, { yes: 'injectors', no: 'replace-doser' }),
    yesNo('parked-regen', 'Parked regeneration stays within limits', {
      conditions: 'running', checks: 'doc',
      component: 'Scan tool, parked regeneration',
      instruction: 'Run a parked regeneration from the scan tool (see the cautions). As dosing starts, does the DOC outlet climb well '
        + 'above its inlet, and do all temperatures stay within the maker’s limits to the end?',
    }, { yes: 'regen-done', no: 'doc-face' }),
  ],
  conclusions: [
    refer('sensor-first', 'One sensor disagrees at rest: run the exhaust temperature sensor card on it first'),
    fault('engine-leak', 'Stop oil or coolant reaching the exhaust before any regeneration', 'engine-leak',
      'Turbo seals, a leaking injector or a head gasket: burning oil or coolant overheats the DPF and can crack it.'),
    refer('injectors', 'Doser holds: look for an injector that dribbles',
      'A cylinder contribution or cut-out test with the scan tool, and the maker’s procedure.'),
    fault('replace-doser', 'Replace the exhaust doser', 'doser',
      'Check the DOC face for fuel soaking before the next regeneration.'),
    fault('doc-face', 'DOC not lighting off or temperatures out of limits: inspect the DOC', 'doc',
      'Look at the DOC face for soot or oil glazing; clean or replace it as the maker says.'),
    good('regen-done', 'Parked regeneration completed within limits',
      'The cause was soot load; clear the codes and verify with a drive, and note the duty cycle (long idling builds soot).'),
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
    yesNo('sample-look', 'Sample clear and clean', {
      checks: 'def',
      instruction: 'Take a sample from the tank into a clean cup. Is it clear, with no crystals, oil or fuel sheen, colour or dirt?',
    }, { yes: 'hydrocarbon', no: 'contaminated' }),
    yesNo('hydrocarbon', 'No fuel or oil (test strip)', {
      checks: 'def',
      instruction: 'Dip a hydrocarbon test strip in the sample as its maker says. Does it show no fuel or oil?',
    }, { yes: 'coolant', no: 'contaminated' }),
    yesNo('coolant', 'No coolant in the DEF', {
      checks: 'def-heater',
      instruction: 'Where the DEF tank is heated by engine coolant, a leaking heater coil puts coolant in the DEF: a green, orange or pink '
        + 'tint, a sweet smell, a DEF level that rose, or coolant lost. Is the DEF free of coolant?',
    }, { yes: 'def-pct', no: 'coolant-in-def' }),
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
    good('def-ok', 'DEF within specification',
      'The fluid is good: if the code stays, the DEF quality sensor or its wiring is next (maker’s procedure).'),
    fault('diluted', 'DEF diluted: drain, flush and refill with fresh DEF', 'def',
      'Find how water got in (wrong fill, rain through the cap).'),
    fault('too-strong', 'DEF too strong: drain and refill with fresh DEF', 'def',
      'Old or evaporated DEF concentrates; check the stock it came from.'),
    fault('contaminated', 'DEF contaminated: drain and clean the tank before refilling', 'def',
      'Fuel or oil in the DEF system can damage the pump, lines and catalyst: do not run the dosing system; follow the maker’s '
      + 'procedure.'),
    fault('coolant-in-def', 'Coolant in the DEF: pressure-test the tank’s heater coil', 'def-heater',
      'Drain and clean the DEF tank, repair or replace the heater, and check the coolant level.'),
    refer('lab-check', 'Both samples just outside: confirm before draining',
      'Read it with a second refractometer or send a sample to a lab before draining a tank that may be good.'),
  ],
}
