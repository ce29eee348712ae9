import { describe, expect, it } from 'vitest'
import { isoDay, isoTime, latestDay } from '../../shared/schemas/dates'

const ok = (s: unknown) => isoDay('From').safeParse(s).success
const why = (s: unknown) => isoDay('From').safeParse(s).error?.issues[0]?.message

describe('real-world days', () => {
  it('takes ISO 8601 calendar days (YYYY-MM-DD) within the span', () => {
    expect(ok('2000-01-01')).toBe(true)
    expect(ok('2026-03-31')).toBe(true)
  })

  it('knows the Gregorian leap rule (a year divisible by 400 is a leap year; by 100 but not 400 is not)', () => {
    expect(ok('2000-02-29')).toBe(true) // 2000: divisible by 400
    expect(ok('2024-02-29')).toBe(true)
    expect(why('2026-02-29')).toMatch(/not a real date/)
    expect(why('2026-04-31')).toMatch(/not a real date/)
  })

  it('refuses days before 2000 and more than five years ahead, naming the field', () => {
    expect(why('1999-12-31')).toBe('From is before 2000-01-01')
    expect(why('0001-01-01')).toBe('From is before 2000-01-01')
    const tooFar = `${Number(latestDay().slice(0, 4)) + 1}-01-01`
    expect(why(tooFar)).toBe('From is more than 5 years ahead')
    expect(ok(latestDay())).toBe(true)
  })

  it('refuses other shapes and control characters', () => {
    for (const s of ['2026-3-1', '20260301', '2026-03-01T00:00:00Z', '2026-03-01\u0000', '', 20260301]) expect(ok(s), String(s)).toBe(false)
  })

  it('five years ahead counts from today in UTC', () => {
    expect(latestDay(new Date('2026-06-15T23:59:00Z'))).toBe('2031-06-15')
  })
})

describe('real-world times', () => {
  it('takes ISO 8601 times with a zone, refuses times without one and outside the span', () => {
    const t = isoTime('Paid at')
    expect(t.safeParse('2026-03-31T14:05:00Z').success).toBe(true)
    expect(t.safeParse('2026-03-31T14:05:00.123+02:00').success).toBe(true)
    expect(t.safeParse('2026-03-31T14:05:00').success).toBe(false)
    expect(t.safeParse('1970-01-01T00:00:00Z').error?.issues[0]?.message).toBe('Paid at is before 2000-01-01')
    expect(t.safeParse('garbage').success).toBe(false)
  })
})
