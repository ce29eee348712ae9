import { describe, expect, it } from 'vitest'
import { boundedMoveTime, clockBoundFlag, longSpanIds } from '~~/shared/sync/clockBounds'

const T = (iso: string) => new Date(iso)
const taken = T('2026-11-30T14:00:00Z')
const now = T('2026-11-30T18:00:00Z')

describe('clockBoundFlag', () => {
  it('trusts times between the call being taken and now, with five minutes of skew either side (common practice)', () => {
    expect(clockBoundFlag(T('2026-11-30T15:30:00Z'), { takenAt: taken, now })).toBeNull()
    expect(clockBoundFlag(T('2026-11-30T13:55:00Z'), { takenAt: taken, now })).toBeNull()
    expect(clockBoundFlag(T('2026-11-30T18:05:00Z'), { takenAt: taken, now })).toBeNull()
  })

  it('flags a phone whose clock says 2000, one a month behind, and one in the future', () => {
    expect(clockBoundFlag(T('2000-01-01T00:00:00Z'), { takenAt: taken, now })).toBe('before_call')
    expect(clockBoundFlag(T('2026-10-31T15:00:00Z'), { takenAt: taken, now })).toBe('before_call')
    expect(clockBoundFlag(T('2026-11-30T13:54:59Z'), { takenAt: taken, now })).toBe('before_call')
    expect(clockBoundFlag(T('2026-11-30T18:05:01Z'), { takenAt: taken, now })).toBe('future')
    expect(clockBoundFlag(T('2027-01-01T00:00:00Z'), { takenAt: taken, now })).toBe('future')
    expect(clockBoundFlag(new Date(Number.NaN), { takenAt: taken, now })).toBe('before_call')
  })
})

describe('longSpanIds', () => {
  const ev = (id: string, kind: string, at: string, flag: string | null = null) => ({ id, kind: kind as never, at: T(at), flag })

  it('flags both ends of labor over 16 h and of travel over 12 h, and nothing shorter', () => {
    const events = [
      ev('t1', 'travel_start', '2026-11-30T08:00:00Z'), ev('a1', 'arrive', '2026-11-30T20:00:01Z'),
      ev('w1', 'work_start', '2026-11-30T20:10:00Z'), ev('s1', 'work_stop', '2026-12-01T12:10:00Z'),
      ev('w2', 'work_start', '2026-12-01T13:00:00Z'), ev('s2', 'work_stop', '2026-12-02T05:00:01Z'),
    ]
    // 12 h 0 min 1 s of travel; 16 h exactly of labor (not over); 16 h 0 min 1 s of labor.
    expect(longSpanIds(events).sort()).toEqual(['a1', 's2', 't1', 'w2'])
  })

  it('does not judge a span still running, and leaves flagged events out of the pairing', () => {
    expect(longSpanIds([ev('w1', 'work_start', '2026-11-01T08:00:00Z')])).toEqual([])
    // The start is already flagged (before the call was taken): the stop pairs with nothing.
    const events = [ev('w1', 'work_start', '2026-11-01T08:00:00Z', 'before_call'), ev('s1', 'work_stop', '2026-12-01T08:00:00Z')]
    expect(longSpanIds(events)).toEqual([])
  })
})

describe('boundedMoveTime', () => {
  it('keeps the phone\'s time between the last move and now', () => {
    const b = { after: T('2026-11-30T14:20:00Z'), now }
    expect(boundedMoveTime(T('2026-11-30T14:38:00Z'), b)).toEqual(T('2026-11-30T14:38:00Z'))
    expect(boundedMoveTime(T('2000-01-01T00:00:00Z'), b)).toEqual(b.after)
    expect(boundedMoveTime(T('2030-01-01T00:00:00Z'), b)).toEqual(now)
  })
})
