import { describe, expect, it } from 'vitest'
import { priceCall, type BillingRates } from '../../shared/utils/billing'
import { clockSpans, clockTotals, type BillingClockEvent } from '../../shared/utils/clockSpans'
import { isPauseMove, statusTimes } from '../../shared/utils/callStatus'
import { mergeCallField, type MergeInput } from '../../server/utils/sync/merge'
import { fieldClockTotals, pauseAndStartWords, runningCalls } from '../../app/utils/fieldClock'

// One active call per mechanic: a `pause` clock event ends whatever runs on a call when its mechanic
// starts on another. The figures are plain arithmetic on the clock times (minutes between two
// times of one morning); the rules are Wayside's own.
const MIN = 60_000
const at = (hhmm: string) => `2026-03-10T${hhmm}:00Z`
const ev = (kind: BillingClockEvent['kind'], hhmm: string, id = `${kind}-${hhmm}`): BillingClockEvent => ({ id, kind, at: at(hhmm) })

describe('a pause ends the running span', () => {
  it('ends travel: driving 08:00, paused 08:40 → 40 min', () => {
    const t = clockTotals([ev('travel_start', '08:00'), ev('pause', '08:40')], new Date(at('12:00')))
    expect(t.travelMs).toBe(40 * MIN) // 08:40 − 08:00 = 40 min
    expect(t.laborMs).toBe(0)
  })

  it('driving again later adds its own stretch: 40 min + (09:30 − 09:10 = 20 min) = 60 min', () => {
    const clock = [ev('travel_start', '08:00'), ev('pause', '08:40'), ev('travel_start', '09:10'), ev('arrive', '09:30')]
    const { travel } = clockSpans(clock, new Date(at('12:00')))
    expect(travel.map(s => (s.end - s.start) / MIN)).toEqual([40, 20])
    expect(travel[0]!.ids).toEqual(['travel_start-08:00', 'pause-08:40'])
    expect(clockTotals(clock, new Date(at('12:00'))).travelMs).toBe(60 * MIN)
  })

  it('ends work: work 10:00, paused 10:25 → 25 min; the pause does not keep counting up to now', () => {
    const clock = [ev('travel_start', '09:00'), ev('arrive', '09:30'), ev('work_start', '10:00'), ev('pause', '10:25')]
    const t = clockTotals(clock, new Date(at('15:00')))
    expect(t.travelMs).toBe(30 * MIN) // 09:30 − 09:00
    expect(t.laborMs).toBe(25 * MIN) // 10:25 − 10:00, not 15:00 − 10:00
  })

  it('a pause with nothing running changes nothing', () => {
    const clock = [ev('travel_start', '08:00'), ev('arrive', '08:30'), ev('pause', '08:45')]
    expect(clockTotals(clock, new Date(at('12:00')))).toEqual({ travelMs: 30 * MIN, laborMs: 0 })
  })

  it('prices travel by time from the two stretches only: 60 min → 1.0 h at $95/h = $95.00', () => {
    const rates: BillingRates = {
      laborCentsPerHour: 14500, afterHoursMultiplierPct: 100, minimumLaborTenths: 0, roadCallMinimumCents: 0,
      travelBasis: 'time', travelCentsPerUnit: 0, travelUnit: 'km', travelCentsPerHour: 9500, roadFactorPct: 100,
      partsMarkupPct: 0, taxRateBasisPoints: 0, laborTaxable: false, travelTaxable: false, partsTaxable: false, coresTaxable: false,
      feesTaxable: false, shopSuppliesBasisPoints: 0, shopSuppliesCapCents: null, environmentalFeeCents: 0,
      timeZone: 'UTC', openMinute: 0, closeMinute: 24 * 60, openDays: [0, 1, 2, 3, 4, 5, 6], holidays: [],
    }
    const p = priceCall({
      rates, clockUntil: at('12:00'), distance: { straightKm: null }, parts: [], taxExempt: false,
      clock: [ev('travel_start', '08:00'), ev('pause', '08:40'), ev('travel_start', '09:10'), ev('arrive', '09:30')],
    })
    const travel = p.lines.filter(l => l.kind === 'travel')
    expect(travel.map(l => l.quantity)).toEqual([1]) // 60 min = 1.0 h
    expect(travel.reduce((n, l) => n + l.amountCents, 0)).toBe(9500) // 1.0 h × $95.00
  })
})

describe('the phone\'s running clock', () => {
  const marks = (...xs: [string, string][]) => xs.map(([kind, hhmm]) => ({ kind, at: at(hhmm) }))
  it('a paused call shows nothing running and says it is paused', () => {
    const t = fieldClockTotals(marks(['travel_start', '08:00'], ['pause', '08:40']), Date.parse(at('09:00')))
    expect(t).toMatchObject({ travelling: false, working: false, paused: true, travelMs: 40 * MIN })
    const w = fieldClockTotals(marks(['arrive', '08:30'], ['work_start', '08:35'], ['pause', '09:00']), Date.parse(at('10:00')))
    expect(w).toMatchObject({ working: false, paused: true, laborMs: 25 * MIN })
  })

  it('driving again clears the pause', () => {
    const t = fieldClockTotals(marks(['travel_start', '08:00'], ['pause', '08:40'], ['travel_start', '09:10']), Date.parse(at('09:20')))
    expect(t).toMatchObject({ travelling: true, paused: false, travelMs: 50 * MIN })
  })

  it('finds the other calls whose clock runs, by number', () => {
    const calls = [
      { id: 'a', number: 7, status: 'en_route', marks: marks(['travel_start', '08:00']) },
      { id: 'b', number: 4, status: 'on_site', marks: marks(['arrive', '07:30'], ['work_start', '07:35']) },
      { id: 'c', number: 9, status: 'on_site', marks: marks(['arrive', '07:00'], ['work_start', '07:05'], ['work_stop', '07:40']) },
      { id: 'd', number: 3, status: 'assigned', marks: marks(['travel_start', '06:00'], ['pause', '06:10']) },
      { id: 'e', number: 2, status: 'completed', marks: marks(['travel_start', '06:00']) },
      { id: 'f', number: 5, status: 'assigned', marks: [] },
    ]
    expect(runningCalls(calls, 'f').map(c => c.number)).toEqual([4, 7])
    expect(runningCalls(calls, 'a').map(c => c.number)).toEqual([4])
  })

  it('names every call the button pauses', () => {
    expect(pauseAndStartWords([4], 'start driving')).toBe('Pause #4 and start driving')
    expect(pauseAndStartWords([4, 7], 'start driving')).toBe('Pause #4, #7 and start driving')
    expect(pauseAndStartWords([], 'start driving')).toBe('Start driving')
  })
})

describe('a pause as a status move', () => {
  const when = new Date('2026-03-10T08:40:00Z')
  it('is en route or at the truck back to assigned, nothing else', () => {
    expect(isPauseMove('en_route', 'assigned')).toBe(true)
    expect(isPauseMove('on_site', 'assigned')).toBe(true)
    expect(isPauseMove('completed', 'assigned')).toBe(false)
    expect(isPauseMove('received', 'assigned')).toBe(false)
  })

  it('keeps the times the call reached, so the board still knows it was driven out to', () => {
    expect(statusTimes('en_route', 'assigned', when)).toEqual({ statusChangedAt: when })
    expect(statusTimes('on_site', 'assigned', when)).toEqual({ statusChangedAt: when })
  })

  it('sync takes a pause but never another move back to assigned', () => {
    const status = (server: MergeInput['serverStatus'], device: string) => mergeCallField({
      field: 'status', device, server, base: { value: server }, role: 'mechanic', serverStatus: server,
    })
    expect(status('en_route', 'assigned')).toEqual({ action: 'take', value: 'assigned' })
    expect(status('on_site', 'assigned')).toEqual({ action: 'take', value: 'assigned' })
    expect(status('completed', 'assigned')).toMatchObject({ action: 'keep', reason: expect.stringMatching(/never moves a status back/) })
    expect(status('received', 'assigned')).toMatchObject({ action: 'reject', reason: expect.stringMatching(/^status: /) })
    expect(status('invoiced', 'assigned').action).toBe('conflict')
  })
})
