// Warning devices at a stopped truck against 49 CFR 392.22 (paragraph numbers from memory of the
// eCFR text; the order of its special rules, (b)(2)(i) fusees … (iv) hills, curves and
// obstructions, (v) divided or one-way roads, (vi) leaking flammable liquid, agrees with
// published summaries; distances as in REFERENCES §6, seen in the source).
import { describe, expect, it } from 'vitest'
import { OBSTRUCTION_SIDES, SCENE_CHECKLIST, SCENE_JOB_CHECKS, sceneProgress, warningDevicePlacement } from '../../shared/utils/safety'

type Plan = ReturnType<typeof warningDevicePlacement>
const feetOf = (p: Plan) => p.devices.map(d => (d.maxFeet === undefined ? [d.feet, d.direction] : [d.feet, d.maxFeet, d.direction]))

describe('warningDevicePlacement (49 CFR 392.22)', () => {
  it('two-lane or undivided road: 10 ft and 100 ft toward traffic, 100 ft the other way', () => {
    // 49 CFR 392.22(b)(1)(i)–(iii): 4 paces (about 10 ft) on the traffic side toward approaching traffic,
    // 40 paces (about 100 ft) toward approaching traffic, 40 paces away from it
    expect(feetOf(warningDevicePlacement('undivided'))).toEqual([[10, 'toward_traffic'], [100, 'toward_traffic'], [100, 'away']])
    expect(feetOf(warningDevicePlacement('undivided', { obstruction: 'none' }))).toEqual(feetOf(warningDevicePlacement('undivided')))
  })

  it('divided or one-way road: 200 ft and 100 ft toward traffic, within 10 ft of the rear', () => {
    // 49 CFR 392.22(b)(2)(v): 200 ft and 100 ft toward approaching traffic, one within 10 ft of the rear on the traffic side
    expect(feetOf(warningDevicePlacement('divided'))).toEqual([[200, 'toward_traffic'], [100, 'toward_traffic'], [10, 'rear']])
  })

  it('undivided road, hill crest or curve behind the truck: the device toward traffic goes 100–500 ft out', () => {
    // 49 CFR 392.22(b)(2)(iv): within 500 ft of a curve, crest of a hill or other obstruction to view, the device
    // in the direction of the obstruction 100 ft to 500 ft from the truck
    expect(feetOf(warningDevicePlacement('undivided', { obstruction: 'behind' })))
      .toEqual([[10, 'toward_traffic'], [100, 500, 'toward_traffic'], [100, 'away']])
  })

  it('undivided road, obstruction ahead: the device ahead goes 100–500 ft out; both sides: both do', () => {
    // 49 CFR 392.22(b)(2)(iv): "in the direction of the obstruction"; on a two-way road traffic also comes from ahead
    expect(feetOf(warningDevicePlacement('undivided', { obstruction: 'ahead' })))
      .toEqual([[10, 'toward_traffic'], [100, 'toward_traffic'], [100, 500, 'away']])
    expect(feetOf(warningDevicePlacement('undivided', { obstruction: 'both' })))
      .toEqual([[10, 'toward_traffic'], [100, 500, 'toward_traffic'], [100, 500, 'away']])
  })

  it('divided road, obstruction behind: the far device stays at least 200 ft back, out to 500 ft', () => {
    // 49 CFR 392.22(b)(2)(v) puts the far device at 200 ft and (b)(2)(iv) allows up to 500 ft: never nearer than 200 ft
    const p = warningDevicePlacement('divided', { obstruction: 'behind' })
    expect(feetOf(p)).toEqual([[200, 500, 'toward_traffic'], [100, 'toward_traffic'], [10, 'rear']])
    expect(Math.min(...p.devices.filter(d => d.direction === 'toward_traffic').map(d => d.feet))).toBe(100)
    expect(p.devices[0]!.feet).toBeGreaterThanOrEqual(200)
  })

  it('divided road, obstruction ahead: no traffic comes from there, so no device moves', () => {
    // 49 CFR 392.22(b)(2)(v): on a one-way road every device faces traffic from behind the truck
    const p = warningDevicePlacement('divided', { obstruction: 'ahead' })
    expect(feetOf(p)).toEqual(feetOf(warningDevicePlacement('divided')))
    expect(p.notes.join(' ')).toMatch(/no traffic comes from ahead/)
    const both = warningDevicePlacement('divided', { obstruction: 'both' })
    expect(feetOf(both)).toEqual(feetOf(warningDevicePlacement('divided', { obstruction: 'behind' })))
  })

  it('metres are feet × 0.3048 exactly', () => {
    // NIST SP 811 appendix B: 1 ft = 0.3048 m exactly; 392.22 itself prints about 30 m for 100 ft and 152 m for 500 ft
    for (const road of ['undivided', 'divided'] as const) {
      for (const obstruction of OBSTRUCTION_SIDES) {
        for (const d of warningDevicePlacement(road, { obstruction }).devices) {
          expect(Math.abs(d.meters - d.feet * 0.3048)).toBeLessThan(1e-12)
          if (d.maxFeet !== undefined) expect(Math.round(d.maxMeters ?? 0)).toBe(152)
        }
      }
    }
    // 200 ft = 60.96 m (the regulation rounds it to 60 m)
    expect(warningDevicePlacement('divided').devices[0]!.meters).toBeCloseTo(60.96, 9)
    expect(Math.round(warningDevicePlacement('undivided').devices[1]!.meters)).toBe(30)
  })

  it('within 10 minutes, hazard flashers first, no flames near fuel, local rules come first', () => {
    // 49 CFR 392.22(a): hazard flashers at once; (b)(1): devices as soon as possible, within 10 minutes
    const p = warningDevicePlacement('undivided')
    expect(p.placeWithinMinutes).toBe(10)
    expect(p.notes.some(n => /hazard flashers/i.test(n))).toBe(true)
    expect(p.notes.some(n => /within 10 minutes/.test(n))).toBe(true)
    // 49 CFR 392.22(b)(2)(vi) and 392.25 (from memory): no flame-producing devices near leaking fuel or flammable cargo
    expect(p.notes.some(n => /flame/i.test(n))).toBe(true)
    // the product owner's rule: safety text defers to local codes and licensed practice
    expect(p.notes.some(n => /local rules.*licensed practice/i.test(n))).toBe(true)
  })

  it('refuses an unknown road type or side', () => {
    // Wayside's own input contract
    expect(() => warningDevicePlacement('freeway' as never)).toThrow(RangeError)
    expect(() => warningDevicePlacement('undivided', { obstruction: 'left' as never })).toThrow(/behind/)
  })
})

describe('the scene checklist', () => {
  const all = [...SCENE_CHECKLIST, ...SCENE_JOB_CHECKS]
  const text = (id: string) => {
    const item = all.find(i => i.id === id)
    return `${item?.label ?? ''} ${item?.caution ?? ''}`
  }

  it('every call: flashers, triangles, vest, chocks, engine off, a lock-out tag, hot exhaust', () => {
    // 49 CFR 392.22(a)–(b): flashers and warning devices; common practice for the rest
    expect(SCENE_CHECKLIST.map(i => i.id))
      .toEqual(['hazard_lamps', 'warning_devices', 'high_visibility', 'wheels_chocked', 'engine_off', 'lockout_tag', 'hot_surfaces'])
    // common practice: a tag on the steering wheel so nobody starts or moves the truck
    expect(text('lockout_tag')).toMatch(/steering wheel/)
    expect(new Set(all.map(i => i.id)).size).toBe(all.length)
    expect(SCENE_JOB_CHECKS.every(i => i.when && i.caution)).toBe(true)
  })

  it('air brakes: drain before opening lines, chock before caging, never open a spring-brake chamber', () => {
    // common practice (air-brake sections of the model commercial driver's manual and brake makers' service notes, from memory)
    expect(text('air_drained')).toMatch(/drained before opening/)
    expect(text('chock_before_caging')).toMatch(/chocked before caging/)
    expect(text('spring_brakes')).toMatch(/stored energy/)
    expect(text('spring_brakes')).toMatch(/never opened/)
  })

  it('tires: a cage, and a tire run below 80 % of its pressure demounted first', () => {
    // OSHA 29 CFR 1910.177 (restraining device, clip-on chuck, stand outside the trajectory) and the 80 % rule
    // for tires run under-inflated, both from memory
    expect(text('tire_cage')).toMatch(/restraining cage/)
    expect(text('tire_cage')).toMatch(/80 %/)
  })

  it('common-rail fuel, a parked regeneration over dry grass, batteries, lifting, high voltage', () => {
    // common practice: common-rail pressure over 1,000 bar, injection injuries; hot regeneration exhaust starts grass fires
    expect(text('fuel_pressure')).toMatch(/1,000 bar/)
    expect(text('fuel_pressure')).toMatch(/never feel for a leak/)
    expect(text('parked_regen')).toMatch(/dry grass/)
    // common practice: battery hydrogen, sparks, eye protection; stands under a lifted load
    expect(text('battery')).toMatch(/hydrogen/)
    expect(text('battery')).toMatch(/eye protection/)
    expect(text('lifting')).toMatch(/only by a jack/)
    expect(text('high_voltage')).toMatch(/high voltage/i)
  })

  it('progress counts the every-call checks; job checks only where ticked', () => {
    // Wayside's own rule
    expect(sceneProgress(null)).toEqual({ done: 0, total: 7, jobChecks: 0 })
    const ticked = { hazard_lamps: true, warning_devices: true, tire_cage: true, battery: false }
    expect(sceneProgress(ticked)).toEqual({ done: 2, total: 7, jobChecks: 1 })
  })
})
