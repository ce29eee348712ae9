// Warning devices around a truck stopped on the road, after 49 CFR 392.22 (US federal rule for
// commercial motor vehicles). Wording is ours; the eCFR text is the authority, and local rules,
// employer policy and licensed practice come first where they ask for more.

export type RoadType = 'undivided' | 'divided'
export type DeviceDirection = 'toward_traffic' | 'away' | 'rear'

export interface WarningDevice {
  position: string
  feet: number
  meters: number
  /** Set when the rule gives a range (hill crest, curve or obstruction): place between feet and maxFeet. */
  maxFeet?: number
  maxMeters?: number
  direction: DeviceDirection
}

export interface WarningDevicePlan {
  devices: WarningDevice[]
  placeWithinMinutes: 10
  notes: string[]
}

/** Where a hill crest, curve or other obstruction within 500 ft hides the truck: behind it, ahead of it, or both. */
export type ObstructionSide = 'none' | 'behind' | 'ahead' | 'both'
export const OBSTRUCTION_SIDES: readonly ObstructionSide[] = ['none', 'behind', 'ahead', 'both']

const FOOT_M = 0.3048 // exact, international foot

function device(position: string, feet: number, direction: DeviceDirection, maxFeet?: number): WarningDevice {
  const d: WarningDevice = { position, feet, meters: feet * FOOT_M, direction }
  if (maxFeet !== undefined) {
    d.maxFeet = maxFeet
    d.maxMeters = maxFeet * FOOT_M
  }
  return d
}

const FAR_NOTE = 'far enough that drivers see it before they reach the curve, crest or obstruction'
const LANE = 'In the middle of the truck\'s lane or shoulder'

/**
 * Where to put the three warning devices (49 CFR 392.22(b)). `obstruction`: which side of the
 * truck a hill crest, curve or other obstruction within 500 ft hides it from drivers, "behind"
 * being the side traffic in the truck's lane comes from. The device on that side then goes 100
 * to 500 ft out (paragraph (b)(2)(iv)); on a divided or one-way road the far one stays at least
 * 200 ft back, its distance there (paragraph (b)(2)(v)), and traffic never comes from ahead.
 */
export function warningDevicePlacement(roadType: RoadType, opts: { obstruction?: ObstructionSide } = {}): WarningDevicePlan {
  if (roadType !== 'undivided' && roadType !== 'divided') {
    throw new RangeError(`Road type must be 'undivided' or 'divided', got ${String(roadType)}`)
  }
  const side = opts.obstruction ?? 'none'
  if (!OBSTRUCTION_SIDES.includes(side)) {
    throw new RangeError(`Obstruction side must be one of ${OBSTRUCTION_SIDES.join(', ')}, got ${String(side)}`)
  }
  const behind = side === 'behind' || side === 'both'
  const ahead = side === 'ahead' || side === 'both'
  const devices: WarningDevice[] = []
  const notes: string[] = []

  if (roadType === 'undivided') {
    devices.push(device('Beside the truck on the traffic side, about 4 paces back toward oncoming traffic', 10, 'toward_traffic'))
    devices.push(behind
      ? device(`${LANE} behind the truck, toward oncoming traffic, 100 to 500 ft out, ${FAR_NOTE}`, 100, 'toward_traffic', 500)
      : device(`${LANE}, about 40 paces back toward oncoming traffic`, 100, 'toward_traffic'))
    devices.push(ahead
      ? device(`${LANE} ahead of the truck, 100 to 500 ft out, ${FAR_NOTE} from the other way`, 100, 'away', 500)
      : device(`${LANE}, about 40 paces ahead of the truck (away from oncoming traffic)`, 100, 'away'))
  }
  else {
    // One-way traffic: all warning goes behind the truck, plus one marking its rear corner.
    devices.push(behind
      ? device(`${LANE} behind the truck, toward oncoming traffic, 200 to 500 ft out, ${FAR_NOTE}`, 200, 'toward_traffic', 500)
      : device(`${LANE}, about 200 ft back toward oncoming traffic`, 200, 'toward_traffic'))
    devices.push(device(`${LANE}, about 100 ft back toward oncoming traffic`, 100, 'toward_traffic'))
    devices.push(device('At the traffic side of the truck, within 10 ft of its rear', 10, 'rear'))
    if (ahead) notes.push('On a divided or one-way road no traffic comes from ahead: a curve or crest ahead of the truck moves no device.')
  }

  notes.unshift(
    'Turn on the hazard flashers as soon as you stop, and keep them on until the devices are out.',
    'Put the warning devices out as soon as you can, within 10 minutes of stopping.',
    'Walk out facing oncoming traffic, carry the devices in front of you, and keep off the travel lane where you can.',
    'No flares or other flame devices near flammable cargo, a fuel leak or spilled fuel: use reflective triangles.',
    'A pace is taken as about 2.5 ft (4 paces ≈ 10 ft, 40 paces ≈ 100 ft); distances are approximate.',
    'This follows US federal rule 49 CFR 392.22; state and local rules, your employer and licensed practice come first '
    + 'where they ask for more.',
  )
  if (behind || (ahead && roadType === 'undivided')) {
    notes.push('Near a hill crest, curve or obstruction, give the device on that side the distance drivers need to see it '
      + 'and stop: up to 500 ft.')
  }
  return { devices, placeWithinMinutes: 10, notes }
}

export interface SceneChecklistItem {
  id: string
  label: string
  caution?: string
  /** For the checks that belong to some jobs only: which. */
  when?: string
}

// Every call, before any work at the roadside. Wording ours; the cautions appear where the work can hurt someone.
export const SCENE_CHECKLIST: readonly SceneChecklistItem[] = [
  { id: 'hazard_lamps', label: 'Hazard flashers on, service truck lights and beacons on' },
  {
    id: 'warning_devices',
    label: 'Warning triangles placed (within 10 minutes of stopping)',
    caution: 'Face traffic while you walk them out; no flares near fuel leaks or flammable cargo.',
  },
  { id: 'high_visibility', label: 'High-visibility vest or jacket on', caution: 'Traffic is the biggest danger at a road call.' },
  { id: 'wheels_chocked', label: 'Parking brakes set and wheels chocked', caution: 'Chock before you go under or between units.' },
  {
    id: 'engine_off',
    label: 'Engine off and key out, unless the test needs it running or key on',
    caution: 'If the test needs the engine running, keep hands, hair and clothing clear of belts and fans, '
      + 'and someone in the cab who knows not to move the truck.',
  },
  {
    id: 'lockout_tag',
    label: 'Lock-out tag on the steering wheel, key in your pocket',
    caution: 'A tag that says a mechanic is working on the truck keeps anyone from starting or moving it while you are under or beside it.',
  },
  {
    id: 'hot_surfaces',
    label: 'Hot exhaust and after-treatment checked before touching',
    caution: 'The exhaust, DPF and SCR stay hot long after shutdown and a regeneration makes them hotter; wear gloves and let them cool.',
  },
]

// Checks that belong to some jobs only: ticked when the job needs them.
export const SCENE_JOB_CHECKS: readonly SceneChecklistItem[] = [
  {
    id: 'air_drained',
    when: 'Air brakes or air lines',
    label: 'Air tanks drained before opening any air line or fitting',
    caution: 'A line opened under pressure whips and blows dirt into eyes; drain every tank and watch the gauges read zero first.',
  },
  {
    id: 'chock_before_caging',
    when: 'Air brakes or air lines',
    label: 'Wheels chocked before caging spring brakes or backing off a slack adjuster',
    caution: 'Once the spring brakes are caged or backed off, nothing but the chocks holds the truck.',
  },
  {
    id: 'spring_brakes',
    when: 'Air brakes or air lines',
    label: 'Spring-brake chambers: spring caged with its release bolt before a chamber is removed; never opened',
    caution: 'The spring inside a spring-brake chamber holds enough stored energy to kill if the chamber is opened; '
      + 'a damaged one is replaced whole.',
  },
  {
    id: 'tire_cage',
    when: 'Tires and wheels',
    label: 'Tire inflated in a restraining cage, with a clip-on chuck and a long hose, standing out of the way',
    caution: 'A tire run flat or below 80 % of its pressure is demounted and inspected before it is inflated again, in a cage: '
      + 'a rim or bead that lets go can kill.',
  },
  {
    id: 'fuel_pressure',
    when: 'Fuel system',
    label: 'Common-rail fuel: engine off and the rail pressure let down before opening a high-pressure line',
    caution: 'A common rail holds well over 1,000 bar (15,000 psi); never feel for a leak with your hand: fuel injected through skin '
      + 'is a medical emergency.',
  },
  {
    id: 'parked_regen',
    when: 'Parked regeneration',
    label: 'Parked regeneration: exhaust outlet over bare ground, clear of dry grass, leaves, fuel and people',
    caution: 'During a parked regeneration the exhaust gas and the pipe get hot enough to set dry grass alight; '
      + 'stay with the truck until it ends.',
  },
  {
    id: 'battery',
    when: 'Batteries or cables',
    label: 'Battery work: eye protection on, no sparks or flames near the batteries',
    caution: 'Batteries give off hydrogen that a spark can ignite; disconnect the ground cable first and reconnect it last.',
  },
  {
    id: 'lifting',
    when: 'Lifting',
    label: 'Lifting: jack stands under the load before anyone goes under',
    caution: 'Never work under a load held only by a jack or air suspension.',
  },
  {
    id: 'high_voltage',
    when: 'Hybrid or electric unit',
    label: 'High-voltage system identified and left alone unless you are trained and equipped',
    caution: 'Orange cables carry high voltage that can kill; follow the maker\'s shutdown procedure and wear rated gloves.',
  },
]

/** How far the every-call checks are: the job checks count only where ticked. */
export function sceneProgress(state: Record<string, boolean> | null | undefined): { done: number, total: number, jobChecks: number } {
  const s = state ?? {}
  return {
    done: SCENE_CHECKLIST.filter(i => s[i.id] === true).length,
    total: SCENE_CHECKLIST.length,
    jobChecks: SCENE_JOB_CHECKS.filter(i => s[i.id] === true).length,
  }
}
