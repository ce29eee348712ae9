// Travel and labor on the phone, from the call's clock events and never typed: the same sums the
// office bills with (clockTotals in shared/utils/clockSpans.ts), plus whether a clock is running.
import { clockTotals, type BillingClockEvent } from '#shared/utils/clockSpans'
import { isOpenStatus } from '#shared/utils/callStatus'

export interface ClockMark { kind: string, at: string }

export function fieldClockTotals(marks: readonly ClockMark[], now = Date.now()) {
  const valid = marks.filter(m => !Number.isNaN(Date.parse(m.at))).sort((a, b) => a.at.localeCompare(b.at))
  const last = (kinds: string[]) => [...valid].reverse().find(m => kinds.includes(m.kind))?.kind
  // A pause (the mechanic started on another call) stops both, as it does in the billing.
  const travelling = last(['travel_start', 'arrive', 'pause']) === 'travel_start'
  const working = last(['work_start', 'work_stop', 'depart', 'pause']) === 'work_start'
  return {
    ...clockTotals(valid as BillingClockEvent[], new Date(now)),
    working, travelling,
    /** Paused for another call and not yet started again. */
    paused: valid.at(-1)?.kind === 'pause',
  }
}

/** 1 h 05 min, 12 min, 0 min. */
export function formatSpan(ms: number): string {
  const min = Math.floor(ms / 60_000)
  const h = Math.floor(min / 60)
  return h ? `${h} h ${String(min % 60).padStart(2, '0')} min` : `${min} min`
}

/** A call on the phone as runningCalls reads it: its status, number and clock marks. */
export interface ClockedCall { id: string, number: number, status: string, revoked?: boolean, marks: readonly ClockMark[] }

/**
 * The calls whose clock runs (travel or work started, not stopped, paused or departed), besides
 * `exceptId`, by number: one mechanic drives to or works on one call at a time, so starting on
 * another pauses these.
 */
export function runningCalls(calls: readonly ClockedCall[], exceptId: string): { id: string, number: number, status: string }[] {
  return calls
    .filter(c => c.id !== exceptId && !c.revoked && isOpenStatus(c.status))
    .filter((c) => {
      const t = fieldClockTotals(c.marks)
      return t.travelling || t.working
    })
    .map(c => ({ id: c.id, number: c.number, status: c.status }))
    .sort((a, b) => a.number - b.number)
}

/** "Pause #4 and start driving", "Pause #4, #7 and start work": the button that starts one call and pauses the others. */
export function pauseAndStartWords(numbers: readonly number[], start: string): string {
  if (!numbers.length) return start.charAt(0).toUpperCase() + start.slice(1)
  return `Pause ${numbers.map(n => `#${n}`).join(', ')} and ${start}`
}
