// Tires and wheel ends, and air brakes.
import type { CardDefinitionInput } from '../../../../shared/schemas/testCards'
import { AIR_BRAKES, DEFER, LIFTING, RUNNING, TIRES, TRAFFIC } from './cautions'
import { fault, good, refer, yesNo } from './steps'

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
    yesNo('damage', 'No cuts, bulges or separations', {
      checks: 'tire',
      component: 'Tread and both sidewalls',
      instruction: 'Roll the truck a little to see all of it. No cut into the cords, no bulge or separation, no exposed belt, no flat spot '
        + 'worn through? (A bulge can burst: stand clear of it.)',
    }, { yes: 'leak', no: 'replace-tire' }),
    yesNo('leak', 'No leak at the valve or the bead', {
      checks: 'valve-or-bead',
      component: 'Valve stem, core and bead',
      instruction: 'Soapy water on the valve core and stem and around both beads: no bubbles?',
    }, { yes: 'wheel', no: 'repair-leak' }),
    yesNo('wheel', 'Wheel and fasteners sound', {
      checks: 'wheel',
      component: 'Wheel, studs and nuts',
      instruction: 'No cracks between the hand holes or around the stud holes, no rust streaks from the nuts (a loose wheel), no missing '
        + 'or loose nuts, no bent flange?',
    }, { yes: 'hub', no: 'wheel-fault' }),
    yesNo('hub', 'Hub cool, dry and without play', {
      checks: 'wheel-end',
      component: 'Hub, seal and bearings',
      instruction: 'After a run, is the hub no hotter than the others on the axle (infrared thermometer)? No oil or grease on the wheel or '
        + 'the inner sidewall (hub seal)? '
        + 'With the axle raised on stands, no play rocking the tire top to bottom?',
    }, { yes: 'tire-good', no: 'wheel-end-fault' }),
  ],
  conclusions: [
    fault('run-low', 'Run below 80 %: demount and inspect before airing it up, in a cage', undefined,
      'A tire run low can have weakened cords that burst when aired up. Deflate fully, demount it and inspect it inside and out; '
      + 'if it is fit to use, inflate it only in a restraining cage with a clip-on chuck, standing clear.'),
    fault('replace-tire', 'Replace the tire', 'tire',
      'Tread below the legal minimum or damage into the cords. Deflate before demounting; seat the new one in a cage.'),
    fault('repair-leak', 'Repair the leak at the valve or bead', 'valve-or-bead',
      'Replace the core or stem, or demount and clean and seal the bead seat; check the pressure again after a while.'),
    fault('wheel-fault', 'Do not move the truck on this wheel: replace the wheel or its fasteners', 'wheel',
      'Torque the nuts to the maker’s figure in the right order and check them again after the first run.'),
    fault('wheel-end-fault', 'Service the wheel end: seal, bearings and adjustment', 'wheel-end',
      'A hot hub may also be a dragging brake: check the brake before releasing the truck.'),
    good('tire-good', 'Tire and wheel end good',
      'Set the pressure to the fleet’s cold figure with the tire cool.'),
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
    yesNo('buildup', 'Build-up from 85 to 100 psi', {
      conditions: 'running', checks: 'compressor',
      component: 'Air gauges',
      instruction: 'Wheels chocked. With the pressure below 85 psi and the engine at fast idle, time the rise from 85 to 100 psi. Does it '
        + 'take 45 seconds or less (dual air system)?',
    }, { yes: 'governor', no: 'slow-buildup' }),
    yesNo('governor', 'Governor cuts out and in', {
      conditions: 'running', checks: 'governor',
      component: 'Air gauges',
      instruction: 'Let it build: does the compressor stop charging at about 125 psi (the maker’s figure) and start again at about 100 psi '
        + 'as you use air?',
    }, { yes: 'leak-released', no: 'governor-fault' }),
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
    yesNo('low-warning', 'Low-air warning at 60 psi or above', {
      conditions: 'key_on_engine_off', checks: 'warning',
      component: 'Low-air lamp and buzzer',
      instruction: 'Key on, engine off. Fan the brake pedal to bleed the pressure down: does the low-air warning come on at or above 60 '
        + 'psi?',
    }, { yes: 'spring-apply', no: 'repair-warning' }),
    yesNo('spring-apply', 'Spring brakes apply between 20 and 45 psi', {
      conditions: 'key_on_engine_off', checks: 'spring-brakes',
      component: 'Parking brake valves',
      instruction: 'Keep fanning the pedal: do the parking brake valves pop out and the spring brakes apply between 20 and 45 psi (the '
        + 'maker’s figure)?',
    }, { yes: 'air-good', no: 'repair-spring-valve' }),
  ],
  conclusions: [
    refer('slow-buildup', 'Slow build-up: look for leaks, then the compressor’s drive and intake',
      'A leak, a clogged intake filter, a slipping drive or a worn compressor; do the leakage steps before condemning the '
      + 'compressor.'),
    fault('governor-fault', 'Governor out of its setting: repair or replace it', 'governor',
      'Check the governor’s signal line and the dryer purge before replacing it.'),
    fault('find-leak', 'Leaks too fast with the brakes released: find the leak', 'air-system',
      'Soapy water on fittings, tanks, the dryer, valves and the spring side of the chambers.'),
    fault('find-leak-applied', 'Leaks too fast with the brakes applied: find the leak on the service side', 'air-system',
      'Service chamber diaphragms, relay and quick-release valves, the foot valve and trailer lines.'),
    fault('repair-warning', 'Repair the low-air warning before the truck moves', 'warning',
      'Switch, lamp, buzzer or wiring; the truck is out of service until it works.'),
    fault('repair-spring-valve', 'Repair the parking brake control before the truck moves', 'spring-brakes',
      'The parking brake valve or its supply; see the cautions on spring-brake chambers.'),
    good('air-good', 'Air-brake check passed',
      'Check pushrod stroke and slack adjusters against the maker’s limits as part of the brake inspection.'),
  ],
}
