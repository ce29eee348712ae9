// Wayside's own starter test cards, written from general trade knowledge in our own words.
// They are a starting point: an admin edits them to the maker's data for the units the shop
// sees (each edit makes a new version). Fault-code patterns marked "from memory" are the usual
// SAE J2012 / J1939 assignments as remembered and should be checked against the maker's list.
import type { NodePgDatabase } from 'drizzle-orm/node-postgres'
import * as t from '../schema'
import { cardDefinitionSchema, type CardDefinitionInput } from '../../../shared/schemas/testCards'
import { seedId } from './ids'

const HOT_EXHAUST = 'Exhaust pipes, the DPF, the SCR can and their sensors stay hot long after shutdown, and hotter still after a regeneration: let them cool, wear gloves, and keep clear of the tailpipe outlet.'
const TRAFFIC = 'Work from the side away from traffic where you can; the scene checklist comes first.'
const KEY_OFF = 'Key off before you unplug or plug in a connector: unplugging with the key on can set more codes or damage a controller.'
const RUNNING = 'With the engine running, keep hands, sleeves, leads and hair clear of the fan and belts, set the parking brakes, chock the wheels, and have nobody in the cab who might move the truck.'
const BATTERY = 'Batteries give off hydrogen that a spark can ignite: eye protection on, no flames or sparks near them, and never lay a tool across the terminals.'
const DEFER = 'Follow the maker’s procedure and specs for this unit where they differ; local rules and licensed practice come first.'

export const SEED_CARDS: { slug: string, definition: CardDefinitionInput }[] = [
  {
    slug: 'egt-rtd-sensor',
    definition: {
      title: 'Exhaust temperature sensor (platinum RTD) and circuit',
      componentType: 'Exhaust temperature sensor (RTD)',
      summary: 'Checks a Pt200-type exhaust or after-treatment temperature sensor against the IEC 60751 curve at ambient, then its 5 V reference, ground and the wire to the controller, and measures the new part beside the old one.',
      // SPN 3241/3242/3246/4765: exhaust and after-treatment gas temperatures; P0544–P0546, P2031–P2033: EGT circuits (from memory).
      codePatterns: ['SPN 3241 FMI *', 'SPN 3242 FMI *', 'SPN 3246 FMI *', 'SPN 4765 FMI *', 'P0544', 'P0545', 'P0546', 'P2031', 'P2032', 'P2033'],
      cautions: [HOT_EXHAUST, KEY_OFF, TRAFFIC, DEFER],
      tools: ['Digital multimeter with fresh battery', 'Back-probe pins or breakout leads', 'Wiring diagram for this unit', 'Thermometer for the ambient temperature', 'Anti-seize for the new sensor threads'],
      steps: [
        {
          id: 'sensor-ohms', title: 'Sensor resistance at ambient', measure: 'resistance', conditions: 'key_off', partRole: 'installed',
          component: 'Exhaust temperature sensor', pins: 'Sensor side, pin to pin',
          instruction: 'Let the exhaust cool to the air temperature. Unplug the sensor and measure across its two pins on the sensor side. Touch the meter leads together first and take that reading off if it is more than a few tenths of an ohm.',
          spec: { kind: 'rtd', r0: 200, tolerancePct: 2 },
          next: { pass: 'ref-volts', fail: 'new-sensor-ohms' },
        },
        {
          id: 'new-sensor-ohms', title: 'New sensor beside the old one', measure: 'resistance', conditions: 'key_off', partRole: 'new', compareWith: 'sensor-ohms',
          component: 'Replacement exhaust temperature sensor', pins: 'Pin to pin',
          instruction: 'Measure the replacement sensor out of its box the same way, at the same air temperature. A good new part should read inside the spec and well away from the old one.',
          spec: { kind: 'rtd', r0: 200, tolerancePct: 2 },
          next: { pass: 'replace-sensor', fail: 'new-part-out' },
        },
        {
          id: 'ref-volts', title: '5 V reference at the harness', measure: 'voltage', conditions: 'key_on_engine_off',
          component: 'Sensor harness connector', pins: 'Signal pin to ground pin, harness side',
          instruction: 'Sensor still unplugged. Key on, engine off. Measure between the signal and ground pins on the harness side.',
          spec: { kind: 'range', min: 4.8, max: 5.2 },
          next: { pass: 'ground-ohms', fail: 'ref-wire-ohms' },
        },
        {
          id: 'ground-ohms', title: 'Sensor ground path', measure: 'resistance', conditions: 'key_off',
          component: 'Sensor harness connector', pins: 'Ground pin, harness side, to battery negative',
          instruction: 'Key off. Measure from the ground pin on the harness side to the battery negative post.',
          spec: { kind: 'range', max: 5 },
          next: { pass: 'signal-wire-ohms', fail: 'repair-ground' },
        },
        {
          id: 'signal-wire-ohms', title: 'Signal wire to the controller', measure: 'resistance', conditions: 'key_off',
          component: 'Harness between sensor and controller', pins: 'Sensor connector signal pin to the controller pin (see the wiring diagram)',
          instruction: 'Key off, controller connector unplugged. Measure from the signal pin at the sensor connector to its pin at the controller. Flex the harness along its run while you watch the meter.',
          spec: { kind: 'range', max: 1 },
          next: { pass: 'circuit-good', fail: 'repair-wiring' },
        },
        {
          id: 'ref-wire-ohms', title: 'Reference wire to the controller', measure: 'resistance', conditions: 'key_off',
          component: 'Harness between sensor and controller', pins: 'Sensor connector signal pin to the controller pin (see the wiring diagram)',
          instruction: 'Key off, controller connector unplugged. Measure the same wire end to end. Also check it reads OL to the ground pin and to chassis.',
          spec: { kind: 'range', max: 1 },
          next: { pass: 'check-controller', fail: 'repair-wiring' },
        },
      ],
      conclusions: [
        { id: 'replace-sensor', text: 'Replace sensor', kind: 'fault', detail: 'The installed sensor is out of spec and the new one reads right. Fit it with anti-seize on the threads, torque to the maker’s figure, clear the codes and verify.' },
        { id: 'new-part-out', text: 'Recheck before replacing: the new part is out of spec too', kind: 'refer', detail: 'Check the ambient temperature you entered, the meter and its leads; try another new part.' },
        { id: 'repair-ground', text: 'Repair the sensor ground circuit', kind: 'fault', detail: 'Find the high resistance between the sensor ground pin and battery negative (connector, splice or ground point).' },
        { id: 'repair-wiring', text: 'Repair wiring between the sensor connector and the controller', kind: 'fault', detail: 'Find the open or high-resistance section; check pins for spread or corrosion and the harness for chafe near the exhaust.' },
        { id: 'circuit-good', text: 'Sensor and circuit test good', kind: 'ok', detail: 'Look for an intermittent: loose or wet connector, chafe that shows only when hot. Clear the codes and verify with a drive.' },
        { id: 'check-controller', text: 'Wiring good but no reference: check the controller', kind: 'refer', detail: 'Check the controller’s power and grounds and any shared 5 V reference; follow the maker’s procedure before replacing a controller.' },
      ],
    },
  },
  {
    slug: 'coolant-temp-ntc',
    definition: {
      title: 'Coolant temperature sensor (NTC thermistor)',
      componentType: 'Coolant temperature sensor (NTC)',
      summary: 'Compares a cold-soaked coolant temperature sensor with its Beta curve at ambient, then checks its reference and ground. Set R25 and Beta to the maker’s data for the sensor fitted.',
      // SPN 110 engine coolant temperature (REFERENCES §4); P0115–P0118 ECT circuit codes (from memory).
      codePatterns: ['SPN 110 FMI *', 'P0115', 'P0116', 'P0117', 'P0118'],
      cautions: ['Never open the cooling system hot: coolant under pressure can scald. Let the engine cool before removing a sensor.', 'The cooling fan can start on its own with the key on: keep clear of it.', KEY_OFF, DEFER],
      tools: ['Digital multimeter', 'Back-probe pins', 'Thermometer for the ambient temperature', 'Wiring diagram for this unit'],
      steps: [
        {
          id: 'ect-ohms', title: 'Sensor resistance after a cold soak', measure: 'resistance', conditions: 'key_off', partRole: 'installed',
          component: 'Coolant temperature sensor', pins: 'Sensor side, pin to pin',
          instruction: 'The engine must have stood off for several hours so the coolant is at air temperature. Unplug the sensor and measure across its pins.',
          spec: { kind: 'ntc_beta', r25: 10000, beta: 3950, tolerancePct: 5 },
          next: { pass: 'ect-ref', fail: 'ect-new' },
        },
        {
          id: 'ect-new', title: 'New sensor beside the old one', measure: 'resistance', conditions: 'key_off', partRole: 'new', compareWith: 'ect-ohms',
          component: 'Replacement coolant temperature sensor', pins: 'Pin to pin',
          instruction: 'Measure the replacement sensor at the same air temperature.',
          spec: { kind: 'ntc_beta', r25: 10000, beta: 3950, tolerancePct: 5 },
          next: { pass: 'replace-sensor', fail: 'new-part-out' },
        },
        {
          id: 'ect-ref', title: '5 V reference at the harness', measure: 'voltage', conditions: 'key_on_engine_off',
          component: 'Sensor harness connector', pins: 'Signal pin to ground pin, harness side',
          instruction: 'Sensor unplugged, key on, engine off. Measure between the two harness pins.',
          spec: { kind: 'range', min: 4.8, max: 5.2 },
          next: { pass: 'ect-ground', fail: 'repair-wiring' },
        },
        {
          id: 'ect-ground', title: 'Sensor ground path', measure: 'resistance', conditions: 'key_off',
          component: 'Sensor harness connector', pins: 'Ground pin, harness side, to battery negative',
          instruction: 'Key off. Measure from the harness ground pin to the battery negative post.',
          spec: { kind: 'range', max: 5 },
          next: { pass: 'circuit-good', fail: 'repair-ground' },
        },
      ],
      conclusions: [
        { id: 'replace-sensor', text: 'Replace sensor', kind: 'fault', detail: 'Drain enough coolant first or have the new sensor ready, top up with the right coolant and bleed the air out.' },
        { id: 'new-part-out', text: 'Recheck before replacing: the new part is out of spec too', kind: 'refer', detail: 'Check the card’s R25 and Beta against the maker’s data for this sensor, and the ambient you entered.' },
        { id: 'repair-wiring', text: 'Repair the reference or signal wiring to the controller', kind: 'fault' },
        { id: 'repair-ground', text: 'Repair the sensor ground circuit', kind: 'fault' },
        { id: 'circuit-good', text: 'Sensor and circuit test good', kind: 'ok', detail: 'Compare the sensor with the oil and intake temperatures in live data after a cold soak (like-sensor comparison).' },
      ],
    },
  },
  {
    slug: 'battery-charging',
    definition: {
      title: 'Battery state of charge and charging voltage (12 V)',
      componentType: 'Batteries and charging system',
      summary: 'Open-circuit voltage for state of charge, then regulated charging voltage with the engine running. For a 12 V system; double the figures for 24 V.',
      // SPN 168 battery potential (dtc.ts, from memory); P0560–P0563 system voltage (from memory).
      codePatterns: ['SPN 168 FMI *', 'SPN 158 FMI *', 'P0560', 'P0562', 'P0563'],
      cautions: [BATTERY, RUNNING, DEFER],
      tools: ['Digital multimeter', 'Eye protection and gloves', 'Battery load tester or conductance tester'],
      steps: [
        {
          id: 'rest-volts', title: 'Battery voltage at rest', measure: 'voltage', conditions: 'key_off',
          component: 'Battery pack', pins: 'Positive post to negative post',
          instruction: 'Engine off for at least an hour, lights off. Measure on the posts themselves, not the cable clamps. About 12.45 V is three-quarters charged at 27 °C; each battery in a pack should read within a tenth of a volt of the others.',
          spec: { kind: 'range', min: 12.45 },
          next: { pass: 'charge-volts', fail: 'charge-volts-low-batt' },
        },
        {
          id: 'charge-volts', title: 'Charging voltage, engine running', measure: 'voltage', conditions: 'running',
          component: 'Battery pack', pins: 'Positive post to negative post',
          instruction: 'Start the engine and hold a fast idle with the headlights and blower on. Measure at the battery posts.',
          spec: { kind: 'range', min: 13.5, max: 14.5 },
          next: { pass: 'battery-ok', fail: 'charging-low', high: 'charging-high' },
        },
        {
          id: 'charge-volts-low-batt', title: 'Charging voltage, engine running (battery was low)', measure: 'voltage', conditions: 'running',
          component: 'Battery pack', pins: 'Positive post to negative post',
          instruction: 'Start the engine and hold a fast idle with the headlights and blower on. Measure at the battery posts.',
          spec: { kind: 'range', min: 13.5, max: 14.5 },
          next: { pass: 'charge-and-test', fail: 'charging-low', high: 'charging-high' },
        },
      ],
      conclusions: [
        { id: 'battery-ok', text: 'Batteries charged and charging system regulating', kind: 'ok' },
        { id: 'charge-and-test', text: 'Charging works; charge the batteries and load test them', kind: 'fault', detail: 'Replace any battery that will not hold a charge; look for a parasitic draw if they run down standing.' },
        { id: 'charging-low', text: 'Charging voltage low: check belt, cables and alternator output', kind: 'fault', detail: 'Check belt tension and condition, voltage drop on the charging cables, then the alternator output.' },
        { id: 'charging-high', text: 'Charging voltage high: regulator overcharging', kind: 'fault', detail: 'Overcharging boils batteries and harms electronics: check the alternator’s sense lead and regulator.' },
      ],
    },
  },
  {
    slug: 'def-concentration',
    definition: {
      title: 'DEF concentration with a refractometer',
      componentType: 'Diesel exhaust fluid (DEF)',
      summary: 'Reads the urea concentration of the DEF in the tank against the ISO 22241 range 31.8–33.2 %.',
      // SPN 3516 DEF concentration, SPN 3364 DEF quality; P207F reductant quality (from memory).
      codePatterns: ['SPN 3516 FMI *', 'SPN 3364 FMI *', 'P207F'],
      cautions: ['DEF irritates eyes and skin: wear eye protection and gloves, rinse any splash with plenty of water.', HOT_EXHAUST, 'Keep the sample clean: dirt in a DEF tank can ruin the dosing system.', DEFER],
      tools: ['DEF refractometer (reads % urea)', 'Clean sample cup or pipette', 'Distilled water to zero the refractometer'],
      steps: [
        {
          id: 'sample-look', title: 'Sample clear and clean', measure: 'yes_no',
          instruction: 'Take a sample from the tank into a clean cup. Is it clear, with no crystals, oil, fuel or dirt?',
          passAnswer: 'yes',
          next: { pass: 'def-pct', fail: 'contaminated' },
        },
        {
          id: 'def-pct', title: 'DEF concentration', measure: 'concentration', component: 'DEF tank',
          instruction: 'Zero the refractometer with distilled water, then put a few drops of the sample on the prism and read the urea percentage.',
          spec: { kind: 'range', min: 31.8, max: 33.2 },
          next: { pass: 'def-ok', fail: 'diluted', high: 'too-strong' },
        },
      ],
      conclusions: [
        { id: 'def-ok', text: 'DEF within specification', kind: 'ok', detail: 'If the code stays, check the DEF quality sensor and its wiring.' },
        { id: 'diluted', text: 'DEF diluted: drain, flush and refill with fresh DEF', kind: 'fault', detail: 'Find how water got in (wrong fill, rain through the cap).' },
        { id: 'too-strong', text: 'DEF too strong: drain and refill with fresh DEF', kind: 'fault', detail: 'Old or evaporated DEF concentrates; check the stock it came from.' },
        { id: 'contaminated', text: 'DEF contaminated: drain and clean the tank before refilling', kind: 'fault', detail: 'Fuel or oil in the DEF system can damage the pump, lines and catalyst: follow the maker’s procedure.' },
      ],
    },
  },
  {
    slug: 'sensor-5v-reference',
    definition: {
      title: '5 V sensor reference circuit',
      componentType: 'Sensor reference circuit',
      summary: 'Finds whether a 5 V sensor supply is missing, pulled down by a shared sensor, shorted high, or lost in the wiring.',
      // SPN 3509–3511 sensor supply voltages; P0641, P0651, P0697 reference voltage circuits (from memory).
      codePatterns: ['SPN 3509 FMI *', 'SPN 3510 FMI *', 'SPN 3511 FMI *', 'P0641', 'P0651', 'P0697'],
      cautions: [KEY_OFF, 'Never probe into the front of a connector pin: back-probe or use a breakout lead, or the pin spreads and makes a new fault.', DEFER],
      tools: ['Digital multimeter', 'Back-probe pins or breakout leads', 'Wiring diagram for this unit'],
      steps: [
        {
          id: 'ref-volts', title: 'Reference at the sensor connector', measure: 'voltage', conditions: 'key_on_engine_off',
          component: 'Sensor harness connector', pins: 'Reference pin to sensor ground pin, harness side',
          instruction: 'Sensor unplugged, key on, engine off. Measure between the reference pin and the sensor ground pin.',
          spec: { kind: 'range', min: 4.8, max: 5.2 },
          next: { pass: 'ground-drop', fail: 'unplug-shared', high: 'shorted-high' },
        },
        {
          id: 'ground-drop', title: 'Sensor ground voltage drop', measure: 'voltage', conditions: 'key_on_engine_off',
          component: 'Sensor ground circuit', pins: 'Sensor ground pin to battery negative',
          instruction: 'Sensor plugged back in (back-probe). Measure from the sensor ground pin to the battery negative post.',
          spec: { kind: 'range', max: 0.1 },
          next: { pass: 'circuit-good', fail: 'repair-ground' },
        },
        {
          id: 'unplug-shared', title: 'Reference with shared sensors unplugged', measure: 'yes_no', conditions: 'key_on_engine_off',
          instruction: 'Key off, unplug the other sensors that share this reference (see the wiring diagram), key on again. Does the reference now read 4.8–5.2 V?',
          passAnswer: 'yes',
          next: { pass: 'shared-sensor', fail: 'ref-wire' },
        },
        {
          id: 'ref-wire', title: 'Reference wire to the controller', measure: 'resistance', conditions: 'key_off',
          component: 'Harness between sensor and controller', pins: 'Reference pin to its controller pin',
          instruction: 'Key off, controller connector unplugged. Measure the reference wire end to end.',
          spec: { kind: 'range', max: 1 },
          next: { pass: 'check-controller', fail: 'repair-wiring' },
        },
      ],
      conclusions: [
        { id: 'circuit-good', text: 'Reference and ground good', kind: 'ok', detail: 'Go on to the sensor’s own check.' },
        { id: 'repair-ground', text: 'Repair the sensor ground circuit', kind: 'fault' },
        { id: 'shared-sensor', text: 'A sensor on the shared reference is pulling it down', kind: 'fault', detail: 'Plug the sensors back one at a time; the one that drops the reference is shorted (or its wiring is).' },
        { id: 'shorted-high', text: 'Reference above spec: look for a short to a higher voltage', kind: 'fault', detail: 'Look for chafe against a 12 V or 24 V feed in the same harness.' },
        { id: 'repair-wiring', text: 'Repair the reference wiring between the sensor and the controller', kind: 'fault' },
        { id: 'check-controller', text: 'Wiring good but no reference: check the controller', kind: 'refer', detail: 'Check the controller’s power and grounds; follow the maker’s procedure before replacing a controller.' },
      ],
    },
  },
]

type Db = NodePgDatabase<typeof t>

/** Inserts the starter cards once (version 1); an admin's later versions are left alone. */
export async function seedCards(db: Db) {
  const author = seedId('user:admin')
  for (const card of SEED_CARDS) {
    const definition = cardDefinitionSchema.parse(card.definition) // a bad seed fails loudly here
    const cardId = seedId(`card:${card.slug}`)
    await db.insert(t.testCards).values({
      id: cardId, slug: card.slug, title: definition.title, componentType: definition.componentType, currentVersion: 1,
    }).onConflictDoNothing()
    await db.insert(t.testCardVersions).values({
      id: seedId(`card:${card.slug}:v1`), cardId, cardVersion: 1, definition: definition as unknown as Record<string, unknown>, authorId: author,
    }).onConflictDoNothing()
  }
}
