// Which part of a span of work fell inside the business's hours, by the local time where the
// business is: its IANA time zone, its open days, its daily hours and its holidays. Zone math
// (daylight-saving days of 23 or 25 hours included) is luxon's, on the Intl time zone data.
import { DateTime } from 'luxon'

export type BusinessHours = {
  /** IANA zone, e.g. America/Chicago. */
  timeZone: string
  /** Opening and closing time, minutes after local midnight (0–1440; 1440 = midnight at the day's end). */
  openMinute: number
  closeMinute: number
  /** Open days, ISO weekday numbers: 1 = Monday … 7 = Sunday. */
  openDays: readonly number[]
  /** Local dates (YYYY-MM-DD) billed as after hours all day. */
  holidays: readonly string[]
}

/** True when `zone` is an IANA time zone this runtime knows. */
export function isTimeZone(zone: string): boolean {
  return DateTime.local().setZone(zone).isValid
}

/** A local wall time on a local date as an instant; a time skipped by a clock change moves forward. */
function localInstant(day: DateTime, minute: number): number {
  if (minute >= 1440) return day.plus({ days: 1 }).startOf('day').toMillis()
  const wall = { year: day.year, month: day.month, day: day.day, hour: Math.floor(minute / 60), minute: minute % 60 }
  return DateTime.fromObject(wall, { zone: day.zone }).toMillis()
}

/**
 * Splits [startMs, endMs) into the time inside business hours and the time after hours, cutting at
 * every opening and closing it crosses.
 */
export function splitByBusinessHours(startMs: number, endMs: number, hours: BusinessHours): { insideMs: number, afterMs: number } {
  if (!(endMs > startMs)) return { insideMs: 0, afterMs: 0 }
  const holidays = new Set(hours.holidays)
  let day = DateTime.fromMillis(startMs, { zone: hours.timeZone }).startOf('day')
  if (!day.isValid) throw new RangeError(`unknown time zone ${hours.timeZone}`)
  let insideMs = 0
  while (day.toMillis() < endMs) {
    const isOpen = hours.openDays.includes(day.weekday) && !holidays.has(day.toISODate()!) && hours.closeMinute > hours.openMinute
    if (isOpen) {
      const open = localInstant(day, hours.openMinute)
      const close = localInstant(day, hours.closeMinute)
      insideMs += Math.max(0, Math.min(endMs, close) - Math.max(startMs, open))
    }
    day = day.plus({ days: 1 }).startOf('day')
  }
  return { insideMs, afterMs: endMs - startMs - insideMs }
}
