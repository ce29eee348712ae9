import { describe, expect, it } from 'vitest'
import { centsSchema } from '../../shared/schemas/money'
import { derateText, unitModelText } from '../../shared/utils/callText'
import { boardAlarm, compareBoardCalls, isPausedCall } from '../../shared/utils/boardUrgency'

const first = (r: { success: boolean, error?: { issues: { message: string }[] } }) => r.error?.issues[0]?.message

describe('centsSchema', () => {
  const s = centsSchema('Price')
  it('says a number too large is too large, whatever else is wrong with it', () => {
    expect(first(s.safeParse(1e20))).toBe('Price is too large (at most $1,000,000.00)')
    expect(s.safeParse(1e20).error?.issues).toHaveLength(1)
    expect(first(s.safeParse(100_000_001))).toMatch(/too large/)
  })
  it('keeps whole cents, the sign and the type in their own words', () => {
    expect(first(s.safeParse(12.5))).toBe('Price must be whole cents')
    expect(first(s.safeParse(-1))).toBe('Price cannot be negative')
    expect(first(s.safeParse('12'))).toBe('Price must be an amount')
    expect(s.parse(0)).toBe(0)
    expect(s.parse(100_000_000)).toBe(100_000_000)
    expect(first(centsSchema('Refund', { positive: true }).safeParse(0))).toBe('Refund must be more than zero')
  })
})

describe('derateText', () => {
  it('joins the state and the note once, without doubled brackets', () => {
    expect(derateText('countdown', '60 min to derate')).toBe('Countdown to derate or shutdown: 60 min to derate')
    expect(derateText('derated', '(speed held to 8 km/h)')).toBe('Derated (power or speed limited): speed held to 8 km/h')
    expect(derateText('derated', null)).toBe('Derated (power or speed limited)')
    expect(derateText('none', 'ignored')).toBeNull()
  })
  it('keeps brackets that are part of the note', () => {
    expect(derateText('shutdown', '(oil) low (gauge)')).toBe('Shut down, will not run: (oil) low (gauge)')
  })
})

describe('unitModelText', () => {
  it('names the engine once', () => {
    expect(unitModelText({ yearMakeModel: '2019 Kestrel T8, DX13', engine: 'DX13' })).toBe('2019 Kestrel T8, DX13')
    expect(unitModelText({ yearMakeModel: '2019 Kestrel T8', engine: 'DX13' })).toBe('2019 Kestrel T8 · DX13 engine')
    expect(unitModelText({ yearMakeModel: null, engine: null })).toBe('')
  })
})

describe('board urgency', () => {
  const now = Date.parse('2026-12-02T12:00:00Z')
  const at = (min: number) => new Date(now - min * 60_000).toISOString()
  it('raises an assignment nobody acted on within the set minutes, in words', () => {
    const c = { status: 'assigned' as const, derate: 'none', receivedAt: at(40), assignedAt: at(12), enRouteAt: null }
    expect(boardAlarm(c, now, 10)).toMatchObject({ kind: 'unacted', words: 'Not started 12 min after assigning' })
    expect(boardAlarm(c, now, 15)).toBeNull()
    // Paused for another call: driven out to before, so its mechanic is busy elsewhere.
    expect(boardAlarm({ ...c, enRouteAt: at(30) }, now, 10)).toBeNull()
    expect(isPausedCall({ ...c, enRouteAt: at(30) })).toBe(true)
  })
  it('raises a call waiting for a mechanic after 15 minutes', () => {
    expect(boardAlarm({ status: 'received', derate: 'none', receivedAt: at(16) }, now)).toMatchObject({ kind: 'unassigned' })
    expect(boardAlarm({ status: 'received', derate: 'none', receivedAt: at(14) }, now)).toBeNull()
  })
  it('puts countdowns and shutdowns first, then the status order, then the oldest', () => {
    const calls = [
      { id: 'a', status: 'received' as const, derate: 'none', receivedAt: at(50) },
      { id: 'b', status: 'on_site' as const, derate: 'shutdown', receivedAt: at(5) },
      { id: 'c', status: 'received' as const, derate: 'derated', receivedAt: at(60) },
      { id: 'd', status: 'assigned' as const, derate: 'countdown', receivedAt: at(10) },
    ]
    expect([...calls].sort(compareBoardCalls).map(c => c.id)).toEqual(['d', 'b', 'c', 'a'])
  })
})
