// Tires and wheel ends, and air brakes.
import type { CardDefinitionInput } from '../../../../shared/schemas/testCards'
import { AIR_BRAKES, DEFER, LIFTING, RUNNING, TIRES, TRAFFIC } from './cautions'

export const TIRE_CARD: CardDefinitionInput = {
  title: 'Tire and wheel end',
  componentType: 'Tires, wheels and hubs',
  kind: 'system',
  summary: 'Pressure first (a tire run low is demounted before it is aired up, in a cage), tread depth by 49 CFR 393.75, damage and leaks, '
    + 'wheels and fasteners, then the hub.',
  codePatterns: [],
  cautions: [TRAFFIC, TIRES, LIFTING, DEFER],
  tools: [
    'Calibrated tire gauge',
    'Clip-on air chuck, in-line gauge and a long hose',
    'Restraining cage',
    'Tread depth gauge',
    'Soapy water',
    'Infrared thermometer',
    'Torque wrench',
  ],
  sources: [
    '49 CFR 393.75(b), (c): tread at least 4/32 in on steer tires, 2/32 in on the others',
    'Demount a tire run below 80 % of its pressure, inflate in a cage: common practice in tire service (29 CFR 1910.177 for rim wheels, '
    + 'from memory)',
  ],
  steps: [
    {
      id: 'pressure', title: 'Pressure before anything else', measure: 'calc', checks: 'inflation',
      component: 'The tire',
      instruction: 'Measure with a calibrated gauge, standing beside the tread, not in front of the wheel. Do not add air yet.',
      calc: { fn: 'inflation' },
      next: { pass: 'tread', fail: 'run-low', low: 'run-low' },
    },
    {
      id: 'tread', title: 'Tread depth', measure: 'calc', checks: 'tire',
      component: 'The tire',
      instruction: 'Measure in a major groove at the shallowest point around the tire, not on a tread-wear bar.',
      calc: { fn: 'tread_depth' },
      next: { pass: 'damage', fail: 'replace-tire', low: 'replace-tire' },
    },
    {
      id: 'damage', title: 'No cuts, bulges or separations', measure: 'yes_no', checks: 'tire',
      component: 'Tread and both sidewalls',
      instruction: 'Roll the truck a little to see all of it. No cut into the cords, no bulge or separation, no exposed belt, no flat spot '
        + 'worn through? (A bulge can burst: stand clear of it.)',
      passAnswer: 'yes',
      next: { pass: 'leak', fail: 'replace-tire' },
    },
    {
      id: 'leak', title: 'No leak at the valve or the bead', measure: 'yes_no', checks: 'valve-or-bead',
      component: 'Valve stem, core and bead',
      instruction: 'Soapy water on the valve core and stem and around both beads: no bubbles?',
      passAnswer: 'yes',
      next: { pass: 'wheel', fail: 'repair-leak' },
    },
    {
      id: 'wheel', title: 'Wheel and fasteners sound', measure: 'yes_no', checks: 'wheel',
      component: 'Wheel, studs and nuts',
      instruction: 'No cracks between the hand holes or around the stud holes, no rust streaks from the nuts (a loose wheel), no missing '
        + 'or loose nuts, no bent flange?',
      passAnswer: 'yes',
      next: { pass: 'hub', fail: 'wheel-fault' },
    },
    {
      id: 'hub', title: 'Hub cool, dry and without play', measure: 'yes_no', checks: 'wheel-end',
      component: 'Hub, seal and bearings',
      instruction: 'After a run, is the hub no hotter than the others on the axle (infrared thermometer)? No oil or grease on the wheel or '
        + 'the inner sidewall (hub seal)? '
        + 'With the axle raised on stands, no play rocking the tire top to bottom?',
      passAnswer: 'yes',
      next: { pass: 'tire-good', fail: 'wheel-end-fault' },
    },
  ],
  conclusions: [
    {
      id: 'run-low', text: 'Run below 80 %: demount and inspect before airing it up, in a cage', kind: 'fault',
      detail: 'A tire run low can have weakened cords that burst when aired up. Deflate fully, demount it and inspect it inside and out; '
        + 'if it is fit to use, inflate it only in a restraining cage with a clip-on chuck, standing clear.',
    },
    {
      id: 'replace-tire', text: 'Replace the tire', kind: 'fault', condemns: 'tire',
      detail: 'Tread below the legal minimum or damage into the cords. Deflate before demounting; seat the new one in a cage.',
    },
    {
      id: 'repair-leak', text: 'Repair the leak at the valve or bead', kind: 'fault', condemns: 'valve-or-bead',
      detail: 'Replace the core or stem, or demount and clean and seal the bead seat; check the pressure again after a while.',
    },
    {
      id: 'wheel-fault', text: 'Do not move the truck on this wheel: replace the wheel or its fasteners', kind: 'fault', condemns: 'wheel',
      detail: 'Torque the nuts to the maker’s figure in the right order and check them again after the first run.',
    },
    {
      id: 'wheel-end-fault', text: 'Service the wheel end: seal, bearings and adjustment', kind: 'fault', condemns: 'wheel-end',
      detail: 'A hot hub may also be a dragging brake: check the brake before releasing the truck.',
    },
    {
      id: 'tire-good', text: 'Tire and wheel end good', kind: 'ok',
      detail: 'Set the pressure to the fleet’s cold figure with the tire cool.',
    },
  ],
}

export const AIR_BRAKE_CARD: CardDefinitionInput = {
  title: 'Air brakes: build-up, governor, leakage, warning and spring brakes',
  componentType: 'Air brake system',
  kind: 'system',
  summary: 'The air-brake check of the model commercial driver’s manual, with the leak rate worked out from the gauge and the time: '
    + 'build-up, governor, leakage released and applied, '
    + 'low-air warning and spring-brake application.',
  // SPN 117 and 118 brake primary and secondary pressure (SPN names, REFERENCES.md §4).
  codePatterns: ['SPN 117 FMI condition', 'SPN 118 FMI condition'],
  cautions: [AIR_BRAKES, TRAFFIC, RUNNING, DEFER],
  tools: ['Dash gauges or a calibrated test gauge', 'Watch with seconds', 'Wheel chocks', 'Soapy water'],
  sources: [
    'Model commercial driver’s license manual, air-brake check: build-up 85 to 100 psi within 45 s; governor cut-out about 125 psi, cut-in '
    + 'about 100 psi',
    'The same check: leakage released at most 2 psi/min (single vehicle) and 3 (combination), applied 3 and 4 after the first drop',
    'The same check: low-air warning at or above 60 psi; spring brakes apply between 20 and 45 psi',
  ],
  steps: [
    {
      id: 'buildup', title: 'Build-up from 85 to 100 psi', measure: 'yes_no', conditions: 'running', checks: 'compressor',
      component: 'Air gauges',
      instruction: 'Wheels chocked. With the pressure below 85 psi and the engine at fast idle, time the rise from 85 to 100 psi. Does it '
        + 'take 45 seconds or less (dual air system)?',
      passAnswer: 'yes',
      next: { pass: 'governor', fail: 'slow-buildup' },
    },
    {
      id: 'governor', title: 'Governor cuts out and in', measure: 'yes_no', conditions: 'running', checks: 'governor',
      component: 'Air gauges',
      instruction: 'Let it build: does the compressor stop charging at about 125 psi (the maker’s figure) and start again at about 100 psi '
        + 'as you use air?',
      passAnswer: 'yes',
      next: { pass: 'leak-released', fail: 'governor-fault' },
    },
    {
      id: 'leak-released', title: 'Leakage, brakes released', measure: 'calc', conditions: 'key_on_engine_off', checks: 'air-system',
      component: 'Air gauges',
      instruction: 'Tanks full, engine off, wheels chocked, parking brakes released. Let the pressure settle for a minute, then note it '
        + 'and watch for one minute without touching the pedal.',
      calc: { fn: 'air_leak', brakes: 'released' },
      next: { pass: 'leak-applied', fail: 'find-leak', high: 'find-leak' },
    },
    {
      id: 'leak-applied', title: 'Leakage, brakes applied', measure: 'calc', conditions: 'key_on_engine_off', checks: 'air-system',
      component: 'Air gauges',
      instruction: 'Apply the service brakes fully and hold them (or use a pedal holder). After the first drop as the chambers fill, note '
        + 'the pressure and watch for one minute.',
      calc: { fn: 'air_leak', brakes: 'applied' },
      next: { pass: 'low-warning', fail: 'find-leak-applied', high: 'find-leak-applied' },
    },
    {
      id: 'low-warning', title: 'Low-air warning at 60 psi or above', measure: 'yes_no', conditions: 'key_on_engine_off', checks: 'warning',
      component: 'Low-air lamp and buzzer',
      instruction: 'Key on, engine off. Fan the brake pedal to bleed the pressure down: does the low-air warning come on at or above 60 '
        + 'psi?',
      passAnswer: 'yes',
      next: { pass: 'spring-apply', fail: 'repair-warning' },
    },
    {
      id: 'spring-apply', title: 'Spring brakes apply between 20 and 45 '
        + 'psi', measure: 'yes_no', conditions: 'key_on_engine_off', checks: 'spring-brakes',
      component: 'Parking brake valves',
      instruction: 'Keep fanning the pedal: do the parking brake valves pop out and the spring brakes apply between 20 and 45 psi (the '
        + 'maker’s figure)?',
      passAnswer: 'yes',
      next: { pass: 'air-good', fail: 'repair-spring-valve' },
    },
  ],
  conclusions: [
    {
      id: 'slow-buildup', text: 'Slow build-up: look for leaks, then the compressor’s drive and intake', kind: 'refer',
      detail: 'A leak, a clogged intake filter, a slipping drive or a worn compressor; do the leakage steps before condemning the '
        + 'compressor.',
    },
    {
      id: 'governor-fault', text: 'Governor out of its setting: repair or replace it', kind: 'fault', condemns: 'governor',
      detail: 'Check the governor’s signal line and the dryer purge before replacing it.',
    },
    {
      id: 'find-leak', text: 'Leaks too fast with the brakes released: find the leak', kind: 'fault', condemns: 'air-system',
      detail: 'Soapy water on fittings, tanks, the dryer, valves and the spring side of the chambers.',
    },
    {
      id: 'find-leak-applied', text: 'Leaks too fast with the brakes applied: find the leak on the service side', kind: 'fault',
      condemns: 'air-system', detail: 'Service chamber diaphragms, relay and quick-release valves, the foot valve and trailer lines.',
    },
    {
      id: 'repair-warning', text: 'Repair the low-air warning before the truck moves', kind: 'fault', condemns: 'warning',
      detail: 'Switch, lamp, buzzer or wiring; the truck is out of service until it works.',
    },
    {
      id: 'repair-spring-valve', text: 'Repair the parking brake control before the truck moves', kind: 'fault', condemns: 'spring-brakes',
      detail: 'The parking brake valve or its supply; see the cautions on spring-brake chambers.',
    },
    {
      id: 'air-good', text: 'Air-brake check passed', kind: 'ok',
      detail: 'Check pushrod stroke and slack adjusters against the maker’s limits as part of the brake inspection.',
    },
  ],
}
