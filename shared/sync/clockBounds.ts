// How far the server trusts a phone's clock. A clock event keeps the device's time (labor is
// billed from it), but a time before the call was taken, after the server's own now, or a span
// nobody works in one go is flagged for the office and left out of the pricing, never billed silently.
import { clockSpans, type BillingClockEvent } from '../utils/clockSpans'

export const CLOCK_FLAGS = ['before_call', 'future', 'long_span'] as const
export type ClockFlag = (typeof CLOCK_FLAGS)[number]

/** Words for the office beside a flagged clock time. */
export const CLOCK_FLAG_WORDS: Record<ClockFlag, string> = {
  before_call: 'before the call was taken',
  future: 'later than the server\'s clock',
  long_span: 'a span longer than anyone works in one go',
}

const MINUTE = 60_000
const HOUR = 60 * MINUTE
/** Phones and servers disagree by a few minutes without anyone being wrong (common practice). */
export const CLOCK_SKEW_MS = 5 * MINUTE
/** The longest span billed without a person looking at it first. */
export const LONGEST_SPAN_MS = { labor: 16 * HOUR, travel: 12 * HOUR } as const

/** The flag a device time earns against the call and the server's clock, or null when it is trusted. */
export function clockBoundFlag(at: Date, bounds: { takenAt: Date, now: Date }): ClockFlag | null {
  const t = at.getTime()
  if (!Number.isFinite(t) || t < bounds.takenAt.getTime() - CLOCK_SKEW_MS) return 'before_call'
  if (t > bounds.now.getTime() + CLOCK_SKEW_MS) return 'future'
  return null
}

/**
 * The events at either end of a finished span longer than anyone works in one go (labor over
 * 16 h, travel over 12 h), paired as the pricing pairs them, among the events not flagged yet.
 * A span still running is not judged: the mechanic may still be at it.
 */
export function longSpanIds(events: (BillingClockEvent & { id: string })[]): string[] {
  const trusted = events.filter(e => !e.flag)
  // Until the epoch: only finished spans (clockSpans extends a running one up to `until`).
  const { labor, travel } = clockSpans(trusted, new Date(0))
  const long = [
    ...labor.filter(s => s.end - s.start > LONGEST_SPAN_MS.labor),
    ...travel.filter(s => s.end - s.start > LONGEST_SPAN_MS.travel),
  ]
  return long.flatMap(s => s.ids)
}

/** Where a status move made on the phone is put on the timeline: the phone's time, kept between the call's last move and now. */
export function boundedMoveTime(deviceAt: Date, bounds: { after: Date, now: Date }): Date {
  const t = deviceAt.getTime()
  if (!Number.isFinite(t)) return bounds.now
  return new Date(Math.min(Math.max(t, bounds.after.getTime()), bounds.now.getTime()))
}
