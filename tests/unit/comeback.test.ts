import { describe, expect, it } from 'vitest'
import { COMEBACK_WINDOW_DAYS, findComebacks } from '../../shared/utils/comeback'

const DAY = 86_400_000
const t0 = Date.parse('2026-03-01T08:00:00Z')
const call = (id: string, daysAfter: number, faultCodes: { code?: string, spn?: number, fmi?: number }[]) => ({
  id, at: new Date(t0 + daysAfter * DAY), faultCodes,
})

// The rule is Wayside's own (issue 3): the same fault code on the same unit within 30 days of an
// earlier call is a comeback. Tests check the rule as stated, no outside source.
describe('findComebacks', () => {
  it('uses a 30-day window by default', () => {
    // our own rule: 30 days
    expect(COMEBACK_WINDOW_DAYS).toBe(30)
  })

  it('flags the later call when the same J2012 code repeats within the window', () => {
    // our own rule: P0117 on day 0 and day 12 -> the day-12 call is a comeback of the first
    const found = findComebacks([call('a', 0, [{ code: 'P0117' }]), call('b', 12, [{ code: 'p0117 ' }])])
    expect(found).toEqual([{ callId: 'b', earlierCallId: 'a', code: 'P0117', days: 12 }])
  })

  it('counts exactly 30 days as within, and 30 days and a minute as outside', () => {
    // our own rule: "within 30 days" includes the limit
    expect(findComebacks([call('a', 0, [{ code: 'P0420' }]), call('b', 30, [{ code: 'P0420' }])])).toHaveLength(1)
    expect(findComebacks([call('a', 0, [{ code: 'P0420' }]), call('b', 30 + 1 / 1440, [{ code: 'P0420' }])])).toEqual([])
  })

  it('matches a J1939 code by SPN and FMI together', () => {
    // our own rule: SPN 3516 FMI 18 again is a comeback; SPN 3516 with FMI 4 is another fault
    const found = findComebacks([
      call('a', 0, [{ spn: 3516, fmi: 18 }]),
      call('b', 5, [{ spn: 3516, fmi: 4 }]),
      call('c', 9, [{ spn: 3516, fmi: 18 }]),
    ])
    expect(found).toEqual([{ callId: 'c', earlierCallId: 'a', code: 'SPN 3516 FMI 18', days: 9 }])
  })

  it('does not treat a J2012 code and a J1939 code as the same', () => {
    // our own rule: different code forms never match
    expect(findComebacks([call('a', 0, [{ code: 'P0117' }]), call('b', 1, [{ spn: 110, fmi: 4 }])])).toEqual([])
  })

  it('links a repeat to the nearest earlier call and chains through three visits', () => {
    // our own rule: day 0, 20, 45 -> 20 is a comeback of 0, 45 of 20 (25 days), 45 is not of 0
    const found = findComebacks([call('c', 45, [{ code: 'P2002' }]), call('a', 0, [{ code: 'P2002' }]), call('b', 20, [{ code: 'P2002' }])])
    expect(found.map(f => [f.callId, f.earlierCallId, f.days])).toEqual([['b', 'a', 20], ['c', 'b', 25]])
  })

  it('ignores a code listed twice on one call and calls with no codes', () => {
    // our own rule: one call is never its own comeback
    expect(findComebacks([call('a', 0, [{ code: 'P0300' }, { code: 'P0300' }]), call('b', 3, [])])).toEqual([])
  })

  it('reports every repeated code of a call', () => {
    // our own rule: two codes repeated -> two comebacks for the same call
    const found = findComebacks([
      call('a', 0, [{ code: 'P0117' }, { spn: 100, fmi: 1 }]),
      call('b', 2, [{ spn: 100, fmi: 1 }, { code: 'P0117' }]),
    ])
    expect(found.map(f => f.code).sort()).toEqual(['P0117', 'SPN 100 FMI 1'])
  })

  it('takes a shorter window when asked, and refuses a nonsense one', () => {
    // our own rule: the window is a parameter
    const calls = [call('a', 0, [{ code: 'P0117' }]), call('b', 10, [{ code: 'P0117' }])]
    expect(findComebacks(calls, 7)).toEqual([])
    expect(() => findComebacks(calls, -1)).toThrow(RangeError)
    expect(() => findComebacks([{ id: 'x', at: 'not a date', faultCodes: [] }])).toThrow(RangeError)
  })
})

describe('codes that cannot be read', () => {
  it('are left out instead of matching each other', () => {
    // our own rule: only a readable J2012 code or a full SPN/FMI pair can repeat
    expect(findComebacks([call('a', 0, [{ code: 'XYZ' }, { spn: 110 }]), call('b', 1, [{ code: 'XYZ' }, { spn: 110 }])])).toEqual([])
  })
})
