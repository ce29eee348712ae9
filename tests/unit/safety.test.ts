import { describe, expect, it } from 'vitest'
import { SCENE_CHECKLIST, warningDevicePlacement } from '../../shared/utils/safety'

const feetOf = (p: ReturnType<typeof warningDevicePlacement>) => p.devices.map(d => [d.feet, d.direction])

describe('warningDevicePlacement (49 CFR 392.22)', () => {
  it('two-lane or undivided road: 10 ft and 100 ft toward traffic, 100 ft the other way', () => {
    // 49 CFR 392.22(b)(1): 4 paces (10 ft) and 40 paces (100 ft) toward approaching traffic, 100 ft away from it
    const p = warningDevicePlacement('undivided')
    expect(feetOf(p)).toEqual([
      [10, 'toward_traffic'],
      [100, 'toward_traffic'],
      [100, 'away'],
    ])
  })

  it('divided or one-way road: 200 ft and 100 ft toward traffic, within 10 ft of the rear', () => {
    // 49 CFR 392.22(b)(2)(v): 200 ft and 100 ft toward approaching traffic, one within 10 ft of the rear, traffic side
    const p = warningDevicePlacement('divided')
    expect(feetOf(p)).toEqual([
      [200, 'toward_traffic'],
      [100, 'toward_traffic'],
      [10, 'rear'],
    ])
  })

  it('hill crest, curve or obstruction within 500 ft: 100–500 ft on that side', () => {
    // 49 CFR 392.22(b)(2)(ii): devices in the direction of the obstruction 100 to 500 ft from the truck
    for (const road of ['undivided', 'divided'] as const) {
      const p = warningDevicePlacement(road, { obstructed: true })
      const ranged = p.devices.filter(d => d.maxFeet !== undefined)
      expect(ranged).toHaveLength(1)
      expect(ranged[0]?.feet).toBe(100)
      expect(ranged[0]?.maxFeet).toBe(500)
      expect(ranged[0]?.direction).toBe('toward_traffic')
      expect(p.devices).toHaveLength(3)
    }
    // 49 CFR 392.22(b)(2)(ii): the obstruction may lie ahead of the truck on a two-way road
    const ahead = warningDevicePlacement('undivided', { obstructed: true, obstructionSide: 'away' })
    expect(ahead.devices.find(d => d.maxFeet !== undefined)?.direction).toBe('away')
  })

  it('metres are feet × 0.3048 exactly', () => {
    // international foot, 0.3048 m exactly: 10 ft = 3.048 m, 100 ft = 30.48 m, 200 ft = 60.96 m, 500 ft = 152.4 m
    const p = warningDevicePlacement('divided', { obstructed: true })
    for (const d of [...p.devices, ...warningDevicePlacement('divided').devices]) {
      expect(Math.abs(d.meters - d.feet * 0.3048)).toBeLessThan(1e-12)
      if (d.maxFeet !== undefined) expect(Math.abs((d.maxMeters ?? 0) - 152.4)).toBeLessThan(1e-9)
    }
    expect(Math.abs((warningDevicePlacement('divided').devices[0]?.meters ?? 0) - 60.96)).toBeLessThan(1e-9)
  })

  it('within 10 minutes, hazard flashers first, local rules come first', () => {
    // 49 CFR 392.22(a)-(b): hazard flashers at once, devices as soon as possible and within 10 minutes
    const p = warningDevicePlacement('undivided')
    expect(p.placeWithinMinutes).toBe(10)
    expect(p.notes.some(n => /hazard flashers/i.test(n))).toBe(true)
    expect(p.notes.some(n => /10 minutes/.test(n))).toBe(true)
    // 49 CFR 393.95 / 392.22: no flame devices near flammable cargo or leaks
    expect(p.notes.some(n => /flame/i.test(n))).toBe(true)
    // DESIGN.md: safety text defers to local codes and licensed practice
    expect(p.notes.some(n => /local rules.*licensed practice/i.test(n))).toBe(true)
  })

  it('rejects an unknown road type', () => {
    // our own input contract
    expect(() => warningDevicePlacement('freeway' as never)).toThrow(RangeError)
    expect(() => warningDevicePlacement('undivided', { obstructed: true, obstructionSide: 'left' as never })).toThrow(RangeError)
  })
})

describe('SCENE_CHECKLIST', () => {
  it('covers the roadside hazards', () => {
    // DESIGN.md look and feel: hot exhaust, traffic, lifting, batteries, high voltage; 49 CFR 392.22 flashers and devices
    const ids = SCENE_CHECKLIST.map(i => i.id)
    for (const id of ['hazard_lamps', 'warning_devices', 'high_visibility', 'wheels_chocked', 'engine_off', 'hot_surfaces', 'battery', 'lifting', 'high_voltage']) {
      expect(ids).toContain(id)
    }
    expect(new Set(ids).size).toBe(ids.length)
    const text = (id: string) => {
      const item = SCENE_CHECKLIST.find(i => i.id === id)
      return `${item?.label ?? ''} ${item?.caution ?? ''}`
    }
    // common practice: battery work means sparks, hydrogen and eye protection
    expect(text('battery')).toMatch(/spark/i)
    expect(text('battery')).toMatch(/hydrogen/i)
    expect(text('battery')).toMatch(/eye protection/i)
    // common practice: never under a load held only by a jack; stands
    expect(text('lifting')).toMatch(/only by a jack/i)
    expect(text('lifting')).toMatch(/stands/i)
    expect(text('hot_surfaces')).toMatch(/exhaust/i)
    expect(text('high_voltage')).toMatch(/high.voltage/i)
    expect(text('engine_off')).toMatch(/unless the test/i)
  })
})
