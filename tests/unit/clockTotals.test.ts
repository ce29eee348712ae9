import { describe, expect, it } from 'vitest'
import { clockTotals, type ClockTotalsEvent } from '../../shared/utils/clockTotals'

const base = Date.parse('2026-04-02T06:00:00Z')
const at = (min: number) => new Date(base + min * 60_000)

// Arithmetic on clock times (DESIGN.md: labor and travel derive from clock events).
describe('clockTotals', () => {
  it('derives travel and labor from one visit', () => {
    // arithmetic: travel 06:00–06:40 = 40 min, work 06:45–08:15 = 90 min
    const ev: ClockTotalsEvent[] = [
      { kind: 'travel_start', at: at(0) }, { kind: 'arrive', at: at(40) },
      { kind: 'work_start', at: at(45) }, { kind: 'work_stop', at: at(135) }, { kind: 'depart', at: at(140) },
    ]
    expect(clockTotals(ev)).toEqual({ travelMinutes: 40, laborMinutes: 90, travelRunning: false, workRunning: false })
  })

  it('adds up two visits and sorts events that arrive out of order', () => {
    // arithmetic: (30 + 25) min travel, (60 + 20) min work
    const ev: ClockTotalsEvent[] = [
      { kind: 'work_stop', at: at(90) }, { kind: 'travel_start', at: at(0) }, { kind: 'arrive', at: at(30) }, { kind: 'work_start', at: at(30) },
      { kind: 'travel_start', at: at(600) }, { kind: 'arrive', at: at(625) }, { kind: 'work_start', at: at(630) }, { kind: 'depart', at: at(650) },
    ]
    const t = clockTotals(ev)
    expect(t.travelMinutes).toBe(55)
    expect(t.laborMinutes).toBe(80)
  })

  it('ignores a double tap and a stop with nothing running', () => {
    // arithmetic: the first of two starts counts; a lone stop adds nothing
    const ev: ClockTotalsEvent[] = [
      { kind: 'work_stop', at: at(5) }, { kind: 'work_start', at: at(10) }, { kind: 'work_start', at: at(12) }, { kind: 'work_stop', at: at(40) },
    ]
    expect(clockTotals(ev).laborMinutes).toBe(30)
  })

  it('counts running time up to now only when asked', () => {
    // arithmetic: travel running since 06:00, now 06:25 -> 25 min
    const ev: ClockTotalsEvent[] = [{ kind: 'travel_start', at: at(0) }]
    expect(clockTotals(ev)).toMatchObject({ travelMinutes: 0, travelRunning: true })
    expect(clockTotals(ev, at(25))).toMatchObject({ travelMinutes: 25, travelRunning: true })
  })

  it('takes ISO strings and drops unreadable times', () => {
    // arithmetic: 20 minutes of work from ISO text
    expect(clockTotals([
      { kind: 'work_start', at: '2026-04-02T06:00:00Z' }, { kind: 'work_stop', at: '2026-04-02T06:20:00Z' }, { kind: 'work_start', at: 'garbage' },
    ]).laborMinutes).toBe(20)
  })
})
