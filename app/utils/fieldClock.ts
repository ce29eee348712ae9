// Travel and labor on the phone, from the call's clock events and never typed: the same sums the
// office bills with (clockTotals in shared/utils/billing.ts), plus whether a clock is running.
import { clockTotals, type BillingClockEvent } from '#shared/utils/billing'

export interface ClockMark { kind: string, at: string }

export function fieldClockTotals(marks: readonly ClockMark[], now = Date.now()) {
  const valid = marks.filter(m => !Number.isNaN(Date.parse(m.at))).sort((a, b) => a.at.localeCompare(b.at))
  const last = (kinds: string[]) => [...valid].reverse().find(m => kinds.includes(m.kind))?.kind
  return {
    ...clockTotals(valid as BillingClockEvent[], new Date(now)),
    working: last(['work_start', 'work_stop', 'depart']) === 'work_start',
    travelling: last(['travel_start', 'arrive']) === 'travel_start',
  }
}

/** 1 h 05 min, 12 min, 0 min. */
export function formatSpan(ms: number): string {
  const min = Math.floor(ms / 60_000)
  const h = Math.floor(min / 60)
  return h ? `${h} h ${String(min % 60).padStart(2, '0')} min` : `${min} min`
}
