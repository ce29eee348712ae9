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

const FOOT_M = 0.3048 // exact, international foot

function device(position: string, feet: number, direction: DeviceDirection, maxFeet?: number): WarningDevice {
  const d: WarningDevice = { position, feet, meters: feet * FOOT_M, direction }
  if (maxFeet !== undefined) {
    d.maxFeet = maxFeet
    d.maxMeters = maxFeet * FOOT_M
  }
  return d
}

/**
 * Where to put the three warning devices. `obstructed`: the truck is within 500 ft of a hill
 * crest, curve or anything else that hides it from drivers coming toward it; the device on that
 * side then goes 100–500 ft out. On an undivided road say which side with `obstructionSide`
 * (default: the side traffic in the truck's lane comes from).
 */
export function warningDevicePlacement(
  roadType: RoadType,
  opts: { obstructed?: boolean, obstructionSide?: 'toward_traffic' | 'away' } = {},
): WarningDevicePlan {
  if (roadType !== 'undivided' && roadType !== 'divided') {
    throw new RangeError(`Road type must be 'undivided' or 'divided', got ${String(roadType)}`)
  }
  const obstructed = opts.obstructed === true
  const side = opts.obstructionSide ?? 'toward_traffic'
  if (side !== 'toward_traffic' && side !== 'away') throw new RangeError(`Obstruction side must be 'toward_traffic' or 'away', got ${String(side)}`)
  const farNote = 'far enough that drivers see it before they reach the curve, crest or obstruction'
  const devices: WarningDevice[] = []

  if (roadType === 'undivided') {
    devices.push(device('Beside the truck on the traffic side, about 4 paces back toward oncoming traffic', 10, 'toward_traffic'))
    if (obstructed && side === 'toward_traffic') {
      devices.push(device(`In the truck's lane or shoulder toward oncoming traffic, 100 to 500 ft out, ${farNote}`, 100, 'toward_traffic', 500))
    }
    else {
      devices.push(device('In the middle of the truck\'s lane or shoulder, about 40 paces back toward oncoming traffic', 100, 'toward_traffic'))
    }
    if (obstructed && side === 'away') {
      devices.push(device(`In the truck's lane or shoulder ahead of the truck, 100 to 500 ft out, ${farNote}`, 100, 'away', 500))
    }
    else {
      devices.push(device('In the middle of the truck\'s lane or shoulder, about 40 paces ahead of the truck (away from oncoming traffic)', 100, 'away'))
    }
  }
  else {
    // One-way traffic: all warning goes behind the truck, plus one marking its rear corner.
    if (obstructed) {
      devices.push(device(`In the truck's lane or shoulder toward oncoming traffic, 100 to 500 ft out and beyond the next device, ${farNote}`, 100, 'toward_traffic', 500))
    }
    else {
      devices.push(device('In the middle of the truck\'s lane or shoulder, about 200 ft back toward oncoming traffic', 200, 'toward_traffic'))
    }
    devices.push(device('In the middle of the truck\'s lane or shoulder, about 100 ft back toward oncoming traffic', 100, 'toward_traffic'))
    devices.push(device('At the traffic side of the truck, within 10 ft of its rear', 10, 'rear'))
  }

  const notes = [
    'Turn on the hazard flashers as soon as you stop, and keep them on until the devices are out.',
    'Put the warning devices out as soon as you can, within 10 minutes of stopping.',
    'Walk out facing oncoming traffic, carry the devices in front of you, and keep off the travel lane where you can.',
    'No flares or other flame devices near flammable cargo, a fuel leak or spilled fuel: use reflective triangles.',
    'A pace is taken as about 2.5 ft (4 paces ≈ 10 ft, 40 paces ≈ 100 ft); distances are approximate.',
    'This follows US federal rule 49 CFR 392.22; state and local rules, your employer and licensed practice come first where they ask for more.',
  ]
  if (obstructed) notes.push('Near a hill crest, curve or obstruction, give the farthest device the full distance drivers need to stop: up to 500 ft.')
  return { devices, placeWithinMinutes: 10, notes }
}

export interface SceneChecklistItem {
  id: string
  label: string
  caution?: string
}

// Before any test at the roadside. Wording ours; the cautions appear where the work can hurt someone.
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
    caution: 'If the test needs the engine running, keep hands, hair and clothing clear of belts and fans, and someone in the cab who knows not to move the truck.',
  },
  {
    id: 'hot_surfaces',
    label: 'Hot exhaust and after-treatment checked before touching',
    caution: 'The exhaust, DPF and SCR stay hot long after shutdown and a regeneration makes them hotter; wear gloves and let them cool.',
  },
  {
    id: 'battery',
    label: 'Battery work: eye protection on, no sparks or flames near the batteries',
    caution: 'Batteries give off hydrogen that a spark can ignite; disconnect the ground cable first and reconnect it last.',
  },
  {
    id: 'lifting',
    label: 'Lifting: jack stands under the load before anyone goes under',
    caution: 'Never work under a load held only by a jack or air suspension.',
  },
  {
    id: 'high_voltage',
    label: 'Hybrid or electric unit: high-voltage system identified and left alone unless you are trained and equipped',
    caution: 'Orange cables carry high voltage that can kill; follow the maker\'s shutdown procedure and wear rated gloves.',
  },
]
